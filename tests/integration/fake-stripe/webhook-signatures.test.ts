import { describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import type { FakeStripe } from '../../../fake-services/stripe/server';
import {
  control,
  maskOrder,
  payByControl,
  type Receiver,
  startReceiver,
  WEBHOOK_SECRET,
  withFakeStripe,
} from './helpers';

let fake: FakeStripe;
let receiver: Receiver;
let stripe: Stripe;

withFakeStripe((started) => ({ fake, receiver, stripe } = started));

describe('webhook signatures', () => {
  it("verify with the SDK's own constructEvent, and a tampered body or another secret is refused", async () => {
    const session = await stripe.checkout.sessions.create(maskOrder());
    await payByControl(fake, session.id);
    await receiver.waitFor(() => receiver.of('checkout.session.completed').length === 1);
    const delivery = receiver.of('checkout.session.completed')[0];
    if (!delivery) throw new Error('no delivery');

    expect(delivery.signature).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
    const event = stripe.webhooks.constructEvent(delivery.raw, delivery.signature, WEBHOOK_SECRET);
    expect(event.id).toBe(delivery.event.id);
    expect(event.type).toBe('checkout.session.completed');
    const completed = event.data.object as Stripe.Checkout.Session;
    expect(completed.id).toBe(session.id);
    expect(completed.metadata).toEqual({ hold_id: 'hold_ibex_42', studio: 'marrowgate' });

    const tampered = delivery.raw.replace(`"amount_total": ${completed.amount_total}`, '"amount_total": 1');
    expect(tampered).not.toBe(delivery.raw);
    expect(() => stripe.webhooks.constructEvent(tampered, delivery.signature, WEBHOOK_SECRET)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
    expect(() =>
      stripe.webhooks.constructEvent(delivery.raw, delivery.signature, 'whsec_someone_else'),
    ).toThrow(Stripe.errors.StripeSignatureVerificationError);
  });

  it("sends events shaped like Stripe's, rendered with the app's API version and naming the request", async () => {
    const session = await stripe.checkout.sessions.create(maskOrder());
    await payByControl(fake, session.id);
    await receiver.waitFor(() => receiver.of('payment_intent.succeeded').length === 1);
    const { payment_intent: paymentIntent } = await stripe.checkout.sessions.retrieve(session.id);
    const refund = await stripe.refunds.create(
      { payment_intent: paymentIntent as string },
      { idempotencyKey: 'refund-order-1001' },
    );
    await receiver.waitFor(() => receiver.of('refund.created').length === 1);

    for (const { raw, signature } of receiver.received)
      stripe.webhooks.constructEvent(raw, signature, WEBHOOK_SECRET);
    const succeeded = receiver.of('payment_intent.succeeded')[0]?.event;
    expect(succeeded).toMatchObject({
      object: 'event',
      livemode: false,
      api_version: Stripe.API_VERSION,
      pending_webhooks: 1,
    });
    expect(succeeded?.request).toEqual({ id: null, idempotency_key: null });
    const created = receiver.of('refund.created')[0]?.event;
    expect(created?.data.object.id).toBe(refund.id);
    expect(created?.request).toEqual({
      id: refund.lastResponse.requestId,
      idempotency_key: 'refund-order-1001',
    });

    const stored = await stripe.events.retrieve(created?.id ?? '');
    expect(stored.type).toBe('refund.created');
    expect(stored.pending_webhooks).toBe(0);
    const listed = await stripe.events.list({ types: ['refund.created', 'charge.refunded'] });
    expect(listed.data.map((e) => e.type).sort()).toEqual(['charge.refunded', 'refund.created']);
  });

  it('takes the endpoint and secret from the control API too', async () => {
    const other = await startReceiver();
    try {
      const set = await control(fake, 'webhook-endpoint', {
        url: other.url,
        secret: 'whsec_second_endpoint',
      });
      expect(set.status).toBe(200);
      const session = await stripe.checkout.sessions.create(maskOrder());
      await stripe.checkout.sessions.expire(session.id);
      await other.waitFor(() => other.of('checkout.session.expired').length === 1);
      const delivery = other.of('checkout.session.expired')[0];
      expect(() =>
        stripe.webhooks.constructEvent(
          delivery?.raw ?? '',
          delivery?.signature ?? '',
          'whsec_second_endpoint',
        ),
      ).not.toThrow();
      expect(receiver.of('checkout.session.expired')).toHaveLength(0);
      expect(
        (await control(fake, 'webhook-endpoint', { url: 'ftp://nowhere', secret: 'whsec_x' })).status,
      ).toBe(400);
      expect(
        (await control(fake, 'webhook-endpoint', { url: other.url, secret: 'not-a-secret' })).status,
      ).toBe(400);
    } finally {
      await other.close();
    }
  });
});
