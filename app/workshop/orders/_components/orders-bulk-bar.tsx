'use client';

import { useState } from 'react';

/**
 * Moves the chosen orders' masks on to their next production stage. Not built yet: the production stages
 * (lib/production) will pass their server action here; until then there is no such button.
 */
export type AdvanceStageAction = (orderIds: string[]) => Promise<{ message: string }>;

type Props = { orderIds: string[]; onClear: () => void; onDone: () => void; advanceStageAction?: AdvanceStageAction };

export function OrdersBulkBar({ orderIds, onClear, onDone, advanceStageAction }: Props) {
  const [status, setStatus] = useState<{ busy: boolean; message: string }>({ busy: false, message: '' });
  if (orderIds.length === 0) return null;

  async function advance() {
    if (!advanceStageAction) return;
    setStatus({ busy: true, message: '' });
    try {
      const { message } = await advanceStageAction(orderIds);
      setStatus({ busy: false, message });
      onDone();
    } catch {
      setStatus({ busy: false, message: 'The stages could not be changed. Please try again.' });
    }
  }

  return (
    <section
      aria-label="Selected orders"
      className="sticky bottom-0 z-10 mt-3 flex flex-wrap items-center gap-3 rounded-sm border border-ink bg-paper px-4 py-3 text-sm shadow-md"
    >
      <p className="font-semibold">
        {orderIds.length} {orderIds.length === 1 ? 'order' : 'orders'} selected
      </p>
      <span className="flex items-center gap-2">
        <button type="button" disabled aria-describedby="packing-slips-note" className="rounded-full border border-paper-edge px-4 py-1 text-ink-faint">
          Print packing slips
        </button>
        <span id="packing-slips-note" className="text-xs text-ink-soft">
          Coming with shipping.
        </span>
      </span>
      {advanceStageAction ? (
        <button type="button" onClick={advance} disabled={status.busy} className="rounded-full bg-ink px-4 py-1 font-semibold text-paper">
          {status.busy ? 'Advancing…' : 'Advance stage'}
        </button>
      ) : null}
      <button type="button" onClick={onClear} className="underline underline-offset-4 hover:text-ember-deep">
        Clear selection
      </button>
      <p role="status" className="basis-full text-ink-soft empty:hidden">
        {status.message}
      </p>
    </section>
  );
}
