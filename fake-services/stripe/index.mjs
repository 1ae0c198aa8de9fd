// Starts the fake Stripe as its own process for the demo and the test run, and waits until it answers.
import { isPortOpen, startService, waitForHttp } from '../../scripts/lib/run.mjs';

export const DEFAULT_STRIPE_PORT = 12111;

/** Test-mode keys for the fake: made up, and only the fake accepts them. */
export const fakeStripeKeys = {
  secretKey: 'sk_test_demold_fake_0000000000000000',
  webhookSecret: 'whsec_demold_fake_0000000000000000',
};

export async function startFakeStripeService({ port = DEFAULT_STRIPE_PORT, webhookUrl, webhookSecret = fakeStripeKeys.webhookSecret, retrySchedule, quiet = false } = {}) {
  if (await isPortOpen(port)) {
    throw new Error(`Port ${port} on 127.0.0.1 is taken, so the fake Stripe cannot start. Stop what uses it, or pick another with FAKE_STRIPE_PORT.`);
  }
  const env = { ...process.env, FAKE_STRIPE_WEBHOOK_URL: webhookUrl ?? '', STRIPE_WEBHOOK_SECRET: webhookSecret };
  if (retrySchedule) env.FAKE_STRIPE_RETRY_SCHEDULE = retrySchedule.join(',');
  const service = startService('stripe', process.execPath, ['--import', 'tsx', 'fake-services/stripe/server.ts', '--port', String(port)], { env, quiet });
  const url = `http://127.0.0.1:${port}`;
  await waitForHttp(`${url}/_control/state`, { timeoutMs: 30_000, process: service.child });
  return { service, url, ...fakeStripeKeys, webhookSecret };
}
