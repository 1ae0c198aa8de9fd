'use client';

import { TextField } from '../../designs/_components/fields';
import { deleteParcelSizeAction, saveParcelSizeAction } from '../actions';
import { DeleteButton } from './delete-button';
import { SaveRow, sectionBox } from './parts';
import { useSettingsForm } from './use-settings-form';

export type ParcelSizeValues = {
  id: string;
  name: string;
  lengthMm: number;
  widthMm: number;
  heightMm: number;
  emptyWeightG: number;
};

const fields = ['name', 'lengthMm', 'widthMm', 'heightMm', 'emptyWeightG'];

export function ParcelSizesSection({ sizes, readOnly }: { sizes: ParcelSizeValues[]; readOnly: boolean }) {
  return (
    <div className="grid gap-4">
      {sizes.length === 0 ? (
        <p className="rounded-sm border border-paper-edge bg-paper px-4 py-4 text-ink-soft">
          No boxes yet: add the ones the studio packs in.
        </p>
      ) : (
        <ul className="grid gap-3">
          {sizes.map((size) => (
            <li key={size.id} className="rounded-sm border border-paper-edge bg-paper">
              <div className="grid gap-2 px-4 py-3 sm:grid-cols-[1fr_auto] sm:items-start">
                <div>
                  <p className="font-semibold">{size.name}</p>
                  <p className="figures text-sm text-ink-soft">
                    {size.lengthMm} × {size.widthMm} × {size.heightMm} mm inside ·{' '}
                    {size.emptyWeightG.toLocaleString('en-IE')} g empty
                  </p>
                </div>
                {readOnly ? null : (
                  <DeleteButton
                    action={deleteParcelSizeAction}
                    field="parcelSizeId"
                    value={size.id}
                    label="Delete box"
                    what={size.name}
                    question={`Delete the box ${size.name}?`}
                  />
                )}
              </div>
              {readOnly ? null : (
                <details className="border-t border-paper-edge">
                  <summary className="cursor-pointer px-4 py-2 text-sm font-semibold hover:bg-paper-deep/60">
                    Edit {size.name}
                  </summary>
                  <div className="px-4 pb-4">
                    <ParcelSizeForm size={size} />
                  </div>
                </details>
              )}
            </li>
          ))}
        </ul>
      )}
      {readOnly ? null : (
        <div className="grid gap-2">
          <h3 className="font-sans text-base font-semibold">Add a box</h3>
          <ParcelSizeForm />
        </div>
      )}
    </div>
  );
}

function ParcelSizeForm({ size }: { size?: ParcelSizeValues }) {
  const { error, formRef, onSubmit, pending, status } = useSettingsForm(saveParcelSizeAction, fields, {
    resetOnSuccess: !size,
  });
  const number = (value: number | undefined) => (value === undefined ? '' : String(value));
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate className={`${sectionBox} grid-cols-2 lg:grid-cols-5`}>
      {size ? <input type="hidden" name="parcelSizeId" value={size.id} /> : null}
      <TextField
        label="Name"
        name="name"
        defaultValue={size?.name ?? ''}
        maxLength={60}
        autoComplete="off"
        className="col-span-2 lg:col-span-1"
        error={error('name')}
      />
      <TextField
        label="Inner length (mm)"
        name="lengthMm"
        defaultValue={number(size?.lengthMm)}
        inputMode="numeric"
        autoComplete="off"
        error={error('lengthMm')}
      />
      <TextField
        label="Inner width (mm)"
        name="widthMm"
        defaultValue={number(size?.widthMm)}
        inputMode="numeric"
        autoComplete="off"
        error={error('widthMm')}
      />
      <TextField
        label="Inner height (mm)"
        name="heightMm"
        defaultValue={number(size?.heightMm)}
        inputMode="numeric"
        autoComplete="off"
        error={error('heightMm')}
      />
      <TextField
        label="Empty weight (g)"
        name="emptyWeightG"
        defaultValue={number(size?.emptyWeightG)}
        inputMode="numeric"
        autoComplete="off"
        error={error('emptyWeightG')}
        hint="With its padding."
      />
      <SaveRow
        label={size ? `Save ${size.name}` : 'Add box'}
        pending={pending}
        status={status}
        className="col-span-2 lg:col-span-5"
      />
    </form>
  );
}
