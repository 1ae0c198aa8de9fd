import 'server-only';
import { getEnv } from '@/lib/env';
import { signToken } from './tokens';

// Every link a waitlist e-mail carries, in one place, so the pages that answer them and the messages that
// hold them cannot drift apart.

/** The page a person lands on from the visible "unsubscribe" link (it shows what they leave and a button). */
export function unsubscribePageUrl(entryId: string): string {
  return `${getEnv().APP_URL}/waitlist/unsubscribe?t=${signToken('waitlist-unsubscribe', { e: entryId })}`;
}

/** The RFC 8058 one-click endpoint: a POST with body `List-Unsubscribe=One-Click` leaves at once, no cookie needed. */
export function oneClickUnsubscribeUrl(entryId: string): string {
  return `${getEnv().APP_URL}/api/waitlist/unsubscribe?t=${signToken('waitlist-unsubscribe', { e: entryId })}`;
}

/**
 * The headers every waitlist message carries (RFC 2369 List-Unsubscribe with an https URI, and RFC 8058's
 * List-Unsubscribe-Post, which tells the mail client a POST unsubscribes without any page).
 */
export function waitlistHeaders(entryId: string): Record<string, string> {
  return {
    'List-Unsubscribe': `<${oneClickUnsubscribeUrl(entryId)}>`,
    'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
  };
}

/** The personal early-access link of one address for one batch; the grant it gives belongs to that address. */
export function earlyAccessUrl(batchId: string, email: string): string {
  return `${getEnv().APP_URL}/drops/${batchId}/early-access?t=${signToken('early-access', { b: batchId, a: email })}`;
}

/** The confirmation link of a pending entry; `nonce` is the one-time secret whose hash the entry keeps. */
export function confirmUrl(entryId: string, nonce: string): string {
  return `${getEnv().APP_URL}/waitlist/confirm?t=${signToken('waitlist-confirm', { e: entryId, n: nonce })}`;
}
