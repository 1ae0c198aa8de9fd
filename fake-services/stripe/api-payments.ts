import type Stripe from 'stripe';
import { z } from 'zod';
import { type ApiRequest, ok, originOf, pathParam, type Route } from './api-types';
import { emitEvent, type FakeContext, snapshot } from './context';
import { listObject, render } from './expand';
import {
  expandParam,
  indexed,
  integer,
  metadata,
  oneOf,
  optionalInteger,
  optionalText,
  parseParams,
} from './params';
import { newRefund } from './payment-objects';
import { invalidRequest, paramError, resourceMissing } from './stripe-errors';

const retrieveSchema = z.strictObject({ expand: expandParam() });
const listParams = {
  limit: optionalInteger(1, 100),
  starting_after: optionalText(),
  ending_before: optionalText(),
  expand: expandParam(),
};

const refundCreateSchema = z.strictObject({
  charge: optionalText(),
  payment_intent: optionalText(),
  amount: optionalInteger(1, 99_999_999),
  reason: oneOf(['duplicate', 'fraudulent', 'requested_by_customer']).optional(),
  metadata: metadata(),
  expand: expandParam(),
});
const refundListSchema = z.strictObject({
  ...listParams,
  charge: optionalText(),
  payment_intent: optionalText(),
});
const eventListSchema = z.strictObject({
  ...listParams,
  type: optionalText(),
  types: indexed(z.string(), { max: 20 }).optional(),
  created: z
    .strictObject({
      gt: integer(0).optional(),
      gte: integer(0).optional(),
      lt: integer(0).optional(),
      lte: integer(0).optional(),
    })
    .optional(),
});

function newestFirst<T>(map: Map<string, T>): T[] {
  return [...map.values()].reverse();
}

/** How an amount reads in Stripe's refund errors, e.g. "€12.50". */
function money(amount: number, currency: string): string {
  const format = new Intl.NumberFormat('en-IE', { style: 'currency', currency: currency.toUpperCase() });
  const digits = format.resolvedOptions().maximumFractionDigits ?? 2;
  return format.format(amount / 10 ** digits);
}

function findChargeToRefund(ctx: FakeContext, p: z.output<typeof refundCreateSchema>): Stripe.Charge {
  if (!p.charge && !p.payment_intent) {
    throw paramError(
      'One of the following params should be provided for this request: payment_intent or charge.',
      'payment_intent',
      'parameter_missing',
    );
  }
  let charge: Stripe.Charge | undefined;
  if (p.payment_intent) {
    const pi = ctx.state.paymentIntents.get(p.payment_intent);
    if (!pi) throw resourceMissing('payment_intent', p.payment_intent, 'payment_intent');
    if (pi.status !== 'succeeded' || typeof pi.latest_charge !== 'string') {
      throw invalidRequest(`This PaymentIntent (${pi.id}) does not have a successful charge to refund.`, {
        param: 'payment_intent',
        code: 'charge_not_refundable',
      });
    }
    charge = ctx.state.charges.get(pi.latest_charge);
    if (p.charge && p.charge !== pi.latest_charge) {
      throw invalidRequest(`The charge ${p.charge} does not belong to the PaymentIntent ${pi.id}.`, {
        param: 'charge',
      });
    }
  } else if (p.charge) {
    charge = ctx.state.charges.get(p.charge);
    if (!charge) throw resourceMissing('charge', p.charge, 'charge');
  }
  if (!charge) throw invalidRequest('There is no charge to refund.', { param: 'charge' });
  if (charge.status !== 'succeeded' || !charge.captured) {
    throw invalidRequest(`Charge ${charge.id} has not succeeded, so there is nothing to refund.`, {
      param: 'charge',
      code: 'charge_not_refundable',
    });
  }
  return charge;
}

function createRefund(ctx: FakeContext, req: ApiRequest) {
  const p = parseParams(refundCreateSchema, req.params);
  const charge = findChargeToRefund(ctx, p);
  const remaining = charge.amount - charge.amount_refunded;
  if (remaining <= 0)
    throw invalidRequest(`Charge ${charge.id} has already been refunded.`, {
      code: 'charge_already_refunded',
    });
  const amount = p.amount ?? remaining;
  if (amount > remaining) {
    throw invalidRequest(
      `Refund amount (${money(amount, charge.currency)}) is greater than unrefunded amount on charge (${money(remaining, charge.currency)})`,
      { param: 'amount', code: 'amount_too_large' },
    );
  }
  const refund = newRefund(charge, amount, p.reason ?? null, p.metadata, ctx.clock.nowSeconds());
  ctx.state.refunds.set(refund.id, refund);
  const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded };
  charge.amount_refunded += amount;
  charge.refunded = charge.amount_refunded === charge.amount;
  if (charge.refunds) {
    charge.refunds.data.unshift(snapshot(refund));
  }
  const origin = originOf(req);
  emitEvent(ctx, 'refund.created', refund, origin);
  emitEvent(ctx, 'charge.refunded', charge, origin, previous);
  return ok(render(ctx, refund, p.expand));
}

function retrieve<T>(map: Map<string, T>, objectName: string, param: string) {
  return (ctx: FakeContext, req: ApiRequest) => {
    const p = parseParams(retrieveSchema, req.params);
    const id = pathParam(req);
    const found = map.get(id);
    if (found === undefined) throw resourceMissing(objectName, id, param);
    return ok(render(ctx, found, p.expand));
  };
}

/** Routes need the maps of the live state, which reset() empties but never replaces. */
export function paymentRoutes(ctx: FakeContext): Route[] {
  const { state } = ctx;
  return [
    {
      method: 'GET',
      pattern: /^\/v1\/payment_intents\/([^/]+)$/,
      handler: retrieve(state.paymentIntents, 'payment_intent', 'intent'),
    },
    {
      method: 'GET',
      pattern: /^\/v1\/charges\/([^/]+)$/,
      handler: retrieve(state.charges, 'charge', 'charge'),
    },
    {
      method: 'GET',
      pattern: /^\/v1\/charges\/([^/]+)\/refunds$/,
      handler: (c, req) => {
        const p = parseParams(z.strictObject(listParams), req.params);
        const id = pathParam(req);
        if (!state.charges.has(id)) throw resourceMissing('charge', id, 'charge');
        const refunds = newestFirst(state.refunds).filter((r) => r.charge === id);
        return ok(render(c, listObject(refunds, p, `/v1/charges/${id}/refunds`), p.expand));
      },
    },
    { method: 'POST', pattern: /^\/v1\/refunds$/, handler: createRefund },
    {
      method: 'GET',
      pattern: /^\/v1\/refunds\/([^/]+)$/,
      handler: retrieve(state.refunds, 'refund', 'refund'),
    },
    {
      method: 'GET',
      pattern: /^\/v1\/refunds$/,
      handler: (c, req) => {
        const p = parseParams(refundListSchema, req.params);
        const refunds = newestFirst(state.refunds)
          .filter((r) => (p.charge ? r.charge === p.charge : true))
          .filter((r) => (p.payment_intent ? r.payment_intent === p.payment_intent : true));
        return ok(render(c, listObject(refunds, p, '/v1/refunds'), p.expand));
      },
    },
    { method: 'GET', pattern: /^\/v1\/events\/([^/]+)$/, handler: retrieve(state.events, 'event', 'id') },
    {
      method: 'GET',
      pattern: /^\/v1\/events$/,
      handler: (c, req) => {
        const p = parseParams(eventListSchema, req.params);
        const wanted = p.types ?? (p.type ? [p.type] : null);
        const matches = (type: string) =>
          !wanted || wanted.some((w) => (w.endsWith('.*') ? type.startsWith(w.slice(0, -1)) : type === w));
        const created = p.created;
        const events = newestFirst(state.events)
          .filter((e) => matches(e.type))
          .filter(
            (e) =>
              (created?.gt === undefined || e.created > created.gt) &&
              (created?.gte === undefined || e.created >= created.gte),
          )
          .filter(
            (e) =>
              (created?.lt === undefined || e.created < created.lt) &&
              (created?.lte === undefined || e.created <= created.lte),
          );
        return ok(render(c, listObject(events, p, '/v1/events'), p.expand));
      },
    },
  ];
}
