'use client';

import { TextField } from '../../designs/_components/fields';
import { deleteRateAction, deleteZoneAction, saveRateAction, saveZoneAction } from '../actions';
import { DeleteButton } from './delete-button';
import { ListPicker, SaveRow, sectionBox, type Choice } from './parts';
import { useSettingsForm } from './use-settings-form';

export type RateValues = {
  id: string;
  label: string;
  upToGrams: number;
  amount: string;
  amountText: string;
  minDays: number;
  maxDays: number;
};
export type ZoneValues = { id: string; name: string; countries: string[]; rates: RateValues[] };

const zoneFields = ['name', 'countries'];
const rateFields = ['label', 'upToGrams', 'amount', 'minDays', 'maxDays'];

const days = (min: number, max: number) =>
  min === max ? `${min} day${min === 1 ? '' : 's'}` : `${min}–${max} days`;

export function ZonesSection({
  zones,
  countries,
  currency,
  readOnly,
}: {
  zones: ZoneValues[];
  countries: Choice[];
  currency: string;
  readOnly: boolean;
}) {
  const nameOf = (code: string) => countries.find((c) => c.code === code)?.name ?? code;
  return (
    <div className="grid gap-4">
      {zones.length === 0 ? (
        <p className="rounded-sm border border-paper-edge bg-paper px-4 py-4 text-ink-soft">
          No shipping zones yet. Buyers cannot pay until their country is in a zone with a rate.
        </p>
      ) : (
        <ul className="grid gap-4">
          {zones.map((zone) => (
            <li key={zone.id} className="rounded-sm border border-paper-edge bg-paper">
              <div className="grid gap-2 px-4 py-3 sm:grid-cols-[1fr_auto] sm:items-start">
                <div>
                  <h3 className="font-sans text-lg font-semibold">{zone.name}</h3>
                  <p className="text-sm text-ink-soft">
                    {zone.countries.map((code) => `${nameOf(code)} (${code})`).join(', ')}
                  </p>
                </div>
                {readOnly ? null : (
                  <DeleteButton
                    action={deleteZoneAction}
                    field="zoneId"
                    value={zone.id}
                    label="Delete zone"
                    what={zone.name}
                    question={`Delete the zone ${zone.name} with its ${zone.rates.length} rates? Buyers in its countries can no longer pay for shipping.`}
                  />
                )}
              </div>
              <div className="overflow-x-auto border-t border-paper-edge">
                {zone.rates.length === 0 ? (
                  <p className="px-4 py-3 text-sm font-semibold text-ember-deep">
                    <span aria-hidden="true">▲ </span>No rates: buyers in this zone cannot pay yet.
                  </p>
                ) : (
                  <table className="w-full text-left text-sm">
                    <caption className="sr-only">Rates of {zone.name}</caption>
                    <thead className="border-b border-paper-edge text-ink-soft">
                      <tr>
                        <th scope="col" className="px-3 py-2 font-semibold">
                          Rate
                        </th>
                        <th scope="col" className="px-3 py-2 text-right font-semibold">
                          Up to
                        </th>
                        <th scope="col" className="px-3 py-2 text-right font-semibold">
                          Amount
                        </th>
                        <th scope="col" className="px-3 py-2 font-semibold">
                          On the way
                        </th>
                      </tr>
                    </thead>
                    <tbody>
                      {zone.rates.map((rate) => (
                        <tr key={rate.id} className="border-b border-paper-edge/60 last:border-0">
                          <th scope="row" className="px-3 py-2 font-semibold">
                            {rate.label}
                          </th>
                          <td className="figures px-3 py-2 text-right">
                            {rate.upToGrams.toLocaleString('en-IE')} g
                          </td>
                          <td className="figures px-3 py-2 text-right">{rate.amountText}</td>
                          <td className="figures px-3 py-2">{days(rate.minDays, rate.maxDays)}</td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                )}
              </div>
              {readOnly ? null : (
                <details className="border-t border-paper-edge">
                  <summary className="cursor-pointer px-4 py-2 text-sm font-semibold hover:bg-paper-deep/60">
                    Edit {zone.name} and its rates
                  </summary>
                  <div className="grid gap-4 px-4 pb-4">
                    <ZoneForm zone={zone} countries={countries} />
                    {zone.rates.map((rate) => (
                      <div key={rate.id} className="grid gap-1">
                        <RateForm zoneId={zone.id} rate={rate} currency={currency} />
                        <DeleteButton
                          action={deleteRateAction}
                          field="rateId"
                          value={rate.id}
                          label="Delete rate"
                          what={`${rate.label} up to ${rate.upToGrams} g`}
                          question={`Delete the rate ${rate.label} up to ${rate.upToGrams} g of ${zone.name}?`}
                        />
                      </div>
                    ))}
                    <RateForm zoneId={zone.id} currency={currency} />
                  </div>
                </details>
              )}
            </li>
          ))}
        </ul>
      )}
      {readOnly ? null : (
        <div className="grid gap-2">
          <h3 className="font-sans text-base font-semibold">Add a zone</h3>
          <ZoneForm countries={countries} />
        </div>
      )}
    </div>
  );
}

function ZoneForm({ zone, countries }: { zone?: ZoneValues; countries: Choice[] }) {
  const { error, formRef, onSubmit, pending, state, status } = useSettingsForm(saveZoneAction, zoneFields, {
    resetOnSuccess: !zone,
  });
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate className={`${sectionBox} sm:grid-cols-2`}>
      {zone ? <input type="hidden" name="zoneId" value={zone.id} /> : null}
      <TextField
        label="Zone name"
        name="name"
        defaultValue={zone?.name ?? ''}
        maxLength={60}
        autoComplete="off"
        error={error('name')}
        hint="For the studio; buyers see the rates, not the zone."
      />
      <div className="sm:col-span-2">
        <ListPicker
          key={zone ? `${zone.id}-${zone.countries.join()}` : `new-${state?.ok ? state.message : ''}`}
          name="countries"
          label="Countries"
          choices={countries}
          initial={zone?.countries ?? []}
          addLabel="Add country"
          emptyText="No countries yet."
          error={error('countries')}
          hint="A country belongs to one zone only."
        />
      </div>
      <SaveRow
        label={zone ? `Save ${zone.name}` : 'Add zone'}
        pending={pending}
        status={status}
        className="sm:col-span-2"
      />
    </form>
  );
}

function RateForm({ zoneId, rate, currency }: { zoneId: string; rate?: RateValues; currency: string }) {
  const { error, formRef, onSubmit, pending, status } = useSettingsForm(saveRateAction, rateFields, {
    resetOnSuccess: !rate,
  });
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate className={`${sectionBox} grid-cols-2 lg:grid-cols-5`}>
      <p className="col-span-2 text-sm font-semibold lg:col-span-5">
        {rate ? `Rate: ${rate.label} up to ${rate.upToGrams} g` : 'Add a rate'}
      </p>
      <input type="hidden" name="zoneId" value={zoneId} />
      <input type="hidden" name="currency" value={currency} />
      {rate ? <input type="hidden" name="rateId" value={rate.id} /> : null}
      <TextField
        label="Label"
        name="label"
        defaultValue={rate?.label ?? ''}
        maxLength={60}
        autoComplete="off"
        className="col-span-2 lg:col-span-1"
        error={error('label')}
      />
      <TextField
        label="Up to (g)"
        name="upToGrams"
        defaultValue={rate ? String(rate.upToGrams) : ''}
        inputMode="numeric"
        autoComplete="off"
        error={error('upToGrams')}
      />
      <TextField
        label={`Amount (${currency})`}
        name="amount"
        defaultValue={rate?.amount ?? ''}
        inputMode="decimal"
        autoComplete="off"
        error={error('amount')}
      />
      <TextField
        label="Fewest days"
        name="minDays"
        defaultValue={rate ? String(rate.minDays) : ''}
        inputMode="numeric"
        autoComplete="off"
        error={error('minDays')}
      />
      <TextField
        label="Most days"
        name="maxDays"
        defaultValue={rate ? String(rate.maxDays) : ''}
        inputMode="numeric"
        autoComplete="off"
        error={error('maxDays')}
      />
      <SaveRow
        label={rate ? 'Save rate' : 'Add rate'}
        pending={pending}
        status={status}
        className="col-span-2 lg:col-span-5"
      />
    </form>
  );
}
