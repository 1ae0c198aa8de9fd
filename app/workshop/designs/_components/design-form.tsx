'use client';

import { useActionState, useEffect } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import type { MeasureField } from '@/lib/catalogue/editing';
import { createDesignAction, updateDesignAction } from '../actions';
import { TextArea, TextField, UnsavedNote } from './fields';
import { focusFirstInvalid, statusFor } from './form-state';
import { NameAndSlugFields } from './name-and-slug-fields';
import { useSubmitByHand } from './use-submit-by-hand';
import { useUnsavedChanges } from './use-unsaved-changes';

export type DesignFormValues = {
  name: string;
  slug: string;
  summary: string;
  story: string;
  basePrice: string;
  materials: string;
  care: string;
  measures: Record<MeasureField, number | null>;
};

type Props =
  | { mode: 'create'; currency: string; values: DesignFormValues }
  | { mode: 'edit'; currency: string; values: DesignFormValues; designId: string; published: boolean };

const measureGroups: { legend: string; hint: string; fields: { name: MeasureField; label: string; unit: 'mm' | 'g' }[] }[] = [
  {
    legend: 'Size and fit',
    hint: 'As the buyer reads them in the fit table. Leave a field empty if it is not measured yet.',
    fields: [
      { name: 'widthMm', label: 'Width', unit: 'mm' },
      { name: 'heightMm', label: 'Height', unit: 'mm' },
      { name: 'depthMm', label: 'Depth', unit: 'mm' },
      { name: 'weightG', label: 'Weight', unit: 'g' },
      { name: 'eyeOpeningWidthMm', label: 'Eye opening width', unit: 'mm' },
      { name: 'eyeSpacingMm', label: 'Eye spacing (centre to centre)', unit: 'mm' },
    ],
  },
  {
    legend: 'Parcel',
    hint:
      'These decide shipping: checkout prices a parcel by the larger of its packed weight and its volume weight. ' +
      'Until all four are set, buyers cannot pay for this design.',
    fields: [
      { name: 'parcelLengthMm', label: 'Parcel length', unit: 'mm' },
      { name: 'parcelWidthMm', label: 'Parcel width', unit: 'mm' },
      { name: 'parcelHeightMm', label: 'Parcel height', unit: 'mm' },
      { name: 'parcelWeightG', label: 'Packed weight', unit: 'g' },
    ],
  },
];

const shownFields = [
  'name',
  'slug',
  'summary',
  'story',
  'basePrice',
  'materials',
  'care',
  ...measureGroups.flatMap((group) => group.fields.map((field) => field.name)),
];

export function DesignForm(props: Props) {
  const { currency, values } = props;
  const [state, dispatch, pending] = useActionState(props.mode === 'create' ? createDesignAction : updateDesignAction, null);
  const { formRef, dirty, onChange, saved } = useUnsavedChanges();
  const { onSubmit, submitted } = useSubmitByHand(dispatch);

  useEffect(() => {
    if (!state) return;
    if (state.ok && submitted.current) saved(submitted.current);
    else focusFirstInvalid(formRef.current);
  }, [state, saved, formRef, submitted]);

  const error = (field: string) => fieldError(state, field);

  return (
    <form ref={formRef} action={dispatch} onSubmit={onSubmit} onChange={onChange} noValidate className="grid gap-6">
      <input type="hidden" name="currency" value={currency} />
      {props.mode === 'edit' ? <input type="hidden" name="designId" value={props.designId} /> : null}

      <fieldset className="grid gap-x-4 gap-y-1 rounded-sm border border-paper-edge bg-paper p-4 sm:grid-cols-2 sm:p-5">
        <legend className="px-1 font-sans text-base font-semibold">Name and address</legend>
        <NameAndSlugFields
          name={values.name}
          slug={values.slug}
          slugFollowsName={props.mode === 'create' && values.slug === ''}
          slugPrefix="/designs/"
          slugHint={
            props.mode === 'edit' && props.published
              ? 'Lower-case letters, digits and hyphens. This is the design’s address in the shop: changing it breaks links buyers already have.'
              : 'Lower-case letters, digits and hyphens; made from the name until you change it.'
          }
          errors={{ name: error('name'), slug: error('slug') }}
        />
        <TextArea
          label="Summary"
          name="summary"
          defaultValue={values.summary}
          rows={2}
          maxLength={300}
          className="sm:col-span-2"
          hint="One or two sentences under the name, on the card and the design page."
          error={error('summary')}
        />
      </fieldset>

      <fieldset className="grid gap-x-4 gap-y-1 rounded-sm border border-paper-edge bg-paper p-4 sm:grid-cols-2 sm:p-5">
        <legend className="px-1 font-sans text-base font-semibold">Price</legend>
        <TextField
          label={`Base price in ${currency}`}
          name="basePrice"
          defaultValue={values.basePrice}
          required
          inputMode="decimal"
          autoComplete="off"
          prefix={currency}
          className="figures"
          error={error('basePrice')}
          hint="The price in the plainest finish; each finish adds its own difference. A change counts in the shop at once, also for buyers paying for a hold right now."
        />
      </fieldset>

      <fieldset className="grid gap-x-4 gap-y-1 rounded-sm border border-paper-edge bg-paper p-4 sm:p-5">
        <legend className="px-1 font-sans text-base font-semibold">Story, materials and care</legend>
        <TextArea label="Story" name="story" defaultValue={values.story} rows={5} maxLength={5000} error={error('story')} />
        <TextArea
          label="Materials"
          name="materials"
          defaultValue={values.materials}
          rows={3}
          maxLength={2000}
          error={error('materials')}
          hint="What the mask is made of, as the buyer reads it."
        />
        <TextArea label="Care" name="care" defaultValue={values.care} rows={3} maxLength={2000} error={error('care')} />
      </fieldset>

      {measureGroups.map((group) => (
        <fieldset
          key={group.legend}
          className="grid grid-cols-2 gap-x-4 gap-y-1 rounded-sm border border-paper-edge bg-paper p-4 sm:p-5 lg:grid-cols-4"
        >
          <legend className="px-1 font-sans text-base font-semibold">{group.legend}</legend>
          <p className="col-span-2 mb-2 text-sm text-ink-soft lg:col-span-4">{group.hint}</p>
          {group.fields.map((field) => (
            <TextField
              key={field.name}
              label={`${field.label} (${field.unit})`}
              name={field.name}
              defaultValue={values.measures[field.name] ?? ''}
              inputMode="numeric"
              autoComplete="off"
              suffix={field.unit}
              error={error(field.name)}
            />
          ))}
        </fieldset>
      ))}

      <div className="sticky bottom-0 -mx-1 flex flex-wrap items-center gap-x-4 gap-y-1 border-t border-paper-edge bg-paper px-1 py-3">
        <button
          type="submit"
          disabled={pending}
          className="rounded-full bg-ink px-6 py-2.5 font-semibold text-paper disabled:opacity-60"
        >
          {props.mode === 'create' ? (pending ? 'Creating…' : 'Create the design') : pending ? 'Saving…' : 'Save the design'}
        </button>
        <UnsavedNote dirty={dirty && !pending} />
        <div className="basis-full">
          <FormStatus state={statusFor(state, shownFields)} />
        </div>
      </div>
    </form>
  );
}
