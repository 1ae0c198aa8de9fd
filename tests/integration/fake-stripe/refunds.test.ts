import { describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import type { FakeStripe } from '../../../fake-services/stripe/server';
import {
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

async function paidOrder(): Promise<{ pi: Stripe.PaymentIntent; total: number }> {
  const session = await stripe.checkout.sessions.create(maskOrder());
  await payByControl(fake, session.id);
  const paid = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] });
  return { pi: paid.payment_intent as Stripe.PaymentIntent, total: paid.amount_total ?? 0 };
}

describe('refunds', () => {
  it('refunds part, then the rest, then refuses more; the charge keeps count and charge.refunded is sent', async () => {
    const { pi, total } = await paidOrder();
    expect(total).toBe(ORDER_SUBTOTAL + 600);
    const chargeId = pi.latest_charge as string;

    const part = await stripe.refunds.create({
      payment_intent: pi.id,
      amount: 8_500,
      reason: 'requested_by_customer',
      metadata: { line: 'ibex' },
    });
    expect(part).toMatchObject({
      object: 'refund',
      amount: 8_500,
      charge: chargeId,
      payment_intent: pi.id,
      status: 'succeeded',
      currency: 'eur',
      reason: 'requested_by_customer',
      metadata: { line: 'ibex' },
    });
    let charge = await stripe.charges.retrieve(chargeId);
    expect([charge.amount_refunded, charge.refunded]).toEqual([8_500, false]);

    const tooMuch = await stripeError(
      stripe.refunds.create({ payment_intent: pi.id, amount: total - 8_500 + 1 }),
    );
    expect(tooMuch).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect([tooMuch.statusCode, tooMuch.code, tooMuch.param]).toEqual([400, 'amount_too_large', 'amount']);
    expect(tooMuch.message).toContain('is greater than unrefunded amount on charge (€211.00)');

    const rest = await stripe.refunds.create({ charge: chargeId });
    expect(rest.amount).toBe(total - 8_500);
    charge = await stripe.charges.retrieve(chargeId);
    expect([charge.amount_refunded, charge.refunded]).toEqual([total, true]);
    expect(charge.refunds?.data.map((r) => r.id)).toEqual([rest.id, part.id]);

    const more = await stripeError(stripe.refunds.create({ payment_intent: pi.id, amount: 1 }));
    expect(more).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(more.code).toBe('charge_already_refunded');

    await receiver.waitFor(
      () => receiver.of('charge.refunded').length === 2 && receiver.of('refund.created').length === 2,
    );
    const refundedAmounts = receiver
      .of('charge.refunded')
      .map((r) => r.event.data.object.amount_refunded)
      .sort((a, b) => Number(a) - Number(b));
    expect(refundedAmounts).toEqual([8_500, total]);
    expect(
      receiver
        .of('refund.created')
        .map((r) => r.event.data.object.id)
        .sort(),
    ).toEqual([part.id, rest.id].sort());

    const listed = await stripe.refunds.list({ payment_intent: pi.id });
    expect(listed.data.map((r) => r.id)).toEqual([rest.id, part.id]);
    expect((await stripe.refunds.retrieve(part.id)).amount).toBe(8_500);
  });

  it('keeps refunds of different payments apart and checks its inputs', async () => {
    const first = await paidOrder();
    const second = await paidOrder();
    await stripe.refunds.create({ payment_intent: first.pi.id, amount: 100 });
    expect((await stripe.refunds.list({ payment_intent: second.pi.id })).data).toEqual([]);
    const reason = await stripeError(
      stripe.refunds.create({
        payment_intent: second.pi.id,
        reason: 'changed_mind' as Stripe.RefundCreateParams.Reason,
      }),
    );
    expect(reason.param).toBe('reason');
    const nothing = await stripeError(stripe.refunds.create({}));
    expect(nothing).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    const unknown = await stripeError(stripe.refunds.create({ payment_intent: 'pi_not_ours' }));
    expect([unknown.statusCode, unknown.code]).toEqual([404, 'resource_missing']);
    const zero = await stripeError(stripe.refunds.create({ payment_intent: second.pi.id, amount: 0 }));
    expect(zero.param).toBe('amount');
  });

  it('will not refund a payment that never succeeded', async () => {
    const session = await stripe.checkout.sessions.create(maskOrder());
    await payByControl(fake, session.id, '4000000000000002');
    const open = await stripe.checkout.sessions.retrieve(session.id);
    const error = await stripeError(stripe.refunds.create({ payment_intent: open.payment_intent as string }));
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(error.param).toBe('payment_intent');
  });
});
