import { z } from 'zod';
import { type ApiRequest, ok, originOf, pathParam, type Route } from './api-types';
import { expireSession, sweepExpired } from './checkout-flow';
import type { FakeContext } from './context';
import { lineItemsList, listObject, render } from './expand';
import {
  currency,
  expandParam,
  indexed,
  integer,
  metadata,
  oneOf,
  optionalBoolean,
  optionalInteger,
  optionalText,
  parseParams,
  text,
} from './params';
import { buildSession, type SessionInput } from './session-objects';
import type { SessionRecord } from './state';
import { invalidRequest, paramError, resourceMissing } from './stripe-errors';

// Stripe's documented window for expires_at ("Manage limited inventory with Checkout"): 30 minutes to 24 hours.
const MIN_EXPIRY_SECONDS = 30 * 60;
const MAX_EXPIRY_SECONDS = 24 * 60 * 60;

/** Stripe's minimum charge amounts for the currencies a small European studio is likely to use. */
const MINIMUM_AMOUNT: Record<string, number> = {
  eur: 50,
  usd: 50,
  gbp: 30,
  chf: 50,
  dkk: 250,
  sek: 300,
  nok: 300,
  pln: 200,
};

const country = () =>
  z.string().transform((value, ctx) => {
    if (!/^[A-Z]{2}$/.test(value)) {
      ctx.addIssue({
        code: 'custom',
        message: `Invalid country: ${value}`,
        params: { stripeCode: 'parameter_invalid_string' },
      });
      return z.NEVER;
    }
    return value;
  });

const deliveryBound = z.strictObject({
  unit: oneOf(['business_day', 'day', 'hour', 'month', 'week']),
  value: integer(1, 1000),
});
const taxBehavior = oneOf(['exclusive', 'inclusive', 'unspecified']);

const shippingRateData = z.strictObject({
  display_name: text(100),
  type: oneOf(['fixed_amount']).optional(),
  fixed_amount: z.strictObject({ amount: integer(0, 99_999_999), currency: currency() }).optional(),
  delivery_estimate: z
    .strictObject({ minimum: deliveryBound.optional(), maximum: deliveryBound.optional() })
    .optional(),
  metadata: metadata(),
  tax_behavior: taxBehavior.optional(),
  tax_code: optionalText(),
});

const lineItem = z.strictObject({
  price: optionalText(),
  price_data: z
    .strictObject({
      currency: currency(),
      unit_amount: integer(0, 99_999_999),
      product_data: z.strictObject({
        name: text(250),
        description: optionalText(40_000),
        images: indexed(text(2048), { max: 8 }).optional(),
        metadata: metadata(),
        tax_code: optionalText(),
      }),
      tax_behavior: taxBehavior.optional(),
    })
    .optional(),
  quantity: integer(1, 999_999),
});

/** The parameters the fake models; anything else is refused as unknown rather than silently ignored. */
const createSchema = z.strictObject({
  mode: oneOf(['payment', 'setup', 'subscription']),
  line_items: indexed(lineItem, { max: 100 }).optional(),
  metadata: metadata(),
  customer_email: optionalText(800),
  client_reference_id: optionalText(200),
  shipping_address_collection: z
    .strictObject({ allowed_countries: indexed(country(), { min: 1, max: 250 }) })
    .optional(),
  shipping_options: indexed(
    z.strictObject({ shipping_rate: optionalText(), shipping_rate_data: shippingRateData.optional() }),
    { max: 5 },
  ).optional(),
  success_url: optionalText(5000),
  cancel_url: optionalText(5000),
  expires_at: optionalInteger(0),
  payment_intent_data: z
    .strictObject({
      metadata: metadata(),
      description: optionalText(1000),
      receipt_email: optionalText(800),
      statement_descriptor: optionalText(22),
      statement_descriptor_suffix: optionalText(22),
      capture_method: oneOf(['automatic', 'automatic_async']).optional(),
    })
    .optional(),
  expand: expandParam(),
  locale: optionalText(10),
  currency: currency().optional(),
  billing_address_collection: oneOf(['auto', 'required']).optional(),
  submit_type: oneOf(['auto', 'book', 'donate', 'pay', 'subscribe']).optional(),
  phone_number_collection: z.strictObject({ enabled: optionalBoolean() }).optional(),
  allowed_payment_method_types: indexed(oneOf(['card'])).optional(),
  customer_creation: oneOf(['if_required']).optional(),
  ui_mode: oneOf(['hosted_page']).optional(),
});

type CreateParams = z.output<typeof createSchema>;

const retrieveSchema = z.strictObject({ expand: expandParam() });
const listParams = {
  limit: optionalInteger(1, 100),
  starting_after: optionalText(),
  ending_before: optionalText(),
  expand: expandParam(),
};
const listSchema = z.strictObject({
  ...listParams,
  payment_intent: optionalText(),
  status: oneOf(['open', 'complete', 'expired']).optional(),
});
const lineItemsSchema = z.strictObject(listParams);

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

function checkUrl(value: string | undefined, param: string): string | null {
  if (value === undefined) return null;
  let url: URL | null = null;
  try {
    url = new URL(value.replace('{CHECKOUT_SESSION_ID}', 'cs'));
  } catch {
    url = null;
  }
  if (!url || (url.protocol !== 'http:' && url.protocol !== 'https:'))
    throw paramError('Not a valid URL', param, 'url_invalid');
  return value;
}

/** The checks that need more than one field, in the order Stripe reports them. */
function toInput(p: CreateParams, now: number): SessionInput {
  if (p.mode !== 'payment') throw paramError(`This fake supports only mode=payment, not ${p.mode}.`, 'mode');
  if (!p.line_items || p.line_items.length === 0)
    throw paramError('Missing required param: line_items.', 'line_items', 'parameter_missing');
  const lineItems = p.line_items.map((item, i) => {
    if (item.price !== undefined) throw resourceMissingParam('price', item.price, `line_items[${i}][price]`);
    if (!item.price_data)
      throw paramError(
        `Missing required param: line_items[${i}][price_data].`,
        `line_items[${i}][price_data]`,
        'parameter_missing',
      );
    const pd = item.price_data;
    return {
      currency: pd.currency,
      unitAmount: pd.unit_amount,
      quantity: item.quantity,
      product: {
        name: pd.product_data.name,
        description: pd.product_data.description,
        images: pd.product_data.images ?? [],
        metadata: pd.product_data.metadata,
      },
    };
  });
  const sessionCurrency = p.currency ?? lineItems[0]?.currency ?? 'eur';
  lineItems.forEach((item, i) => {
    if (item.currency !== sessionCurrency) {
      throw paramError('All line items must share one currency.', `line_items[${i}][price_data][currency]`);
    }
  });
  const shippingOptions = (p.shipping_options ?? []).map((option, i) => {
    if (option.shipping_rate !== undefined)
      throw resourceMissingParam(
        'shipping_rate',
        option.shipping_rate,
        `shipping_options[${i}][shipping_rate]`,
      );
    const data = option.shipping_rate_data;
    if (!data)
      throw paramError(
        `Missing required param: shipping_options[${i}][shipping_rate_data].`,
        `shipping_options[${i}][shipping_rate_data]`,
        'parameter_missing',
      );
    if (!data.fixed_amount) {
      throw paramError(
        `Missing required param: shipping_options[${i}][shipping_rate_data][fixed_amount].`,
        `shipping_options[${i}][shipping_rate_data][fixed_amount]`,
        'parameter_missing',
      );
    }
    if (data.fixed_amount.currency !== sessionCurrency) {
      throw paramError(
        'The shipping rate must be in the currency of the line items.',
        `shipping_options[${i}][shipping_rate_data][fixed_amount][currency]`,
      );
    }
    const estimate = data.delivery_estimate;
    return {
      displayName: data.display_name,
      amount: data.fixed_amount.amount,
      currency: data.fixed_amount.currency,
      deliveryEstimate: estimate
        ? { minimum: estimate.minimum ?? null, maximum: estimate.maximum ?? null }
        : null,
      metadata: data.metadata,
    };
  });
  if (p.customer_email !== undefined && !EMAIL.test(p.customer_email)) {
    throw paramError(`Invalid email address: ${p.customer_email}`, 'customer_email', 'email_invalid');
  }
  const expiresAt = p.expires_at ?? now + MAX_EXPIRY_SECONDS;
  if (expiresAt < now + MIN_EXPIRY_SECONDS) {
    throw paramError(
      'The `expires_at` timestamp must be at least 30 minutes from Checkout Session creation.',
      'expires_at',
    );
  }
  if (expiresAt > now + MAX_EXPIRY_SECONDS) {
    throw paramError(
      'The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.',
      'expires_at',
    );
  }
  const subtotal = lineItems.reduce((sum, item) => sum + item.unitAmount * item.quantity, 0);
  const minimum = MINIMUM_AMOUNT[sessionCurrency];
  if (minimum !== undefined && subtotal + (shippingOptions[0]?.amount ?? 0) < minimum) {
    throw paramError(
      `The Checkout Session's total amount due must add up to at least ${minimum} in the smallest unit of ${sessionCurrency}.`,
      'line_items',
    );
  }
  const pid = p.payment_intent_data;
  return {
    lineItems,
    metadata: p.metadata,
    customerEmail: p.customer_email ?? null,
    clientReferenceId: p.client_reference_id ?? null,
    allowedCountries: p.shipping_address_collection?.allowed_countries ?? null,
    shippingOptions,
    successUrl: checkUrl(p.success_url, 'success_url'),
    cancelUrl: checkUrl(p.cancel_url, 'cancel_url'),
    expiresAt,
    locale: p.locale ?? null,
    billingAddressCollection: p.billing_address_collection ?? null,
    submitType: p.submit_type ?? null,
    phoneNumberCollection: p.phone_number_collection?.enabled ?? false,
    paymentIntentData: {
      metadata: pid?.metadata ?? {},
      description: pid?.description ?? null,
      receiptEmail: pid?.receipt_email ?? null,
      statementDescriptor: pid?.statement_descriptor ?? null,
      statementDescriptorSuffix: pid?.statement_descriptor_suffix ?? null,
    },
  };
}

function resourceMissingParam(kind: string, id: string, param: string) {
  // The fake has no Prices or Shipping Rates API, so an id made elsewhere can never be found here.
  return resourceMissing(kind, id, param, false);
}

function sessionRecord(ctx: FakeContext, req: ApiRequest): SessionRecord {
  sweepExpired(ctx);
  const id = pathParam(req);
  const record = ctx.state.sessions.get(id);
  if (!record) throw resourceMissing('checkout.session', id, 'session');
  return record;
}

export const checkoutRoutes: Route[] = [
  {
    method: 'POST',
    pattern: /^\/v1\/checkout\/sessions$/,
    handler: (ctx, req) => {
      const params = parseParams(createSchema, req.params);
      const built = buildSession(
        toInput(params, ctx.clock.nowSeconds()),
        ctx.clock.nowSeconds(),
        ctx.baseUrl,
        req.stripeVersion,
      );
      for (const product of built.products) ctx.state.products.set(product.id, product);
      for (const price of built.prices) ctx.state.prices.set(price.id, price);
      for (const rate of built.shippingRates) ctx.state.shippingRates.set(rate.id, rate);
      ctx.state.sessions.set(built.record.session.id, built.record);
      return ok(render(ctx, built.record.session, params.expand));
    },
  },
  {
    method: 'GET',
    pattern: /^\/v1\/checkout\/sessions$/,
    handler: (ctx, req) => {
      const params = parseParams(listSchema, req.params);
      sweepExpired(ctx);
      const sessions = [...ctx.state.sessions.values()]
        .map((r) => r.session)
        .filter((s) => (params.payment_intent ? s.payment_intent === params.payment_intent : true))
        .filter((s) => (params.status ? s.status === params.status : true))
        .reverse();
      return ok(render(ctx, listObject(sessions, params, '/v1/checkout/sessions'), params.expand));
    },
  },
  {
    method: 'GET',
    pattern: /^\/v1\/checkout\/sessions\/([^/]+)$/,
    handler: (ctx, req) => {
      const params = parseParams(retrieveSchema, req.params);
      return ok(render(ctx, sessionRecord(ctx, req).session, params.expand));
    },
  },
  {
    method: 'POST',
    pattern: /^\/v1\/checkout\/sessions\/([^/]+)\/expire$/,
    handler: (ctx, req) => {
      const params = parseParams(retrieveSchema, req.params);
      const record = sessionRecord(ctx, req);
      if (record.session.status !== 'open') {
        throw invalidRequest(
          `Only Checkout Sessions with a status of \`open\` can be expired; this one is \`${record.session.status}\`.`,
        );
      }
      expireSession(ctx, record, originOf(req));
      return ok(render(ctx, record.session, params.expand));
    },
  },
  {
    method: 'GET',
    pattern: /^\/v1\/checkout\/sessions\/([^/]+)\/line_items$/,
    handler: (ctx, req) => {
      const params = parseParams(lineItemsSchema, req.params);
      const record = sessionRecord(ctx, req);
      return ok(render(ctx, lineItemsList(ctx, record.session.id, params), params.expand));
    },
  },
];
