// Plain words for what an order, its masks and its log record. Safe to import anywhere.
import { orderStateLabels, orderStates, type OrderState } from '@/lib/orders/states';
import { lineStages, stageLabels, type LineStage } from '@/lib/production/stages';
import type { OrderEventView, OrderLineView, RefundView } from '@/lib/orders/queries';

export const oversoldReasonLabels: Record<NonNullable<OrderLineView['oversoldReason']>, string> = {
  stock_gone: 'Paid after the stock had gone',
  over_buyer_limit: 'Over the per-buyer limit',
};

export const oversoldResolutionLabels: Record<NonNullable<OrderLineView['oversoldResolution']>, string> = {
  refunded: 'Decided: refunded',
  extra_cast: 'Decided: an extra will be cast',
};

// A mask's stage in words: the production rules' own labels.
export { stageLabels };

export const refundStatusLabels: Record<RefundView['status'], string> = {
  pending: 'Waiting for the payment service',
  succeeded: 'Refunded',
  failed: 'Failed',
};

export const refundPendingWords = 'Refund sent, waiting for the payment service';

const eventLabels: Record<string, string> = {
  checkout_started: 'Checkout started',
  checkout_changed: 'Checkout changed',
  paid: 'Paid',
  amount_mismatch: 'Paid a different amount than the total',
  line_oversold: 'A mask was oversold',
  duplicate_payment: 'Paid twice: the second payment goes back',
  payment_failed: 'A payment attempt failed',
  cancelled: 'Cancelled',
  refund_requested: 'Refund asked for',
  refund_failed: 'Refund failed',
  refunded: 'Refunded',
  restocked: 'Masks put back on sale',
  extra_cast_confirmed: 'An extra will be cast',
  state_changed: 'State changed',
  shipped: 'Shipped',
  address_changed: 'Shipping address changed',
  email_resent: 'E-mail sent again',
};

/** An event of the order's log in plain words; unknown kinds fall back to their own name, spaced out. */
export function eventLabel(event: Pick<OrderEventView, 'type' | 'data'>): string {
  if (event.type === 'paid' && event.data.late === true) return 'Paid after the hold had ended';
  if (event.type === 'packing_slip_printed') {
    return event.data.customsDeclaration === true ? 'Packing slip and customs declaration printed' : 'Packing slip printed';
  }
  if (event.type === 'line_stage') {
    const stage = (key: unknown) => (typeof key === 'string' && (lineStages as readonly string[]).includes(key) ? stageLabels[key as LineStage] : 'another stage');
    return `A mask moved from ${stage(event.data.from)} to ${stage(event.data.to)}`;
  }
  const known = eventLabels[event.type];
  if (known) return known;
  const spaced = event.type.replaceAll('_', ' ');
  return spaced.charAt(0).toUpperCase() + spaced.slice(1);
}

/** Who did it when no studio person did: the buyer at checkout, otherwise the shop on its own. */
export function eventActor(type: string): string {
  return type === 'checkout_started' || type === 'checkout_changed' ? 'Buyer' : 'Automatic';
}

export function stateWords(state: string | null): string | null {
  if (state === null) return null;
  return (orderStates as readonly string[]).includes(state)
    ? orderStateLabels[state as OrderState]
    : state.replaceAll('_', ' ');
}

/** A calendar date such as "2027-01-15" as people read it: "Fri 15 Jan 2027". */
export function formatDay(isoDate: string): string {
  const at = new Date(`${isoDate}T00:00:00Z`);
  if (Number.isNaN(at.getTime())) return isoDate;
  return new Intl.DateTimeFormat('en-GB', {
    weekday: 'short',
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    timeZone: 'UTC',
  }).format(at);
}
