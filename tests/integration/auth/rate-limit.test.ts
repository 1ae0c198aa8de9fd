import { describe, expect, it } from 'vitest';
import { withAppDatabase } from '../support/app-database';

withAppDatabase('ratelimit');

async function attempt(email: string, ip: string) {
  const { consumeSignInAllowance } = await import('@/lib/auth/rate-limit');
  try {
    await consumeSignInAllowance({ email, ip });
    return 'sent';
  } catch (error) {
    return error as { status: number; code: string; message: string; retryAfterSeconds?: number };
  }
}

describe('sign-in e-mail limits', () => {
  it('allow a few e-mails per address, then answer 429 with when to try again', async () => {
    const { SIGN_IN_LIMITS } = await import('@/lib/auth/rate-limit');
    for (let i = 0; i < SIGN_IN_LIMITS.perAddress.points; i += 1) {
      expect(await attempt('flood@example.com', `198.51.100.${i}`)).toBe('sent');
    }
    const refused = await attempt('flood@example.com', '198.51.100.200');
    expect(refused).toMatchObject({ status: 429, code: 'rate_limited' });
    if (typeof refused !== 'string') {
      expect(refused.message).toMatch(/try again in \d+ minutes/);
      expect(refused.retryAfterSeconds).toBeGreaterThan(0);
      expect(refused.retryAfterSeconds).toBeLessThanOrEqual(SIGN_IN_LIMITS.perAddress.duration);
    }
    // Another address is not affected.
    expect(await attempt('calm@example.com', '198.51.100.201')).toBe('sent');
  });

  it('limit one network however many addresses it tries, and count in PostgreSQL for every instance', async () => {
    const { SIGN_IN_LIMITS } = await import('@/lib/auth/rate-limit');
    const ip = '203.0.113.7';
    const outcomes = await Promise.all(
      Array.from({ length: SIGN_IN_LIMITS.perIp.points + 3 }, (_, i) => attempt(`spray${i}@example.com`, ip)),
    );
    expect(outcomes.filter((o) => o === 'sent')).toHaveLength(SIGN_IN_LIMITS.perIp.points);
    const { query } = await import('../support/database');
    const [row] = await query<{ points: number }>(process.env.DATABASE_URL!, 'SELECT points FROM rate_limits WHERE key = $1', [`sign-in-ip:${ip}`]);
    expect(row?.points).toBeGreaterThanOrEqual(SIGN_IN_LIMITS.perIp.points);
  });
});
