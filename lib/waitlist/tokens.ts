import 'server-only';
import { createHmac, timingSafeEqual } from 'node:crypto';
import { getEnv } from '@/lib/env';

// Links in waitlist e-mails carry their own proof: a payload and an HMAC-SHA256 of it under the app's secret,
// with the link's purpose mixed in, so a confirmation link cannot be used to unsubscribe, an early-access link
// cannot be rewritten for another batch or address, and every link dies if the secret changes.

export type TokenPurpose = 'waitlist-confirm' | 'waitlist-unsubscribe' | 'early-access';

const maxTokenLength = 1000;

function mac(purpose: TokenPurpose, body: string): string {
  return createHmac('sha256', getEnv().AUTH_SECRET).update(`${purpose}:${body}`).digest('base64url');
}

/** `body.mac`, both base64url: the payload is readable (it holds ids and an address, never a secret). */
export function signToken(purpose: TokenPurpose, payload: Record<string, string | number>): string {
  const body = Buffer.from(JSON.stringify(payload)).toString('base64url');
  return `${body}.${mac(purpose, body)}`;
}

/** The payload if the token is whole and was made for this purpose; null for anything tampered with or malformed. */
export function readToken(purpose: TokenPurpose, token: string | null | undefined): Record<string, unknown> | null {
  if (!token || token.length > maxTokenLength) return null;
  const [body, given, extra] = token.split('.');
  if (!body || !given || extra !== undefined) return null;
  const expected = Buffer.from(mac(purpose, body));
  const actual = Buffer.from(given);
  if (expected.length !== actual.length || !timingSafeEqual(expected, actual)) return null;
  try {
    const payload: unknown = JSON.parse(Buffer.from(body, 'base64url').toString('utf8'));
    return payload && typeof payload === 'object' && !Array.isArray(payload) ? (payload as Record<string, unknown>) : null;
  } catch {
    return null;
  }
}
