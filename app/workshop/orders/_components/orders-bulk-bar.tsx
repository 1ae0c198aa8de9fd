'use client';

import { useState } from 'react';
import type { ActionResult } from '@/lib/auth/action';
import { advanceOrdersAction } from '../actions';

type Props = {
  /** The chosen orders, in the order of the list. */
  orders: { id: string; number: string }[];
  onClear: () => void;
  onDone: () => void;
};

/** The packing slips of these orders, one PDF, built by the packing-slip route. */
export function packingSlipsHref(numbers: string[]): string {
  const query = new URLSearchParams();
  for (const number of numbers) query.append('number', number);
  return `/api/workshop/orders/packing-slips?${query}`;
}

/** What to do with the chosen orders: print their packing slips, or move their masks one stage on. */
export function OrdersBulkBar({ orders, onClear, onDone }: Props) {
  const [status, setStatus] = useState<{ busy: boolean; result: ActionResult | null }>({ busy: false, result: null });
  if (orders.length === 0) return null;

  async function advance() {
    setStatus({ busy: true, result: null });
    const form = new FormData();
    form.set('orderIds', orders.map((order) => order.id).join(','));
    try {
      const result = await advanceOrdersAction(null, form);
      setStatus({ busy: false, result });
      onDone();
    } catch {
      setStatus({
        busy: false,
        result: { ok: false, error: { code: 'network', message: 'The stages could not be changed: the connection failed. Please try again.' } },
      });
    }
  }

  const result = status.result;
  const refusals = result && !result.ok ? (result.error.fieldErrors?.orderIds ?? []) : [];
  return (
    <section
      aria-label="Selected orders"
      className="sticky bottom-0 z-10 mt-3 flex flex-wrap items-center gap-3 rounded-sm border border-ink bg-paper px-4 py-3 text-sm shadow-md"
    >
      <p className="font-semibold">
        {orders.length} {orders.length === 1 ? 'order' : 'orders'} selected
      </p>
      <a
        href={packingSlipsHref(orders.map((order) => order.number))}
        target="_blank"
        rel="noopener"
        className="rounded-full border border-ink px-4 py-1 font-semibold hover:bg-ink hover:text-paper"
      >
        Print packing slips<span className="sr-only"> of the selected orders (PDF, opens in a new tab)</span>
      </a>
      <button
        type="button"
        onClick={advance}
        disabled={status.busy}
        aria-describedby="advance-stage-note"
        className="rounded-full bg-ink px-4 py-1 font-semibold text-paper disabled:opacity-60"
      >
        {status.busy ? 'Advancing…' : 'Advance stage'}
      </button>
      <span id="advance-stage-note" className="text-xs text-ink-soft">
        Moves each mask one stage on; packed masks wait for shipping.
      </span>
      <button type="button" onClick={onClear} className="underline underline-offset-4 hover:text-ember-deep">
        Clear selection
      </button>
      <div role="status" aria-live="polite" className="basis-full empty:hidden">
        {result ? (
          result.ok ? (
            <p className="font-semibold text-moss">{result.message}</p>
          ) : refusals.length > 0 ? (
            <>
              <p className="font-semibold text-ember-deep">Nothing was moved:</p>
              <ul className="list-disc pl-5 text-ember-deep">
                {refusals.map((reason) => (
                  <li key={reason}>{reason}</li>
                ))}
              </ul>
            </>
          ) : (
            <p className="font-semibold text-ember-deep">{result.error.message}</p>
          )
        ) : null}
      </div>
    </section>
  );
}
