'use client';

import Link from 'next/link';
import { useActionState, useId } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import { maxTrackingLength } from '@/lib/orders/shipping-schemas';
import { shipOrderAction } from '../../actions';

type Props = {
  orderNumber: string;
  carriers: { id: string; name: string }[];
  /** Null while every mask still to go is packed; otherwise why the order cannot ship yet. */
  notReady: string | null;
  isOwner: boolean;
};

const inputStyle = 'w-full rounded-sm border border-paper-edge bg-white px-3 py-2 aria-[invalid]:border-ember';

/** Carrier and tracking number, then "Mark shipped": the buyer's e-mail with the link goes out from here. */
export function ShipForm({ orderNumber, carriers, notReady, isOwner }: Props) {
  const [state, action, pending] = useActionState(shipOrderAction, null);
  const ids = { carrier: useId(), tracking: useId(), trackingHelp: useId(), status: useId() };
  if (notReady) return <p className="text-sm text-ink-soft">{notReady}</p>;
  if (carriers.length === 0) {
    return (
      <p className="text-sm text-ink-soft">
        No carriers yet, so there is nothing to ship with.{' '}
        {isOwner ? (
          <Link href="/workshop/settings" className="underline underline-offset-4">
            Add one in the settings
          </Link>
        ) : (
          'The owner adds them in the settings.'
        )}
      </p>
    );
  }
  const carrierError = fieldError(state, 'carrierId');
  const trackingError = fieldError(state, 'trackingNumber');
  const listed = state && !state.ok ? state.error.fieldErrors?.lines : undefined;
  return (
    <form action={action} className="grid gap-3 rounded-sm border border-paper-edge bg-paper px-4 py-3 text-sm" aria-describedby={ids.status}>
      <input type="hidden" name="number" value={orderNumber} />
      <div className="grid gap-1">
        <label htmlFor={ids.carrier} className="font-semibold">
          Carrier
        </label>
        <select
          id={ids.carrier}
          name="carrierId"
          required
          defaultValue={carriers.length === 1 ? carriers[0]!.id : ''}
          aria-invalid={carrierError ? true : undefined}
          aria-describedby={carrierError ? `${ids.carrier}-error` : undefined}
          className={inputStyle}
        >
          {carriers.length > 1 ? (
            <option value="" disabled>
              Choose the carrier
            </option>
          ) : null}
          {carriers.map((carrier) => (
            <option key={carrier.id} value={carrier.id}>
              {carrier.name}
            </option>
          ))}
        </select>
        {carrierError ? (
          <p id={`${ids.carrier}-error`} className="text-ember-deep">
            {carrierError}
          </p>
        ) : null}
      </div>
      <div className="grid gap-1">
        <label htmlFor={ids.tracking} className="font-semibold">
          Tracking number
        </label>
        <input
          id={ids.tracking}
          name="trackingNumber"
          required
          maxLength={maxTrackingLength + 20}
          autoComplete="off"
          spellCheck={false}
          aria-invalid={trackingError ? true : undefined}
          aria-describedby={`${ids.trackingHelp}${trackingError ? ` ${ids.tracking}-error` : ''}`}
          className={`${inputStyle} figures uppercase`}
        />
        <p id={ids.trackingHelp} className="text-xs text-ink-soft">
          As on the label: letters, digits, spaces and hyphens, up to {maxTrackingLength}.
        </p>
        {trackingError ? (
          <p id={`${ids.tracking}-error`} className="text-ember-deep">
            {trackingError}
          </p>
        ) : null}
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" disabled={pending} className="rounded-full bg-ink px-4 py-2 font-semibold text-paper disabled:opacity-60">
          {pending ? 'Marking shipped…' : 'Mark shipped'}
        </button>
        <span className="text-xs text-ink-soft">The buyer gets an e-mail with the tracking link.</span>
      </div>
      <FormStatus state={state} id={ids.status} />
      {listed && listed.length > 1 ? (
        <ul className="list-disc pl-5 text-ember-deep">
          {listed.map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
      ) : null}
    </form>
  );
}
