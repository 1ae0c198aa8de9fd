import type { Metadata } from 'next';
import { requirePageRole } from '@/lib/auth/authorize';
import { hasRole } from '@/lib/auth/roles';
import { formatMoney } from '@/lib/money';
import { loadShippingZones } from '@/lib/orders/shipping';
import {
  basisPointsToPercent,
  countryCodes,
  countryName,
  currencyCodes,
  exampleTrackingNumber,
  minorToAmount,
  timeZones,
} from '@/lib/settings/schemas';
import { currencyLockReason, loadStudioSettings } from '@/lib/settings/studio';
import { ReadOnlyNotice } from '../designs/_components/read-only';
import { CalendarSection } from './_components/calendar-section';
import { CarriersSection } from './_components/carriers-section';
import { CustomsSection } from './_components/customs-section';
import { MoneySection } from './_components/money-section';
import { ParcelSizesSection } from './_components/parcel-sizes-section';
import { Section } from './_components/parts';
import { StudioSection } from './_components/studio-section';
import { ZonesSection } from './_components/zones-section';

export const metadata: Metadata = { title: 'Settings' };

const sections = [
  { id: 'studio', title: 'Studio' },
  { id: 'calendar', title: 'Working calendar' },
  { id: 'money', title: 'Money' },
  { id: 'shipping', title: 'Shipping zones and rates' },
  { id: 'boxes', title: 'Parcel sizes' },
  { id: 'carriers', title: 'Carriers' },
  { id: 'customs', title: 'Customs' },
];

export default async function SettingsPage() {
  const user = await requirePageRole('staff', '/workshop/settings');
  const studio = await loadStudioSettings();
  if (!studio) {
    return (
      <>
        <h1 className="text-3xl font-medium">Settings</h1>
        <p className="mt-2 text-ink-soft">
          The shop has no studio yet. Run the set-up first, then come back here.
        </p>
      </>
    );
  }
  const [zones, currencyLock] = await Promise.all([
    loadShippingZones(studio.id),
    currencyLockReason(studio.id),
  ]);
  const readOnly = !hasRole(user.role, 'owner');

  const countries = countryCodes()
    .map((code) => ({ code, name: countryName(code) }))
    .sort((a, b) => a.name.localeCompare(b.name, 'en'));
  const currencyNames = new Intl.DisplayNames(['en'], { type: 'currency' });
  const currencies = currencyCodes()
    .map((code) => ({ code, name: currencyNames.of(code) ?? code }))
    .sort((a, b) => a.name.localeCompare(b.name, 'en'));
  const zoneList = [...timeZones()];
  // A zone stored before this list was made (an alias, say) stays choosable, so saving other fields never fails on it.
  if (!zoneList.includes(studio.timeZone)) zoneList.unshift(studio.timeZone);
  const money = (amountMinor: number) => formatMoney({ amountMinor, currency: studio.currency });

  return (
    <>
      <h1 className="text-3xl font-medium">Settings</h1>
      <p className="mt-1 max-w-3xl text-ink-soft">
        What the shop, checkout, the planner and the e-mails know about {studio.name}. Each part saves on its
        own; every change is kept in the audit log.
      </p>
      {readOnly ? (
        <div className="mt-4">
          <ReadOnlyNotice what="settings" />
        </div>
      ) : null}
      <nav aria-label="Settings sections" className="mt-4">
        <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
          {sections.map((s) => (
            <li key={s.id}>
              <a href={`#${s.id}-title`} className="underline underline-offset-4 hover:text-ember-deep">
                {s.title}
              </a>
            </li>
          ))}
        </ul>
      </nav>

      <Section
        id="studio"
        title="Studio"
        intro="The studio’s name and contact details, where it ships from, its currency and its time zone."
      >
        <StudioSection
          values={{
            name: studio.name,
            contactEmail: studio.contactEmail ?? '',
            mailPerMinute: studio.mailPerMinute,
            postalAddress: studio.postalAddress,
            country: studio.country,
            currency: studio.currency,
            timeZone: studio.timeZone,
          }}
          countries={countries}
          currencies={currencies}
          timeZones={zoneList}
          currencyLock={currencyLock}
          readOnly={readOnly}
        />
      </Section>

      <Section
        id="calendar"
        title="Working calendar"
        intro="The days and hours the planner counts when it sizes a batch and promises a ship date."
      >
        <CalendarSection
          values={{
            workingDays: studio.workingDays,
            hoursPerDay: studio.hoursPerDay,
            holidays: studio.holidays,
          }}
          readOnly={readOnly}
        />
      </Section>

      <Section id="money" title="Money" intro={`Amounts are in ${studio.currency}, the studio’s currency.`}>
        <MoneySection
          currency={studio.currency}
          readOnly={readOnly}
          values={{
            taxLabel: studio.taxLabel,
            taxRate: basisPointsToPercent(studio.taxRateBasisPoints),
            cardFeePercent: basisPointsToPercent(studio.cardFeeBasisPoints),
            cardFeeFixed: minorToAmount(studio.cardFeeFixedMinor, studio.currency),
            volumetricDivisor: studio.volumetricDivisor,
          }}
        />
      </Section>

      <Section
        id="shipping"
        title="Shipping zones and rates"
        intro="Checkout finds the buyer’s country in one zone, then offers each of its rates whose weight covers the parcel."
      >
        <ZonesSection
          currency={studio.currency}
          countries={countries}
          readOnly={readOnly}
          zones={zones.map((zone) => ({
            id: zone.id,
            name: zone.name,
            countries: zone.countries,
            rates: zone.rates.map((rate) => ({
              id: rate.id,
              label: rate.label,
              upToGrams: rate.upToGrams,
              amount: minorToAmount(rate.amountMinor, studio.currency),
              amountText: money(rate.amountMinor),
              minDays: rate.minDays,
              maxDays: rate.maxDays,
            })),
          }))}
        />
      </Section>

      <Section
        id="boxes"
        title="Parcel sizes"
        intro="The boxes the studio packs in, measured inside, with the weight of the empty box and its padding."
      >
        <ParcelSizesSection sizes={studio.parcelSizes} readOnly={readOnly} />
      </Section>

      <Section
        id="carriers"
        title="Carriers"
        intro="The carriers the studio ships with, and the link that lets a buyer follow a parcel."
      >
        <CarriersSection
          carriers={studio.carriers}
          exampleNumber={exampleTrackingNumber}
          readOnly={readOnly}
        />
      </Section>

      <Section
        id="customs"
        title="Customs"
        intro="What a customs declaration needs for parcels that leave the studio’s customs area."
      >
        <CustomsSection
          countries={countries}
          readOnly={readOnly}
          values={{
            area: studio.customs.area,
            hsCode: studio.customs.hsCode ?? '',
            description: studio.customs.description,
            originCountry: studio.customs.originCountry ?? '',
          }}
        />
      </Section>
    </>
  );
}
