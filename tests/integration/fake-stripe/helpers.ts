import http from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { afterEach, beforeEach } from 'vitest';
import {
  type FakeStripe,
  type FakeStripeOptions,
  startFakeStripe,
} from '../../../fake-services/stripe/server';

export const SECRET_KEY = 'sk_test_marrowgate0000000001';
export const WEBHOOK_SECRET = 'whsec_marrowgate_test_secret';
export const FAST_RETRIES = [200, 400, 800];

export async function startFake(options: Partial<FakeStripeOptions> = {}): Promise<FakeStripe> {
  return startFakeStripe({ port: 0, retrySchedule: FAST_RETRIES, ...options });
}

/** The real SDK, pointed at the fake by configuration only. */
export function sdk(fake: FakeStripe, config: Stripe.StripeConfig = {}, key = SECRET_KEY): Stripe {
  return new Stripe(key, { host: '127.0.0.1', port: fake.port, protocol: 'http', ...config });
}

export async function control<T = Record<string, unknown>>(
  fake: FakeStripe,
  path: string,
  body?: unknown,
): Promise<{ status: number; body: T }> {
  const response = await fetch(`${fake.url}/_control/${path}`, {
    method: body === undefined ? 'GET' : 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  return { status: response.status, body: (await response.json()) as T };
}

export const inMinutes = (minutes: number) => Math.floor(Date.now() / 1000) + minutes * 60;

/** A drop from the demo studio: two masks and two ways to ship them. */
export function maskOrder(
  overrides: Partial<Stripe.Checkout.SessionCreateParams> = {},
): Stripe.Checkout.SessionCreateParams {
  return {
    mode: 'payment',
    line_items: [
      {
        price_data: {
          currency: 'eur',
          unit_amount: 8_500,
          product_data: { name: 'Ibex — Old Bone', description: 'Hand-carved, Marrowgate Studio' },
        },
        quantity: 2,
      },
      {
        price_data: { currency: 'eur', unit_amount: 12_000, product_data: { name: 'Moth — Verdigris' } },
        quantity: 1,
      },
    ],
    metadata: { hold_id: 'hold_ibex_42', studio: 'marrowgate' },
    customer_email: 'wren.hollis@example.test',
    client_reference_id: 'order_1001',
    shipping_address_collection: { allowed_countries: ['IE', 'FR'] },
    shipping_options: [
      {
        shipping_rate_data: {
          display_name: 'Tracked post',
          type: 'fixed_amount',
          fixed_amount: { amount: 600, currency: 'eur' },
          delivery_estimate: {
            minimum: { unit: 'business_day', value: 3 },
            maximum: { unit: 'business_day', value: 5 },
          },
        },
      },
      {
        shipping_rate_data: {
          display_name: 'Courier',
          type: 'fixed_amount',
          fixed_amount: { amount: 1_500, currency: 'eur' },
        },
      },
    ],
    success_url: 'http://127.0.0.1:3999/checkout/done?session={CHECKOUT_SESSION_ID}',
    cancel_url: 'http://127.0.0.1:3999/cart',
    expires_at: inMinutes(45),
    payment_intent_data: { metadata: { hold_id: 'hold_ibex_42' } },
    ...overrides,
  };
}

/** 2 × 85.00 + 1 × 120.00, in cents. */
export const ORDER_SUBTOTAL = 29_000;

export const IRISH_ADDRESS = {
  name: 'Wren Hollis',
  line1: '4 Tanner Lane',
  city: 'Cork',
  postal_code: 'T12 X2Y4',
  country: 'IE',
};

export async function payByControl(
  fake: FakeStripe,
  sessionId: string,
  card = '4242424242424242',
  extra: Record<string, unknown> = {},
) {
  return control<{
    outcome: string;
    session?: Stripe.Checkout.Session;
    error?: { code: string; decline_code: string | null; message: string };
  }>(fake, `sessions/${sessionId}/pay`, {
    card,
    email: 'wren.hollis@example.test',
    shipping: IRISH_ADDRESS,
    ...extra,
  });
}

export interface Received {
  raw: string;
  signature: string;
  event: { id: string; type: string; data: { object: Record<string, unknown> }; [key: string]: unknown };
  at: number;
}

export interface Receiver {
  url: string;
  received: Received[];
  of(type: string): Received[];
  waitFor(predicate: (received: Received[]) => boolean, timeoutMs?: number): Promise<void>;
  close(): Promise<void>;
}

/** A stand-in for the app's webhook endpoint; `answer` picks the status for the nth delivery (1-based). */
export async function startReceiver(
  answer: (n: number, event: Received['event']) => number = () => 200,
): Promise<Receiver> {
  const received: Received[] = [];
  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const raw = Buffer.concat(chunks).toString('utf8');
      const event = JSON.parse(raw) as Received['event'];
      received.push({ raw, signature: String(req.headers['stripe-signature'] ?? ''), event, at: Date.now() });
      res.statusCode = answer(received.length, event);
      res.end();
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}/webhooks/stripe`,
    received,
    of: (type) => received.filter((r) => r.event.type === type),
    async waitFor(predicate, timeoutMs = 5_000) {
      const deadline = Date.now() + timeoutMs;
      while (!predicate(received)) {
        if (Date.now() > deadline)
          throw new Error(
            `webhook receiver: condition not met; got ${received.map((r) => r.event.type).join(', ') || 'nothing'}`,
          );
        await new Promise((r) => setTimeout(r, 20));
      }
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

/** The error a Stripe call failed with; fails the test when the call succeeds instead. */
export async function stripeError(promise: Promise<unknown>): Promise<Stripe.errors.StripeError> {
  try {
    await promise;
  } catch (e) {
    if (e instanceof Stripe.errors.StripeError) return e;
    throw e;
  }
  throw new Error('expected the Stripe call to fail, but it succeeded');
}

export type StartedFake = { fake: FakeStripe; receiver: Receiver; stripe: Stripe };

/**
 * A fresh fake and webhook receiver for every test, closed afterwards; `use` hands them to the test
 * file's own variables.
 */
export function withFakeStripe(use: (started: StartedFake) => void): void {
  let started: StartedFake | undefined;
  beforeEach(async () => {
    const receiver = await startReceiver();
    const fake = await startFake({ webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET });
    started = { fake, receiver, stripe: sdk(fake) };
    use(started);
  });
  afterEach(async () => {
    await started?.fake.close();
    await started?.receiver.close();
    started = undefined;
  });
}
