export const orderStates = ['awaiting_payment', 'paid', 'in_production', 'shipped', 'partly_refunded', 'refunded', 'cancelled'] as const;
export type OrderState = (typeof orderStates)[number];

export const orderStateLabels: Record<OrderState, string> = {
  awaiting_payment: 'Awaiting payment',
  paid: 'Paid',
  in_production: 'In production',
  shipped: 'Shipped',
  partly_refunded: 'Partly refunded',
  refunded: 'Refunded',
  cancelled: 'Cancelled',
};

/**
 * The state an order is in, from its money: unpaid orders keep theirs (awaiting payment or cancelled); a
 * paid one is refunded, partly refunded, or follows its production (paid, in production, shipped).
 */
export function nextState(order: { state: OrderState; paid_minor: number; refunded_minor: number }): OrderState {
  if (order.paid_minor <= 0) return order.state === 'cancelled' ? 'cancelled' : 'awaiting_payment';
  if (order.refunded_minor >= order.paid_minor) return 'refunded';
  if (order.refunded_minor > 0) return 'partly_refunded';
  if (order.state === 'in_production' || order.state === 'shipped') return order.state;
  return 'paid';
}
