'use client';

import Link from 'next/link';
import { useActionState } from 'react';
import { FormStatus } from '@/components/ui/form-status';
import type { WaitlistState } from '@/lib/waitlist/schemas';
import { leaveAllWaitlistsAction, leaveWaitlistEntryAction } from '../actions';

export type WaitlistRow = { id: string; designName: string; designSlug: string; finishNames: string[]; state: WaitlistState };

const waitlistStateWords: Record<WaitlistState, string> = { pending: 'Waiting for confirmation', confirmed: 'On the list', left: 'Left' };
const stateMarks: Record<WaitlistState, string> = { pending: '✉', confirmed: '✓', left: '–' };
const stateColours: Record<WaitlistState, string> = { pending: 'text-ink', confirmed: 'text-moss', left: 'text-ink-faint' };

function LeaveOne({ entry }: { entry: WaitlistRow }) {
  const [state, action, pending] = useActionState(leaveWaitlistEntryAction, null);
  return (
    <form action={action} className="flex flex-wrap items-center gap-3">
      <input type="hidden" name="entryId" value={entry.id} />
      <button
        type="submit"
        disabled={pending}
        aria-label={`Leave the ${entry.designName} waitlist`}
        className="rounded-full border border-paper-edge px-4 py-1.5 text-sm font-semibold hover:border-ink disabled:opacity-60"
      >
        {pending ? 'Leaving…' : 'Leave'}
      </button>
      {state && !state.ok ? <FormStatus state={state} /> : null}
    </form>
  );
}

/** The buyer's waitlists with their state in words, a Leave button each, and Leave all. */
export function WaitlistList({ entries }: { entries: WaitlistRow[] }) {
  const [allState, leaveAll, leavingAll] = useActionState(leaveAllWaitlistsAction, null);
  const active = entries.filter((e) => e.state !== 'left');
  if (entries.length === 0) {
    return (
      <p className="mt-2 text-ink-soft">
        You are not on any waitlist. Missed a drop? <Link href="/waitlist" className="underline underline-offset-4">Join a waitlist</Link>.
      </p>
    );
  }
  return (
    <>
      <ul className="mt-3 grid gap-2" data-testid="my-waitlists">
        {entries.map((entry) => (
          <li key={entry.id} className="grid gap-2 rounded-sm border border-paper-edge px-4 py-3 sm:grid-cols-[1fr_auto] sm:items-center">
            <span>
              <Link href={`/designs/${entry.designSlug}`} className="font-semibold underline-offset-4 hover:underline">
                {entry.designName}
              </Link>
              <span className="text-ink-soft"> · {entry.finishNames.length > 0 ? entry.finishNames.join(', ') : 'any finish'}</span>
              <span className={`block text-sm ${stateColours[entry.state]}`}>
                <span aria-hidden="true">{stateMarks[entry.state]} </span>
                {waitlistStateWords[entry.state]}
                {entry.state === 'pending' ? ': use the link in the e-mail we sent' : ''}
              </span>
            </span>
            {entry.state === 'left' ? null : <LeaveOne entry={entry} />}
          </li>
        ))}
      </ul>
      {active.length > 1 ? (
        <form action={leaveAll} className="mt-3 flex flex-wrap items-center gap-4">
          <input type="hidden" name="scope" value="all" />
          <button type="submit" disabled={leavingAll} className="rounded-full border border-ink px-5 py-2 font-semibold disabled:opacity-60">
            {leavingAll ? 'Leaving…' : 'Leave all'}
          </button>
          <FormStatus state={allState} />
        </form>
      ) : null}
    </>
  );
}
