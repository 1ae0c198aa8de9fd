import 'server-only';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { AppError } from '@/lib/api/errors';
import { getDb } from '@/lib/db/connection';

// Counters live in PostgreSQL (table rate_limits, by migration) so every app instance shares them.
export type Limit = { points: number; duration: number };

const globalForLimits = globalThis as typeof globalThis & { __demoldLimiters?: Map<string, RateLimiterPostgres> };

function limiter(name: string, limit: Limit): RateLimiterPostgres {
  const all = (globalForLimits.__demoldLimiters ??= new Map());
  let found = all.get(name);
  if (!found) {
    found = new RateLimiterPostgres({
      storeClient: getDb().sequelize,
      storeType: 'sequelize',
      tableName: 'rate_limits',
      tableCreated: true,
      clearExpiredByTimeout: false,
      keyPrefix: name,
      ...limit,
    });
    all.set(name, found);
  }
  return found;
}

/** Counts one attempt under `name` for `key`; past the limit, a 429 AppError saying when to come back. */
export async function consumeAllowance(name: string, limit: Limit, key: string, what: string): Promise<void> {
  try {
    await limiter(name, limit).consume(key);
  } catch (rejection) {
    if (!(rejection instanceof RateLimiterRes)) throw rejection;
    const seconds = Math.max(1, Math.ceil(rejection.msBeforeNext / 1000));
    const wait = seconds < 90 ? `${seconds} second${seconds === 1 ? '' : 's'}` : `${Math.ceil(seconds / 60)} minutes`;
    throw new AppError('rate_limited', `${what} You can try again in ${wait}.`, 429, { retryAfterSeconds: seconds }, seconds);
  }
}
