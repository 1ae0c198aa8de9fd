import { afterEach, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import type { FakeStripe } from '../../../fake-services/stripe/server';
import type { Delivery } from '../../../fake-services/stripe/webhooks';
import {
  control,
  FAST_RETRIES,
  maskOrder,
  payByControl,
  type Receiver,
  sdk,
  startFake,
  startReceiver,
  WEBHOOK_SECRET,
  stripeError,
} from './helpers';

const opened: Array<{ close(): Promise<void> }> = [];

afterEach(async () => {
  await Promise.all(opened.splice(0).map((o) => o.close()));
});

async function setUp(
  answer?: (n: number) => number,
): Promise<{ fake: FakeStripe; receiver: Receiver; stripe: Stripe }> {
  const receiver = await startReceiver(answer);
  const fake = await startFake({ webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET });
  opened.push(fake, receiver);
  return { fake, receiver, stripe: sdk(fake) };
}

async function deliveries(fake: FakeStripe, type?: string): Promise<Delivery[]> {
  return (await control<{ data: Delivery[] }>(fake, `webhooks${type ? `?type=${type}` : ''}`)).body.data;
}

describe('faults for /v1', () => {
  it('failRate 1 answers 500 api_error to every request, and the SDK throws StripeAPIError', async () => {
    const { fake } = await setUp();
    const stripe = sdk(fake, { maxNetworkRetries: 0 });
    expect((await control(fake, 'faults', { failRate: 1 })).status).toBe(200);
    const error = await stripeError(stripe.checkout.sessions.create(maskOrder()));
    expect(error).toBeInstanceOf(Stripe.errors.StripeAPIError);
    expect([error.statusCode, error.rawType]).toEqual([500, 'api_error']);
    const state = await control<{ checkout_sessions: { total: number }; requests: number }>(fake, 'state');
    expect(state.body.checkout_sessions.total).toBe(0);
    const { body } = await control<{ data: Array<{ fault: string | null; status: number }> }>(
      fake,
      'requests',
    );
    expect(body.data.at(-1)).toMatchObject({ fault: 'fail_rate', status: 500 });

    await control(fake, 'faults', {});
    expect((await stripe.checkout.sessions.create(maskOrder())).status).toBe('open');
  });

  it('fails the same requests for the same seed, and an SDK retry with its idempotency key recovers', async () => {
    const { fake } = await setUp();
    const stripe = sdk(fake, { maxNetworkRetries: 0 });
    const session = await stripe.checkout.sessions.create(maskOrder());
    const pattern = async () => {
      const outcomes: boolean[] = [];
      for (let i = 0; i < 12; i += 1)
        outcomes.push(
          await stripe.checkout.sessions.retrieve(session.id).then(
            () => true,
            () => false,
          ),
        );
      return outcomes;
    };
    await control(fake, 'faults', { failRate: 0.5, seed: 7 });
    const first = await pattern();
    await control(fake, 'faults', { failRate: 0.5, seed: 7 });
    expect(await pattern()).toEqual(first);
    expect(first).toContain(true);
    expect(first).toContain(false);

    // An injected failure is not saved under the key, so the retry runs the request for real.
    await control(fake, 'faults', { failRate: 1 });
    const failed = await stripeError(
      stripe.checkout.sessions.create(maskOrder(), { idempotencyKey: 'flaky-create' }),
    );
    expect(failed).toBeInstanceOf(Stripe.errors.StripeAPIError);
    await control(fake, 'faults', {});
    const created = await stripe.checkout.sessions.create(maskOrder(), { idempotencyKey: 'flaky-create' });
    expect(created.lastResponse.headers['idempotent-replayed']).toBeUndefined();
  });

  it('applies latencyMs to every request', async () => {
    const { fake, stripe } = await setUp();
    const session = await stripe.checkout.sessions.create(maskOrder());
    await control(fake, 'faults', { latencyMs: 1_500 });
    const started = performance.now();
    await stripe.checkout.sessions.retrieve(session.id);
    const slow = performance.now() - started;
    expect(slow).toBeGreaterThanOrEqual(1_500);
    await control(fake, 'faults', {});
    const quick = performance.now();
    await stripe.checkout.sessions.retrieve(session.id);
    // A wide margin: on a busy two-core machine an ordinary request can take a few hundred milliseconds.
    expect(performance.now() - quick).toBeLessThan(slow - 750);
  });

  it('answers a second request with the same key 409 while the first is still running', async () => {
    const { fake, stripe } = await setUp();
    await control(fake, 'faults', { latencyMs: 500 });
    const noRetry = sdk(fake, { maxNetworkRetries: 0 });
    const first = stripe.checkout.sessions.create(maskOrder(), { idempotencyKey: 'double-click' });
    // The key is claimed before the latency starts; wait for that rather than guess a delay.
    const deadline = Date.now() + 2_000;
    while ((await control<{ idempotency_keys: number }>(fake, 'state')).body.idempotency_keys === 0) {
      if (Date.now() > deadline) throw new Error('the first request never reached the fake');
      await new Promise((r) => setTimeout(r, 10));
    }
    const second = await stripeError(
      noRetry.checkout.sessions.create(maskOrder(), { idempotencyKey: 'double-click' }),
    );
    expect(second.statusCode).toBe(409);
    expect(second.rawType).toBe('idempotency_error');
    expect((await first).status).toBe('open');
  });

  it('refuses bad fault settings', async () => {
    const { fake } = await setUp();
    expect((await control(fake, 'faults', { failRate: 2 })).status).toBe(400);
    expect((await control(fake, 'faults', { latencyMs: -1 })).status).toBe(400);
    expect((await control(fake, 'faults', { webhook: { repeat: 0 } })).status).toBe(400);
    expect((await control(fake, 'faults', { surprise: true })).status).toBe(400);
  });
});

describe('faults for webhooks', () => {
  it('repeat: 3 delivers the same event three times', async () => {
    const { fake, receiver, stripe } = await setUp();
    await control(fake, 'faults', { webhook: { repeat: 3 } });
    const session = await stripe.checkout.sessions.create(maskOrder());
    await payByControl(fake, session.id);
    await receiver.waitFor(() => receiver.of('checkout.session.completed').length === 3);
    const ids = new Set(receiver.of('checkout.session.completed').map((r) => r.event.id));
    expect(ids.size).toBe(1);
    for (const { raw, signature } of receiver.of('checkout.session.completed'))
      stripe.webhooks.constructEvent(raw, signature, WEBHOOK_SECRET);
  });

  it('retries with back-off while the endpoint fails: 500, 500, then 200 makes three attempts', async () => {
    const { fake, receiver, stripe } = await setUp((n) => (n <= 2 ? 500 : 200));
    const session = await stripe.checkout.sessions.create(maskOrder());
    await stripe.checkout.sessions.expire(session.id);
    await receiver.waitFor(() => receiver.received.length === 3);
    expect(new Set(receiver.received.map((r) => r.event.id)).size).toBe(1);
    const gaps = [1, 2].map((i) => (receiver.received[i]?.at ?? 0) - (receiver.received[i - 1]?.at ?? 0));
    expect(gaps[0]).toBeGreaterThanOrEqual((FAST_RETRIES[0] ?? 0) - 20);
    expect(gaps[1]).toBeGreaterThanOrEqual((FAST_RETRIES[1] ?? 0) - 20);
    const [delivery] = await deliveries(fake, 'checkout.session.expired');
    expect(delivery?.status).toBe('succeeded');
    expect(delivery?.attempts.map((a) => a.status_code)).toEqual([500, 500, 200]);
    await new Promise((r) => setTimeout(r, 300));
    expect(receiver.received).toHaveLength(3);
  });

  it('gives up after the schedule runs out', async () => {
    const { fake, receiver, stripe } = await setUp(() => 503);
    const session = await stripe.checkout.sessions.create(maskOrder());
    await stripe.checkout.sessions.expire(session.id);
    await receiver.waitFor(() => receiver.received.length === FAST_RETRIES.length + 1, 4_000);
    // The fake records the last attempt after the endpoint answered: read the delivery once it is settled.
    let [delivery] = await deliveries(fake, 'checkout.session.expired');
    for (let tries = 0; delivery?.status !== 'failed' && tries < 50; tries += 1) {
      await new Promise((r) => setTimeout(r, 100));
      [delivery] = await deliveries(fake, 'checkout.session.expired');
    }
    expect(delivery?.status).toBe('failed');
    expect(delivery?.attempts).toHaveLength(FAST_RETRIES.length + 1);
    expect((await stripe.events.retrieve(delivery?.event_id ?? '')).pending_webhooks).toBe(1);
  });

  it('drop keeps the event from the endpoint but not from GET /v1/events', async () => {
    const { fake, receiver, stripe } = await setUp();
    await control(fake, 'faults', { webhook: { drop: true } });
    const session = await stripe.checkout.sessions.create(maskOrder());
    await stripe.checkout.sessions.expire(session.id);
    await new Promise((r) => setTimeout(r, 200));
    expect(receiver.received).toHaveLength(0);
    expect((await deliveries(fake)).map((d) => d.status)).toEqual(['dropped']);
    expect((await stripe.events.list({ type: 'checkout.session.expired' })).data).toHaveLength(1);
  });

  it('shuffle sends the events of one payment in another order than they happened', async () => {
    const { fake, receiver, stripe } = await setUp();
    await control(fake, 'faults', { webhook: { shuffle: true } });
    const session = await stripe.checkout.sessions.create(maskOrder());
    await payByControl(fake, session.id);
    const happened = [
      'payment_intent.created',
      'charge.succeeded',
      'payment_intent.succeeded',
      'checkout.session.completed',
    ];
    await receiver.waitFor(() => receiver.received.length === happened.length);
    const arrived = receiver.received.map((r) => r.event.type);
    expect([...arrived].sort()).toEqual([...happened].sort());
    expect(arrived).not.toEqual(happened);
  });
});
