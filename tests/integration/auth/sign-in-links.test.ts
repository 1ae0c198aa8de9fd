import { randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { withAppDatabase } from '../support/app-database';

withAppDatabase('links');

async function newLink(email: string, expiresInMs = 15 * 60_000) {
  const { demoldAdapter } = await import('@/lib/auth/adapter');
  const { hashSignInToken } = await import('@/lib/auth/sign-in-link');
  const secret = randomBytes(32).toString('hex');
  const token = hashSignInToken(secret);
  await demoldAdapter().createVerificationToken!({ identifier: email, token, expires: new Date(Date.now() + expiresInMs) });
  return { secret, token };
}

describe('sign-in links', () => {
  it('are stored only as a hash of their secret', async () => {
    const { query } = await import('../support/database');
    const { secret } = await newLink('hash@example.com');
    const rows = await query<{ token: string }>(process.env.DATABASE_URL!, 'SELECT token FROM verification_tokens WHERE identifier = $1', ['hash@example.com']);
    expect(rows).toHaveLength(1);
    expect(rows[0]!.token).not.toContain(secret);
    expect(rows[0]!.token).toMatch(/^[0-9a-f]{64}$/);
  });

  it('work exactly once, even when clicked many times at the same moment', async () => {
    const { demoldAdapter } = await import('@/lib/auth/adapter');
    const { inspectSignInLink } = await import('@/lib/auth/sign-in-link');
    const { secret, token } = await newLink('race@example.com');
    expect(await inspectSignInLink({ token: secret, email: 'race@example.com' })).toBe('valid');

    // Twelve concurrent uses over the pool's separate connections: PostgreSQL must let one through.
    const adapter = demoldAdapter();
    const results = await Promise.all(
      Array.from({ length: 12 }, () => adapter.useVerificationToken!({ identifier: 'race@example.com', token })),
    );
    expect(results.filter(Boolean)).toHaveLength(1);
    expect(await inspectSignInLink({ token: secret, email: 'race@example.com' })).toBe('used');
  });

  it('are told apart: expired, forged, or for another address', async () => {
    const { inspectSignInLink } = await import('@/lib/auth/sign-in-link');
    const expired = await newLink('late@example.com', -1_000);
    expect(await inspectSignInLink({ token: expired.secret, email: 'late@example.com' })).toBe('expired');

    const real = await newLink('mine@example.com');
    const forged = real.secret.slice(0, -1) + (real.secret.endsWith('0') ? '1' : '0');
    expect(await inspectSignInLink({ token: forged, email: 'mine@example.com' })).toBe('unknown');
    expect(await inspectSignInLink({ token: real.secret, email: 'someone-else@example.com' })).toBe('unknown');
    expect(await inspectSignInLink({ token: "' OR 1=1 --", email: 'mine@example.com' })).toBe('unknown');
  });
});
