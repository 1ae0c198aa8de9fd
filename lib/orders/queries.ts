import 'server-only';
import { sql } from '@/lib/db/sql';
import { isValidOrderToken } from './links';
import type { RefundReason } from './schemas';
import type { OrderState } from './states';

export type OrderLineView = {
  id: string; position: number; designName: string; finishName: string; unitPriceMinor: number;
  oversold: boolean; oversoldReason: 'stock_gone' | 'over_buyer_limit' | null; oversoldResolution: 'refunded' | 'extra_cast' | null;
  refunded: boolean; restocked: boolean; stage: string;
};
export type RefundView = { id: string; amountMinor: number; reason: RefundReason; note: string; status: 'pending' | 'succeeded' | 'failed'; failure: string | null; createdAt: string; lineIds: string[] };
export type OrderEventView = { id: string; type: string; fromState: string | null; toState: string | null; actorName: string | null; data: Record<string, unknown>; createdAt: string };
export type ShipTo = { name?: string | null; address?: { line1?: string | null; line2?: string | null; city?: string | null; postal_code?: string | null; state?: string | null; country?: string | null } | null };

export type OrderView = {
  id: string; number: string; state: OrderState; userId: string | null; email: string; buyerName: string | null; currency: string;
  linesMinor: number; shippingMinor: number; totalMinor: number; taxLabel: string; taxRateBasisPoints: number; taxIncludedMinor: number;
  shippingCountry: string; shippingLabel: string; shippingMinDays: number; shippingMaxDays: number; shipTo: ShipTo | null;
  paidMinor: number; refundedMinor: number; paidAt: string | null; cancelledAt: string | null; createdAt: string;
  batchId: string; batchName: string; designName: string; designSlug: string; shipBy: string; studioName: string; timeZone: string;
  /** The parcel as recorded when the order shipped; all null before. */
  shipment: ShipmentView | null;
  /** What the buyer wrote for the studio, if anything. */
  buyerNote: string | null;
  lines: OrderLineView[]; refunds: RefundView[]; events: OrderEventView[];
};
export type ShipmentView = { carrierName: string; trackingNumber: string; trackingUrl: string | null; shippedAt: string };

type OrderRow = {
  id: string; number: string; state: OrderState; user_id: string | null; email: string; buyer_name: string | null; currency: string;
  lines_minor: number; shipping_minor: number; total_minor: number; tax_label: string; tax_rate_bp: number; tax_included_minor: number;
  shipping_country: string; shipping_label: string; shipping_min_days: number; shipping_max_days: number; ship_to: ShipTo | null;
  paid_minor: number; refunded_minor: number; paid_at: Date | null; cancelled_at: Date | null; created_at: Date;
  batch_id: string; batch_name: string; design_name: string; design_slug: string; ship_by: string; studio_name: string; time_zone: string;
  carrier_name: string | null; tracking_number: string | null; tracking_url: string | null; shipped_at: Date | null; buyer_note: string | null;
};

const orderSelect = `
  SELECT o.*, b.name AS batch_name, to_char(b.ship_by, 'YYYY-MM-DD') AS ship_by, d.name AS design_name, d.slug AS design_slug,
         st.name AS studio_name, st.time_zone
    FROM orders o JOIN batches b ON b.id = o.batch_id JOIN designs d ON d.id = b.design_id JOIN studios st ON st.id = o.studio_id`;

export async function getOrderByNumber(number: string): Promise<OrderView | null> {
  const [row] = await sql<OrderRow>(`${orderSelect} WHERE o.number = $1`, [number]);
  if (!row) return null;
  const [lines, refunds, events] = await Promise.all([
    sql<{ id: string; position: number; design_name: string; finish_name: string; unit_price_minor: number; oversold: boolean; oversold_reason: OrderLineView['oversoldReason']; oversold_resolution: OrderLineView['oversoldResolution']; refunded: boolean; restocked: boolean; stage: string }>(
      `SELECT * FROM order_lines WHERE order_id = $1 ORDER BY position`,
      [row.id],
    ),
    sql<{ id: string; amount_minor: number; reason: RefundReason; note: string; status: RefundView['status']; failure: string | null; created_at: Date; line_ids: string[] }>(
      `SELECT * FROM refunds WHERE order_id = $1 ORDER BY created_at`,
      [row.id],
    ),
    sql<{ id: string; type: string; from_state: string | null; to_state: string | null; actor_name: string | null; data: Record<string, unknown>; created_at: Date }>(
      `SELECT e.id::text, e.type, e.from_state, e.to_state, coalesce(u.name, u.email) AS actor_name, e.data, e.created_at
         FROM order_events e LEFT JOIN users u ON u.id = e.actor_user_id WHERE e.order_id = $1 ORDER BY e.id`,
      [row.id],
    ),
  ]);
  return {
    id: row.id, number: row.number, state: row.state, userId: row.user_id, email: row.email, buyerName: row.buyer_name, currency: row.currency,
    linesMinor: row.lines_minor, shippingMinor: row.shipping_minor, totalMinor: row.total_minor, taxLabel: row.tax_label,
    taxRateBasisPoints: row.tax_rate_bp, taxIncludedMinor: row.tax_included_minor, shippingCountry: row.shipping_country,
    shippingLabel: row.shipping_label, shippingMinDays: row.shipping_min_days, shippingMaxDays: row.shipping_max_days, shipTo: row.ship_to,
    paidMinor: row.paid_minor, refundedMinor: row.refunded_minor, paidAt: row.paid_at?.toISOString() ?? null,
    cancelledAt: row.cancelled_at?.toISOString() ?? null, createdAt: row.created_at.toISOString(),
    batchId: row.batch_id, batchName: row.batch_name, designName: row.design_name, designSlug: row.design_slug, shipBy: row.ship_by,
    studioName: row.studio_name, timeZone: row.time_zone,
    shipment:
      row.shipped_at && row.carrier_name && row.tracking_number
        ? { carrierName: row.carrier_name, trackingNumber: row.tracking_number, trackingUrl: row.tracking_url, shippedAt: row.shipped_at.toISOString() }
        : null,
    buyerNote: row.buyer_note,
    lines: lines.map((l) => ({
      id: l.id, position: l.position, designName: l.design_name, finishName: l.finish_name, unitPriceMinor: l.unit_price_minor,
      oversold: l.oversold, oversoldReason: l.oversold_reason, oversoldResolution: l.oversold_resolution, refunded: l.refunded, restocked: l.restocked, stage: l.stage,
    })),
    refunds: refunds.map((r) => ({
      id: r.id, amountMinor: r.amount_minor, reason: r.reason, note: r.note, status: r.status, failure: r.failure, createdAt: r.created_at.toISOString(), lineIds: r.line_ids,
    })),
    events: events.map((e) => ({ id: e.id, type: e.type, fromState: e.from_state, toState: e.to_state, actorName: e.actor_name, data: e.data, createdAt: e.created_at.toISOString() })),
  };
}

export type OrderNoteView = { id: string; authorName: string; body: string; createdAt: string };

/** The studio's own notes on an order, oldest first. Workshop only: buyers never see them. */
export async function listOrderNotes(orderId: string): Promise<OrderNoteView[]> {
  const rows = await sql<{ id: string; author_name: string; body: string; created_at: Date }>(
    `SELECT n.id::text, coalesce(u.name, u.email, n.author_label) AS author_name, n.body, n.created_at
       FROM order_notes n LEFT JOIN users u ON u.id = n.author_user_id WHERE n.order_id = $1 ORDER BY n.id`,
    [orderId],
  );
  return rows.map((r) => ({ id: r.id, authorName: r.author_name, body: r.body, createdAt: r.created_at.toISOString() }));
}

/** The order if this visitor may see it: its buyer signed in, or anyone holding the signed link. */
export async function getOrderForBuyer(number: string, who: { userId: string | null; token: string | null }): Promise<OrderView | null> {
  const order = await getOrderByNumber(number);
  if (!order) return null;
  const ownsIt = who.userId !== null && order.userId === who.userId;
  return ownsIt || isValidOrderToken(order.id, who.token) ? order : null;
}

export type OrderSummary = {
  id: string; number: string; state: OrderState; designName: string; finishName: string; quantity: number; totalMinor: number;
  refundedMinor: number; currency: string; createdAt: string; paidAt: string | null; email: string; buyerName: string | null;
  batchName: string; oversoldOpen: number;
};

const summarySelect = `
  SELECT o.id, o.number, o.state, o.total_minor, o.refunded_minor, o.currency, o.created_at, o.paid_at, o.email, o.buyer_name,
         b.name AS batch_name, min(l.design_name) AS design_name, min(l.finish_name) AS finish_name, count(l.id)::int AS quantity,
         count(l.id) FILTER (WHERE l.oversold AND l.oversold_resolution IS NULL AND NOT l.refunded)::int AS oversold_open
    FROM orders o JOIN batches b ON b.id = o.batch_id LEFT JOIN order_lines l ON l.order_id = o.id`;

type SummaryRow = {
  id: string; number: string; state: OrderState; total_minor: number; refunded_minor: number; currency: string; created_at: Date; paid_at: Date | null;
  email: string; buyer_name: string | null; batch_name: string; design_name: string; finish_name: string; quantity: number; oversold_open: number;
};
const toSummary = (r: SummaryRow): OrderSummary => ({
  id: r.id, number: r.number, state: r.state, designName: r.design_name, finishName: r.finish_name, quantity: r.quantity, totalMinor: r.total_minor,
  refundedMinor: r.refunded_minor, currency: r.currency, createdAt: r.created_at.toISOString(), paidAt: r.paid_at?.toISOString() ?? null,
  email: r.email, buyerName: r.buyer_name, batchName: r.batch_name, oversoldOpen: r.oversold_open,
});

/** A buyer's orders, newest first; unpaid attempts whose payment page ran out are left out. */
export async function listBuyerOrders(userId: string): Promise<OrderSummary[]> {
  const rows = await sql<SummaryRow>(
    `${summarySelect} WHERE o.user_id = $1 AND o.paid_at IS NOT NULL GROUP BY o.id, b.name ORDER BY o.created_at DESC LIMIT 100`,
    [userId],
  );
  return rows.map(toSummary);
}

export type OversoldLine = {
  lineId: string; orderId: string; orderNumber: string; designName: string; finishName: string; batchName: string; unitPriceMinor: number;
  currency: string; email: string; buyerName: string | null; reason: 'stock_gone' | 'over_buyer_limit'; paidAt: string; refundPending: boolean;
};

/** Every oversold line the maker has not decided on yet, oldest first. */
export async function listOversoldLines(): Promise<OversoldLine[]> {
  const rows = await sql<{ line_id: string; order_id: string; number: string; design_name: string; finish_name: string; batch_name: string; unit_price_minor: number; currency: string; email: string; buyer_name: string | null; oversold_reason: OversoldLine['reason']; paid_at: Date; refund_pending: boolean }>(
    `SELECT l.id AS line_id, o.id AS order_id, o.number, l.design_name, l.finish_name, b.name AS batch_name, l.unit_price_minor, o.currency, o.email,
            o.buyer_name, l.oversold_reason, o.paid_at,
            EXISTS (SELECT 1 FROM refunds r WHERE r.order_id = o.id AND r.status = 'pending' AND l.id = ANY(r.line_ids)) AS refund_pending
       FROM order_lines l JOIN orders o ON o.id = l.order_id JOIN batches b ON b.id = o.batch_id
      WHERE l.oversold AND l.oversold_resolution IS NULL AND NOT l.refunded
      ORDER BY o.paid_at, l.position`,
  );
  return rows.map((r) => ({
    lineId: r.line_id, orderId: r.order_id, orderNumber: r.number, designName: r.design_name, finishName: r.finish_name, batchName: r.batch_name,
    unitPriceMinor: r.unit_price_minor, currency: r.currency, email: r.email, buyerName: r.buyer_name, reason: r.oversold_reason,
    paidAt: r.paid_at.toISOString(), refundPending: r.refund_pending,
  }));
}
