import Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { sdk } from '../fake-stripe/helpers';
import { control, pay, waitUntil, withCheckoutWorld } from './support';

const world = withCheckoutWorld('checkout');

async function holdAndCheckout(email: string, quantity = 1, stock?: Awaited<ReturnType<typeof world.freshBatch>>) {
  const { createHold } = await import('@/lib/drops/holds');
  const { startCheckout } = await import('@/lib/orders/checkout');
  const batch = stock ?? (await world.freshBatch(3, { perBuyerLimit: 2 }));
  const buyer = await world.buyer(email);
  const hold = await createHold(buyer, { batchId: batch.batchId, finishId: batch.finishId, quantity });
  const shippingRateId = await world.irishRate(buyer, hold.id);
  const checkout = await startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId });
  return { batch, buyer, hold, checkout, shippingRateId };
}

describe('paying for a hold', () => {
  it('keeps the buyer’s note for the studio, and a changed note without a new session', async () => {
    const { createHold } = await import('@/lib/drops/holds');
    const { startCheckout } = await import('@/lib/orders/checkout');
    const { checkoutSchema } = await import('@/lib/orders/schemas');
    const batch = await world.freshBatch(3);
    const buyer = await world.buyer('note@example.com');
    const hold = await createHold(buyer, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
    const shippingRateId = await world.irishRate(buyer, hold.id);
    const input = checkoutSchema.parse({ holdId: hold.id, country: 'IE', shippingRateId, note: '  A gift for my sister:\nno price inside, please.  ' });
    const first = await startCheckout(buyer, input);
    expect((await world.order(hold.id))!.buyer_note).toBe('A gift for my sister:\nno price inside, please.');
    const again = await startCheckout(buyer, { ...input, note: 'Leave it with the neighbour at 12.' });
    expect(again.url).toBe(first.url);
    expect((await world.order(hold.id))!.buyer_note).toBe('Leave it with the neighbour at 12.');
    // A tab or an escape is not text a person typed into a note; a line break is.
    expect(checkoutSchema.safeParse({ ...input, note: 'door\tcode' }).success).toBe(false);
    expect(checkoutSchema.safeParse({ ...input, note: 'x'.repeat(501) }).success).toBe(false);
    expect(checkoutSchema.parse({ ...input, note: '   ' }).note).toBeNull();
  });

  it('turns a paid hold into an order: held becomes sold, one confirmation, totals priced on the server', async () => {
    const { batch, hold, checkout } = await holdAndCheckout('paid@example.com', 2);
    expect(await world.stock(batch.stockId)).toMatchObject({ quantity: 3, held: 2, sold: 0 });
    const order = (await world.order(hold.id))!;
    expect(order.state).toBe('awaiting_payment');

    // What Stripe was asked to charge is what the server priced: Ibex base + Old Bone (no difference) × 2,
    // plus the Irish tracked-post rate for the chargeable weight of two boxes.
    const session = await sdk(world.fake()).checkout.sessions.retrieve(checkout.url.split('/').pop()!, { expand: ['line_items'] });
    expect(session.amount_total).toBe(order.total_minor);
    expect(session.line_items?.data[0]).toMatchObject({ quantity: 2, amount_total: 48_000 });
    expect(session.metadata).toMatchObject({ order_id: order.id, order_number: order.number });
    expect(session.shipping_address_collection?.allowed_countries).toEqual(['IE']);
    // Stripe's limit: a session may expire no sooner than 30 minutes after it is made.
    expect(session.expires_at - session.created).toBeGreaterThanOrEqual(30 * 60);

    expect((await pay(world.fake(), checkout.url)).status).toBe(200);
    const paid = await waitUntil(() => world.order(order.number), (o) => o?.state === 'paid');
    expect(paid!.paid_minor).toBe(order.total_minor);
    expect(await world.stock(batch.stockId)).toMatchObject({ quantity: 3, held: 0, sold: 2, available: 1 });
    const [holdRow] = await world.rows<{ state: string }>(`SELECT state FROM holds WHERE id = $1`, [hold.id]);
    expect(holdRow!.state).toBe('converted');
    const lines = await world.rows<{ counted_in_stock: boolean; oversold: boolean }>(`SELECT counted_in_stock, oversold FROM order_lines WHERE order_id = $1`, [order.id]);
    expect(lines).toEqual([{ counted_in_stock: true, oversold: false }, { counted_in_stock: true, oversold: false }]);
    // Each change of state is recorded once, in order.
    const events = await world.rows<{ type: string; from_state: string | null; to_state: string | null }>(
      `SELECT type, from_state, to_state FROM order_events WHERE order_id = $1 ORDER BY id`,
      [order.id],
    );
    expect(events).toEqual([
      { type: 'checkout_started', from_state: null, to_state: 'awaiting_payment' },
      { type: 'paid', from_state: 'awaiting_payment', to_state: 'paid' },
    ]);
    const mail = await world.outbox(order.number);
    expect(mail.map((m) => m.dedupe_key)).toEqual([`order-confirmation:${order.id}`]);
    expect(mail[0]!.to_address).toBe('juno@example.com');
    // The included VAT at the demo's 23%: round(total × 2300 / 12300).
    const [row] = await world.rows<{ tax_included_minor: number }>(`SELECT tax_included_minor FROM orders WHERE id = $1`, [order.id]);
    expect(row!.tax_included_minor).toBe(Math.round((order.total_minor * 2300) / 12300));
  });

  it('makes one session for a double click or a retry: the idempotency key comes from the order', async () => {
    const { createHold } = await import('@/lib/drops/holds');
    const { startCheckout } = await import('@/lib/orders/checkout');
    const batch = await world.freshBatch(2);
    const buyer = await world.buyer('double@example.com');
    const hold = await createHold(buyer, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
    const shippingRateId = await world.irishRate(buyer, hold.id);
    const input = { holdId: hold.id, country: 'IE', shippingRateId };
    const results = await Promise.all([startCheckout(buyer, input), startCheckout(buyer, input), startCheckout(buyer, input)]);
    expect(new Set(results.map((r) => r.url)).size).toBe(1);
    const again = await startCheckout(buyer, input);
    expect(again.url).toBe(results[0]!.url);
    const sessions = await world.rows(`SELECT cs.id FROM checkout_sessions cs JOIN orders o ON o.id = cs.order_id WHERE o.hold_id = $1`, [hold.id]);
    expect(sessions).toHaveLength(1);
    const orders = await world.rows(`SELECT id FROM orders WHERE hold_id = $1`, [hold.id]);
    expect(orders).toHaveLength(1);
  });

  it('a new country starts a new session and expires the old one, so only one can be paid', async () => {
    const { startCheckout, getCheckoutOptions } = await import('@/lib/orders/checkout');
    const { buyer, hold, checkout } = await holdAndCheckout('mover@example.com');
    const french = await getCheckoutOptions(buyer, { holdId: hold.id, country: 'FR' });
    expect(french.options.length).toBeGreaterThan(0);
    const moved = await startCheckout(buyer, { holdId: hold.id, country: 'FR', shippingRateId: french.options[0]!.rateId });
    expect(moved.url).not.toBe(checkout.url);
    const old = await sdk(world.fake()).checkout.sessions.retrieve(checkout.url.split('/').pop()!);
    expect(old.status).toBe('expired');
    const order = (await world.order(hold.id))!;
    expect(order.state).toBe('awaiting_payment');
    expect(order.total_minor).toBe(french.options[0]!.totalMinor);
  });

  it('refuses what cannot be bought, in words the buyer can act on', async () => {
    const { startCheckout, getCheckoutOptions } = await import('@/lib/orders/checkout');
    const { createHold, releaseHold } = await import('@/lib/drops/holds');
    const batch = await world.freshBatch(2);
    const buyer = await world.buyer('refused@example.com');
    const other = await world.buyer('other@example.com');
    const hold = await createHold(buyer, { batchId: batch.batchId, finishId: batch.finishId, quantity: 1 });
    const rate = await world.irishRate(buyer, hold.id);
    await expect(startCheckout(other, { holdId: hold.id, country: 'IE', shippingRateId: rate })).rejects.toMatchObject({ code: 'hold_not_found', status: 404 });
    await expect(getCheckoutOptions(buyer, { holdId: hold.id, country: 'AQ' })).rejects.toMatchObject({ code: 'no_shipping_to_country', status: 422 });
    await expect(startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: '00000000-0000-4000-8000-000000000000' })).rejects.toMatchObject({
      code: 'shipping_option_unknown',
    });
    await releaseHold(buyer, hold.id);
    await expect(startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: rate })).rejects.toMatchObject({ code: 'hold_ended', status: 409 });
  });

  it('a declined card keeps the hold and records the failure; the buyer can pay again', async () => {
    const { hold, checkout } = await holdAndCheckout('declined@example.com');
    expect((await pay(world.fake(), checkout.url, '4000000000000002')).status).toBe(402);
    const order = (await world.order(hold.id))!;
    await waitUntil(() => world.rows(`SELECT 1 FROM order_events WHERE order_id = $1 AND type = 'payment_failed'`, [order.id]), (r) => r.length === 1);
    const [holdRow] = await world.rows<{ state: string }>(`SELECT state FROM holds WHERE id = $1`, [hold.id]);
    expect(holdRow!.state).toBe('active');
    expect((await pay(world.fake(), checkout.url)).status).toBe(200);
    await waitUntil(() => world.order(order.number), (o) => o?.state === 'paid');
  });
});

describe('the webhook endpoint', () => {
  async function post(body: string, signature: string | null) {
    const { POST } = await import('@/app/api/webhooks/stripe/route');
    const headers = new Headers({ 'Content-Type': 'application/json' });
    if (signature !== null) headers.set('Stripe-Signature', signature);
    return POST(new Request('http://127.0.0.1/api/webhooks/stripe', { method: 'POST', headers, body }), undefined);
  }
  const event = (id: string) =>
    JSON.stringify({ id, object: 'event', type: 'checkout.session.completed', created: Math.floor(Date.now() / 1000), data: { object: { id: 'cs_test_unknown', object: 'checkout.session', payment_status: 'paid', metadata: {} } } });

  it('refuses forged, missing and stale signatures with 400 and records nothing', async () => {
    const payload = event('evt_forged_1');
    const forged = Stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_not_the_endpoint_secret' });
    // Stripe's default tolerance is 300 seconds: a signature from ten minutes ago is stale.
    const stale = Stripe.webhooks.generateTestHeaderString({ payload, secret: process.env.STRIPE_WEBHOOK_SECRET!, timestamp: Math.floor(Date.now() / 1000) - 600 });
    const resigned = Stripe.webhooks.generateTestHeaderString({ payload: event('evt_other'), secret: process.env.STRIPE_WEBHOOK_SECRET! });
    for (const signature of [forged, stale, resigned, 't=1,v1=abc', null]) {
      const response = await post(payload, signature);
      expect(response.status).toBe(400);
      const body = await response.json();
      expect(body.error.code).toMatch(/^signature_(invalid|missing)$/);
    }
    expect(await world.rows(`SELECT 1 FROM payment_events WHERE id = 'evt_forged_1'`)).toHaveLength(0);
  });

  it('accepts the SDK’s own generateTestHeaderString signature; an unknown session is recorded and ignored, once', async () => {
    const payload = event('evt_sdk_signed');
    const signature = Stripe.webhooks.generateTestHeaderString({ payload, secret: process.env.STRIPE_WEBHOOK_SECRET! });
    const first = await post(payload, signature);
    expect(first.status).toBe(200);
    expect(await first.json()).toMatchObject({ received: true, outcome: 'unknown_session' });
    const second = await post(payload, signature);
    expect(await second.json()).toMatchObject({ outcome: 'duplicate' });
    expect(await world.rows(`SELECT outcome FROM payment_events WHERE id = 'evt_sdk_signed'`)).toEqual([{ outcome: 'unknown_session' }]);
  });

  it('does not read a huge body', async () => {
    const response = await post('x'.repeat(600 * 1024), 't=1,v1=abc');
    expect(response.status).toBe(413);
  });
});

describe('when the webhook does not come', () => {
  it('the sweep reads a paid session back from Stripe and makes the order', async () => {
    const { reconcileOpenSessions } = await import('@/lib/orders/sweeps');
    const { hold, checkout } = await holdAndCheckout('dropped@example.com');
    await control(world.fake(), 'faults', { webhook: { drop: true } });
    expect((await pay(world.fake(), checkout.url)).status).toBe(200);
    await new Promise((resolve) => setTimeout(resolve, 300));
    expect((await world.order(hold.id))!.state).toBe('awaiting_payment');
    await reconcileOpenSessions({ quietForSeconds: 0 });
    expect((await world.order(hold.id))!.state).toBe('paid');
  });

  it('the buyer coming back from the payment page sees the payment at once', async () => {
    const { syncReturningBuyer } = await import('@/lib/orders/sweeps');
    const { hold, checkout } = await holdAndCheckout('returning@example.com');
    await control(world.fake(), 'faults', { webhook: { drop: true } });
    await pay(world.fake(), checkout.url);
    const order = (await world.order(hold.id))!;
    await syncReturningBuyer(order.id, checkout.url.split('/').pop()!);
    expect((await world.order(hold.id))!.state).toBe('paid');
  });
});
