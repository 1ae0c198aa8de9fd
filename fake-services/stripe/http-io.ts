import type { IncomingMessage, ServerResponse } from 'node:http';

export const MAX_BODY_BYTES = 1024 * 1024;

export class BodyTooLarge extends Error {}

/** Reads the whole body, refusing more than `limit` bytes so a runaway client cannot fill memory. */
export function readBody(req: IncomingMessage, limit = MAX_BODY_BYTES): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    let failed = false;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > limit) {
        if (!failed) reject(new BodyTooLarge(`the body is larger than ${limit} bytes`));
        failed = true;
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => {
      if (!failed) resolve(Buffer.concat(chunks).toString('utf8'));
    });
    req.on('error', (e) => {
      if (!failed) reject(e);
      failed = true;
    });
  });
}

export function send(
  res: ServerResponse,
  status: number,
  body: string,
  headers: Record<string, string>,
): void {
  if (res.headersSent) return;
  res.writeHead(status, {
    'Content-Length': String(Buffer.byteLength(body)),
    'Cache-Control': 'no-cache, no-store',
    ...headers,
  });
  res.end(body);
}

/** Stripe answers pretty-printed JSON; so does the fake, which also makes its answers easy to read in logs. */
export function sendJson(
  res: ServerResponse,
  status: number,
  body: unknown,
  headers: Record<string, string> = {},
): void {
  send(res, status, JSON.stringify(body, null, 2), { 'Content-Type': 'application/json', ...headers });
}

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
