import 'server-only';
import type Stripe from 'stripe';
import { AppError } from '@/lib/api/errors';
import {
  chargeableWeightG,
  parcelFor,
  quote,
  shippingOptionsFor,
  toStripeAmount,
  zoneFor,
  type ShippingOption,
} from '@/lib/checkout/pricing';
import { inTransaction, sql } from '@/lib/db/sql';
import { getEnv } from '@/lib/env';
import { getStripe, paymentProviderError } from '@/lib/payments/stripe';
import { orderUrl } from './links';
import type { CheckoutInput } from './schemas';
import { countryChoices, loadShippingZones } from './shipping';

type Buyer = { id: string; email: string; name: string | null };

type HoldContext = {
  hold_id: string; user_id: string; state: string; quantity: number; expires_at: Date; running: boolean;
  batch_id: string; batch_name: string; stock_id: string; design_name: string; base_price_minor: number; currency: string;
  parcel_length_mm: number | null; parcel_width_mm: number | null; parcel_height_mm: number | null; parcel_weight_g: number | null;
  finish_name: string; price_difference_minor: number; studio_id: string; studio_name: string;
  tax_label: string; tax_rate_bp: number; volumetric_divisor: number;
  order_id: string | null; order_number: string | null; order_state: string | null;
};

async function loadHold(buyer: Buyer, holdId: string): Promise<HoldContext> {
  const [row] = await sql<HoldContext>(
    `SELECT h.id AS hold_id, h.user_id, h.state, h.quantity, h.expires_at, (h.state = 'active' AND h.expires_at > now()) AS running,
            b.id AS batch_id, b.name AS batch_name, s.id AS stock_id,
            d.name AS design_name, d.base_price_minor, d.currency,
            d.parcel_length_mm, d.parcel_width_mm, d.parcel_height_mm, d.parcel_weight_g,
            f.name AS finish_name, f.price_difference_minor,
            st.id AS studio_id, st.name AS studio_name, st.tax_label, st.tax_rate_bp, st.volumetric_divisor,
            o.id AS order_id, o.number AS order_number, o.state AS order_state
       FROM holds h
       JOIN batches b ON b.id = h.batch_id
       JOIN batch_stock s ON s.id = h.batch_stock_id
       JOIN finishes f ON f.id = s.finish_id
       JOIN designs d ON d.id = b.design_id
       JOIN studios st ON st.id = d.studio_id
       LEFT JOIN orders o ON o.hold_id = h.id
      WHERE h.id = $1 AND h.user_id = $2`,
    [holdId, buyer.id],
  );
  if (!row) throw new AppError('hold_not_found', 'That hold is not yours, or it no longer exists.', 404);
  if (row.order_state && !['awaiting_payment', 'cancelled'].includes(row.order_state)) {
    throw new AppError('already_paid', `This hold is already paid: it is order ${row.order_number}.`, 409, { orderNumber: row.order_number });
  }
  if (!row.running) {
    throw new AppError(
      'hold_ended',
      'Your hold has ended, so the mask went back on sale. Hold it again if it is still available.',
      409,
      { batchId: row.batch_id },
    );
  }
  return row;
}

function parcelOf(hold: HoldContext) {
  if (!hold.parcel_length_mm || !hold.parcel_width_mm || !hold.parcel_height_mm || !hold.parcel_weight_g) {
    throw new AppError(
      'cannot_ship_yet',
      'The studio has not set the parcel size of this design yet, so shipping cannot be priced. Please tell the studio.',
      409,
    );
  }
  return parcelFor(
    { lengthMm: hold.parcel_length_mm, widthMm: hold.parcel_width_mm, heightMm: hold.parcel_height_mm, weightG: hold.parcel_weight_g },
    hold.quantity,
  );
}

const unitPrice = (hold: HoldContext) => hold.base_price_minor + hold.price_difference_minor;

export type CheckoutOptions = {
  holdId: string;
  currency: string;
  countries: { code: string; name: string }[];
  country: string | null;
  chargeableWeightG: number;
  taxLabel: string;
  taxRateBasisPoints: number;
  linesMinor: number;
  options: (ShippingOption & { totalMinor: number; taxIncludedMinor: number })[];
};

/** What the buyer may choose before paying: where it ships, how, and what each choice costs in total. */
export async function getCheckoutOptions(buyer: Buyer, input: { holdId: string; country?: string }): Promise<CheckoutOptions> {
  const hold = await loadHold(buyer, input.holdId);
  const zones = await loadShippingZones(hold.studio_id);
  const weight = chargeableWeightG(parcelOf(hold), hold.volumetric_divisor);
  const countries = countryChoices(zones.flatMap((zone) => zone.countries));
  const country = input.country ?? null;
  const zone = country ? zoneFor(zones, country) : null;
  if (country && !zone) {
    throw new AppError('no_shipping_to_country', 'The studio does not ship to that country. Choose one of the countries listed.', 422, {
      countries: countries.map((c) => c.code),
    });
  }
  const lines = [{ unitPriceMinor: unitPrice(hold), quantity: hold.quantity }];
  const options = zone
    ? shippingOptionsFor(zone, weight).map((option) => {
        const q = quote(hold.currency, lines, option.amountMinor, hold.tax_rate_bp);
        return { ...option, totalMinor: q.totalMinor, taxIncludedMinor: q.taxIncludedMinor };
      })
    : [];
  return {
    holdId: hold.hold_id,
    currency: hold.currency,
    countries,
    country,
    chargeableWeightG: weight,
    taxLabel: hold.tax_label,
    taxRateBasisPoints: hold.tax_rate_bp,
    linesMinor: unitPrice(hold) * hold.quantity,
    options,
  };
}

type OrderRow = {
  id: string; number: string; state: string; batch_id: string; hold_id: string; email: string; currency: string;
  lines_minor: number; shipping_minor: number; total_minor: number; shipping_country: string; shipping_rate_id: string;
  shipping_label: string; shipping_min_days: number; shipping_max_days: number; checkout_round: number; round_started_at: Date;
};

/**
 * Starts (or resumes) paying for a hold: prices the order on the server, records it as awaiting payment,
 * and opens a Stripe Checkout Session for it. Every request for the same hold and the same choices gets
 * the same session: the Idempotency-Key is derived from the order and its round, and the parameters are
 * built only from the stored order, so a double click or a retry can never make a second one.
 */
export async function startCheckout(buyer: Buyer, input: CheckoutInput): Promise<{ url: string; orderNumber: string }> {
  const hold = await loadHold(buyer, input.holdId);
  const zones = await loadShippingZones(hold.studio_id);
  const zone = zoneFor(zones, input.country);
  if (!zone) throw new AppError('no_shipping_to_country', 'The studio does not ship to that country. Choose one of the countries listed.', 422);
  const weight = chargeableWeightG(parcelOf(hold), hold.volumetric_divisor);
  const option = shippingOptionsFor(zone, weight).find((o) => o.rateId === input.shippingRateId);
  if (!option) {
    throw new AppError('shipping_option_unknown', 'That shipping option is not offered for this parcel and country. Choose one of those shown.', 422);
  }
  const priced = quote(hold.currency, [{ unitPriceMinor: unitPrice(hold), quantity: hold.quantity }], option.amountMinor, hold.tax_rate_bp);

  const order = await inTransaction(async (transaction) => {
    const fields = [
      hold.currency, priced.linesMinor, priced.shippingMinor, priced.totalMinor, hold.tax_label, hold.tax_rate_bp, priced.taxIncludedMinor,
      input.country, option.rateId, option.label, option.minDays, option.maxDays, weight, input.note ?? null,
    ];
    const [created] = await sql<OrderRow>(
      `INSERT INTO orders (studio_id, batch_id, user_id, hold_id, email, buyer_name, currency, lines_minor, shipping_minor, total_minor,
                           tax_label, tax_rate_bp, tax_included_minor, shipping_country, shipping_rate_id, shipping_label,
                           shipping_min_days, shipping_max_days, chargeable_weight_g, buyer_note)
       VALUES ($15, $16, $17, $18, $19, $20, $1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14)
       ON CONFLICT (hold_id) DO NOTHING RETURNING *`,
      [...fields, hold.studio_id, hold.batch_id, buyer.id, hold.hold_id, buyer.email, buyer.name],
      transaction,
    );
    if (created) {
      for (let position = 1; position <= hold.quantity; position += 1) {
        await sql(
          `INSERT INTO order_lines (order_id, position, batch_stock_id, design_name, finish_name, unit_price_minor) VALUES ($1, $2, $3, $4, $5, $6)`,
          [created.id, position, hold.stock_id, hold.design_name, hold.finish_name, unitPrice(hold)],
          transaction,
        );
      }
      await recordOrderEvent(created.id, 'checkout_started', { to: 'awaiting_payment', data: { country: input.country, shipping: option.label } }, transaction);
      return created;
    }
    // The order exists: a new choice of country or shipping starts a new round (and a new session).
    const [changed] = await sql<OrderRow>(
      `UPDATE orders SET currency = $1, lines_minor = $2, shipping_minor = $3, total_minor = $4, tax_label = $5, tax_rate_bp = $6,
              tax_included_minor = $7, shipping_country = $8, shipping_rate_id = $9, shipping_label = $10, shipping_min_days = $11,
              shipping_max_days = $12, chargeable_weight_g = $13, buyer_note = $14, checkout_round = checkout_round + 1, round_started_at = now(),
              state = 'awaiting_payment', cancelled_at = NULL, updated_at = now()
        WHERE hold_id = $15 AND state IN ('awaiting_payment', 'cancelled')
          AND (shipping_country <> $8 OR shipping_rate_id IS DISTINCT FROM $9 OR total_minor <> $4 OR state = 'cancelled')
        RETURNING *`,
      [...fields, hold.hold_id],
      transaction,
    );
    if (changed) {
      await recordOrderEvent(changed.id, 'checkout_changed', { to: 'awaiting_payment', data: { country: input.country, shipping: option.label, round: changed.checkout_round } }, transaction);
      return changed;
    }
    const [existing] = await sql<OrderRow>(`SELECT * FROM orders WHERE hold_id = $1`, [hold.hold_id], transaction);
    if (!existing) throw new Error('order for hold vanished');
    if (!['awaiting_payment', 'cancelled'].includes(existing.state)) {
      throw new AppError('already_paid', `This hold is already paid: it is order ${existing.number}.`, 409, { orderNumber: existing.number });
    }
    // Same country, shipping and total: the session stands, but a changed note for the studio is kept.
    await sql(`UPDATE orders SET buyer_note = $2, updated_at = now() WHERE id = $1 AND buyer_note IS DISTINCT FROM $2`, [existing.id, input.note ?? null], transaction);
    return existing;
  });

  const [open] = await sql<{ id: string; url: string }>(
    `SELECT id, url FROM checkout_sessions WHERE order_id = $1 AND round = $2 AND status = 'open' AND expires_at > now() + interval '1 minute'`,
    [order.id, order.checkout_round],
  );
  if (open?.url) return { url: open.url, orderNumber: order.number };

  const session = await createSession(order, hold);
  await sql(
    `INSERT INTO checkout_sessions (id, order_id, round, url, expires_at) VALUES ($1, $2, $3, $4, to_timestamp($5))
     ON CONFLICT (id) DO NOTHING`,
    [session.id, order.id, order.checkout_round, session.url, session.expires_at],
  );
  // Sessions of earlier rounds must not be paid as well: close them (the sweep retries if this fails).
  await expireOtherSessions(order.id, session.id);
  if (!session.url) throw new AppError('payments_unavailable', 'The payment page could not be opened. Please try again.', 503, undefined, 10);
  return { url: session.url, orderNumber: order.number };
}

/** Stripe accepts expires_at only 30 minutes to 24 hours ahead ("Manage limited inventory" in Stripe's docs). */
const minimumSessionMinutes = 45;

function sessionExpiry(order: OrderRow, hold: HoldContext): number {
  const fromRound = order.round_started_at.getTime() + minimumSessionMinutes * 60_000;
  const fromHold = hold.expires_at.getTime() + 5 * 60_000;
  return Math.floor(Math.max(fromRound, fromHold) / 1000);
}

async function createSession(order: OrderRow, hold: HoldContext): Promise<Stripe.Checkout.Session> {
  const appUrl = getEnv().APP_URL;
  const currency = order.currency.toLowerCase();
  const metadata = { order_id: order.id, order_number: order.number, hold_id: hold.hold_id, round: String(order.checkout_round) };
  try {
    return await getStripe().checkout.sessions.create(
      {
        mode: 'payment',
        client_reference_id: order.id,
        customer_email: order.email,
        line_items: [
          {
            quantity: hold.quantity,
            price_data: {
              currency,
              unit_amount: toStripeAmount(unitPrice(hold), order.currency),
              product_data: {
                name: `${hold.design_name} — ${hold.finish_name}`,
                description: `${hold.studio_name}, ${hold.batch_name}. Hand-cast and hand-painted to order.`,
              },
            },
          },
        ],
        shipping_address_collection: { allowed_countries: [order.shipping_country as Stripe.Checkout.SessionCreateParams.ShippingAddressCollection.AllowedCountry] },
        shipping_options: [
          {
            shipping_rate_data: {
              display_name: order.shipping_label,
              type: 'fixed_amount',
              fixed_amount: { amount: toStripeAmount(order.shipping_minor, order.currency), currency },
              delivery_estimate: {
                minimum: { unit: 'business_day', value: order.shipping_min_days },
                maximum: { unit: 'business_day', value: order.shipping_max_days },
              },
              metadata: { rate_id: order.shipping_rate_id },
            },
          },
        ],
        metadata,
        payment_intent_data: { metadata, description: `Order ${order.number} from ${hold.studio_name}` },
        success_url: orderUrl(order, '&paid=1&session_id={CHECKOUT_SESSION_ID}'),
        cancel_url: `${appUrl}/drops/${hold.batch_id}?checkout=cancelled`,
        expires_at: sessionExpiry(order, hold),
      },
      { idempotencyKey: `demold-checkout-${order.id}-${order.checkout_round}` },
    );
  } catch (error) {
    throw paymentProviderError(error);
  }
}

/** Expires a buyer's earlier sessions for the same order; what fails here the sweep finishes later. */
export async function expireOtherSessions(orderId: string, keepSessionId: string | null): Promise<void> {
  const others = await sql<{ id: string }>(
    `SELECT id FROM checkout_sessions WHERE order_id = $1 AND status = 'open' AND id IS DISTINCT FROM $2`,
    [orderId, keepSessionId],
  );
  for (const other of others) await expireSessionQuietly(other.id);
}

/** Asks Stripe to expire a session; a session that is no longer open is simply read back as it is. */
export async function expireSessionQuietly(sessionId: string): Promise<Stripe.Checkout.Session | null> {
  const stripe = getStripe();
  try {
    const session = await stripe.checkout.sessions.expire(sessionId);
    await sql(`UPDATE checkout_sessions SET status = $2, updated_at = now() WHERE id = $1 AND status = 'open'`, [session.id, session.status ?? 'expired']);
    return session;
  } catch (error) {
    const stripeError = error as { type?: string; statusCode?: number };
    if (stripeError.type === 'StripeInvalidRequestError') {
      try {
        return await stripe.checkout.sessions.retrieve(sessionId);
      } catch {
        return null;
      }
    }
    console.error('Expiring a checkout session failed; the sweep will try again', { sessionId, error: (error as Error).message });
    return null;
  }
}

export async function recordOrderEvent(
  orderId: string,
  type: string,
  { from, to, actor, data }: { from?: string | null; to?: string | null; actor?: string | null; data?: Record<string, unknown> },
  transaction?: import('sequelize').Transaction,
): Promise<void> {
  await sql(
    `INSERT INTO order_events (order_id, type, from_state, to_state, actor_user_id, data) VALUES ($1, $2, $3, $4, $5, $6)`,
    [orderId, type, from ?? null, to ?? null, actor ?? null, JSON.stringify(data ?? {})],
    transaction,
  );
}
