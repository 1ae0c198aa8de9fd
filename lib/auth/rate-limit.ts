import 'server-only';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { AppError } from '@/lib/api/errors';
import { getDb } from '@/lib/db/connection';

// Counters live in PostgreSQL so every app instance shares them. Limits are our own choice: enough for a
// person who mistypes or loses an e-mail, too few to flood someone's inbox.
export const SIGN_IN_LIMITS = {
  perAddress: { points: 3, duration: 15 * 60 },
  perIp: { points: 10, duration: 60 * 60 },
} as const;

type Limiters = { perAddress: RateLimiterPostgres; perIp: RateLimiterPostgres };
const globalForLimits = globalThis as typeof globalThis & { __demoldSignInLimiters?: Limiters };

function limiters(): Limiters {
  if (!globalForLimits.__demoldSignInLimiters) {
    const storeClient = getDb().sequelize;
    const common = { storeClient, storeType: 'sequelize', tableName: 'rate_limits', tableCreated: true, clearExpiredByTimeout: false };
    globalForLimits.__demoldSignInLimiters = {
      perAddress: new RateLimiterPostgres({ ...common, keyPrefix: 'sign-in-address', ...SIGN_IN_LIMITS.perAddress }),
      perIp: new RateLimiterPostgres({ ...common, keyPrefix: 'sign-in-ip', ...SIGN_IN_LIMITS.perIp }),
    };
  }
  return globalForLimits.__demoldSignInLimiters;
}

/** Counts one sign-in e-mail against the address and the IP; throws a 429 AppError past either limit. */
export async function consumeSignInAllowance({ email, ip }: { email: string; ip: string }): Promise<void> {
  const { perAddress, perIp } = limiters();
  try {
    await perIp.consume(ip);
  } catch (rejection) {
    throw tooMany(rejection, 'Too many sign-in e-mails were asked for from your network.');
  }
  try {
    await perAddress.consume(email);
  } catch (rejection) {
    throw tooMany(rejection, 'We have already sent several sign-in e-mails to this address. Check your inbox and spam folder.');
  }
}

function tooMany(rejection: unknown, what: string): AppError {
  if (!(rejection instanceof RateLimiterRes)) throw rejection;
  const seconds = Math.max(1, Math.ceil(rejection.msBeforeNext / 1000));
  const minutes = Math.ceil(seconds / 60);
  return new AppError(
    'rate_limited',
    `${what} You can ask again in ${minutes} minute${minutes === 1 ? '' : 's'}.`,
    429,
    { retryAfterSeconds: seconds },
    seconds,
  );
}
