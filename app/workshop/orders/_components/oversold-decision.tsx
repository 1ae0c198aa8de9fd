'use client';

import { useActionState } from 'react';
import type { ActionResult } from '@/lib/auth/action';
import { confirmExtraCastAction, refundOrderAction } from '../actions';
import { useReportDecision } from './decision-status';
import { refundPendingWords } from './order-words';

type Props = {
  lineId: string;
  orderNumber: string;
  currency: string;
  /** Which mask, for screen readers and for the announced outcome, e.g. "DM-1001, Hare — Bone white". */
  label: string;
  refundPending: boolean;
};

/** The maker's two one-step answers to an oversold mask: give the money back, or cast one more. */
export function OversoldDecision({ lineId, orderNumber, currency, label, refundPending }: Props) {
  const report = useReportDecision();
  const withReport =
    (action: (previous: ActionResult | null, formData: FormData) => Promise<ActionResult>) =>
    async (previous: ActionResult | null, formData: FormData) => {
      const result = await action(previous, formData);
      report(
        result.ok
          ? { ok: true, message: `${label}: ${result.message}` }
          : { ok: false, error: { ...result.error, message: `${label}: ${result.error.message}` } },
      );
      return result;
    };
  const [, refund, refunding] = useActionState(withReport(refundOrderAction), null);
  const [, extra, confirming] = useActionState(withReport(confirmExtraCastAction), null);
  const busy = refunding || confirming || refundPending;
  return (
    <form className="flex flex-wrap items-center gap-2">
      <input type="hidden" name="number" value={orderNumber} />
      <input type="hidden" name="currency" value={currency} />
      <input type="hidden" name="mode" value="lines" />
      <input type="hidden" name="lineIds" value={lineId} />
      <input type="hidden" name="lineId" value={lineId} />
      <input type="hidden" name="reason" value="oversold" />
      <button
        type="submit"
        formAction={refund}
        disabled={busy}
        className="rounded-full border border-ink px-3 py-1 text-sm font-semibold hover:bg-ink hover:text-paper disabled:opacity-60 disabled:hover:bg-transparent disabled:hover:text-ink"
      >
        {refunding ? 'Refunding…' : 'Refund this mask'}
        <span className="sr-only">: {label}</span>
      </button>
      <button
        type="submit"
        formAction={extra}
        disabled={busy}
        className="rounded-full border border-paper-edge px-3 py-1 text-sm hover:border-ink disabled:opacity-60"
      >
        {confirming ? 'Saving…' : 'An extra will be cast'}
        <span className="sr-only">: {label}</span>
      </button>
      {refundPending ? <p className="basis-full text-sm text-ink-soft">{refundPendingWords}</p> : null}
    </form>
  );
}
