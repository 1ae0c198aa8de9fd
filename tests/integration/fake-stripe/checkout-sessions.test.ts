import { describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import type { FakeStripe } from '../../../fake-services/stripe/server';
import {
  control,
  inMinutes,
  maskOrder,
  ORDER_SUBTOTAL,
  payByControl,
  type Receiver,
  stripeError,
  withFakeStripe,
} from './helpers';

let fake: FakeStripe;
let receiver: Receiver;
let stripe: Stripe;

withFakeStripe((started) => ({ fake, receiver, stripe } = started));

async function invalid(promise: Promise<unknown>): Promise<Stripe.errors.StripeError> {
  const error = await stripeError(promise);
  expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
  return error;
}

describe('creating a Checkout Session', () => {
  it('answers with an open session that carries what was sent', async () => {
    const session = await stripe.checkout.sessions.create(maskOrder({ expand: ['line_items'] }));
    expect(session).toMatchObject({
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      currency: 'eur',
      customer_email: 'wren.hollis@example.test',
      client_reference_id: 'order_1001',
      metadata: { hold_id: 'hold_ibex_42', studio: 'marrowgate' },
      shipping_address_collection: { allowed_countries: ['IE', 'FR'] },
      amount_subtotal: ORDER_SUBTOTAL,
      // Stripe preselects the first shipping option.
      amount_total: ORDER_SUBTOTAL + 600,
      total_details: { amount_discount: 0, amount_shipping: 600, amount_tax: 0 },
      payment_intent: null,
    });
    expect(session.url).toBe(`${fake.url}/pay/${session.id}`);
    expect(session.shipping_options.map((o) => o.shipping_amount)).toEqual([600, 1_500]);
    expect(session.line_items?.data.map((li) => [li.description, li.quantity, li.amount_total])).toEqual([
      ['Ibex — Old Bone', 2, 17_000],
      ['Moth — Verdigris', 1, 12_000],
    ]);

    const items = await stripe.checkout.sessions.listLineItems(session.id, {
      expand: ['data.price.product'],
    });
    expect(items.object).toBe('list');
    expect(items.has_more).toBe(false);
    const product = items.data[0]?.price?.product as Stripe.Product;
    expect(product).toMatchObject({
      object: 'product',
      name: 'Ibex — Old Bone',
      description: 'Hand-carved, Marrowgate Studio',
    });
    const page = await stripe.checkout.sessions.listLineItems(session.id, { limit: 1 });
    expect(page.data).toHaveLength(1);
    expect(page.has_more).toBe(true);

    const rate = (
      await stripe.checkout.sessions.retrieve(session.id, { expand: ['shipping_cost.shipping_rate'] })
    ).shipping_cost?.shipping_rate as Stripe.ShippingRate;
    expect(rate).toMatchObject({
      object: 'shipping_rate',
      display_name: 'Tracked post',
      fixed_amount: { amount: 600, currency: 'eur' },
    });
  });

  it('accepts expires_at from 30 minutes to 24 hours ahead, and defaults to 24 hours', async () => {
    const at = inMinutes(31);
    const soon = await stripe.checkout.sessions.create(maskOrder({ expires_at: at }));
    expect(soon.expires_at).toBe(at);
    const late = await stripe.checkout.sessions.create(maskOrder({ expires_at: inMinutes(23 * 60 + 50) }));
    expect(late.status).toBe('open');
    const unset = await stripe.checkout.sessions.create(maskOrder({ expires_at: undefined }));
    expect(unset.expires_at - unset.created).toBe(24 * 3600);
  });

  it.each([
    ['29 minutes', 29],
    ['25 hours', 25 * 60],
    ['in the past', -5],
  ])('refuses expires_at %s ahead with a 400 naming expires_at', async (_label, minutes) => {
    const error = await invalid(
      stripe.checkout.sessions.create(maskOrder({ expires_at: inMinutes(minutes) })),
    );
    expect(error.statusCode).toBe(400);
    expect(error.param).toBe('expires_at');
    expect(error.message).toMatch(/expires_at/);
  });

  it("refuses bad parameters with Stripe's codes and bracketed names", async () => {
    const missing = await invalid(
      stripe.checkout.sessions.create({
        mode: 'payment',
        line_items: [{ price_data: { currency: 'eur', product_data: { name: 'Hare' } }, quantity: 1 }],
      }),
    );
    expect([missing.code, missing.param]).toEqual([
      'parameter_missing',
      'line_items[0][price_data][unit_amount]',
    ]);
    const unknown = await invalid(
      stripe.checkout.sessions.create({
        ...maskOrder(),
        colour: 'soot',
      } as Stripe.Checkout.SessionCreateParams),
    );
    expect([unknown.code, unknown.param]).toEqual(['parameter_unknown', 'colour']);
    const notInt = await invalid(
      stripe.checkout.sessions.create(
        maskOrder({
          line_items: [
            {
              price_data: { currency: 'eur', unit_amount: 12.5, product_data: { name: 'Boar' } },
              quantity: 1,
            },
          ],
        }),
      ),
    );
    expect([notInt.code, notInt.param]).toEqual([
      'parameter_invalid_integer',
      'line_items[0][price_data][unit_amount]',
    ]);
    const mixed = await invalid(
      stripe.checkout.sessions.create(
        maskOrder({
          shipping_options: [
            {
              shipping_rate_data: {
                display_name: 'Post',
                type: 'fixed_amount',
                fixed_amount: { amount: 500, currency: 'gbp' },
              },
            },
          ],
        }),
      ),
    );
    expect(mixed.param).toBe('shipping_options[0][shipping_rate_data][fixed_amount][currency]');
    const badUrl = await invalid(stripe.checkout.sessions.create(maskOrder({ success_url: 'not a url' })));
    expect([badUrl.code, badUrl.param]).toEqual(['url_invalid', 'success_url']);
    const badEmail = await invalid(
      stripe.checkout.sessions.create(maskOrder({ customer_email: 'wren-at-example' })),
    );
    expect(badEmail.param).toBe('customer_email');
    const session = await stripe.checkout.sessions.create(maskOrder());
    for (const path of ['amount_total', 'constructor.prototype', '__proto__']) {
      const badExpand = await invalid(stripe.checkout.sessions.retrieve(session.id, { expand: [path] }));
      expect(badExpand.param).toBe('expand[0]');
    }
    const missingSession = await stripeError(stripe.checkout.sessions.retrieve('cs_test_nothing_here'));
    expect([missingSession.statusCode, missingSession.code]).toEqual([404, 'resource_missing']);
  });
});

describe('expiring a Checkout Session', () => {
  it('expires an open session and tells the app with checkout.session.expired', async () => {
    const session = await stripe.checkout.sessions.create(maskOrder());
    const expired = await stripe.checkout.sessions.expire(session.id);
    expect(expired.status).toBe('expired');
    expect(expired.url).toBeNull();
    await receiver.waitFor(() => receiver.of('checkout.session.expired').length === 1);
    const event = receiver.of('checkout.session.expired')[0]?.event;
    expect(event?.data.object).toMatchObject({
      id: session.id,
      status: 'expired',
      metadata: { hold_id: 'hold_ibex_42' },
    });
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('expired');
    const page = await fetch(session.url ?? '');
    expect(page.status).toBe(410);
    expect(await page.text()).toContain('This checkout has expired');
    expect((await payByControl(fake, session.id)).status).toBe(409);
  });

  it('refuses to expire a session that is already complete or expired', async () => {
    const paid = await stripe.checkout.sessions.create(maskOrder());
    await payByControl(fake, paid.id);
    const error = await invalid(stripe.checkout.sessions.expire(paid.id));
    expect(error.statusCode).toBe(400);
    expect((await stripe.checkout.sessions.retrieve(paid.id)).status).toBe('complete');

    const gone = await stripe.checkout.sessions.create(maskOrder());
    await stripe.checkout.sessions.expire(gone.id);
    await invalid(stripe.checkout.sessions.expire(gone.id));
    await receiver.waitFor(() => receiver.of('checkout.session.expired').length === 1);
    await new Promise((r) => setTimeout(r, 100));
    expect(receiver.of('checkout.session.expired')).toHaveLength(1);
  });

  it('expires a session by itself once its expires_at passes on the clock, cancelling a declined payment', async () => {
    const session = await stripe.checkout.sessions.create(maskOrder({ expires_at: inMinutes(40) }));
    const declined = await payByControl(fake, session.id, '4000000000000002');
    expect(declined.status).toBe(402);
    await control(fake, 'clock', { advanceSeconds: 39 * 60 });
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
    await control(fake, 'clock', { advanceSeconds: 2 * 60 });
    await receiver.waitFor(() => receiver.of('checkout.session.expired').length === 1);
    const after = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] });
    expect(after.status).toBe('expired');
    expect((after.payment_intent as Stripe.PaymentIntent).status).toBe('canceled');
    const listed = await stripe.checkout.sessions.list({ status: 'expired' });
    expect(listed.data.map((s) => s.id)).toEqual([session.id]);
  });
});
