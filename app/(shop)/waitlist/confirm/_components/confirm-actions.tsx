'use client';

import { useMutation } from '@tanstack/react-query';
import { ApiError, readApiResponse } from '@/lib/api/client';

const post = (path: string, t: string) =>
  fetch(path, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ t }) });

/** The button that uses a ready link, or the one that asks for a fresh link when this one expired or was replaced. */
export function ConfirmActions({ token, outcome, designName, email }: { token: string; outcome: 'ready' | 'expired' | 'superseded'; designName: string; email: string }) {
  const confirm = useMutation({ mutationFn: async () => readApiResponse<{ outcome: string; message: string }>(await post('/api/waitlist/confirm', token)) });
  const resend = useMutation({ mutationFn: async () => readApiResponse<{ outcome: string; message: string }>(await post('/api/waitlist/resend', token)) });
  const problem = (error: unknown) => (error instanceof ApiError ? error.message : error ? 'We could not reach the shop. Check your connection and try again.' : '');
  const needsFresh = outcome !== 'ready' || confirm.data?.outcome === 'expired' || confirm.data?.outcome === 'superseded';

  if (confirm.data && !needsFresh) {
    return (
      <p role="status" className="mt-6 rounded-sm border border-moss/40 bg-moss-wash p-5" data-testid="confirm-result">
        {confirm.data.message}
      </p>
    );
  }
  if (needsFresh) {
    return (
      <div className="mt-6 rounded-sm border border-paper-edge p-5">
        <p>
          {outcome === 'superseded'
            ? `A newer link for the ${designName} waitlist was sent since this one, so this one no longer works.`
            : `This link for the ${designName} waitlist has expired.`}{' '}
          We can send a fresh one to {email}.
        </p>
        {resend.data ? (
          <p role="status" className="mt-3 font-semibold text-moss">{resend.data.message}</p>
        ) : (
          <button
            type="button"
            onClick={() => resend.mutate()}
            disabled={resend.isPending}
            className="mt-4 rounded-full bg-ink px-6 py-3 font-semibold text-paper hover:bg-ink-soft disabled:opacity-60"
          >
            {resend.isPending ? 'Sending…' : 'Send me a fresh link'}
          </button>
        )}
        <p role="alert" className="mt-2 min-h-5 text-sm font-semibold text-ember-deep">{problem(resend.error)}</p>
      </div>
    );
  }
  return (
    <div className="mt-6 rounded-sm border border-paper-edge p-5">
      <p>
        Join the waitlist for <strong>{designName}</strong> with {email}? We write when its next batch opens, and every message has a link
        to leave.
      </p>
      <button
        type="button"
        onClick={() => confirm.mutate()}
        disabled={confirm.isPending}
        className="mt-4 rounded-full bg-ink px-6 py-3 font-semibold text-paper hover:bg-ink-soft disabled:opacity-60"
      >
        {confirm.isPending ? 'Confirming…' : 'Yes, put me on the list'}
      </button>
      <p role="alert" className="mt-2 min-h-5 text-sm font-semibold text-ember-deep">{problem(confirm.error)}</p>
    </div>
  );
}
