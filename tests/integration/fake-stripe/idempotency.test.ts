import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import type { FakeStripe } from '../../../fake-services/stripe/server';
import { control, maskOrder, sdk, startFake, stripeError } from './helpers';

let fake: FakeStripe;
let stripe: Stripe;

beforeEach(async () => {
  fake = await startFake();
  stripe = sdk(fake);
});

afterEach(async () => {
  await fake.close();
});

const sessionCount = async () =>
  (await control<{ checkout_sessions: { total: number } }>(fake, 'state')).body.checkout_sessions.total;

describe('idempotent requests', () => {
  it('replays the first answer for the same key and parameters, saying so in Idempotent-Replayed', async () => {
    const params = maskOrder();
    const first = await stripe.checkout.sessions.create(params, { idempotencyKey: 'hold_ibex_42-checkout' });
    const again = await stripe.checkout.sessions.create(params, { idempotencyKey: 'hold_ibex_42-checkout' });
    expect(again.id).toBe(first.id);
    expect(JSON.parse(JSON.stringify(again))).toEqual(JSON.parse(JSON.stringify(first)));
    expect(again.lastResponse.statusCode).toBe(first.lastResponse.statusCode);
    expect(first.lastResponse.headers['idempotent-replayed']).toBeUndefined();
    expect(again.lastResponse.headers['idempotent-replayed']).toBe('true');
    expect(await sessionCount()).toBe(1);
  });

  it('refuses the same key with other parameters with an idempotency_error', async () => {
    await stripe.checkout.sessions.create(maskOrder(), { idempotencyKey: 'reused-key' });
    const error = await stripeError(
      stripe.checkout.sessions.create(maskOrder({ client_reference_id: 'order_1002' }), {
        idempotencyKey: 'reused-key',
      }),
    );
    expect(error).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
    expect((error as Stripe.errors.StripeError).statusCode).toBe(400);
    expect((error as Stripe.errors.StripeError).rawType).toBe('idempotency_error');
    expect(await sessionCount()).toBe(1);
  });

  it('makes a new session for each create without a key of ours (the SDK sends a fresh one each time)', async () => {
    const a = await stripe.checkout.sessions.create(maskOrder());
    const b = await stripe.checkout.sessions.create(maskOrder());
    expect(a.id).not.toBe(b.id);
    expect(await sessionCount()).toBe(2);
    const { body } = await control<{ data: Array<{ path: string; idempotency_key: string | null }> }>(
      fake,
      'requests',
    );
    const keys = body.data.filter((r) => r.path === '/v1/checkout/sessions').map((r) => r.idempotency_key);
    expect(keys).toHaveLength(2);
    expect(keys[0]).toMatch(/^stripe-node-retry-/);
    expect(keys[0]).not.toBe(keys[1]);
  });

  it('keeps keys apart per API key', async () => {
    const other = sdk(fake, {}, 'sk_test_another_account_000');
    const a = await stripe.checkout.sessions.create(maskOrder(), { idempotencyKey: 'shared-key' });
    const b = await other.checkout.sessions.create(maskOrder(), { idempotencyKey: 'shared-key' });
    expect(b.id).not.toBe(a.id);
    expect(b.lastResponse.headers['idempotent-replayed']).toBeUndefined();
  });

  it('does not save a request whose parameters failed validation, so the corrected retry goes through', async () => {
    const bad = await stripeError(
      stripe.checkout.sessions.create(maskOrder({ expires_at: Math.floor(Date.now() / 1000) + 60 }), {
        idempotencyKey: 'fix-and-retry',
      }),
    );
    expect(bad).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    const good = await stripe.checkout.sessions.create(maskOrder(), { idempotencyKey: 'fix-and-retry' });
    expect(good.status).toBe('open');
  });

  it('saves an error the endpoint gave and replays it', async () => {
    const session = await stripe.checkout.sessions.create(maskOrder());
    await stripe.checkout.sessions.expire(session.id);
    const first = await stripeError(
      stripe.checkout.sessions.expire(session.id, {}, { idempotencyKey: 'expire-twice' }),
    );
    const second = await stripeError(
      stripe.checkout.sessions.expire(session.id, {}, { idempotencyKey: 'expire-twice' }),
    );
    expect(first).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(second.message).toBe(first.message);
    expect(second.headers?.['idempotent-replayed']).toBe('true');
    expect(first.headers?.['idempotent-replayed']).toBeUndefined();
  });

  it('forgets keys after 24 hours', async () => {
    const params = maskOrder({ expires_at: undefined });
    const first = await stripe.checkout.sessions.create(params, { idempotencyKey: 'day-old' });
    await control(fake, 'clock', { advanceSeconds: 23 * 3600 });
    expect((await stripe.checkout.sessions.create(params, { idempotencyKey: 'day-old' })).id).toBe(first.id);
    await control(fake, 'clock', { advanceSeconds: 2 * 3600 });
    expect((await stripe.checkout.sessions.create(params, { idempotencyKey: 'day-old' })).id).not.toBe(
      first.id,
    );
  });
});
