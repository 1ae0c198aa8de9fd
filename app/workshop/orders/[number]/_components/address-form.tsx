'use client';

import { useActionState, useId, useState } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import type { ActionResult } from '@/lib/auth/action';
import type { ShipTo } from '@/lib/orders/queries';
import { updateShipToAction } from '../../actions';

type Props = {
  orderNumber: string;
  shipTo: ShipTo | null;
  /** The country the shipping was priced for; the parcel stays within it. */
  country: string;
  countryName: string;
  /** Why the address cannot change any more, or null while it can. */
  lockedReason: string | null;
};

const fields = [
  { name: 'name', label: 'Name on the parcel', autoComplete: 'name', required: true },
  { name: 'line1', label: 'Address line 1', autoComplete: 'address-line1', required: true },
  { name: 'line2', label: 'Address line 2 (optional)', autoComplete: 'address-line2', required: false },
  { name: 'postal_code', label: 'Postcode (optional)', autoComplete: 'postal-code', required: false },
  { name: 'city', label: 'Town or city', autoComplete: 'address-level2', required: true },
  { name: 'state', label: 'County, state or region (optional)', autoComplete: 'address-level1', required: false },
] as const;

/** Where the parcel goes, as an address block; the studio may correct it until a mask is packed. */
export function AddressPanel({ orderNumber, shipTo, country, countryName, lockedReason }: Props) {
  const [editing, setEditing] = useState(false);
  const [state, action, pending] = useActionState(async (previous: ActionResult | null, formData: FormData) => {
    const result = await updateShipToAction(previous, formData);
    if (result.ok) setEditing(false);
    return result;
  }, null);
  const baseId = useId();
  const address = shipTo?.address;
  const value = (name: (typeof fields)[number]['name']) => (name === 'name' ? (shipTo?.name ?? '') : (address?.[name] ?? ''));

  if (!editing) {
    return (
      <div className="grid gap-2 text-sm">
        {shipTo ? (
          <address className="rounded-sm border border-paper-edge bg-paper px-4 py-3 not-italic">
            {shipTo.name ? <span className="block font-semibold">{shipTo.name}</span> : null}
            {address?.line1 ? <span className="block">{address.line1}</span> : null}
            {address?.line2 ? <span className="block">{address.line2}</span> : null}
            {address?.postal_code || address?.city ? <span className="block">{[address.postal_code, address.city].filter(Boolean).join(' ')}</span> : null}
            {address?.state ? <span className="block">{address.state}</span> : null}
            <span className="block">{countryName}</span>
          </address>
        ) : (
          <p className="text-ink-soft">No address yet: the payment service sends it with the payment.</p>
        )}
        {lockedReason ? (
          <p className="flex gap-2 text-ink-soft">
            <span aria-hidden="true">◆</span>
            <span>{lockedReason}</span>
          </p>
        ) : shipTo ? (
          <div>
            <button type="button" onClick={() => setEditing(true)} className="rounded-full border border-ink px-4 py-1 font-semibold">
              Change the address
            </button>
          </div>
        ) : null}
        {state?.ok ? <FormStatus state={state} /> : null}
      </div>
    );
  }

  return (
    <form action={action} className="grid gap-3 rounded-sm border border-paper-edge bg-paper px-4 py-3 text-sm">
      <input type="hidden" name="number" value={orderNumber} />
      <input type="hidden" name="country" value={country} />
      {fields.map((field) => {
        const id = `${baseId}-${field.name}`;
        const error = fieldError(state, field.name);
        return (
          <div key={field.name} className="grid gap-1">
            <label htmlFor={id} className="font-semibold">
              {field.label}
            </label>
            <input
              id={id}
              name={field.name}
              defaultValue={value(field.name)}
              required={field.required}
              autoComplete={`shipping ${field.autoComplete}`}
              aria-invalid={error ? true : undefined}
              aria-describedby={error ? `${id}-error` : undefined}
              className="w-full rounded-sm border border-paper-edge bg-white px-3 py-2 aria-[invalid]:border-ember"
            />
            {error ? (
              <p id={`${id}-error`} className="text-ember-deep">
                {error}
              </p>
            ) : null}
          </div>
        );
      })}
      <p className="text-ink-soft">
        Country: <span className="font-semibold">{countryName}</span>. The shipping was paid for it, so it stays.
      </p>
      {fieldError(state, 'country') ? <p className="text-ember-deep">{fieldError(state, 'country')}</p> : null}
      <div className="flex flex-wrap gap-3">
        <button type="submit" disabled={pending} className="rounded-full bg-ink px-4 py-1 font-semibold text-paper disabled:opacity-60">
          {pending ? 'Saving…' : 'Save the address'}
        </button>
        <button type="button" onClick={() => setEditing(false)} className="underline underline-offset-4">
          Cancel
        </button>
      </div>
      <FormStatus state={state} />
    </form>
  );
}
