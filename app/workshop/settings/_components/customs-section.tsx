'use client';

import { TextField } from '../../designs/_components/fields';
import { updateCustomsAction } from '../actions';
import { ListPicker, SaveRow, SelectField, sectionBox, type Choice } from './parts';
import { useSettingsForm } from './use-settings-form';

export type CustomsValues = { area: string[]; hsCode: string; description: string; originCountry: string };

const shown = ['area', 'hsCode', 'description', 'originCountry'];

export function CustomsSection({
  values,
  countries,
  readOnly,
}: {
  values: CustomsValues;
  countries: Choice[];
  readOnly: boolean;
}) {
  const { error, formRef, onSubmit, pending, status } = useSettingsForm(updateCustomsAction, shown);
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate>
      <fieldset disabled={readOnly} className={`${sectionBox} sm:grid-cols-2`}>
        <legend className="sr-only">Customs</legend>
        <div className="sm:col-span-2">
          <ListPicker
            name="area"
            label="Countries of the studio’s customs area"
            choices={countries}
            initial={values.area}
            addLabel="Add country"
            emptyText="None: every parcel abroad travels with a customs declaration."
            error={error('area')}
            hint="A parcel to a country outside this list (and outside the country it ships from) travels with a customs declaration."
            disabled={readOnly}
          />
        </div>
        <TextField
          label="HS code (optional until you ship outside the area)"
          name="hsCode"
          defaultValue={values.hsCode}
          inputMode="numeric"
          autoComplete="off"
          maxLength={20}
          error={error('hsCode')}
          hint="6 digits, or 8 or 10 with your country’s national extension. Which code fits your masks is for the studio to settle with its customs authority: Demold does not suggest one."
        />
        <TextField
          label="Description of contents"
          name="description"
          defaultValue={values.description}
          maxLength={200}
          autoComplete="off"
          error={error('description')}
          hint="Plain words a customs officer reads on the declaration."
        />
        <SelectField
          label="Country of origin"
          name="originCountry"
          defaultValue={values.originCountry}
          error={error('originCountry')}
          hint="Where the masks are made."
        >
          <option value="">Not set</option>
          {countries.map((c) => (
            <option key={c.code} value={c.code}>
              {c.name} ({c.code})
            </option>
          ))}
        </SelectField>
        {readOnly ? null : (
          <SaveRow label="Save customs details" pending={pending} status={status} className="sm:col-span-2" />
        )}
      </fieldset>
    </form>
  );
}
