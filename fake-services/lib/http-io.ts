import type { IncomingMessage, ServerResponse } from 'node:http';

// Plain HTTP that every fake under fake-services/ needs. What is one service's own (Stripe's pretty JSON
// and payment page, UploadThing's CORS headers) stays in that service's folder.

/** What a fake reads of a body that is not a file upload. */
export const MAX_BODY_BYTES = 1024 * 1024;

export class BodyTooLarge extends Error {}

/** Reads the whole body as bytes, refusing more than `limit` so a runaway client cannot fill memory. */
export function readBody(req: IncomingMessage, limit = MAX_BODY_BYTES): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const declared = Number(req.headers['content-length'] ?? NaN);
    if (Number.isFinite(declared) && declared > limit) {
      req.resume();
      reject(new BodyTooLarge(`the body is larger than ${limit} bytes`));
      return;
    }
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
      if (!failed) resolve(Buffer.concat(chunks, size));
    });
    req.on('error', (e) => {
      if (!failed) reject(e);
      failed = true;
    });
  });
}

/** Answers once, never cached; a second answer to the same request (after a timeout, say) is dropped. */
export function send(
  res: ServerResponse,
  status: number,
  body: string,
  headers: Record<string, string>,
): void {
  if (res.headersSent) return;
  res.writeHead(status, {
    'Content-Length': String(Buffer.byteLength(body)),
    'Cache-Control': 'no-store',
    ...headers,
  });
  res.end(body);
}

/** `indent` pretty-prints the JSON, as Stripe's API does. */
export function sendJson(
  res: ServerResponse,
  status: number,
  body: unknown,
  headers: Record<string, string> = {},
  indent = 0,
): void {
  send(res, status, JSON.stringify(body, null, indent), { 'Content-Type': 'application/json', ...headers });
}
