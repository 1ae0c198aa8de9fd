'use client';

import { useActionState } from 'react';
import { FormStatus } from '@/components/ui/form-status';
import type { PublishProblem } from '@/lib/catalogue/editing';
import type { DesignStatus } from '@/models';
import { setDesignStatusAction } from '../actions';
import { StatusBadge, statusMoves } from './status';

const problemWords: Record<PublishProblem, string> = {
  no_published_finish: 'Publish at least one of its finishes.',
  no_photo: 'Add at least one photo of the design or of a published finish.',
};

export function DesignStatusControl({
  designId,
  name,
  status,
  problems,
}: {
  designId: string;
  name: string;
  status: DesignStatus;
  problems: PublishProblem[];
}) {
  const [state, action, pending] = useActionState(setDesignStatusAction, null);
  return (
    <section aria-labelledby="design-state-title" className="grid gap-2 rounded-sm border border-paper-edge bg-paper p-4 sm:p-5">
      <h2 id="design-state-title" className="font-sans text-base font-semibold">
        State
      </h2>
      <p className="flex flex-wrap items-center gap-2">
        <StatusBadge status={status} withMeaning />
      </p>
      {status !== 'published' && problems.length > 0 ? (
        <div className="text-sm text-ink-soft">
          <p>Before {name} can be published:</p>
          <ul className="ml-5 list-disc">
            {problems.map((problem) => (
              <li key={problem}>{problemWords[problem]}</li>
            ))}
          </ul>
        </div>
      ) : null}
      {status === 'published' ? (
        <p className="text-sm text-ink-soft">Retiring takes it out of the shop (not while one of its batches is coming up or on sale); its orders stay as they are.</p>
      ) : null}
      <div className="flex flex-wrap gap-2">
        {statusMoves[status].map((move) => (
          <form key={move.to} action={action}>
            <input type="hidden" name="designId" value={designId} />
            <input type="hidden" name="status" value={move.to} />
            <button
              type="submit"
              disabled={pending}
              className={
                move.to === 'published'
                  ? 'rounded-full bg-ink px-5 py-2 font-semibold text-paper disabled:opacity-60'
                  : 'rounded-full border border-paper-edge px-5 py-2 font-semibold hover:border-ink disabled:opacity-60'
              }
            >
              {pending ? 'Saving…' : `${move.label} ${name}`}
            </button>
          </form>
        ))}
      </div>
      <FormStatus state={state} />
    </section>
  );
}
