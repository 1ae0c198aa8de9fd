'use client';

import { TextField } from '../../designs/_components/fields';
import { updateMoneyAction } from '../actions';
import { SaveRow, sectionBox } from './parts';
import { useSettingsForm } from './use-settings-form';

export type MoneyValues = {
  taxLabel: string;
  taxRate: string;
  cardFeePercent: string;
  cardFeeFixed: string;
  volumetricDivisor: number;
};

const shown = ['taxLabel', 'taxRate', 'cardFeePercent', 'cardFeeFixed', 'volumetricDivisor'];

export function MoneySection({
  values,
  currency,
  readOnly,
}: {
  values: MoneyValues;
  currency: string;
  readOnly: boolean;
}) {
  const { error, formRef, onSubmit, pending, status } = useSettingsForm(updateMoneyAction, shown);
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate>
      <input type="hidden" name="currency" value={currency} />
      <fieldset disabled={readOnly} className={`${sectionBox} sm:grid-cols-2`}>
        <legend className="sr-only">Money</legend>
        <TextField
          label="Tax name"
          name="taxLabel"
          defaultValue={values.taxLabel}
          maxLength={20}
          autoComplete="off"
          error={error('taxLabel')}
          hint="As receipts call it, such as VAT."
        />
        <TextField
          label="Tax rate"
          name="taxRate"
          defaultValue={values.taxRate}
          inputMode="decimal"
          autoComplete="off"
          suffix="%"
          error={error('taxRate')}
          hint="Included in every price. Check the rate that applies to the studio with its tax office."
        />
        <TextField
          label="Card fee, percentage"
          name="cardFeePercent"
          defaultValue={values.cardFeePercent}
          inputMode="decimal"
          autoComplete="off"
          suffix="%"
          error={error('cardFeePercent')}
          hint="From the payment provider’s price list; the planner counts it in each mask’s margin."
        />
        <TextField
          label={`Card fee, fixed amount in ${currency}`}
          name="cardFeeFixed"
          defaultValue={values.cardFeeFixed}
          inputMode="decimal"
          autoComplete="off"
          prefix={currency}
          error={error('cardFeeFixed')}
          hint="Charged per payment on top of the percentage; 0 if there is none."
        />
        <TextField
          label="Volumetric divisor (cm³ per kg)"
          name="volumetricDivisor"
          defaultValue={String(values.volumetricDivisor)}
          inputMode="numeric"
          autoComplete="off"
          error={error('volumetricDivisor')}
          hint="Checkout charges the larger of a parcel’s weight and its volume divided by this. Use your carriers’ figure."
        />
        {readOnly ? null : (
          <SaveRow label="Save money settings" pending={pending} status={status} className="sm:col-span-2" />
        )}
      </fieldset>
    </form>
  );
}
