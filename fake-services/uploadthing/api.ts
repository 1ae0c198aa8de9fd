import type { IncomingMessage, ServerResponse } from 'node:http';
import { z } from 'zod';
import { sendJson } from '../lib/http-io';
import type { FakeContext } from './context';
import { header } from './headers';

// The calls the app's server makes, authenticated by the `x-uploadthing-api-key` header:
//   POST {ingest}/route-metadata   (handleUploadAction, before the browser uploads)
//   POST {origin}/callback-result  (handleCallbackRequest, after onUploadComplete; origin from the callback)
//   POST {api}/v6/deleteFiles      (UTApi.deleteFiles)

const routeMetadataBody = z.object({
  fileKeys: z.array(z.string().min(1)).min(1),
  metadata: z.unknown(),
  isDev: z.boolean(),
  callbackUrl: z.url(),
  callbackSlug: z.string().min(1),
  awaitServerData: z.boolean().default(true),
});

const callbackResultBody = z.union([
  z.object({ fileKey: z.string().min(1), error: z.string() }),
  z.object({ fileKey: z.string().min(1), callbackData: z.unknown() }),
]);

const deleteFilesBody = z.object({ fileKeys: z.array(z.string()).optional(), customIds: z.array(z.string()).optional() });

function authorized(ctx: FakeContext, req: IncomingMessage, res: ServerResponse): boolean {
  if (header(req, 'x-uploadthing-api-key') === ctx.settings.apiKey) return true;
  sendJson(res, 401, { error: 'Invalid or missing API key (x-uploadthing-api-key).' });
  return false;
}

function parseJson<T extends z.ZodType>(schema: T, body: Buffer, res: ServerResponse): z.output<T> | null {
  let json: unknown;
  try {
    json = JSON.parse(body.toString('utf8'));
  } catch {
    sendJson(res, 400, { error: 'The body is not JSON.' });
    return null;
  }
  const result = schema.safeParse(json);
  if (!result.success) {
    sendJson(res, 400, { error: `Invalid request body: ${result.error.issues.map((i) => `${i.path.join('.') || 'body'}: ${i.message}`).join('; ')}` });
    return null;
  }
  return result.data;
}

export function handleRouteMetadata(ctx: FakeContext, req: IncomingMessage, res: ServerResponse, body: Buffer): void {
  if (!authorized(ctx, req, res)) return;
  const input = parseJson(routeMetadataBody, body, res);
  if (!input) return;
  const registeredAt = Date.now();
  let stream = null;
  if (input.isDev) {
    // Dev mode: the answer stays open and carries each file's callback as a line of JSON
    // ({ payload, signature, hook }), which the app's handler forwards to itself.
    res.writeHead(200, { 'Content-Type': 'application/x-ndjson', 'Cache-Control': 'no-store' });
    res.flushHeaders();
    const pending = new Set(input.fileKeys);
    const timer = setTimeout(() => res.end(), ctx.settings.devStreamTimeoutMs);
    timer.unref();
    stream = { res, pending, timer };
  }
  for (const key of input.fileKeys) {
    ctx.state.registrations.set(key, {
      key,
      callbackUrl: input.callbackUrl,
      callbackSlug: input.callbackSlug,
      metadata: input.metadata ?? {},
      isDev: input.isDev,
      awaitServerData: input.awaitServerData,
      registeredAt,
      stream,
    });
  }
  if (!input.isDev) sendJson(res, 200, { ok: true });
}

export function handleCallbackResult(ctx: FakeContext, req: IncomingMessage, res: ServerResponse, body: Buffer): void {
  if (!authorized(ctx, req, res)) return;
  const input = parseJson(callbackResultBody, body, res);
  if (!input) return;
  if (!ctx.state.registrations.has(input.fileKey)) {
    sendJson(res, 404, { error: `No upload is registered for file key ${input.fileKey}.` });
    return;
  }
  ctx.state.recordResult(input.fileKey, 'error' in input ? { error: input.error } : { callbackData: input.callbackData ?? null });
  sendJson(res, 200, { ok: true });
}

export function handleDeleteFiles(ctx: FakeContext, req: IncomingMessage, res: ServerResponse, body: Buffer): void {
  if (!authorized(ctx, req, res)) return;
  const input = parseJson(deleteFilesBody, body, res);
  if (!input) return;
  let deletedCount = 0;
  for (const file of [...ctx.state.files.values()]) {
    if (input.fileKeys?.includes(file.key) || (file.customId !== null && input.customIds?.includes(file.customId))) {
      ctx.state.files.delete(file.key);
      deletedCount += 1;
    }
  }
  sendJson(res, 200, { success: true, deletedCount });
}
