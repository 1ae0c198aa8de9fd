import 'server-only';
import { createHash } from 'node:crypto';
import { getDb } from '@/lib/db/connection';
import { getEnv } from '@/lib/env';

export type SignInLinkState = 'valid' | 'used' | 'expired' | 'unknown';

/** The hash next-auth stores for a link's secret (SHA-256 of the secret followed by AUTH_SECRET). */
export function hashSignInToken(token: string): string {
  return createHash('sha256').update(`${token}${getEnv().AUTH_SECRET}`).digest('hex');
}

/**
 * What became of a sign-in link, so the sign-in page can say "already used" or "expired" instead of one
 * vague error. Reads only; next-auth itself uses the link, in one statement.
 */
export async function inspectSignInLink({ token, email }: { token: string; email: string }): Promise<SignInLinkState> {
  if (!/^[A-Za-z0-9_-]{16,200}$/.test(token) && !/^[0-9a-f]{16,200}$/.test(token)) return 'unknown';
  const row = await getDb().models.VerificationToken.findOne({
    where: { identifier: email, token: hashSignInToken(token) },
  });
  if (!row) return 'unknown';
  if (row.usedAt) return 'used';
  if (row.expires.getTime() <= Date.now()) return 'expired';
  return 'valid';
}
