import { describe, expect, it } from 'vitest';
import { sdk } from '../fake-stripe/helpers';
import { control, pay, waitUntil, withCheckoutWorld } from './support';

const world = withCheckoutWorld('payment_faults');

type Ledger = { orders: number; paidTotal: number; refundedTotal: number; sold: number; confirmations: number; refundMails: number; sessionsPerOrder: number[] };

/**
 * The same little drop, run against whatever the fake Stripe is doing: five buyers each hold a mask and
 * pay, and the maker refunds the first order. A buyer whose click fails clicks again, as a person would.
 */
async function runDrop(label: string): Promise<Ledger> {
  const { createHold } = await import('@/lib/drops/holds');
  const { startCheckout } = await import('@/lib/orders/checkout');
  const { refundOrder, retryPendingRefunds } = await import('@/lib/orders/refunds');
  const { sweepPayments, reconcileOpenSessions } = await import('@/lib/orders/sweeps');
  const batch = await world.freshBatch(5);
  const orderIds: string[] = [];
  await Promise.all(
    Array.from({ length: 5 }, async (_, i) => {
      const buyer = await world.buyer(`${label}-${i}@example.com`);
      const hold = await createHold(buyer, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
      const rate = await world.irishRate(buyer, hold.id);
      let url: string | null = null;
      for (let attempt = 0; attempt < 10 && !url; attempt += 1) {
        try {
          url = (await startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: rate })).url;
        } catch (error) {
          expect((error as { code?: string }).code).toBe('payments_unavailable');
        }
      }
      expect(url).not.toBeNull();
      expect((await pay(world.fake(), url!)).status).toBe(200);
      orderIds.push((await world.order(hold.id))!.id);
    }),
  );
  // Webhooks may be late, repeated and shuffled; the sweep reads back whatever has not arrived yet.
  await waitUntil(
    async () => {
      await reconcileOpenSessions({ quietForSeconds: 0 });
      return world.rows<{ n: number }>(`SELECT count(*)::int AS n FROM orders WHERE id = ANY($1::uuid[]) AND state = 'paid'`, [orderIds]);
    },
    (rows) => rows[0]!.n === 5,
    30_000,
  );
  const first = (await world.rows<{ id: string }>(`SELECT id FROM orders WHERE id = ANY($1::uuid[]) ORDER BY created_at LIMIT 1`, [orderIds]))[0]!.id;
  let refund = { status: 'pending' as string };
  for (let attempt = 0; attempt < 10 && refund.status === 'pending'; attempt += 1) {
    try {
      refund = attempt === 0 ? await refundOrder(await world.owner(), { mode: 'all', orderId: first, reason: 'failed_casting', note: '', restock: false }) : { status: (await retryPendingRefunds(0)) > 0 ? 'succeeded' : 'pending' };
    } catch (error) {
      throw new Error(`refund refused: ${(error as Error).message}`);
    }
  }
  await sweepPayments();
  // Let the repeated deliveries finish before counting.
  await waitUntil(async () => (await control<{ webhooks: Record<string, number> }>(world.fake(), 'state')).body.webhooks, (w) => !w.pending, 30_000).catch(() => undefined);
  await new Promise((resolve) => setTimeout(resolve, 500));
  // The bad day is over; now read Stripe's record to compare (the checks themselves must not be faulted).
  await control(world.fake(), 'faults', {});

  const [totals] = await world.rows<{ orders: number; paid: number; refunded: number }>(
    `SELECT count(*)::int AS orders, sum(paid_minor)::int AS paid, sum(refunded_minor)::int AS refunded FROM orders WHERE id = ANY($1::uuid[])`,
    [orderIds],
  );
  const mails = await world.rows<{ dedupe_key: string }>(`SELECT dedupe_key FROM mail_outbox WHERE dedupe_key LIKE ANY($1::text[])`, [
    orderIds.map((id) => `order-confirmation:${id}`),
  ]);
  const refundMails = await world.rows(`SELECT 1 FROM mail_outbox m JOIN refunds r ON m.dedupe_key = 'refund:' || r.id WHERE r.order_id = ANY($1::uuid[])`, [orderIds]);
  // Stripe's own record must agree with ours: what each payment took and what went back.
  const stripe = sdk(world.fake());
  const sessions = await stripe.checkout.sessions.list({ limit: 100 });
  const sessionsPerOrder = orderIds.map((id) => sessions.data.filter((s) => s.metadata?.order_id === id).length);
  const ours = await world.rows<{ payment_intent_id: string; paid_minor: number; refunded_minor: number }>(
    `SELECT payment_intent_id, paid_minor, refunded_minor FROM orders WHERE id = ANY($1::uuid[])`,
    [orderIds],
  );
  for (const order of ours) {
    const intent = await stripe.paymentIntents.retrieve(order.payment_intent_id);
    expect(intent.amount_received).toBe(order.paid_minor);
    const refunds = await stripe.refunds.list({ payment_intent: order.payment_intent_id });
    expect(refunds.data.reduce((sum, r) => sum + r.amount, 0)).toBe(order.refunded_minor);
  }
  const stock = await world.stock(batch.stockId);
  expect(stock.quantity).toBe(stock.available + stock.held + stock.sold);
  return {
    orders: totals!.orders,
    paidTotal: totals!.paid,
    refundedTotal: totals!.refunded,
    sold: stock.sold,
    confirmations: mails.length,
    refundMails: refundMails.length,
    sessionsPerOrder,
  };
}

describe('payments when Stripe has a bad day', () => {
  it('30% failed requests and every webhook three times in random order leave the same orders, stock and e-mails as a clean run', async () => {
    const clean = await runDrop('clean');
    expect(clean).toMatchObject({ orders: 5, sold: 5, confirmations: 5, refundMails: 1, sessionsPerOrder: [1, 1, 1, 1, 1] });
    expect(clean.refundedTotal).toBe(clean.paidTotal / 5);

    await control(world.fake(), 'faults', { failRate: 0.3, seed: 7, webhook: { repeat: 3, shuffle: true } });
    const before = (await control<{ data: { fault: string | null }[] }>(world.fake(), 'requests')).body.data.filter((r) => r.fault).length;
    const faulty = await runDrop('faulty');
    expect(faulty).toEqual(clean);
    // The faults really happened: requests were failed, and webhooks were sent more than once each.
    const failed = (await control<{ data: { fault: string | null }[] }>(world.fake(), 'requests')).body.data.filter((r) => r.fault).length - before;
    expect(failed).toBeGreaterThan(0);
    const deliveries = (await control<{ data: { event_id: string }[] }>(world.fake(), 'webhooks')).body.data;
    expect(deliveries.length).toBeGreaterThan(new Set(deliveries.map((d) => d.event_id)).size);
    const repeated = await world.rows<{ n: number }>(`SELECT count(*)::int AS n FROM payment_events WHERE outcome = 'duplicate'`);
    // Duplicates are answered without being recorded again: each event id is in the table once.
    expect(repeated[0]!.n).toBe(0);
  });

  it('a Stripe that answers after 10 seconds still takes one payment and one refund', async () => {
    const { createHold } = await import('@/lib/drops/holds');
    const { startCheckout } = await import('@/lib/orders/checkout');
    const { refundOrder } = await import('@/lib/orders/refunds');
    const batch = await world.freshBatch(1);
    const buyer = await world.buyer('patient@example.com');
    const hold = await createHold(buyer, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
    const rate = await world.irishRate(buyer, hold.id);
    await control(world.fake(), 'faults', { latencyMs: 10_000 });
    const started = Date.now();
    const checkout = await startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: rate });
    expect(Date.now() - started).toBeGreaterThanOrEqual(10_000);
    await pay(world.fake(), checkout.url);
    const order = await waitUntil(() => world.order(hold.id), (o) => o?.state === 'paid', 30_000);
    const refund = await refundOrder(await world.owner(), { mode: 'all', orderId: order!.id, reason: 'buyer_request', note: '', restock: true });
    expect(refund.status).toBe('succeeded');
    await control(world.fake(), 'faults', {});
    const refunds = await sdk(world.fake()).refunds.list({ payment_intent: order!.payment_intent_id! });
    expect(refunds.data).toHaveLength(1);
    expect(await world.stock(batch.stockId)).toMatchObject({ quantity: 1, sold: 0, available: 1 });
  }, 90_000);
});
