import 'server-only';
import Stripe from 'stripe';
import { AppError } from '@/lib/api/errors';
import { getEnv } from '@/lib/env';

const globalForStripe = globalThis as typeof globalThis & { __demoldStripe?: Stripe };

/**
 * The official Stripe client. Pointing it at the local fake is configuration only (STRIPE_API_URL gives
 * host, port and protocol); unset, it talks to Stripe itself. The SDK retries network failures and 409s
 * itself, with the same Idempotency-Key, so a retry never makes a second object.
 */
export function getStripe(): Stripe {
  if (globalForStripe.__demoldStripe) return globalForStripe.__demoldStripe;
  const env = getEnv();
  if (!env.STRIPE_SECRET_KEY) {
    throw new AppError('payments_unavailable', 'Payments are not set up in this shop yet. Please try again later.', 503, undefined, 300);
  }
  const fake = env.STRIPE_API_URL ? new URL(env.STRIPE_API_URL) : null;
  globalForStripe.__demoldStripe = new Stripe(env.STRIPE_SECRET_KEY, {
    maxNetworkRetries: 2,
    timeout: env.STRIPE_TIMEOUT_MS,
    appInfo: { name: 'Demold' },
    ...(fake
      ? { host: fake.hostname, port: Number(fake.port || (fake.protocol === 'https:' ? 443 : 80)), protocol: fake.protocol.replace(':', '') as 'http' | 'https' }
      : {}),
  });
  return globalForStripe.__demoldStripe;
}

/** Only tests swap the client (for one pointed at a fake started on a free port). */
export function setStripeForTests(client: Stripe | undefined): void {
  globalForStripe.__demoldStripe = client;
}

/** A Stripe failure as the buyer or maker should hear it: the provider is down or slow, try again. */
export function paymentProviderError(error: unknown): AppError {
  if (error instanceof AppError) return error;
  const stripeError = error as { type?: string; message?: string; statusCode?: number; code?: string };
  console.error('Stripe request failed', { type: stripeError.type, code: stripeError.code, status: stripeError.statusCode, message: stripeError.message });
  return new AppError(
    'payments_unavailable',
    'The payment service did not answer in time. Nothing was charged; please try again in a minute.',
    503,
    undefined,
    30,
  );
}
