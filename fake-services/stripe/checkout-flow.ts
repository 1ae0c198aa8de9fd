import type Stripe from 'stripe';
import { customerOrigin, emitEvent, type FakeContext, type Origin, snapshot } from './context';
import { newId } from './ids';
import { type AddressInput, address, type CardInput, newCharge, newPaymentIntent } from './payment-objects';
import { applyShippingChoice } from './session-objects';
import type { SessionRecord } from './state';
import { cardOutcome, luhnValid } from './test-cards';

/** A payment as entered on the payment page or sent to `POST /_control/sessions/:id/pay`, not yet checked. */
export interface PaymentAttempt {
  email: string;
  cardNumber: string;
  expMonth: number | null;
  expYear: number | null;
  cvc: string;
  name: string;
  shipping: {
    line1: string;
    line2: string;
    city: string;
    postal_code: string;
    state: string;
    country: string;
  } | null;
  shippingRate: string | null;
}

/** Field name → message; the field names are the payment page's inputs. */
export type FieldErrors = Partial<
  Record<
    | 'email'
    | 'card_number'
    | 'card_expiry'
    | 'card_cvc'
    | 'name'
    | 'line1'
    | 'city'
    | 'postal_code'
    | 'country'
    | 'shipping_rate',
    string
  >
>;

export type PayResult =
  | { kind: 'paid'; session: Stripe.Checkout.Session }
  | {
      kind: 'declined';
      code: string;
      declineCode: string | null;
      message: string;
      paymentIntent: Stripe.PaymentIntent;
      charge: Stripe.Charge;
    }
  | { kind: 'invalid'; errors: FieldErrors }
  | { kind: 'not_open'; status: string };

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

/** The checks Stripe's own page makes before it tries the card at all. */
function check(
  record: SessionRecord,
  attempt: PaymentAttempt,
  now: Date,
): { errors: FieldErrors; card: CardInput | null; shipping: AddressInput | null } {
  const errors: FieldErrors = {};
  const session = record.session;
  if (!EMAIL.test(attempt.email.trim())) errors.email = 'Enter an e-mail address, like name@example.com.';
  const digits = attempt.cardNumber.replace(/[\s-]/g, '');
  if (!/^\d+$/.test(digits) || !luhnValid(digits)) errors.card_number = 'Your card number is incorrect.';
  const month = attempt.expMonth;
  let year = attempt.expYear;
  if (year !== null && year < 100) year += 2000;
  if (month === null || year === null || month < 1 || month > 12) {
    errors.card_expiry = "Your card's expiration date is incomplete.";
  } else if (
    year < now.getUTCFullYear() ||
    (year === now.getUTCFullYear() && month < now.getUTCMonth() + 1)
  ) {
    errors.card_expiry = "Your card's expiration date is in the past.";
  }
  if (!/^\d{3,4}$/.test(attempt.cvc.trim())) errors.card_cvc = "Your card's security code is incomplete.";
  if (attempt.name.trim() === '') errors.name = 'Enter the name on the card.';
  let shipping: AddressInput | null = null;
  const allowed = session.shipping_address_collection?.allowed_countries ?? null;
  if (allowed) {
    const s = attempt.shipping;
    if (!s || s.line1.trim() === '') errors.line1 = 'Enter the first line of the address.';
    if (!s || s.city.trim() === '') errors.city = 'Enter the town or city.';
    if (!s || s.postal_code.trim() === '') errors.postal_code = 'Enter the postal code.';
    if (!s || !(allowed as string[]).includes(s.country))
      errors.country = 'Choose one of the countries this shop ships to.';
    if (s) {
      shipping = {
        line1: s.line1.trim(),
        line2: s.line2.trim() || null,
        city: s.city.trim(),
        postal_code: s.postal_code.trim(),
        state: s.state.trim() || null,
        country: s.country,
      };
    }
  }
  if (session.shipping_options.length > 0) {
    const chosen = attempt.shippingRate ?? session.shipping_options[0]?.shipping_rate;
    if (!session.shipping_options.some((o) => o.shipping_rate === chosen))
      errors.shipping_rate = 'Choose a shipping method.';
  }
  const card =
    month !== null && year !== null
      ? { number: digits, expMonth: month, expYear: year, cvc: attempt.cvc.trim() }
      : null;
  return { errors, card, shipping };
}

/**
 * Pays a Checkout Session: one code path for the payment page's form and the control API. A decline
 * leaves the session open with its payment intent waiting for another payment method, as Stripe does.
 */
export function payCheckoutSession(
  ctx: FakeContext,
  record: SessionRecord,
  attempt: PaymentAttempt,
): PayResult {
  sweepExpired(ctx);
  const session = record.session;
  if (session.status !== 'open') return { kind: 'not_open', status: session.status ?? 'unknown' };
  const { errors, card, shipping } = check(record, attempt, new Date(ctx.clock.nowMs()));
  if (Object.keys(errors).length > 0 || !card) return { kind: 'invalid', errors };

  const origin = customerOrigin(record.apiVersion);
  const now = ctx.clock.nowSeconds();
  applyShippingChoice(
    session,
    attempt.shippingRate ?? (session.shipping_options[0]?.shipping_rate as string | undefined) ?? null,
  );
  const amount = session.amount_total ?? 0;

  let pi =
    typeof session.payment_intent === 'string'
      ? ctx.state.paymentIntents.get(session.payment_intent)
      : undefined;
  if (!pi) {
    pi = newPaymentIntent(record, now, amount);
    ctx.state.paymentIntents.set(pi.id, pi);
    ctx.state.sessionByPaymentIntent.set(pi.id, session.id);
    session.payment_intent = pi.id;
    emitEvent(ctx, 'payment_intent.created', pi, origin);
  }
  pi.amount = amount;
  const name = attempt.name.trim();
  const email = attempt.email.trim();
  const shippingDetails: Stripe.PaymentIntent.Shipping | null = shipping
    ? { address: address(shipping), carrier: null, name, phone: null, tracking_number: null }
    : null;
  pi.shipping = shippingDetails;
  const paymentMethodId = newId('pm');
  const outcome = cardOutcome(card.number);
  const decline =
    outcome.kind === 'decline'
      ? { code: outcome.code, declineCode: outcome.declineCode, message: outcome.message }
      : null;
  const charge = newCharge({
    paymentIntent: pi,
    paymentMethodId,
    card,
    name,
    email,
    billing: shipping,
    shipping: shippingDetails,
    created: now,
    baseUrl: ctx.baseUrl,
    decline,
  });
  ctx.state.charges.set(charge.id, charge);
  pi.latest_charge = charge.id;
  pi.payment_method = paymentMethodId;

  if (decline) {
    pi.status = 'requires_payment_method';
    pi.payment_method = null;
    pi.last_payment_error = {
      charge: charge.id,
      code: decline.code as Stripe.PaymentIntent.LastPaymentError.Code,
      ...(decline.declineCode ? { decline_code: decline.declineCode } : {}),
      doc_url: `https://docs.stripe.com/error-codes/${decline.code.replace(/_/g, '-')}`,
      message: decline.message,
      type: 'card_error',
    };
    emitEvent(ctx, 'charge.failed', charge, origin);
    emitEvent(ctx, 'payment_intent.payment_failed', pi, origin);
    return { kind: 'declined', ...decline, paymentIntent: snapshot(pi), charge: snapshot(charge) };
  }

  pi.status = 'succeeded';
  pi.amount_received = amount;
  pi.last_payment_error = null;
  session.status = 'complete';
  session.payment_status = 'paid';
  session.url = null;
  session.customer_details = {
    address: address(shipping),
    business_name: null,
    email,
    individual_name: null,
    name,
    phone: null,
    tax_exempt: 'none',
    tax_ids: [],
  };
  session.collected_information = {
    business_name: null,
    individual_name: null,
    shipping_details: shipping
      ? {
          address: address(
            shipping,
          ) as Stripe.Checkout.Session.CollectedInformation.ShippingDetails['address'],
          name,
        }
      : null,
  };
  emitEvent(ctx, 'charge.succeeded', charge, origin);
  emitEvent(ctx, 'payment_intent.succeeded', pi, origin);
  emitEvent(ctx, 'checkout.session.completed', session, origin);
  return { kind: 'paid', session: snapshot(session) };
}

/** Expires an open session (the expire endpoint, or its expires_at passing) and cancels its payment intent. */
export function expireSession(ctx: FakeContext, record: SessionRecord, origin: Origin): void {
  const session = record.session;
  session.status = 'expired';
  session.url = null;
  const pi =
    typeof session.payment_intent === 'string'
      ? ctx.state.paymentIntents.get(session.payment_intent)
      : undefined;
  if (pi && pi.status !== 'succeeded' && pi.status !== 'canceled') {
    pi.status = 'canceled';
    pi.canceled_at = ctx.clock.nowSeconds();
    pi.cancellation_reason = 'abandoned';
    emitEvent(ctx, 'payment_intent.canceled', pi, origin);
  }
  emitEvent(ctx, 'checkout.session.expired', session, origin);
}

/** Expires every open session whose expires_at has passed on the fake's clock. */
export function sweepExpired(ctx: FakeContext): void {
  const now = ctx.clock.nowSeconds();
  for (const record of ctx.state.sessions.values()) {
    if (record.session.status === 'open' && record.session.expires_at <= now) {
      expireSession(ctx, record, customerOrigin(record.apiVersion));
    }
  }
}
