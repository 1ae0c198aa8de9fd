import { describe, expect, it } from 'vitest';
import { sdk } from '../fake-stripe/helpers';
import { pay, waitUntil, withCheckoutWorld } from './support';

const world = withCheckoutWorld('refunds');

async function paidOrder(email: string, quantity = 1, batch?: Awaited<ReturnType<typeof world.freshBatch>>) {
  const { createHold } = await import('@/lib/drops/holds');
  const { startCheckout } = await import('@/lib/orders/checkout');
  const stock = batch ?? (await world.freshBatch(4, { perBuyerLimit: 2 }));
  const buyer = await world.buyer(email);
  const hold = await createHold(buyer, { batchId: stock.batchId, finishId: stock.finishId, quantity });
  const checkout = await startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: await world.irishRate(buyer, hold.id) });
  await pay(world.fake(), checkout.url);
  const order = await waitUntil(() => world.order(hold.id), (o) => o?.state === 'paid');
  return { stock, buyer, hold, order: order!, checkout };
}

describe('the late payment', () => {
  it('a payment after the hold ended and the stock went to someone else becomes an oversold line, never a lost payment', async () => {
    const { createHold, expireHolds } = await import('@/lib/drops/holds');
    const { startCheckout } = await import('@/lib/orders/checkout');
    const batch = await world.freshBatch(1);
    const late = await world.buyer('late@example.com');
    const hold = await createHold(late, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
    const checkout = await startCheckout(late, { holdId: hold.id, country: 'IE', shippingRateId: await world.irishRate(late, hold.id) });
    // The hold runs out while the buyer is still on the payment page…
    await world.rows(`UPDATE holds SET expires_at = now() - interval '1 second' WHERE id = $1`, [hold.id]);
    await expireHolds();
    // …and someone else holds and pays for the last mask.
    const quick = await paidOrder('quick@example.com', 1, batch);
    expect(await world.stock(batch.stockId)).toMatchObject({ quantity: 1, held: 0, sold: 1, available: 0 });
    // Now the first buyer's payment completes.
    expect((await pay(world.fake(), checkout.url)).status).toBe(200);
    const order = await waitUntil(() => world.order(hold.id), (o) => o?.state === 'paid');
    expect(order!.paid_minor).toBeGreaterThan(0);
    const lines = await world.rows<{ oversold: boolean; oversold_reason: string; counted_in_stock: boolean }>(
      `SELECT oversold, oversold_reason, counted_in_stock FROM order_lines WHERE order_id = $1`,
      [order!.id],
    );
    expect(lines).toEqual([{ oversold: true, oversold_reason: 'stock_gone', counted_in_stock: false }]);
    // The stock rule still holds; sold never passes quantity.
    expect(await world.stock(batch.stockId)).toMatchObject({ quantity: 1, held: 0, sold: 1, available: 0 });
    const { listOversoldLines } = await import('@/lib/orders/queries');
    expect((await listOversoldLines()).map((l) => l.orderNumber)).toContain(order!.number);
    const mail = await world.outbox(order!.number);
    expect(mail.some((m) => m.dedupe_key === `order-confirmation:${order!.id}`)).toBe(true);
    expect(mail.filter((m) => m.dedupe_key.startsWith(`oversold-alert:${order!.id}`)).length).toBeGreaterThan(0);
    expect(quick.order.state).toBe('paid');

    // The maker refunds it in one step: the whole amount goes back, the line is settled, the buyer gets the apology.
    const { refundOrder } = await import('@/lib/orders/refunds');
    const [line] = await world.rows<{ id: string }>(`SELECT id FROM order_lines WHERE order_id = $1`, [order!.id]);
    const result = await refundOrder(await world.owner(), { mode: 'lines', orderId: order!.id, lineIds: [line!.id], reason: 'oversold', note: '', restock: false });
    expect(result.status).toBe('succeeded');
    const refunded = (await world.order(order!.number))!;
    expect(refunded.state).toBe('refunded');
    expect(refunded.refunded_minor).toBe(refunded.paid_minor);
    expect((await listOversoldLines()).map((l) => l.orderNumber)).not.toContain(order!.number);
    const stripeRefunds = await sdk(world.fake()).refunds.list({ payment_intent: refunded.payment_intent_id! });
    expect(stripeRefunds.data.map((r) => r.amount)).toEqual([refunded.paid_minor]);
    const apology = (await world.outbox(order!.number)).filter((m) => m.dedupe_key.startsWith('refund:'));
    expect(apology).toHaveLength(1);
    expect(apology[0]!.subject).toMatch(/Sorry/);
    expect(await world.stock(batch.stockId)).toMatchObject({ quantity: 1, sold: 1 });
  });

  it('the maker can confirm an extra will be cast: the batch grows by one and the line counts as sold', async () => {
    const { createHold, expireHolds } = await import('@/lib/drops/holds');
    const { startCheckout } = await import('@/lib/orders/checkout');
    const { confirmExtraCast } = await import('@/lib/orders/refunds');
    const batch = await world.freshBatch(1);
    const late = await world.buyer('extra@example.com');
    const hold = await createHold(late, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
    const checkout = await startCheckout(late, { holdId: hold.id, country: 'IE', shippingRateId: await world.irishRate(late, hold.id) });
    await world.rows(`UPDATE holds SET expires_at = now() - interval '1 second' WHERE id = $1`, [hold.id]);
    await expireHolds();
    await paidOrder('first-come@example.com', 1, batch);
    await pay(world.fake(), checkout.url);
    const order = await waitUntil(() => world.order(hold.id), (o) => o?.state === 'paid');
    const [line] = await world.rows<{ id: string }>(`SELECT id FROM order_lines WHERE order_id = $1`, [order!.id]);
    await confirmExtraCast(await world.owner(), line!.id);
    expect(await world.stock(batch.stockId)).toMatchObject({ quantity: 2, sold: 2, available: 0 });
    await expect(confirmExtraCast(await world.owner(), line!.id)).rejects.toMatchObject({ code: 'line_not_oversold' });
  });

  it('a late payment that still finds stock is simply sold', async () => {
    const { createHold, expireHolds } = await import('@/lib/drops/holds');
    const { startCheckout } = await import('@/lib/orders/checkout');
    const batch = await world.freshBatch(2);
    const buyer = await world.buyer('slow@example.com');
    const hold = await createHold(buyer, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
    const checkout = await startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: await world.irishRate(buyer, hold.id) });
    await world.rows(`UPDATE holds SET expires_at = now() - interval '1 second' WHERE id = $1`, [hold.id]);
    await expireHolds();
    await pay(world.fake(), checkout.url);
    const order = await waitUntil(() => world.order(hold.id), (o) => o?.state === 'paid');
    const lines = await world.rows<{ oversold: boolean }>(`SELECT oversold FROM order_lines WHERE order_id = $1`, [order!.id]);
    expect(lines).toEqual([{ oversold: false }]);
    expect(await world.stock(batch.stockId)).toMatchObject({ quantity: 2, held: 0, sold: 1, available: 1 });
  });

  it('the sweep expires the session of an ended hold and cancels the unpaid order, once', async () => {
    const { createHold, expireHolds } = await import('@/lib/drops/holds');
    const { startCheckout } = await import('@/lib/orders/checkout');
    const { expireSessionsOfEndedHolds } = await import('@/lib/orders/sweeps');
    const batch = await world.freshBatch(2);
    const buyer = await world.buyer('walked-away@example.com');
    const hold = await createHold(buyer, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
    const checkout = await startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: await world.irishRate(buyer, hold.id) });
    await world.rows(`UPDATE holds SET expires_at = now() - interval '1 second' WHERE id = $1`, [hold.id]);
    await expireHolds();
    expect(await expireSessionsOfEndedHolds()).toBeGreaterThanOrEqual(1);
    const session = await sdk(world.fake()).checkout.sessions.retrieve(checkout.url.split('/').pop()!);
    expect(session.status).toBe('expired');
    const order = await waitUntil(() => world.order(hold.id), (o) => o?.state === 'cancelled');
    // The session's own expired webhook arrives too and changes nothing more.
    await waitUntil(() => world.rows(`SELECT 1 FROM payment_events WHERE type = 'checkout.session.expired' AND object_id = $1`, [session.id]), (r) => r.length === 1);
    const events = await world.rows<{ type: string }>(`SELECT type FROM order_events WHERE order_id = $1 AND type = 'cancelled'`, [order!.id]);
    expect(events).toHaveLength(1);
    expect(await world.stock(batch.stockId)).toMatchObject({ held: 0, sold: 0, available: 2 });
  });
});

describe('refunds from the workshop', () => {
  it('an amount, then the rest: partly refunded, then refunded; never more than was paid', async () => {
    const { refundOrder } = await import('@/lib/orders/refunds');
    const { order } = await paidOrder('partial@example.com');
    const owner = await world.owner();
    const first = await refundOrder(owner, { mode: 'amount', orderId: order.id, amountMinor: 5_000, reason: 'buyer_request', note: 'scratch on the horn', restock: false });
    expect(first.status).toBe('succeeded');
    expect(await world.order(order.number)).toMatchObject({ state: 'partly_refunded', refunded_minor: 5_000 });
    await expect(
      refundOrder(owner, { mode: 'amount', orderId: order.id, amountMinor: order.paid_minor, reason: 'other', note: '', restock: false }),
    ).rejects.toMatchObject({ code: 'amount_too_large', status: 422 });
    const rest = await refundOrder(owner, { mode: 'all', orderId: order.id, reason: 'other', note: '', restock: false });
    expect(rest.amountMinor).toBe(order.paid_minor - 5_000);
    expect(await world.order(order.number)).toMatchObject({ state: 'refunded', refunded_minor: order.paid_minor });
    await expect(refundOrder(owner, { mode: 'all', orderId: order.id, reason: 'other', note: '', restock: false })).rejects.toMatchObject({ code: 'nothing_left_to_refund' });
    // Stripe holds the same record: two refunds adding up to the payment.
    const refunds = await sdk(world.fake()).refunds.list({ payment_intent: order.payment_intent_id! });
    expect(refunds.data.map((r) => r.amount).sort((a, b) => a - b)).toEqual([5_000, order.paid_minor - 5_000].sort((a, b) => a - b));
    const mails = (await world.outbox(order.number)).filter((m) => m.dedupe_key.startsWith('refund:'));
    expect(mails).toHaveLength(2);
    // Stripe's reason for a buyer's request is requested_by_customer.
    expect(refunds.data.find((r) => r.amount === 5_000)!.reason).toBe('requested_by_customer');
  });

  it('chosen masks, with their stock put back on sale when the maker asks', async () => {
    const { refundOrder } = await import('@/lib/orders/refunds');
    const { stock, order } = await paidOrder('two-masks@example.com', 2);
    expect(await world.stock(stock.stockId)).toMatchObject({ quantity: 4, sold: 2, available: 2 });
    const lines = await world.rows<{ id: string; unit_price_minor: number }>(`SELECT id, unit_price_minor FROM order_lines WHERE order_id = $1 ORDER BY position`, [order.id]);
    const result = await refundOrder(await world.owner(), { mode: 'lines', orderId: order.id, lineIds: [lines[0]!.id], reason: 'failed_casting', note: '', restock: true });
    // One of two masks: its price only; the shipping stays, since the other mask still ships.
    expect(result.amountMinor).toBe(lines[0]!.unit_price_minor);
    expect(await world.stock(stock.stockId)).toMatchObject({ quantity: 4, sold: 1, available: 3 });
    const after = await world.rows<{ refunded: boolean; restocked: boolean }>(`SELECT refunded, restocked FROM order_lines WHERE order_id = $1 ORDER BY position`, [order.id]);
    expect(after).toEqual([{ refunded: true, restocked: true }, { refunded: false, restocked: false }]);
    // The last mask: its price and the shipping.
    const last = await refundOrder(await world.owner(), { mode: 'lines', orderId: order.id, lineIds: [lines[1]!.id], reason: 'failed_casting', note: '', restock: false });
    expect(last.amountMinor).toBe(order.paid_minor - lines[0]!.unit_price_minor);
    expect(await world.order(order.number)).toMatchObject({ state: 'refunded' });
    await expect(
      refundOrder(await world.owner(), { mode: 'lines', orderId: order.id, lineIds: [lines[1]!.id], reason: 'other', note: '', restock: false }),
    ).rejects.toMatchObject({ code: 'nothing_left_to_refund' });
  });

  it('a refund Stripe does not confirm stays pending and the sweep sends it again with the same key, once', async () => {
    const { refundOrder, retryPendingRefunds } = await import('@/lib/orders/refunds');
    const { control } = await import('./support');
    const { order } = await paidOrder('flaky-refund@example.com');
    await control(world.fake(), 'faults', { failRate: 1 });
    const result = await refundOrder(await world.owner(), { mode: 'all', orderId: order.id, reason: 'buyer_request', note: '', restock: false });
    expect(result.status).toBe('pending');
    expect(await world.order(order.number)).toMatchObject({ state: 'paid', refunded_minor: 0 });
    await control(world.fake(), 'faults', {});
    expect(await retryPendingRefunds(0)).toBe(1);
    expect(await retryPendingRefunds(0)).toBe(0);
    expect(await world.order(order.number)).toMatchObject({ state: 'refunded', refunded_minor: order.paid_minor });
    const refunds = await sdk(world.fake()).refunds.list({ payment_intent: order.payment_intent_id! });
    expect(refunds.data).toHaveLength(1);
  });

  it('a refund made outside the workshop, seen before its payment, is applied once the payment is', async () => {
    const { handleStripeEvent } = await import('@/lib/orders/payments');
    const { control } = await import('./support');
    const { createHold } = await import('@/lib/drops/holds');
    const { startCheckout } = await import('@/lib/orders/checkout');
    const batch = await world.freshBatch(2);
    const buyer = await world.buyer('out-of-order@example.com');
    const hold = await createHold(buyer, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
    const checkout = await startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: await world.irishRate(buyer, hold.id) });
    await control(world.fake(), 'faults', { webhook: { drop: true } });
    await pay(world.fake(), checkout.url);
    const stripe = sdk(world.fake());
    const session = await stripe.checkout.sessions.retrieve(checkout.url.split('/').pop()!);
    await stripe.refunds.create({ payment_intent: session.payment_intent as string, amount: 1_000 });
    // Deliver the events newest first: the refund before the payment it belongs to.
    const events = (await stripe.events.list({ limit: 100 })).data.filter((e) => {
      const object = e.data.object as { id?: string; payment_intent?: string };
      return object.id === session.id || object.payment_intent === session.payment_intent;
    });
    expect(events.map((e) => e.type)).toEqual(expect.arrayContaining(['refund.created', 'checkout.session.completed']));
    for (const event of events) await handleStripeEvent(event);
    for (const event of events) expect(await handleStripeEvent(event)).toMatchObject({ outcome: 'duplicate' });
    const order = (await world.order(hold.id))!;
    expect(order).toMatchObject({ state: 'partly_refunded', refunded_minor: 1_000 });
    expect(await world.stock(batch.stockId)).toMatchObject({ held: 0, sold: 1 });
  });
});
