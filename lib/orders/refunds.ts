import 'server-only';
import type Stripe from 'stripe';
import { AppError } from '@/lib/api/errors';
import { writeAudit, type AuditActor } from '@/lib/audit/log';
import { toStripeAmount } from '@/lib/checkout/pricing';
import { inTransaction, sql } from '@/lib/db/sql';
import { kickMail } from '@/lib/mail/outbox';
import { formatMoney } from '@/lib/money';
import { getStripe } from '@/lib/payments/stripe';
import { recordOrderEvent } from './checkout';
import { upsertRefund } from './payments';
import { refundReasonLabels, type RefundInput } from './schemas';

type Actor = Exclude<AuditActor, 'system'>;

export type RefundResult = { refundId: string; status: 'succeeded' | 'pending' | 'failed'; amountMinor: number; message: string };

type PendingRefund = { id: string; order_id: string | null; payment_intent_id: string; amount_minor: number; currency: string; reason: string; number: string | null };

/**
 * The owner refunds an order: all of what is left, chosen masks, or an amount. The refund is recorded as
 * pending first, then sent to Stripe with an idempotency key made from its id, so a retry (by the SDK, by
 * the sweep, by a second click) never refunds twice. The order's state follows what Stripe answers.
 */
export async function refundOrder(actor: Actor, input: RefundInput): Promise<RefundResult> {
  const pending = await inTransaction(async (transaction) => {
    const [order] = await sql<{ id: string; number: string; state: string; currency: string; payment_intent_id: string | null; paid_minor: number; shipping_minor: number }>(
      `SELECT id, number, state, currency, payment_intent_id, paid_minor, shipping_minor FROM orders WHERE id = $1 FOR UPDATE`,
      [input.orderId],
      transaction,
    );
    if (!order) throw new AppError('order_not_found', 'There is no such order.', 404);
    if (!order.payment_intent_id || order.paid_minor <= 0) throw new AppError('order_not_paid', 'This order has not been paid, so there is nothing to refund.', 409);
    const [{ committed }] = (await sql<{ committed: number }>(
      `SELECT coalesce(sum(amount_minor), 0)::int AS committed FROM refunds WHERE order_id = $1 AND payment_intent_id = $2 AND status <> 'failed'`,
      [order.id, order.payment_intent_id],
      transaction,
    )) as [{ committed: number }];
    const left = order.paid_minor - committed;
    if (left <= 0) throw new AppError('nothing_left_to_refund', 'This order is already refunded in full.', 409);

    const lines = await sql<{ id: string; unit_price_minor: number; refunded: boolean; pending: boolean }>(
      `SELECT l.id, l.unit_price_minor, l.refunded,
              EXISTS (SELECT 1 FROM refunds r WHERE r.order_id = l.order_id AND r.status = 'pending' AND l.id = ANY(r.line_ids)) AS pending
         FROM order_lines l WHERE l.order_id = $1 ORDER BY l.position`,
      [order.id],
      transaction,
    );
    const open = lines.filter((line) => !line.refunded && !line.pending);
    let amount: number;
    let lineIds: string[];
    if (input.mode === 'all') {
      amount = left;
      lineIds = open.map((line) => line.id);
    } else if (input.mode === 'lines') {
      const chosen = open.filter((line) => input.lineIds.includes(line.id));
      if (chosen.length !== new Set(input.lineIds).size) {
        throw new AppError('line_not_refundable', 'One of the chosen masks is not in this order or is already refunded. Reload the order and choose again.', 422);
      }
      lineIds = chosen.map((line) => line.id);
      // When nothing of the order will ship any more, its shipping goes back too (common practice).
      const everyLine = chosen.length === open.length;
      amount = Math.min(left, chosen.reduce((sum, line) => sum + line.unit_price_minor, 0) + (everyLine ? order.shipping_minor : 0));
    } else {
      if (input.amountMinor > left) {
        throw new AppError('amount_too_large', `At most ${left} (in minor units) is left to refund on this order.`, 422, { leftMinor: left });
      }
      amount = input.amountMinor;
      lineIds = [];
    }
    if (amount <= 0) throw new AppError('nothing_left_to_refund', 'Nothing is left to refund for what you chose.', 409);
    const [row] = await sql<PendingRefund>(
      `INSERT INTO refunds (order_id, payment_intent_id, amount_minor, currency, reason, note, line_ids, restock, created_by)
       VALUES ($1, $2, $3, $4, $5, $6, $7::uuid[], $8, $9)
       RETURNING id, order_id, payment_intent_id, amount_minor, currency, reason, $10::text AS number`,
      [order.id, order.payment_intent_id, amount, order.currency, input.reason, input.note, lineIds, input.restock, actor.id, order.number],
      transaction,
    );
    await recordOrderEvent(order.id, 'refund_requested', { actor: actor.id, data: { refundId: row!.id, amountMinor: amount, reason: input.reason, lines: lineIds.length } }, transaction);
    const masks = lineIds.length === 0 ? '' : ` (${lineIds.length === 1 ? '1 mask' : `${lineIds.length} masks`})`;
    await writeAudit(
      {
        actor,
        action: 'order.refunded',
        subject: { type: 'order', id: order.id },
        summary: `Refunded ${formatMoney({ amountMinor: amount, currency: order.currency })} of ${order.number}${masks}`,
        before: { currency: order.currency, refundedMinor: committed, leftToRefundMinor: left },
        after: { currency: order.currency, refundedMinor: committed + amount, leftToRefundMinor: left - amount, masks: lineIds.length, reason: refundReasonLabels[input.reason], restock: input.restock },
      },
      transaction,
    );
    return row!;
  });
  return sendRefund(pending);
}

const stripeReason = (reason: string): Stripe.RefundCreateParams.Reason | undefined =>
  reason === 'buyer_request' ? 'requested_by_customer' : reason === 'duplicate_payment' ? 'duplicate' : undefined;

/** Sends a recorded refund to Stripe. Parameters come only from the stored row, so a retry matches the first try. */
async function sendRefund(row: PendingRefund): Promise<RefundResult> {
  let refund: Stripe.Refund;
  try {
    refund = await getStripe().refunds.create(
      {
        payment_intent: row.payment_intent_id,
        amount: toStripeAmount(row.amount_minor, row.currency),
        reason: stripeReason(row.reason),
        metadata: { demold_refund_id: row.id, order_id: row.order_id ?? '', order_number: row.number ?? '', reason: row.reason },
      },
      { idempotencyKey: `demold-refund-${row.id}` },
    );
  } catch (error) {
    const stripeError = error as { type?: string; message?: string; code?: string };
    if (stripeError.type === 'StripeInvalidRequestError') {
      // Stripe refused it for good (already refunded, amount too large): record that and say it.
      await inTransaction(async (transaction) => {
        const failed = await sql<{ id: string }>(
          `UPDATE refunds SET status = 'failed', failure = $2, updated_at = now() WHERE id = $1 AND status = 'pending' RETURNING id`,
          [row.id, stripeError.message ?? stripeError.code ?? 'refused'],
          transaction,
        );
        if (row.order_id) await recordOrderEvent(row.order_id, 'refund_failed', { data: { refundId: row.id, code: stripeError.code ?? null } }, transaction);
        // The log said "Refunded" when the owner asked; it says so too when the money did not go back.
        if (failed.length > 0 && row.order_id) {
          await writeAudit(
            {
              actor: 'system',
              action: 'order.refund_failed',
              subject: { type: 'order', id: row.order_id },
              summary: `Stripe refused the refund of ${formatMoney({ amountMinor: row.amount_minor, currency: row.currency })} of ${row.number ?? 'an order'}: nothing was paid back`,
              before: { refundStatus: 'pending' },
              after: { refundStatus: 'failed', reason: stripeError.message ?? stripeError.code ?? 'refused' },
            },
            transaction,
          );
        }
      });
      throw new AppError('refund_refused', `Stripe refused the refund: ${stripeError.message ?? 'no reason given'}`, 422);
    }
    console.error('Refund not confirmed by Stripe yet; the sweep retries it', { refundId: row.id, error: stripeError.message });
    return { refundId: row.id, status: 'pending', amountMinor: row.amount_minor, message: 'The payment service did not answer in time. The refund is recorded and will be sent again automatically within minutes.' };
  }
  await inTransaction((transaction) => upsertRefund(refund, transaction));
  kickMail();
  const status = refund.status === 'succeeded' ? 'succeeded' : refund.status === 'failed' ? 'failed' : 'pending';
  return { refundId: row.id, status, amountMinor: row.amount_minor, message: status === 'succeeded' ? 'Refunded. The buyer gets an e-mail.' : 'The refund is on its way.' };
}

/** Refunds recorded but never confirmed (Stripe was down or slow): send them again, with their own keys. */
export async function retryPendingRefunds(olderThanSeconds = 30): Promise<number> {
  const rows = await sql<PendingRefund>(
    `SELECT r.id, r.order_id, r.payment_intent_id, r.amount_minor, r.currency, r.reason, o.number
       FROM refunds r LEFT JOIN orders o ON o.id = r.order_id
      WHERE r.status = 'pending' AND r.stripe_refund_id IS NULL AND r.created_at < now() - make_interval(secs => $1)
      ORDER BY r.created_at LIMIT 50`,
    [olderThanSeconds],
  );
  let done = 0;
  for (const row of rows) {
    try {
      const result = await sendRefund(row);
      if (result.status !== 'pending') done += 1;
    } catch (error) {
      if (!(error instanceof AppError)) throw error;
    }
  }
  return done;
}

/** The maker will cast one more for an oversold line: the batch grows by one and the line counts as sold. */
export async function confirmExtraCast(actor: Actor, lineId: string): Promise<void> {
  await inTransaction(async (transaction) => {
    const [line] = await sql<{ id: string; order_id: string; batch_stock_id: string; state: string; number: string; design_name: string; finish_name: string }>(
      `SELECT l.id, l.order_id, l.batch_stock_id, o.state, o.number, l.design_name, l.finish_name FROM order_lines l JOIN orders o ON o.id = l.order_id
        WHERE l.id = $1 AND l.oversold AND l.oversold_resolution IS NULL AND NOT l.refunded FOR UPDATE OF l, o`,
      [lineId],
      transaction,
    );
    if (!line) throw new AppError('line_not_oversold', 'That line is not waiting for a decision any more: it was refunded or already confirmed.', 409);
    const [stock] = await sql<{ quantity: number; sold: number }>(
      `UPDATE batch_stock SET quantity = quantity + 1, sold = sold + 1, updated_at = now() WHERE id = $1 RETURNING quantity, sold`,
      [line.batch_stock_id],
      transaction,
    );
    await sql(`UPDATE order_lines SET oversold_resolution = 'extra_cast', counted_in_stock = true, updated_at = now() WHERE id = $1`, [line.id], transaction);
    await recordOrderEvent(line.order_id, 'extra_cast_confirmed', { actor: actor.id, data: { lineId } }, transaction);
    await writeAudit(
      {
        actor,
        action: 'order.extra_cast_confirmed',
        subject: { type: 'order', id: line.order_id },
        summary: `Confirmed an extra ${line.design_name} — ${line.finish_name} will be cast for ${line.number}`,
        before: { quantity: stock!.quantity - 1, sold: stock!.sold - 1 },
        after: { quantity: stock!.quantity, sold: stock!.sold },
      },
      transaction,
    );
  });
}
