import type { ServerResponse } from 'node:http';
import { send, sendJson as sharedSendJson } from '../lib/http-io';

// The Stripe fake's own ways of answering; reading bodies and the plain answer are in ../lib/http-io.ts.

/** Stripe answers pretty-printed JSON; so does the fake, which also makes its answers easy to read in logs. */
export const sendJson = (
  res: ServerResponse,
  status: number,
  body: unknown,
  headers: Record<string, string> = {},
) => sharedSendJson(res, status, body, headers, 2);

export function sendHtml(res: ServerResponse, status: number, html: string, returnUrl?: string | null): void {
  // Browsers check form-action against the redirect that follows a form post too, so the shop's return
  // address (where a paid form is sent on to) must be allowed beside the fake itself.
  let returnOrigin = '';
  try {
    returnOrigin = returnUrl ? ` ${new URL(returnUrl).origin}` : '';
  } catch {
    returnOrigin = '';
  }
  send(res, status, html, {
    'Content-Type': 'text/html; charset=utf-8',
    // The page loads nothing from elsewhere but product images; forms post only back to the fake.
    'Content-Security-Policy': `default-src 'none'; img-src * data:; style-src 'unsafe-inline'; form-action 'self'${returnOrigin}`,
    'X-Content-Type-Options': 'nosniff',
  });
}

export function redirect(res: ServerResponse, location: string): void {
  send(res, 303, '', { Location: location });
}
