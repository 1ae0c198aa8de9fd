import http from 'node:http';
import { BodyTooLarge, readBody } from '../lib/http-io';
import { argValue, assertLoopback, closeServer, listen, portFrom, runAsCli } from '../lib/serve';
import { sweepExpired } from './checkout-flow';
import { Clock } from './clock';
import type { FakeContext } from './context';
import { handleControl } from './control';
import { DEFAULT_SEED, FaultState } from './faults';
import { sendJson } from './http-io';
import { IdempotencyStore } from './idempotency';
import { seededRandom } from './ids';
import { handlePaymentPage, handleReceipt } from './payment-page';
import { apiRoutes, handleApi } from './router';
import { FakeState } from './state';
import { WebhookDispatcher } from './webhooks';

/*
 * A local stand-in for Stripe that the official `stripe` SDK talks to unchanged:
 *   new Stripe(secretKey, { host: '127.0.0.1', port, protocol: 'http' })
 * It serves /v1 (Stripe's API, the parts in README.md), /pay/:id (the hosted payment page) and
 * /_control (for tests). State lives in memory and is gone when the process ends.
 */

export interface FakeStripeOptions {
  /** 0 picks a free port. */
  port: number;
  /** Loopback only: the fake has no authentication worth the name and must not be reachable from elsewhere. */
  host?: string;
  webhookUrl?: string;
  webhookSecret?: string;
  /** Milliseconds before each webhook retry; its length is the number of retries. */
  retrySchedule?: number[];
  webhookTimeoutMs?: number;
  /** How often to look for sessions whose expires_at has passed. */
  expiryCheckMs?: number;
}

export interface FakeStripe {
  url: string;
  port: number;
  close(): Promise<void>;
}

/** Stripe retries for days; the fake keeps the same shape but short, and tests make it shorter still. */
export const DEFAULT_RETRY_SCHEDULE = [1_000, 5_000, 30_000, 120_000, 600_000];

export async function startFakeStripe(options: FakeStripeOptions): Promise<FakeStripe> {
  const host = options.host ?? '127.0.0.1';
  assertLoopback(host, 'Stripe');
  if (options.webhookUrl) {
    const endpoint = new URL(options.webhookUrl);
    if (endpoint.protocol !== 'http:' && endpoint.protocol !== 'https:')
      throw new Error(`The webhook URL must be http(s): ${options.webhookUrl}`);
    if (!options.webhookSecret?.startsWith('whsec_')) {
      throw new Error(
        'A webhook URL needs its signing secret (whsec_...), from STRIPE_WEBHOOK_SECRET or webhookSecret.',
      );
    }
  }
  const clock = new Clock();
  const state = new FakeState();
  const webhooks = new WebhookDispatcher({
    url: options.webhookUrl,
    secret: options.webhookSecret,
    retrySchedule: options.retrySchedule ?? DEFAULT_RETRY_SCHEDULE,
    timeoutMs: options.webhookTimeoutMs ?? 10_000,
    random: seededRandom(DEFAULT_SEED),
    onDelivered: (eventId) => {
      const event = state.events.get(eventId);
      if (event) event.pending_webhooks = 0;
    },
  });
  const ctx: FakeContext = {
    state,
    clock,
    webhooks,
    idempotency: new IdempotencyStore(() => clock.nowSeconds()),
    faults: new FaultState(),
    baseUrl: '',
  };
  const routes = apiRoutes(ctx);

  const server = http.createServer((req, res) => {
    void (async () => {
      const url = new URL(req.url ?? '/', 'http://fake-stripe.invalid');
      try {
        const body = (await readBody(req)).toString('utf8');
        const method = req.method ?? 'GET';
        if (url.pathname.startsWith('/v1/')) {
          await handleApi(ctx, routes, req, res, url, body);
          return;
        }
        if (url.pathname.startsWith('/_control/')) {
          handleControl(ctx, method, url, body, res);
          return;
        }
        const pay = /^\/pay\/([^/]+)$/.exec(url.pathname);
        if (pay && (method === 'GET' || method === 'POST')) {
          handlePaymentPage(ctx, req, res, decodeURIComponent(pay[1] ?? ''), body);
          return;
        }
        const receipt = /^\/receipts\/([^/]+)$/.exec(url.pathname);
        if (receipt && method === 'GET') {
          handleReceipt(ctx, res, decodeURIComponent(receipt[1] ?? ''));
          return;
        }
        sendJson(res, 404, {
          error: {
            type: 'invalid_request_error',
            message: `Unrecognized request URL (${method}: ${url.pathname}).`,
          },
        });
      } catch (e) {
        if (e instanceof BodyTooLarge) {
          sendJson(res, 413, {
            error: { type: 'invalid_request_error', message: 'The request body is too large.' },
          });
          return;
        }
        console.error('[fake-stripe] unexpected failure', e);
        sendJson(res, 500, { error: { type: 'api_error', message: 'An unknown error occurred' } });
      }
    })();
  });

  const { port, url } = await listen(server, options.port, host);
  ctx.baseUrl = url;

  // Expiry is also checked on every request; the timer is for the webhook when nobody is asking.
  const sweeper = setInterval(() => sweepExpired(ctx), options.expiryCheckMs ?? 1_000);
  sweeper.unref();

  return {
    url,
    port,
    async close() {
      clearInterval(sweeper);
      await webhooks.close();
      await closeServer(server);
    },
  };
}

// `node --import tsx fake-services/stripe/server.ts [--port 12111] [--host 127.0.0.1]`
runAsCli('stripe', async (args) => {
  const schedule = process.env.FAKE_STRIPE_RETRY_SCHEDULE?.split(',').map(Number);
  if (schedule?.some((n) => !Number.isFinite(n) || n < 0))
    throw new Error('FAKE_STRIPE_RETRY_SCHEDULE must be milliseconds separated by commas');
  const fake = await startFakeStripe({
    port: portFrom(args, 'FAKE_STRIPE_PORT', 12111),
    host: argValue(args, '--host'),
    webhookUrl: process.env.FAKE_STRIPE_WEBHOOK_URL || undefined,
    webhookSecret: process.env.STRIPE_WEBHOOK_SECRET || undefined,
    retrySchedule: schedule,
  });
  console.log(
    `fake Stripe listening on ${fake.url} (webhooks: ${process.env.FAKE_STRIPE_WEBHOOK_URL || 'none yet'})`,
  );
  return fake;
});
