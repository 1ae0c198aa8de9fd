'use client';

import { useActionState, useState } from 'react';
import { FormStatus } from '@/components/ui/form-status';
import { cancelBatchAction } from '../actions';

/** Cancelling asks once more, in words, before it happens. */
export function CancelBatch({ batchId, name }: { batchId: string; name: string }) {
  const [state, action, pending] = useActionState(cancelBatchAction, null);
  const [confirming, setConfirming] = useState(false);
  return (
    <form action={action} className="grid gap-2">
      <input type="hidden" name="batchId" value={batchId} />
      {confirming ? (
        <div className="flex flex-wrap items-center gap-3">
          <span>Cancel {name}? Running holds are let go and the drop page says it is cancelled.</span>
          <button type="submit" disabled={pending} className="rounded-full bg-ember-deep px-5 py-2 font-semibold text-paper disabled:opacity-60">
            {pending ? 'Cancelling…' : 'Yes, cancel the batch'}
          </button>
          <button type="button" onClick={() => setConfirming(false)} className="rounded-full border border-ink px-5 py-2 font-semibold">Keep it</button>
        </div>
      ) : (
        <button type="button" onClick={() => setConfirming(true)} className="justify-self-start rounded-full border border-ember-deep px-5 py-2 font-semibold text-ember-deep">
          Cancel this batch…
        </button>
      )}
      <FormStatus state={state} />
    </form>
  );
}
