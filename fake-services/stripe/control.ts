import type { ServerResponse } from 'node:http';
import { z } from 'zod';
import { type PaymentAttempt, payCheckoutSession, sweepExpired } from './checkout-flow';
import type { FakeContext } from './context';
import { faultsSchema } from './faults';
import { sendJson } from './http-io';

/*
 * The control API for tests, under /_control/ so that it can never be mistaken for Stripe's. JSON in,
 * JSON out; bad input gets the same error shape as the /v1 API.
 */

const endpointSchema = z.strictObject({
  url: z.union([z.url({ protocol: /^https?$/ }), z.null()]),
  secret: z
    .string()
    .regex(/^whsec_\S+$/, 'a signing secret starts with whsec_')
    .optional(),
});

const cardSchema = z.union([
  z.string(),
  z.strictObject({
    number: z.string(),
    exp_month: z.number().int().optional(),
    exp_year: z.number().int().optional(),
    cvc: z.string().optional(),
  }),
]);

const paySchema = z.strictObject({
  card: cardSchema,
  email: z.string().max(800).default('customer@example.test'),
  name: z.string().max(200).optional(),
  shipping: z
    .strictObject({
      name: z.string().max(200).optional(),
      line1: z.string().max(200),
      line2: z.string().max(200).optional(),
      city: z.string().max(200),
      postal_code: z.string().max(40),
      state: z.string().max(200).optional(),
      country: z.string().length(2),
    })
    .optional(),
  shipping_rate: z.string().optional(),
});

const clockSchema = z.strictObject({
  advanceSeconds: z
    .number()
    .min(0)
    .max(400 * 24 * 3600),
});

function badRequest(res: ServerResponse, issues: ReadonlyArray<z.core.$ZodIssue>): void {
  const issue = issues[0];
  sendJson(res, 400, {
    error: {
      type: 'invalid_request_error',
      message: issue ? `${issue.path.join('.') || 'body'}: ${issue.message}` : 'Invalid body',
      param: issue?.path.join('.'),
    },
  });
}

function parseJson(body: string): unknown {
  if (body.trim() === '') return {};
  try {
    return JSON.parse(body) as unknown;
  } catch {
    return Symbol('invalid json');
  }
}

function toAttempt(input: z.output<typeof paySchema>): PaymentAttempt {
  const card = typeof input.card === 'string' ? { number: input.card } : input.card;
  // The test cards work with any future expiry and any CVC, so those may be left out.
  const nextYear = new Date().getUTCFullYear() + 3;
  return {
    email: input.email,
    cardNumber: card.number,
    expMonth: 'exp_month' in card ? (card.exp_month ?? 12) : 12,
    expYear: 'exp_year' in card ? (card.exp_year ?? nextYear) : nextYear,
    cvc: 'cvc' in card ? (card.cvc ?? '123') : '123',
    name: input.name ?? input.shipping?.name ?? 'Test Customer',
    shipping: input.shipping
      ? { ...input.shipping, line2: input.shipping.line2 ?? '', state: input.shipping.state ?? '' }
      : null,
    shippingRate: input.shipping_rate ?? null,
  };
}

function counts(ctx: FakeContext) {
  const byStatus = <T extends { status: string | null }>(items: Iterable<T>) => {
    const out: Record<string, number> = {};
    for (const item of items) out[item.status ?? 'null'] = (out[item.status ?? 'null'] ?? 0) + 1;
    return out;
  };
  const { state } = ctx;
  return {
    checkout_sessions: {
      total: state.sessions.size,
      ...byStatus([...state.sessions.values()].map((r) => r.session)),
    },
    payment_intents: { total: state.paymentIntents.size, ...byStatus(state.paymentIntents.values()) },
    charges: { total: state.charges.size, ...byStatus(state.charges.values()) },
    refunds: state.refunds.size,
    events: state.events.size,
    webhook_deliveries: { total: ctx.webhooks.deliveries.length, ...byStatus(ctx.webhooks.deliveries) },
    requests: state.requests.length,
    idempotency_keys: ctx.idempotency.size,
    clock: { now: ctx.clock.nowSeconds(), offset_seconds: ctx.clock.offsetSeconds },
    webhook_endpoint: ctx.webhooks.endpointUrl,
    faults: { ...ctx.faults.api, webhook: ctx.webhooks.faults },
  };
}

/** Routes /_control/*; answers 404 in Stripe's error shape for anything else. */
export function handleControl(
  ctx: FakeContext,
  method: string,
  url: URL,
  body: string,
  res: ServerResponse,
): void {
  const path = url.pathname;
  const json = method === 'POST' ? parseJson(body) : {};
  if (typeof json === 'symbol') {
    sendJson(res, 400, { error: { type: 'invalid_request_error', message: 'The body must be JSON.' } });
    return;
  }
  if (method === 'GET' && path === '/_control/state') {
    sweepExpired(ctx);
    sendJson(res, 200, counts(ctx));
    return;
  }
  if (method === 'GET' && path === '/_control/requests') {
    const id = url.searchParams.get('id');
    const pathFilter = url.searchParams.get('path');
    const data = ctx.state.requests.filter(
      (r) => (!id || r.id === id) && (!pathFilter || r.path === pathFilter),
    );
    sendJson(res, 200, { data });
    return;
  }
  if (method === 'GET' && path === '/_control/webhooks') {
    const type = url.searchParams.get('type');
    sendJson(res, 200, {
      endpoint: ctx.webhooks.endpointUrl,
      data: ctx.webhooks.deliveries.filter((d) => !type || d.event_type === type),
    });
    return;
  }
  if (method === 'POST' && path === '/_control/faults') {
    const parsed = faultsSchema.safeParse(json);
    if (!parsed.success) return badRequest(res, parsed.error.issues);
    const applied = ctx.faults.apply(parsed.data);
    ctx.webhooks.faults = applied.webhook;
    sendJson(res, 200, { ...applied.api, webhook: applied.webhook });
    return;
  }
  if (method === 'POST' && path === '/_control/reset') {
    ctx.state.reset();
    ctx.webhooks.reset();
    ctx.idempotency.reset();
    ctx.faults.reset();
    ctx.clock.reset();
    sendJson(res, 200, counts(ctx));
    return;
  }
  if (method === 'POST' && path === '/_control/webhook-endpoint') {
    const parsed = endpointSchema.safeParse(json);
    if (!parsed.success) return badRequest(res, parsed.error.issues);
    const { url: endpointUrl, secret } = parsed.data;
    if (endpointUrl !== null && !secret) {
      sendJson(res, 400, {
        error: {
          type: 'invalid_request_error',
          message: 'secret: a signing secret (whsec_...) is needed with a url',
          param: 'secret',
        },
      });
      return;
    }
    ctx.webhooks.setEndpoint(endpointUrl === null || !secret ? null : { url: endpointUrl, secret });
    sendJson(res, 200, { url: ctx.webhooks.endpointUrl });
    return;
  }
  if (method === 'POST' && path === '/_control/clock') {
    const parsed = clockSchema.safeParse(json);
    if (!parsed.success) return badRequest(res, parsed.error.issues);
    ctx.clock.advance(parsed.data.advanceSeconds);
    sweepExpired(ctx);
    sendJson(res, 200, { now: ctx.clock.nowSeconds(), offset_seconds: ctx.clock.offsetSeconds });
    return;
  }
  const pay = /^\/_control\/sessions\/([^/]+)\/pay$/.exec(path);
  if (method === 'POST' && pay) {
    const record = ctx.state.sessions.get(decodeURIComponent(pay[1] ?? ''));
    if (!record) {
      sendJson(res, 404, {
        error: {
          type: 'invalid_request_error',
          code: 'resource_missing',
          message: `No such checkout.session: '${pay[1]}'`,
        },
      });
      return;
    }
    const parsed = paySchema.safeParse(json);
    if (!parsed.success) return badRequest(res, parsed.error.issues);
    const result = payCheckoutSession(ctx, record, toAttempt(parsed.data));
    if (result.kind === 'paid') sendJson(res, 200, { outcome: 'paid', session: result.session });
    else if (result.kind === 'declined') {
      sendJson(res, 402, {
        outcome: 'declined',
        error: {
          type: 'card_error',
          code: result.code,
          decline_code: result.declineCode,
          message: result.message,
          charge: result.charge.id,
        },
        payment_intent: result.paymentIntent,
      });
    } else if (result.kind === 'invalid') sendJson(res, 400, { outcome: 'invalid', errors: result.errors });
    else sendJson(res, 409, { outcome: 'not_open', status: result.status });
    return;
  }
  sendJson(res, 404, {
    error: {
      type: 'invalid_request_error',
      message: `Unrecognized control URL (${method}: ${path}). See fake-services/stripe/README.md.`,
    },
  });
}
