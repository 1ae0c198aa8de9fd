import type { IncomingMessage, ServerResponse } from 'node:http';
import { send } from '../lib/http-io';
import { checkoutRoutes } from './api-checkout';
import { sweepExpired } from './checkout-flow';
import { paymentRoutes } from './api-payments';
import type { ApiRequest, ApiResponse, Route } from './api-types';
import { DEFAULT_API_VERSION, type FakeContext } from './context';
import { type FormObject, parseFormParams } from './form-params';
import type { Reservation } from './idempotency';
import { newId } from './ids';
import { apiError, authenticationError, paramError, StripeHttpError, unrecognizedUrl } from './stripe-errors';

const NO_KEY_MESSAGE =
  "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY'). See https://docs.stripe.com/api#authentication for details.";
const TEST_KEY = /^(sk|rk)_test_[A-Za-z0-9_]{8,}$/;
const API_VERSION = /^\d{4}-\d{2}-\d{2}(\.[a-z]+)?$/;

export function apiRoutes(ctx: FakeContext): Route[] {
  return [...checkoutRoutes, ...paymentRoutes(ctx)];
}

/** Bearer (what the SDK sends) or Basic with the key as user name (what curl -u sends). */
function apiKeyOf(req: IncomingMessage): string {
  const header = req.headers.authorization;
  if (!header) throw authenticationError(NO_KEY_MESSAGE);
  let key = '';
  const [scheme, value = ''] = header.trim().split(/\s+/, 2);
  if (scheme?.toLowerCase() === 'bearer') key = value;
  else if (scheme?.toLowerCase() === 'basic')
    key = Buffer.from(value, 'base64').toString('utf8').split(':')[0] ?? '';
  else throw authenticationError(NO_KEY_MESSAGE);
  if (key.startsWith('sk_live_') || key.startsWith('rk_live_')) {
    throw authenticationError(
      'This fake accepts test-mode keys only (sk_test_...); a live key never belongs here.',
    );
  }
  if (key.startsWith('pk_'))
    throw authenticationError(
      'This API call cannot be made with a publishable API key. Please use a secret API key.',
    );
  if (!TEST_KEY.test(key))
    throw authenticationError(`Invalid API Key provided: ${key.slice(0, 8)}****${key.slice(-4)}`);
  return key;
}

function headerValue(req: IncomingMessage, name: string): string | null {
  const value = req.headers[name];
  return Array.isArray(value) ? (value[0] ?? null) : (value ?? null);
}

function match(routes: Route[], method: string, path: string): { route: Route; params: string[] } | null {
  for (const route of routes) {
    if (route.method !== method) continue;
    const m = route.pattern.exec(path);
    if (m) return { route, params: m.slice(1) };
  }
  return null;
}

function sleep(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

/** One /v1 request: authenticate, parse, idempotency, faults, handler, log; every failure in Stripe's shape. */
export async function handleApi(
  ctx: FakeContext,
  routes: Route[],
  req: IncomingMessage,
  res: ServerResponse,
  url: URL,
  body: string,
): Promise<void> {
  const requestId = newId('req', 14);
  const method = req.method ?? 'GET';
  const idempotencyKey = method === 'POST' ? headerValue(req, 'idempotency-key') : null;
  const requestedVersion = headerValue(req, 'stripe-version');
  let params: FormObject | string = method === 'POST' ? body : url.search.slice(1);
  let status = 500;
  let replayed = false;
  let fault: 'fail_rate' | null = null;
  let reservation: Reservation | null = null;
  const headers: Record<string, string> = {
    'Request-Id': requestId,
    'Stripe-Version': requestedVersion ?? DEFAULT_API_VERSION,
  };
  if (idempotencyKey) headers['Idempotency-Key'] = idempotencyKey;

  /** Serialized once, so that a replay under the same idempotency key is byte-for-byte the first answer. */
  const respond = (statusCode: number, payload: unknown, save?: Reservation | null) => {
    status = statusCode;
    const text = JSON.stringify(payload, null, 2);
    if (save?.kind === 'new') save.complete(statusCode, text, requestId);
    send(res, statusCode, text, { 'Content-Type': 'application/json', ...headers });
  };

  try {
    const apiKey = apiKeyOf(req);
    // Whatever is asked, the answer reflects sessions whose time ran out since the last request.
    sweepExpired(ctx);
    if (requestedVersion !== null && !API_VERSION.test(requestedVersion)) {
      throw paramError(`Invalid Stripe API version: ${requestedVersion}`, undefined, 'api_version_invalid');
    }
    const contentType = headerValue(req, 'content-type') ?? '';
    if (method === 'POST' && body !== '' && !contentType.startsWith('application/x-www-form-urlencoded')) {
      throw paramError(
        'Stripe v1 requests must be form-encoded (Content-Type: application/x-www-form-urlencoded).',
        undefined,
      );
    }
    params = parseFormParams(typeof params === 'string' ? params : '');
    const found = match(routes, method, url.pathname);
    if (!found) throw unrecognizedUrl(method, url.pathname);
    const apiReq: ApiRequest = {
      method,
      path: url.pathname,
      pathParams: found.params,
      params,
      apiKey,
      idempotencyKey,
      stripeVersion: requestedVersion ?? DEFAULT_API_VERSION,
      requestId,
    };
    if (idempotencyKey) {
      reservation = ctx.idempotency.reserve(apiKey, idempotencyKey, `${method} ${url.pathname}`, params);
      if (reservation.kind === 'replay') {
        replayed = true;
        headers['Idempotent-Replayed'] = 'true';
        headers['Original-Request'] = reservation.originalRequestId;
        status = reservation.status;
        send(res, reservation.status, reservation.body, { 'Content-Type': 'application/json', ...headers });
        return;
      }
    }
    if (ctx.faults.api.latencyMs > 0) await sleep(ctx.faults.api.latencyMs);
    if (ctx.faults.shouldFail()) {
      fault = 'fail_rate';
      throw apiError('An unknown error occurred (the failRate fault of the fake Stripe).');
    }
    let result: ApiResponse;
    try {
      result = found.route.handler(ctx, apiReq);
    } catch (e) {
      if (e instanceof StripeHttpError) throw e;
      // A bug in the fake: say so in its log, but answer like Stripe, without a stack trace.
      console.error('[fake-stripe] handler failed', e);
      throw new StripeHttpError(500, { type: 'api_error', message: 'An unknown error occurred' }, false);
    }
    respond(result.status, result.body, reservation);
  } catch (e) {
    const error = e instanceof StripeHttpError ? e : apiError();
    if (!(e instanceof StripeHttpError)) console.error('[fake-stripe] request failed', e);
    if (error.status === 401) headers['WWW-Authenticate'] = 'Bearer realm="Stripe"';
    const keep = reservation?.kind === 'new' && error.idempotent ? reservation : null;
    if (reservation?.kind === 'new' && !keep) reservation.release();
    // Injected failures are transient by design: tell the SDK it may retry (with the same idempotency key).
    if (fault) headers['Stripe-Should-Retry'] = 'true';
    respond(
      error.status,
      { error: { ...error.body, request_log_url: `${ctx.baseUrl}/_control/requests?id=${requestId}` } },
      keep,
    );
  } finally {
    ctx.state.logRequest({
      id: requestId,
      at: new Date(ctx.clock.nowMs()).toISOString(),
      method,
      path: url.pathname,
      idempotency_key: idempotencyKey,
      stripe_version: requestedVersion,
      params: typeof params === 'string' ? null : params,
      status,
      replayed,
      fault,
    });
  }
}
