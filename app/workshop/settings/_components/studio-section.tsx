'use client';

import { TextArea, TextField } from '../../designs/_components/fields';
import { updateStudioDetailsAction } from '../actions';
import { SaveRow, SelectField, sectionBox, type Choice } from './parts';
import { useSettingsForm } from './use-settings-form';

export type StudioValues = {
  name: string;
  contactEmail: string;
  mailPerMinute: number;
  postalAddress: string;
  country: string;
  currency: string;
  timeZone: string;
};

const shown = ['name', 'contactEmail', 'mailPerMinute', 'postalAddress', 'country', 'currency', 'timeZone'];

export function StudioSection({
  values,
  countries,
  currencies,
  timeZones,
  currencyLock,
  readOnly,
}: {
  values: StudioValues;
  countries: Choice[];
  currencies: Choice[];
  timeZones: string[];
  currencyLock: string | null;
  readOnly: boolean;
}) {
  const { error, formRef, onSubmit, pending, status } = useSettingsForm(updateStudioDetailsAction, shown);
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate>
      <fieldset disabled={readOnly} className={`${sectionBox} sm:grid-cols-2`}>
        <legend className="sr-only">The studio</legend>
        <TextField
          label="Studio name"
          name="name"
          defaultValue={values.name}
          required
          maxLength={100}
          autoComplete="organization"
          error={error('name')}
          hint="Shown in the shop, on drop pages and in every e-mail."
        />
        <TextField
          label="Contact e-mail"
          name="contactEmail"
          type="email"
          defaultValue={values.contactEmail}
          autoComplete="email"
          error={error('contactEmail')}
          hint="Buyers’ replies to the shop’s e-mails go here. Leave empty to send without a reply address."
        />
        <TextField
          label="E-mails a minute, at most"
          name="mailPerMinute"
          defaultValue={String(values.mailPerMinute)}
          inputMode="numeric"
          autoComplete="off"
          error={error('mailPerMinute')}
          hint="The pace of waitlist announcements and every other e-mail. Your mail provider's plan says how many it takes."
        />
        <TextArea
          label="Postal address"
          name="postalAddress"
          defaultValue={values.postalAddress}
          rows={5}
          maxLength={500}
          className="sm:col-span-2"
          error={error('postalAddress')}
          hint="One line per line of the address. Printed at the foot of e-mails and on packing slips."
        />
        <SelectField
          label="Ships from"
          name="country"
          defaultValue={values.country}
          error={error('country')}
          hint="The country the parcels leave from."
        >
          {countries.map((c) => (
            <option key={c.code} value={c.code}>
              {c.name} ({c.code})
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Time zone"
          name="timeZone"
          defaultValue={values.timeZone}
          error={error('timeZone')}
          hint="Drop times are planned and shown to the studio in this zone."
        >
          {timeZones.map((zone) => (
            <option key={zone} value={zone}>
              {zone.replace(/_/g, ' ')}
            </option>
          ))}
        </SelectField>
        {currencyLock ? (
          <>
            <input type="hidden" name="currency" value={values.currency} />
            <SelectField
              label="Currency"
              defaultValue={values.currency}
              disabled
              error={error('currency')}
              hint={currencyLock}
            >
              {currencies
                .filter((c) => c.code === values.currency)
                .map((c) => (
                  <option key={c.code} value={c.code}>
                    {c.name} ({c.code})
                  </option>
                ))}
            </SelectField>
          </>
        ) : (
          <SelectField
            label="Currency"
            name="currency"
            defaultValue={values.currency}
            error={error('currency')}
            hint="All prices are in this currency. It is fixed once the first batch or order exists."
          >
            {currencies.map((c) => (
              <option key={c.code} value={c.code}>
                {c.name} ({c.code})
              </option>
            ))}
          </SelectField>
        )}
        {readOnly ? null : (
          <SaveRow label="Save studio details" pending={pending} status={status} className="sm:col-span-2" />
        )}
      </fieldset>
    </form>
  );
}
