import type { IncomingMessage } from 'node:http';

// Headers as the UploadThing fake reads and answers them; bodies and JSON answers are in ../lib/http-io.ts.

/**
 * The ingest host and the file host are on another origin than the app, so the browser asks first
 * (OPTIONS) for the PUT and HEAD it sends with custom headers, and may read `x-ut-range-start` only if
 * it is exposed.
 */
export function corsHeaders(req: IncomingMessage): Record<string, string> {
  const origin = typeof req.headers.origin === 'string' ? req.headers.origin : '*';
  const requested = req.headers['access-control-request-headers'];
  return {
    'Access-Control-Allow-Origin': origin,
    'Access-Control-Allow-Methods': 'GET, HEAD, PUT, OPTIONS',
    'Access-Control-Allow-Headers':
      typeof requested === 'string' && requested ? requested : 'range, content-type, x-uploadthing-version, b3, traceparent',
    'Access-Control-Expose-Headers': 'x-ut-range-start, content-length, content-type, etag',
    'Access-Control-Max-Age': '600',
    Vary: 'Origin',
  };
}

export function header(req: IncomingMessage, name: string): string | undefined {
  const value = req.headers[name.toLowerCase()];
  return Array.isArray(value) ? value.join(',') : value;
}
