import { orderStateLabels, type OrderState } from '@/lib/orders/states';
import type { RefundView } from '@/lib/orders/queries';
import { refundStatusLabels } from './order-words';

// Each state is said in words with its own mark; colour only repeats what the words say.
const stateMarks: Record<OrderState, { mark: string; style: string }> = {
  awaiting_payment: { mark: '○', style: 'border-paper-edge text-ink-soft' },
  paid: { mark: '●', style: 'border-paper-edge text-ink' },
  in_production: { mark: '◐', style: 'border-paper-edge text-ink' },
  shipped: { mark: '▸', style: 'border-moss/40 text-moss' },
  partly_refunded: { mark: '◑', style: 'border-paper-edge text-ink-soft' },
  refunded: { mark: '↺', style: 'border-paper-edge text-ink-faint' },
  cancelled: { mark: '✕', style: 'border-paper-edge text-ink-faint' },
};

export function OrderStateBadge({ state }: { state: OrderState }) {
  const { mark, style } = stateMarks[state];
  return (
    <span
      className={`inline-flex items-center gap-1 whitespace-nowrap rounded-full border bg-paper px-2 py-0.5 text-xs font-semibold ${style}`}
    >
      <span aria-hidden="true">{mark}</span>
      {orderStateLabels[state]}
    </span>
  );
}

/** The one thing on these pages meant to catch the eye: a mask paid for that the stock could not cover. */
export function OversoldBadge({ count }: { count?: number }) {
  return (
    <span className="inline-flex items-center gap-1 whitespace-nowrap rounded-sm border border-ember bg-ember-wash px-1.5 py-0.5 text-xs font-semibold text-ember-deep">
      <span aria-hidden="true">▲</span>
      Oversold{count && count > 1 ? ` (${count})` : ''}
    </span>
  );
}

/** A quiet flag such as "Refunded" or "Back on sale". */
export function Flag({ mark, children }: { mark: string; children: string }) {
  return (
    <span className="inline-flex items-center gap-1 whitespace-nowrap rounded-sm border border-paper-edge px-1.5 py-0.5 text-xs font-semibold text-ink-soft">
      <span aria-hidden="true">{mark}</span>
      {children}
    </span>
  );
}

const refundMarks: Record<RefundView['status'], { mark: string; style: string }> = {
  pending: { mark: '◌', style: 'text-ink-soft' },
  succeeded: { mark: '✓', style: 'text-moss' },
  failed: { mark: '✕', style: 'text-ember-deep' },
};

export function RefundStatus({ status, failure }: { status: RefundView['status']; failure: string | null }) {
  const { mark, style } = refundMarks[status];
  return (
    <span className={`font-semibold ${style}`}>
      <span aria-hidden="true">{mark} </span>
      {refundStatusLabels[status]}
      {status === 'failed' && failure ? <span className="font-normal text-ink-soft">: {failure}</span> : null}
    </span>
  );
}

/** An empty cell: a dash to the eye, words to a screen reader. */
export function Nothing({ words = 'Nothing' }: { words?: string }) {
  return (
    <span className="text-ink-faint">
      <span aria-hidden="true">—</span>
      <span className="sr-only">{words}</span>
    </span>
  );
}
