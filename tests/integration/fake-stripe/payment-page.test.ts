import { describe, expect, it } from 'vitest';
import type Stripe from 'stripe';
import type { FakeStripe } from '../../../fake-services/stripe/server';
import { control, maskOrder, ORDER_SUBTOTAL, payByControl, type Receiver, withFakeStripe } from './helpers';

let fake: FakeStripe;
let receiver: Receiver;
let stripe: Stripe;

withFakeStripe((started) => ({ fake, receiver, stripe } = started));

const expiryYear = new Date().getUTCFullYear() + 2;

const FRENCH_FORM = {
  email: 'ines.caradec@example.test',
  name: 'Inès Caradec',
  line1: '12 rue des Tanneurs',
  city: 'Rennes',
  postal_code: '35000',
  country: 'FR',
  card_expiry: `09 / ${String(expiryYear).slice(2)}`,
  card_cvc: '321',
};

function post(url: string, fields: Record<string, string>): Promise<Response> {
  return fetch(url, { method: 'POST', body: new URLSearchParams(fields), redirect: 'manual' });
}

describe('the hosted payment page', () => {
  it('is a labelled, plain form limited to the allowed countries and the session’s shipping options', async () => {
    const session = await stripe.checkout.sessions.create(maskOrder());
    const response = await fetch(session.url ?? '');
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toMatch(/^text\/html/);
    const html = await response.text();
    expect(html).toContain('Test payment page — no real money moves');
    expect(html).toContain('<html lang="en">');
    const countries = [...html.matchAll(/<option value="([A-Z]{2})"/g)].map((m) => m[1]);
    expect(countries).toEqual(['IE', 'FR']);
    const rates = [...html.matchAll(/name="shipping_rate" value="(shr_[^"]+)"/g)].map((m) => m[1]);
    expect(rates).toEqual(session.shipping_options.map((o) => o.shipping_rate));
    for (const [, id] of html.matchAll(/<(?:input|select) id="([^"]+)"/g))
      expect(html).toContain(`<label for="${id}"`);
    expect(html).toContain('value="wren.hollis@example.test"');
    expect(html).toContain('€170.00');
  });

  it('takes a 4242 card, redirects to success_url with the session id, and completes the session', async () => {
    const session = await stripe.checkout.sessions.create(maskOrder());
    const courier = session.shipping_options[1]?.shipping_rate as string;
    const response = await post(session.url ?? '', {
      ...FRENCH_FORM,
      card_number: '4242 4242 4242 4242',
      shipping_rate: courier,
    });
    expect(response.status).toBe(303);
    expect(response.headers.get('location')).toBe(
      `http://127.0.0.1:3999/checkout/done?session=${session.id}`,
    );

    const done = await stripe.checkout.sessions.retrieve(session.id, {
      expand: ['payment_intent.latest_charge'],
    });
    expect(done.status).toBe('complete');
    expect(done.payment_status).toBe('paid');
    expect(done.amount_subtotal).toBe(ORDER_SUBTOTAL);
    expect(done.amount_total).toBe(ORDER_SUBTOTAL + 1_500);
    expect(done.total_details?.amount_shipping).toBe(1_500);
    expect(done.shipping_cost).toMatchObject({ amount_total: 1_500, shipping_rate: courier });
    expect(done.customer_details).toMatchObject({
      email: 'ines.caradec@example.test',
      name: 'Inès Caradec',
      address: { country: 'FR', city: 'Rennes' },
    });
    expect(done.collected_information?.shipping_details).toEqual({
      name: 'Inès Caradec',
      address: {
        line1: '12 rue des Tanneurs',
        line2: null,
        city: 'Rennes',
        postal_code: '35000',
        state: null,
        country: 'FR',
      },
    });
    const pi = done.payment_intent as Stripe.PaymentIntent;
    expect(pi).toMatchObject({
      status: 'succeeded',
      amount: ORDER_SUBTOTAL + 1_500,
      amount_received: ORDER_SUBTOTAL + 1_500,
      currency: 'eur',
      metadata: { hold_id: 'hold_ibex_42' },
    });
    const charge = pi.latest_charge as Stripe.Charge;
    expect(charge).toMatchObject({
      status: 'succeeded',
      paid: true,
      captured: true,
      amount_captured: ORDER_SUBTOTAL + 1_500,
      payment_intent: pi.id,
    });
    expect(charge.payment_method_details?.card).toMatchObject({
      brand: 'visa',
      last4: '4242',
      exp_month: 9,
      exp_year: expiryYear,
    });

    await receiver.waitFor(
      () =>
        receiver.of('checkout.session.completed').length === 1 &&
        receiver.of('payment_intent.succeeded').length === 1,
    );
    expect(receiver.of('checkout.session.completed')[0]?.event.data.object).toMatchObject({
      id: session.id,
      amount_total: ORDER_SUBTOTAL + 1_500,
    });
    const again = await fetch(session.url ?? '');
    expect(await again.text()).toContain('This order is paid');
  });

  it('shows a decline on the form, keeps the session open and fires payment_intent.payment_failed; a good card then pays', async () => {
    const session = await stripe.checkout.sessions.create(maskOrder());
    const response = await post(session.url ?? '', { ...FRENCH_FORM, card_number: '4000 0000 0000 0002' });
    expect(response.status).toBe(402);
    const html = await response.text();
    expect(html).toMatch(/role="alert"[^>]*>\s*<h2>Your card was declined\./);
    expect(html).toContain('value="12 rue des Tanneurs"');

    const open = await stripe.checkout.sessions.retrieve(session.id);
    expect(open.status).toBe('open');
    expect(open.payment_status).toBe('unpaid');
    await receiver.waitFor(() => receiver.of('payment_intent.payment_failed').length === 1);
    const failed = receiver.of('payment_intent.payment_failed')[0]?.event.data
      .object as unknown as Stripe.PaymentIntent;
    expect(failed.status).toBe('requires_payment_method');
    expect(failed.last_payment_error).toMatchObject({
      type: 'card_error',
      code: 'card_declined',
      decline_code: 'generic_decline',
    });
    expect(receiver.of('checkout.session.completed')).toHaveLength(0);

    const retry = await post(session.url ?? '', { ...FRENCH_FORM, card_number: '4242424242424242' });
    expect(retry.status).toBe(303);
    const paid = await stripe.checkout.sessions.retrieve(session.id);
    expect(paid.status).toBe('complete');
    expect(paid.payment_intent).toBe(failed.id);
  });

  it('declines 4000 0000 0000 9995 for insufficient funds', async () => {
    const session = await stripe.checkout.sessions.create(maskOrder());
    const result = await payByControl(fake, session.id, '4000000000009995');
    expect(result.status).toBe(402);
    expect(result.body.error).toMatchObject({ code: 'card_declined', decline_code: 'insufficient_funds' });
    const html = await (
      await post(session.url ?? '', { ...FRENCH_FORM, card_number: '4000000000009995' })
    ).text();
    expect(html).toContain('Your card has insufficient funds.');
  });

  it('refuses a number that fails the Luhn check, and a country the shop does not ship to, without charging', async () => {
    const session = await stripe.checkout.sessions.create(maskOrder());
    const response = await post(session.url ?? '', {
      ...FRENCH_FORM,
      card_number: '4242 4242 4242 4241',
      country: 'DE',
    });
    expect(response.status).toBe(400);
    const html = await response.text();
    expect(html).toContain('Your card number is incorrect.');
    expect(html).toMatch(/id="card_number"[^>]*aria-invalid="true"/);
    expect(html).toContain('Choose one of the countries this shop ships to.');
    const state = await control<{ charges: { total: number }; payment_intents: { total: number } }>(
      fake,
      'state',
    );
    expect(state.body.charges.total).toBe(0);
    expect(state.body.payment_intents.total).toBe(0);
  });

  it('declines a Luhn-valid number that is not a test card, as Stripe does in test mode', async () => {
    const session = await stripe.checkout.sessions.create(maskOrder());
    const result = await payByControl(fake, session.id, '4111111111111111');
    expect(result.status).toBe(402);
    expect(result.body.error).toMatchObject({ code: 'card_declined', decline_code: 'test_mode_live_card' });
  });

  it('answers 404 for an unknown session', async () => {
    const response = await fetch(`${fake.url}/pay/cs_test_unknown`);
    expect(response.status).toBe(404);
  });
});
