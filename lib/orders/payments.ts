import 'server-only';
import type Stripe from 'stripe';
import type { Transaction } from 'sequelize';
import { inTransaction, sql } from '@/lib/db/sql';
import { kickMail } from '@/lib/mail/outbox';
import { recordOrderEvent } from './checkout';
import { queueOrderConfirmation, queueOversoldAlert, queueRefundEmail } from './notify';
import { nextState, type OrderState } from './states';

// What the payment provider tells us, applied to orders. Every function here is idempotent and does not
// depend on the order events arrive in: a repeat changes nothing, a refund seen before its payment waits
// for it, and a payment after its hold ended becomes an oversold line instead of a lost payment.

export type EventOutcome = { outcome: 'processed' | 'duplicate' | 'ignored' | 'unknown_session'; note?: string };

/** Records the event by id once and applies it, all in one transaction. */
export async function handleStripeEvent(event: Stripe.Event): Promise<EventOutcome> {
  return inTransaction(async (transaction) => {
    const object = event.data.object as { id?: string };
    const inserted = await sql<{ id: string }>(
      `INSERT INTO payment_events (id, type, object_id, outcome, stripe_created_at) VALUES ($1, $2, $3, 'processing', to_timestamp($4))
       ON CONFLICT (id) DO NOTHING RETURNING id`,
      [event.id, event.type, object.id ?? null, event.created],
      transaction,
    );
    if (inserted.length === 0) return { outcome: 'duplicate' };
    const result = await applyEvent(event, transaction);
    await sql(`UPDATE payment_events SET outcome = $2, note = $3 WHERE id = $1`, [event.id, result.outcome, result.note ?? null], transaction);
    return result;
  });
}

async function applyEvent(event: Stripe.Event, transaction: Transaction): Promise<EventOutcome> {
  switch (event.type) {
    case 'checkout.session.completed':
    case 'checkout.session.async_payment_succeeded':
      if (event.data.object.payment_status !== 'paid') return { outcome: 'ignored', note: 'not paid yet' };
      return completeSession(event.data.object, transaction);
    case 'checkout.session.expired':
      return expireSession(event.data.object, transaction);
    case 'payment_intent.payment_failed':
      return recordPaymentFailure(event.data.object, transaction);
    case 'refund.created':
    case 'refund.updated':
    case 'refund.failed':
      return upsertRefund(event.data.object, transaction);
    case 'charge.refunded': {
      const refunds = event.data.object.refunds?.data ?? [];
      for (const refund of refunds) await upsertRefund(refund, transaction);
      return { outcome: 'processed', note: `${refunds.length} refund(s) seen on the charge` };
    }
    default:
      return { outcome: 'ignored', note: 'not an event this shop acts on' };
  }
}

type LockedOrder = {
  id: string; number: string; state: OrderState; user_id: string | null; hold_id: string | null; batch_id: string;
  total_minor: number; paid_minor: number; refunded_minor: number; payment_intent_id: string | null; checkout_round: number; email: string;
};

async function lockOrder(orderId: string | null | undefined, transaction: Transaction): Promise<LockedOrder | null> {
  if (!orderId || !/^[0-9a-f-]{36}$/i.test(orderId)) return null;
  const [order] = await sql<LockedOrder>(`SELECT * FROM orders WHERE id = $1 FOR UPDATE`, [orderId], transaction);
  return order ?? null;
}

const idOf = (value: string | { id: string } | null | undefined) => (typeof value === 'string' ? value : (value?.id ?? null));

/** A paid Checkout Session: the order becomes paid; the hold's stock becomes sold, or the line oversold. */
export async function completeSession(session: Stripe.Checkout.Session, transaction: Transaction): Promise<EventOutcome> {
  const order = await lockOrder(session.metadata?.order_id ?? session.client_reference_id, transaction);
  if (!order) return { outcome: 'unknown_session', note: `no order for session ${session.id}` };
  const paymentIntentId = idOf(session.payment_intent);
  const round = Number(session.metadata?.round ?? order.checkout_round) || order.checkout_round;
  await sql(
    `INSERT INTO checkout_sessions (id, order_id, round, status, url, expires_at) VALUES ($1, $2, $3, 'complete', $4, to_timestamp($5))
     ON CONFLICT (id) DO UPDATE SET status = 'complete', updated_at = now()`,
    [session.id, order.id, round, session.url, session.expires_at],
    transaction,
  );
  if (order.payment_intent_id && order.payment_intent_id === paymentIntentId) return { outcome: 'duplicate', note: 'order already paid by this payment' };
  if (order.payment_intent_id && paymentIntentId) {
    // Two sessions of one order were both paid: keep the first, give the second back in full.
    await sql(
      `INSERT INTO refunds (order_id, payment_intent_id, amount_minor, currency, reason, note)
       SELECT $1, $2, $3, currency, 'duplicate_payment', 'Paid twice: the second payment is returned automatically.' FROM orders WHERE id = $1
       AND NOT EXISTS (SELECT 1 FROM refunds WHERE payment_intent_id = $2)`,
      [order.id, paymentIntentId, session.amount_total ?? 0],
      transaction,
    );
    await recordOrderEvent(order.id, 'duplicate_payment', { data: { paymentIntentId, amountMinor: session.amount_total } }, transaction);
    return { outcome: 'processed', note: 'second payment for a paid order: refund queued' };
  }

  const lines = await sql<{ id: string; batch_stock_id: string }>(
    `SELECT id, batch_stock_id FROM order_lines WHERE order_id = $1 ORDER BY position FOR UPDATE`,
    [order.id],
    transaction,
  );
  const [hold] = order.hold_id
    ? await sql<{ id: string; state: string; quantity: number; batch_stock_id: string; user_id: string }>(
        `SELECT id, state, quantity, batch_stock_id, user_id FROM holds WHERE id = $1 FOR UPDATE`,
        [order.hold_id],
        transaction,
      )
    : [];
  const oversold: string[] = [];
  if (hold && hold.state === 'active') {
    // In time (or after its minutes but before anyone else could take the stock): the held units are sold.
    await sql(`UPDATE holds SET state = 'converted', reason = 'paid', ended_at = now(), updated_at = now() WHERE id = $1`, [hold.id], transaction);
    await sql(`UPDATE batch_stock SET held = held - $2, sold = sold + $2, updated_at = now() WHERE id = $1`, [hold.batch_stock_id, hold.quantity], transaction);
    await sql(`UPDATE order_lines SET counted_in_stock = true, updated_at = now() WHERE order_id = $1`, [order.id], transaction);
  } else {
    // The late payment: the hold ended first. Each mask is sold if the stock and the buyer's limit still
    // allow it; otherwise its line is oversold, for the maker to refund or cast an extra.
    for (const line of lines) {
      const reason = await claimLateUnit(order, line.batch_stock_id, transaction);
      if (reason === null) {
        await sql(`UPDATE order_lines SET counted_in_stock = true, updated_at = now() WHERE id = $1`, [line.id], transaction);
      } else {
        await sql(`UPDATE order_lines SET oversold = true, oversold_reason = $2, updated_at = now() WHERE id = $1`, [line.id, reason], transaction);
        oversold.push(line.id);
      }
    }
  }

  const shipping = session.collected_information?.shipping_details ?? null;
  const email = session.customer_details?.email ?? order.email;
  await sql(
    `UPDATE orders SET state = 'paid', payment_intent_id = $2, paid_minor = $3, paid_at = now(), email = $4, buyer_name = coalesce($5, buyer_name),
            ship_to = $6, cancelled_at = NULL, updated_at = now() WHERE id = $1`,
    [order.id, paymentIntentId, session.amount_total ?? 0, email, shipping?.name ?? session.customer_details?.name ?? null, shipping ? JSON.stringify(shipping) : null],
    transaction,
  );
  await recordOrderEvent(
    order.id,
    'paid',
    { from: order.state, to: 'paid', data: { paymentIntentId, amountMinor: session.amount_total, late: !(hold && hold.state === 'active'), oversoldLines: oversold.length } },
    transaction,
  );
  if (session.amount_total !== order.total_minor) {
    await recordOrderEvent(order.id, 'amount_mismatch', { data: { expected: order.total_minor, paid: session.amount_total } }, transaction);
  }
  for (const lineId of oversold) await recordOrderEvent(order.id, 'line_oversold', { data: { lineId } }, transaction);
  // Refunds that arrived before this payment was seen belong to this order now.
  if (paymentIntentId) {
    await sql(`UPDATE refunds SET order_id = $1, updated_at = now() WHERE payment_intent_id = $2 AND order_id IS NULL`, [order.id, paymentIntentId], transaction);
  }
  await applyRefunds(order.id, transaction, null);
  await queueOrderConfirmation(order.id, transaction);
  if (oversold.length > 0) await queueOversoldAlert(order.id, transaction);
  return { outcome: 'processed', note: oversold.length ? `${oversold.length} line(s) oversold` : undefined };
}

async function claimLateUnit(order: LockedOrder, stockId: string, transaction: Transaction): Promise<'stock_gone' | 'over_buyer_limit' | null> {
  if (order.user_id) {
    const allowed = await sql(
      `INSERT INTO buyer_allowances AS a (batch_id, user_id, taken, per_buyer_limit)
       SELECT $1, $2, 1, per_buyer_limit FROM batches WHERE id = $1
       ON CONFLICT (batch_id, user_id) DO UPDATE SET taken = a.taken + 1 WHERE a.taken + 1 <= a.per_buyer_limit
       RETURNING 1 AS ok`,
      [order.batch_id, order.user_id],
      transaction,
    );
    if (allowed.length === 0) return 'over_buyer_limit';
  }
  const sold = await sql(
    `UPDATE batch_stock SET sold = sold + 1, updated_at = now() WHERE id = $1 AND available >= 1 RETURNING 1 AS ok`,
    [stockId],
    transaction,
  );
  if (sold.length > 0) return null;
  if (order.user_id) {
    await sql(`UPDATE buyer_allowances SET taken = taken - 1 WHERE batch_id = $1 AND user_id = $2`, [order.batch_id, order.user_id], transaction);
  }
  return 'stock_gone';
}

/** A session that ran out unpaid: the order is cancelled and its hold, if still running, let go. */
export async function expireSession(session: Stripe.Checkout.Session, transaction: Transaction): Promise<EventOutcome> {
  const order = await lockOrder(session.metadata?.order_id ?? session.client_reference_id, transaction);
  if (!order) return { outcome: 'unknown_session', note: `no order for session ${session.id}` };
  await sql(`UPDATE checkout_sessions SET status = 'expired', updated_at = now() WHERE id = $1 AND status = 'open'`, [session.id], transaction);
  if (order.state !== 'awaiting_payment') return { outcome: 'processed', note: `order is ${order.state}` };
  const round = Number(session.metadata?.round ?? order.checkout_round);
  const [open] = await sql(`SELECT 1 AS one FROM checkout_sessions WHERE order_id = $1 AND status = 'open'`, [order.id], transaction);
  if (round < order.checkout_round || open) return { outcome: 'processed', note: 'an earlier session of this order, replaced by a newer one' };
  if (order.hold_id && order.user_id) {
    await sql(`SELECT release_hold($1, $2) AS released`, [order.hold_id, order.user_id], transaction);
  }
  await sql(`UPDATE orders SET state = 'cancelled', cancelled_at = now(), updated_at = now() WHERE id = $1`, [order.id], transaction);
  await recordOrderEvent(order.id, 'cancelled', { from: order.state, to: 'cancelled', data: { reason: 'the payment page expired unpaid' } }, transaction);
  return { outcome: 'processed' };
}

async function recordPaymentFailure(intent: Stripe.PaymentIntent, transaction: Transaction): Promise<EventOutcome> {
  const order = await lockOrder(intent.metadata?.order_id, transaction);
  if (!order) return { outcome: 'ignored', note: 'no order for this payment' };
  // The buyer stays on the payment page and may try another card while the hold runs; nothing is released.
  const error = intent.last_payment_error;
  await recordOrderEvent(order.id, 'payment_failed', { data: { code: error?.code ?? null, declineCode: error?.decline_code ?? null, message: error?.message ?? null } }, transaction);
  return { outcome: 'processed' };
}

const refundStatus = (status: string | null) => (status === 'succeeded' ? 'succeeded' : status === 'failed' || status === 'canceled' ? 'failed' : 'pending');

/** A refund as Stripe reports it, matched to the one the workshop asked for (or recorded as made elsewhere). */
export async function upsertRefund(refund: Stripe.Refund, transaction: Transaction): Promise<EventOutcome> {
  const paymentIntentId = idOf(refund.payment_intent);
  if (!paymentIntentId) return { outcome: 'ignored', note: 'refund without a payment' };
  const ours = refund.metadata?.demold_refund_id;
  const status = refundStatus(refund.status);
  const [existing] = await sql<{ id: string; order_id: string | null }>(
    `SELECT id, order_id FROM refunds WHERE stripe_refund_id = $1 OR id = $2::uuid FOR UPDATE`,
    [refund.id, ours && /^[0-9a-f-]{36}$/i.test(ours) ? ours : null],
    transaction,
  );
  let orderId: string | null;
  if (existing) {
    await sql(
      `UPDATE refunds SET stripe_refund_id = $2, status = CASE WHEN status = 'succeeded' THEN status ELSE $3 END,
              failure = $4, updated_at = now() WHERE id = $1`,
      [existing.id, refund.id, status, refund.failure_reason ?? null],
      transaction,
    );
    orderId = existing.order_id;
  } else {
    const [order] = await sql<{ id: string }>(`SELECT id FROM orders WHERE payment_intent_id = $1`, [paymentIntentId], transaction);
    orderId = order?.id ?? null;
    await sql(
      `INSERT INTO refunds (order_id, payment_intent_id, stripe_refund_id, amount_minor, currency, reason, note, status)
       VALUES ($1, $2, $3, $4, upper($5), 'other', 'Made outside the workshop', $6) ON CONFLICT (stripe_refund_id) DO NOTHING`,
      [orderId, paymentIntentId, refund.id, refund.amount, refund.currency, status],
      transaction,
    );
  }
  if (orderId) await applyRefunds(orderId, transaction, null);
  return { outcome: 'processed' };
}

/**
 * Brings an order in line with its succeeded refunds: the refunded total, the lines they covered (and
 * their stock, where the maker asked for it back), the state, and one refund e-mail per refund.
 */
export async function applyRefunds(orderId: string, transaction: Transaction, actor: string | null): Promise<void> {
  const [order] = await sql<LockedOrder & { stage_summary: string | null }>(`SELECT * FROM orders WHERE id = $1 FOR UPDATE`, [orderId], transaction);
  if (!order || !order.payment_intent_id) return;
  const refunds = await sql<{ id: string; amount_minor: number; line_ids: string[]; restock: boolean; reason: string; applied: boolean }>(
    `SELECT r.id, r.amount_minor, r.line_ids, r.restock, r.reason,
            EXISTS (SELECT 1 FROM order_events e WHERE e.order_id = r.order_id AND e.type = 'refunded' AND e.data->>'refundId' = r.id::text) AS applied
       FROM refunds r WHERE r.order_id = $1 AND r.payment_intent_id = $2 AND r.status = 'succeeded' ORDER BY r.created_at`,
    [orderId, order.payment_intent_id],
    transaction,
  );
  let refunded = order.refunded_minor;
  for (const refund of refunds.filter((r) => !r.applied)) {
    refunded = Math.min(order.paid_minor, refunded + refund.amount_minor);
    if (refund.line_ids.length > 0) {
      await sql(
        `UPDATE order_lines SET refunded = true, oversold_resolution = CASE WHEN oversold AND oversold_resolution IS NULL THEN 'refunded' ELSE oversold_resolution END, updated_at = now()
          WHERE order_id = $1 AND id = ANY($2::uuid[])`,
        [orderId, refund.line_ids],
        transaction,
      );
      if (refund.restock) await restockLines(order, refund.line_ids, transaction);
    }
    const before: OrderState = order.state;
    const after = nextState({ ...order, refunded_minor: refunded });
    await sql(`UPDATE orders SET refunded_minor = $2, state = $3, updated_at = now() WHERE id = $1`, [orderId, refunded, after], transaction);
    await recordOrderEvent(orderId, 'refunded', { from: before, to: after, actor, data: { refundId: refund.id, amountMinor: refund.amount_minor, reason: refund.reason } }, transaction);
    order.state = after;
    await queueRefundEmail(refund.id, transaction);
  }
  // A payment with no refund still needs its state set (paid after awaiting, or after a cancellation).
  const settled = nextState({ ...order, refunded_minor: refunded });
  if (settled !== order.state) {
    await sql(`UPDATE orders SET state = $2, updated_at = now() WHERE id = $1`, [orderId, settled], transaction);
    await recordOrderEvent(orderId, 'state_changed', { from: order.state, to: settled, actor }, transaction);
  }
}

async function restockLines(order: LockedOrder, lineIds: string[], transaction: Transaction): Promise<void> {
  const lines = await sql<{ id: string; batch_stock_id: string }>(
    `UPDATE order_lines SET counted_in_stock = false, restocked = true, updated_at = now()
      WHERE order_id = $1 AND id = ANY($2::uuid[]) AND counted_in_stock AND NOT restocked RETURNING id, batch_stock_id`,
    [order.id, lineIds],
    transaction,
  );
  for (const line of lines) {
    await sql(`UPDATE batch_stock SET sold = sold - 1, updated_at = now() WHERE id = $1`, [line.batch_stock_id], transaction);
    if (order.user_id) {
      await sql(`UPDATE buyer_allowances SET taken = greatest(taken - 1, 0) WHERE batch_id = $1 AND user_id = $2`, [order.batch_id, order.user_id], transaction);
    }
  }
  if (lines.length) await recordOrderEvent(order.id, 'restocked', { data: { lines: lines.length } }, transaction);
}

/** For the reconcile sweep and the order page: apply a session read back from Stripe, as if its event came. */
export async function applySessionFromStripe(session: Stripe.Checkout.Session): Promise<EventOutcome> {
  const result = await inTransaction(async (transaction): Promise<EventOutcome> => {
    if (session.status === 'complete' && session.payment_status === 'paid') return completeSession(session, transaction);
    if (session.status === 'expired') return expireSession(session, transaction);
    return { outcome: 'ignored', note: 'session still open' };
  });
  if (result.outcome === 'processed') kickMail();
  return result;
}
