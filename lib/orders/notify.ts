import 'server-only';
import type { Transaction } from 'sequelize';
import { OrderConfirmationEmail } from '@/emails/order-confirmation';
import { OrderInProductionEmail } from '@/emails/order-in-production';
import { OrderShippedEmail } from '@/emails/order-shipped';
import { OversoldAlertEmail } from '@/emails/oversold-alert';
import { OversoldApologyEmail } from '@/emails/oversold-apology';
import { RefundIssuedEmail } from '@/emails/refund-issued';
import { sql } from '@/lib/db/sql';
import { getEnv } from '@/lib/env';
import { enqueueEmail } from '@/lib/mail/outbox';
import { loadStudioSettings } from '@/lib/settings/studio';
import { orderUrl } from './links';
import type { RefundReason } from './schemas';

// Each message is rendered and put in the outbox inside the transaction that made its cause, with a key
// that makes it once per cause: one confirmation per order, one refund e-mail per refund, one "being made"
// and one "shipped" e-mail per order. A resend from the workshop is a cause of its own, with its own key.

/** The outbox keys of the messages sent once per order; a resend adds `:resend:<event id>`. */
export const orderMailKeys = {
  confirmation: (orderId: string) => `order-confirmation:${orderId}`,
  inProduction: (orderId: string) => `order-in-production:${orderId}`,
  shipped: (orderId: string) => `order-shipped:${orderId}`,
};

// Completes "… has refunded €x on order DM-1001 because …".
const refundReasonClauses: Record<RefundReason, string> = {
  oversold: 'your payment arrived after the last mask had gone',
  failed_casting: 'a casting failed',
  buyer_request: 'you asked for it',
  duplicate_payment: 'you were charged twice',
  other: 'the studio decided to',
};

type OrderForMail = {
  id: string; number: string; email: string; buyer_name: string | null; currency: string; lines_minor: number; shipping_minor: number;
  total_minor: number; paid_minor: number; refunded_minor: number; tax_label: string; tax_rate_bp: number; tax_included_minor: number;
  shipping_label: string; shipping_min_days: number; shipping_max_days: number; ship_to: ShipTo | null; studio_name: string; batch_name: string;
  ship_by: string; time_zone: string; carrier_name: string | null; tracking_number: string | null; tracking_url: string | null;
};
type ShipTo = { name?: string | null; address?: Record<string, string | null> | null };

async function orderForMail(orderId: string, transaction: Transaction): Promise<OrderForMail> {
  const [order] = await sql<OrderForMail>(
    `SELECT o.*, st.name AS studio_name, st.time_zone, b.name AS batch_name, to_char(b.ship_by, 'YYYY-MM-DD') AS ship_by
       FROM orders o JOIN studios st ON st.id = o.studio_id JOIN batches b ON b.id = o.batch_id WHERE o.id = $1`,
    [orderId],
    transaction,
  );
  if (!order) throw new Error(`order ${orderId} not found`);
  return order;
}

export function addressLines(shipTo: ShipTo | null): string[] {
  const a = shipTo?.address;
  if (!a) return [];
  const region = new Intl.DisplayNames(['en'], { type: 'region' });
  return [a.line1, a.line2, [a.postal_code, a.city].filter(Boolean).join(' '), a.state, a.country ? (region.of(a.country) ?? a.country) : null].filter(
    (line): line is string => Boolean(line && line.trim()),
  );
}

const percent = (bp: number) => (bp / 100).toLocaleString('en', { maximumFractionDigits: 2 });

function longDate(isoDate: string): string {
  return new Intl.DateTimeFormat('en-IE', { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' }).format(
    new Date(`${isoDate}T12:00:00Z`),
  );
}

/** Queues the order confirmation; `dedupeKey` is given only for a resend. Returns false when it was queued before. */
export async function queueOrderConfirmation(orderId: string, transaction: Transaction, { dedupeKey }: { dedupeKey?: string } = {}): Promise<boolean> {
  const order = await orderForMail(orderId, transaction);
  const lines = await sql<{ design_name: string; finish_name: string; unit_price_minor: number; oversold: boolean }>(
    `SELECT design_name, finish_name, unit_price_minor, oversold FROM order_lines WHERE order_id = $1 ORDER BY position`,
    [orderId],
    transaction,
  );
  const oversold = lines.some((line) => line.oversold);
  return enqueueEmail(
    {
      dedupeKey: dedupeKey ?? orderMailKeys.confirmation(order.id),
      to: order.email,
      subject: `Your order ${order.number} from ${order.studio_name}`,
      body: OrderConfirmationEmail({
        studioName: order.studio_name,
        buyerName: order.buyer_name,
        orderNumber: order.number,
        orderUrl: orderUrl(order),
        currency: order.currency,
        lines: lines.map((line) => ({ designName: line.design_name, finishName: line.finish_name, unitPriceMinor: line.unit_price_minor, oversold: line.oversold })),
        subtotalMinor: order.lines_minor,
        shippingLabel: order.shipping_label,
        shippingMinor: order.shipping_minor,
        totalMinor: order.total_minor,
        taxLabel: order.tax_label,
        taxRatePercent: percent(order.tax_rate_bp),
        taxIncludedMinor: order.tax_included_minor,
        shipTo: { name: order.ship_to?.name ?? order.buyer_name ?? '', lines: addressLines(order.ship_to) },
        shipBy: longDate(order.ship_by),
        oversold,
      }),
    },
    transaction,
  );
}

export async function queueOversoldAlert(orderId: string, transaction: Transaction): Promise<void> {
  const order = await orderForMail(orderId, transaction);
  const [line] = await sql<{ design_name: string; finish_name: string }>(
    `SELECT design_name, finish_name FROM order_lines WHERE order_id = $1 AND oversold ORDER BY position LIMIT 1`,
    [orderId],
    transaction,
  );
  const owners = await sql<{ email: string }>(`SELECT email FROM users WHERE role = 'owner' ORDER BY email`, [], transaction);
  const appUrl = getEnv().APP_URL;
  for (const owner of owners) {
    await enqueueEmail(
      {
        dedupeKey: `oversold-alert:${order.id}:${owner.email}`,
        to: owner.email,
        subject: `Oversold: order ${order.number} was paid after the stock had gone`,
        body: OversoldAlertEmail({
          studioName: order.studio_name,
          orderNumber: order.number,
          workshopOrderUrl: `${appUrl}/workshop/orders/${order.number}`,
          oversoldQueueUrl: `${appUrl}/workshop/oversold`,
          designName: line?.design_name ?? '',
          finishName: line?.finish_name ?? '',
          batchName: order.batch_name,
          buyerEmail: order.email,
          paidMinor: order.paid_minor,
          currency: order.currency,
        }),
      },
      transaction,
    );
  }
}

export async function queueRefundEmail(refundId: string, transaction: Transaction): Promise<void> {
  const [refund] = await sql<{ order_id: string; amount_minor: number; reason: RefundReason; line_ids: string[] }>(
    `SELECT order_id, amount_minor, reason, line_ids FROM refunds WHERE id = $1`,
    [refundId],
    transaction,
  );
  if (!refund) return;
  const order = await orderForMail(refund.order_id, transaction);
  const lines = await sql<{ design_name: string; finish_name: string; oversold: boolean }>(
    `SELECT design_name, finish_name, oversold FROM order_lines WHERE order_id = $1 AND id = ANY($2::uuid[]) ORDER BY position`,
    [refund.order_id, refund.line_ids],
    transaction,
  );
  const base = { studioName: order.studio_name, orderNumber: order.number, orderUrl: orderUrl(order), currency: order.currency };
  const apology = refund.reason === 'oversold' && lines.length > 0;
  await enqueueEmail(
    {
      dedupeKey: `refund:${refundId}`,
      to: order.email,
      subject: apology ? `Sorry: we refunded your order ${order.number}` : `Refund for your order ${order.number}`,
      body: apology
        ? OversoldApologyEmail({ ...base, designName: lines[0]!.design_name, finishName: lines[0]!.finish_name, batchName: order.batch_name, amountMinor: refund.amount_minor })
        : RefundIssuedEmail({
            ...base,
            amountMinor: refund.amount_minor,
            reasonText: refundReasonClauses[refund.reason] ?? refundReasonClauses.other,
            refundedLines: lines.map((line) => `${line.design_name} in ${line.finish_name}`),
            totalRefundedMinor: order.refunded_minor,
            totalPaidMinor: order.paid_minor,
          }),
    },
    transaction,
  );
}

const lineWords = (lines: { design_name: string; finish_name: string }[]) => lines.map((line) => `${line.design_name} in ${line.finish_name}`);

/** "Your masks are being made": once per order, when its first mask leaves the mold queue. */
export async function queueInProductionEmail(orderId: string, transaction: Transaction): Promise<boolean> {
  const order = await orderForMail(orderId, transaction);
  const lines = await sql<{ design_name: string; finish_name: string }>(
    `SELECT design_name, finish_name FROM order_lines WHERE order_id = $1 AND NOT refunded ORDER BY position`,
    [orderId],
    transaction,
  );
  return enqueueEmail(
    {
      dedupeKey: orderMailKeys.inProduction(order.id),
      to: order.email,
      subject: lines.length > 1 ? `Your masks are being made: order ${order.number}` : `Your mask is being made: order ${order.number}`,
      body: OrderInProductionEmail({
        studioName: order.studio_name,
        buyerName: order.buyer_name,
        orderNumber: order.number,
        orderUrl: orderUrl(order),
        lines: lineWords(lines),
        shipBy: longDate(order.ship_by),
      }),
    },
    transaction,
  );
}

/** The parcel is on its way, with the carrier's tracking link as it was recorded when the order shipped. */
export async function queueShippedEmail(orderId: string, transaction: Transaction, { dedupeKey }: { dedupeKey?: string } = {}): Promise<boolean> {
  const order = await orderForMail(orderId, transaction);
  if (!order.carrier_name || !order.tracking_number || !order.tracking_url) throw new Error(`order ${order.number} has no shipment to tell of`);
  const [lines, studio] = await Promise.all([
    sql<{ design_name: string; finish_name: string }>(
      `SELECT design_name, finish_name FROM order_lines WHERE order_id = $1 AND stage = 'shipped' ORDER BY position`,
      [orderId],
      transaction,
    ),
    loadStudioSettings(transaction),
  ]);
  const days = order.shipping_min_days === order.shipping_max_days ? `${order.shipping_min_days}` : `${order.shipping_min_days}–${order.shipping_max_days}`;
  return enqueueEmail(
    {
      dedupeKey: dedupeKey ?? orderMailKeys.shipped(order.id),
      to: order.email,
      subject: `Order ${order.number} from ${order.studio_name} has shipped`,
      body: OrderShippedEmail({
        studioName: order.studio_name,
        buyerName: order.buyer_name,
        orderNumber: order.number,
        orderUrl: orderUrl(order),
        shippedLines: lineWords(lines),
        carrierName: order.carrier_name,
        trackingNumber: order.tracking_number,
        trackingUrl: order.tracking_url,
        shippingLabel: `${order.shipping_label}, ${days} working days`,
        shipTo: { name: order.ship_to?.name ?? order.buyer_name ?? '', lines: addressLines(order.ship_to) },
        contactEmail: studio?.contactEmail ?? null,
      }),
    },
    transaction,
  );
}
