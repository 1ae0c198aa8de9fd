import 'server-only';
import { createHmac, timingSafeEqual } from 'node:crypto';
import { getEnv } from '@/lib/env';

// The link in a buyer's e-mails opens their order without signing in: it carries an HMAC of the order's
// id under the app's secret, so it cannot be made for another order, and it changes if the secret does.
function orderToken(orderId: string): string {
  return createHmac('sha256', getEnv().AUTH_SECRET).update(`order:${orderId}`).digest('base64url');
}

export function orderLinkToken(orderId: string): string {
  return orderToken(orderId);
}

export function isValidOrderToken(orderId: string, token: string | null | undefined): boolean {
  if (!token || token.length > 100) return false;
  const expected = Buffer.from(orderToken(orderId));
  const given = Buffer.from(token);
  return expected.length === given.length && timingSafeEqual(expected, given);
}

export function orderUrl(order: { id: string; number: string }, extra = ''): string {
  return `${getEnv().APP_URL}/orders/${order.number}?token=${orderLinkToken(order.id)}${extra}`;
}
