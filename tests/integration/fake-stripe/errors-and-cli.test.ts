import { spawn } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import type { FakeStripe } from '../../../fake-services/stripe/server';
import { control, maskOrder, sdk, SECRET_KEY, startFake, stripeError } from './helpers';

let fake: FakeStripe;

beforeAll(async () => {
  fake = await startFake();
});

afterAll(async () => {
  await fake.close();
});

async function raw(pathname: string, init: RequestInit & { key?: string | null } = {}) {
  const headers = new Headers(init.headers);
  if (init.key !== null) headers.set('Authorization', `Bearer ${init.key ?? SECRET_KEY}`);
  const response = await fetch(`${fake.url}${pathname}`, { ...init, headers });
  const text = await response.text();
  return {
    status: response.status,
    text,
    json: JSON.parse(text) as { error?: { type: string; code?: string; message: string; param?: string } },
  };
}

describe('authentication', () => {
  it('refuses a missing key with 401 and a bad one with StripeAuthenticationError', async () => {
    const missing = await raw('/v1/checkout/sessions', { key: null });
    expect(missing.status).toBe(401);
    expect(missing.json.error).toMatchObject({ type: 'invalid_request_error' });
    expect(missing.json.error?.message).toContain('You did not provide an API key');

    for (const key of ['sk_test_x', 'sk_live_0123456789abcdef', 'pk_test_0123456789abcdef']) {
      const error = await stripeError(sdk(fake, { maxNetworkRetries: 0 }, key).checkout.sessions.list());
      expect(error).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
    }
    const basic = await raw('/v1/events', {
      key: null,
      headers: { Authorization: `Basic ${Buffer.from(`${SECRET_KEY}:`).toString('base64')}` },
    });
    expect(basic.status).toBe(200);
  });
});

describe("bad input gets Stripe's error shape, never a crash", () => {
  it.each([
    ['a broken bracket', 'mode=payment&line_items[0=1'],
    ['a hash where a string belongs', 'mode[x]=payment'],
    ['a string where a hash belongs', 'mode=payment&metadata=oops'],
    ['an array index where a hash belongs', 'mode=payment&line_items[x][quantity]=1'],
    ['a clash of array and hash', 'mode=payment&expand[]=a&expand[b]=c'],
    ['bad percent-encoding', 'mode=%E0%A4%A&line_items[0][quantity]=%ZZ'],
    ['a prototype key', '__proto__[polluted]=1&mode=payment'],
    ['a huge integer', 'mode=payment&expires_at=99999999999999999999999'],
    ['nothing at all', ''],
  ])('%s', async (_label, body) => {
    const answer = await raw('/v1/checkout/sessions', {
      method: 'POST',
      body,
      headers: { 'Content-Type': 'application/x-www-form-urlencoded' },
    });
    expect(answer.status).toBe(400);
    expect(answer.json.error?.type).toBe('invalid_request_error');
    expect(answer.text).not.toMatch(/at .+\.ts:\d+/);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it('refuses JSON bodies, unknown URLs and a malformed Stripe-Version', async () => {
    const json = await raw('/v1/refunds', {
      method: 'POST',
      body: '{"amount":1}',
      headers: { 'Content-Type': 'application/json' },
    });
    expect(json.status).toBe(400);
    const unknown = await raw('/v1/customers');
    expect(unknown.status).toBe(404);
    expect(unknown.json.error?.message).toContain('Unrecognized request URL (GET: /v1/customers)');
    const version = await raw('/v1/events', { headers: { 'Stripe-Version': 'yesterday' } });
    expect([version.status, version.json.error?.code]).toEqual([400, 'api_version_invalid']);
    const control404 = await control(fake, 'nothing-here');
    expect(control404.status).toBe(404);
    const notJson = await fetch(`${fake.url}/_control/faults`, { method: 'POST', body: '{oops' });
    expect(notJson.status).toBe(400);
  });

  it('parses GET query strings and rejects unknown query parameters', async () => {
    const ok = await raw('/v1/events?limit=2&types[]=checkout.session.completed');
    expect(ok.status).toBe(200);
    const bad = await raw('/v1/events?limit=1000');
    expect([bad.status, bad.json.error?.param]).toEqual([400, 'limit']);
    const odd = await raw('/v1/events?colour=soot');
    expect([odd.status, odd.json.error?.code]).toEqual([400, 'parameter_unknown']);
  });

  it('reset forgets everything', async () => {
    const stripe = sdk(fake);
    await stripe.checkout.sessions.create(maskOrder());
    const before = await control<{ checkout_sessions: { total: number } }>(fake, 'state');
    expect(before.body.checkout_sessions.total).toBeGreaterThan(0);
    const after = await control<{ checkout_sessions: { total: number }; requests: number }>(
      fake,
      'reset',
      {},
    );
    expect(after.body.checkout_sessions.total).toBe(0);
    expect(after.body.requests).toBe(0);
  });
});

describe('the command line', () => {
  it('starts with node --import tsx, listens on loopback and stops on SIGTERM', async () => {
    const repoRoot = path.resolve(__dirname, '../../..');
    const child = spawn(
      process.execPath,
      ['--import', 'tsx', 'fake-services/stripe/server.ts', '--port', '0'],
      {
        cwd: repoRoot,
        env: { ...process.env, FAKE_STRIPE_WEBHOOK_URL: '', STRIPE_WEBHOOK_SECRET: '' },
        stdio: ['ignore', 'pipe', 'pipe'],
      },
    );
    try {
      const url = await new Promise<string>((resolve, reject) => {
        let out = '';
        const timer = setTimeout(() => reject(new Error(`no start within 15 s: ${out}`)), 15_000);
        child.stdout.on('data', (chunk: Buffer) => {
          out += chunk.toString();
          const m = /listening on (http:\/\/127\.0\.0\.1:\d+)/.exec(out);
          if (m?.[1]) {
            clearTimeout(timer);
            resolve(m[1]);
          }
        });
        child.on('exit', (code) => reject(new Error(`exited ${code}: ${out}`)));
      });
      const port = Number(new URL(url).port);
      const stripe = new Stripe(SECRET_KEY, { host: '127.0.0.1', port, protocol: 'http' });
      const session = await stripe.checkout.sessions.create(maskOrder());
      expect(session.url).toBe(`${url}/pay/${session.id}`);
    } finally {
      const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
      child.kill('SIGTERM');
      expect(await exited).toBe(0);
    }
  });
});
