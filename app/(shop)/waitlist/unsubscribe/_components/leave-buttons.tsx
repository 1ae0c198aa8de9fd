'use client';

import { useMutation } from '@tanstack/react-query';
import { ApiError, readApiResponse } from '@/lib/api/client';

/** Posts the same body a mail client's one-click unsubscribe sends (RFC 8058), plus our own `scope`. */
export function LeaveButtons({ token, otherEntries }: { token: string; otherEntries: number }) {
  const leave = useMutation({
    mutationFn: async (scope: 'entry' | 'all') =>
      readApiResponse<{ message: string }>(
        await fetch(`/api/waitlist/unsubscribe?t=${encodeURIComponent(token)}`, {
          method: 'POST',
          headers: { 'Content-Type': 'application/x-www-form-urlencoded' },
          body: new URLSearchParams({ 'List-Unsubscribe': 'One-Click', scope }),
        }),
      ),
  });
  if (leave.data) {
    return (
      <p role="status" className="mt-6 rounded-sm border border-moss/40 bg-moss-wash p-5" data-testid="leave-result">
        {leave.data.message}
      </p>
    );
  }
  const problem = leave.error instanceof ApiError ? leave.error.message : leave.error ? 'We could not reach the shop. Check your connection and try again.' : '';
  return (
    <div className="mt-6">
      <div className="flex flex-wrap gap-3">
        <button
          type="button"
          onClick={() => leave.mutate('entry')}
          disabled={leave.isPending}
          className="rounded-full bg-ink px-6 py-3 font-semibold text-paper hover:bg-ink-soft disabled:opacity-60"
        >
          {leave.isPending && leave.variables === 'entry' ? 'Leaving…' : 'Leave this waitlist'}
        </button>
        <button
          type="button"
          onClick={() => leave.mutate('all')}
          disabled={leave.isPending}
          className="rounded-full border border-ink px-6 py-3 font-semibold disabled:opacity-60"
        >
          {leave.isPending && leave.variables === 'all' ? 'Leaving…' : 'Leave every waitlist of this address'}
        </button>
      </div>
      {otherEntries > 0 ? (
        <p className="mt-2 text-sm text-ink-soft">
          This address is on {otherEntries} other {otherEntries === 1 ? 'waitlist' : 'waitlists'} too.
        </p>
      ) : null}
      <p role="alert" className="mt-2 min-h-5 text-sm font-semibold text-ember-deep">{problem}</p>
    </div>
  );
}
