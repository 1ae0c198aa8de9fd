'use client';

import { useActionState, useId } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import { recordPullsAction, retireMoldAction } from '../actions';

/** The maker's buttons for one mold: add the pulls just cast, or retire it. */
export function MoldActions({ moldId, label }: { moldId: string; label: string }) {
  const [pullState, record, recording] = useActionState(recordPullsAction, null);
  const [retireState, retire, retiring] = useActionState(retireMoldAction, null);
  const pullsId = useId();
  const pullsError = fieldError(pullState, 'pulls');
  const shown = retireState ?? (pullState && !pullState.ok && pullState.error.fieldErrors ? null : pullState);
  return (
    <div className="grid gap-2">
      <div className="flex flex-wrap items-end gap-2">
        <form action={record} className="flex items-end gap-2">
          <input type="hidden" name="moldId" value={moldId} />
          <div className="grid gap-1">
            <label htmlFor={pullsId} className="text-xs font-semibold">Pulls cast</label>
            <input
              id={pullsId}
              name="pulls"
              type="number"
              inputMode="numeric"
              min={1}
              max={500}
              step={1}
              defaultValue={1}
              required
              aria-invalid={pullsError ? true : undefined}
              aria-describedby={`${pullsId}-error`}
              className="w-20 rounded-sm border border-paper-edge bg-white px-2 py-1 aria-[invalid]:border-ember"
            />
          </div>
          <button type="submit" disabled={recording} className="rounded-full border border-paper-edge px-3 py-1 text-sm hover:border-ink disabled:opacity-60">
            Record pulls<span className="sr-only"> for {label}</span>
          </button>
        </form>
        <form
          action={retire}
          onSubmit={(event) => {
            if (!window.confirm(`Retire ${label}? It keeps its record but takes no more pulls.`)) event.preventDefault();
          }}
        >
          <input type="hidden" name="moldId" value={moldId} />
          <button type="submit" disabled={retiring} className="rounded-full border border-ember/50 px-3 py-1 text-sm text-ember-deep hover:border-ember disabled:opacity-60">
            Retire<span className="sr-only"> {label}</span>
          </button>
        </form>
      </div>
      <p id={`${pullsId}-error`} className="text-sm font-semibold text-ember-deep">{pullsError ?? ''}</p>
      <FormStatus state={shown} />
    </div>
  );
}
