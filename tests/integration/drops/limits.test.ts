import { describe, expect, it } from 'vitest';
import { withAppDatabase } from '../support/app-database';

withAppDatabase('holdlimits');

describe('hold attempt limits', () => {
  it('let a buyer tap quickly at the opening, then answer 429 with Retry-After seconds', async () => {
    const { HOLD_LIMITS, consumeHoldAllowance } = await import('@/lib/drops/limits');
    const attempt = () => consumeHoldAllowance({ userId: 'f7b6f3c0-0000-4000-8000-000000000001', ip: '192.0.2.10' });
    const results = await Promise.allSettled(Array.from({ length: HOLD_LIMITS.perBuyer.points + 5 }, attempt));
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(HOLD_LIMITS.perBuyer.points);
    const refused = results.find((r) => r.status === 'rejected') as PromiseRejectedResult;
    expect(refused.reason).toMatchObject({ status: 429, code: 'rate_limited' });
    expect(refused.reason.retryAfterSeconds).toBeGreaterThan(0);
    expect(refused.reason.retryAfterSeconds).toBeLessThanOrEqual(HOLD_LIMITS.perBuyer.duration);
    expect(refused.reason.message).toMatch(/try again in \d+ seconds?/);
  });

  it('count one network across many buyers', async () => {
    const { HOLD_LIMITS, consumeHoldAllowance } = await import('@/lib/drops/limits');
    const n = HOLD_LIMITS.perIp.points + 10;
    const results = await Promise.allSettled(
      Array.from({ length: n }, (_, i) => consumeHoldAllowance({ userId: `buyer-${i}`, ip: '192.0.2.99' })),
    );
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(HOLD_LIMITS.perIp.points);
  });
});
