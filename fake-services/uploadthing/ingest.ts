import type { IncomingMessage, ServerResponse } from 'node:http';
import { BodyTooLarge, readBody, sendJson } from '../lib/http-io';
import type { FakeContext } from './context';
import { corsHeaders, header } from './headers';
import { checkPresignedUrl, md5Hex, signPayload, type PresignedFile } from './protocol';
import type { Registration, StoredFile } from './state';

// The ingest side, which the browser talks to directly (another origin than the app):
//   OPTIONS /<key>?…  CORS preflight
//   HEAD    /<key>?…  resume offset in x-ut-range-start (uploadFile in uploadthing/client)
//   PUT     /<key>?…  multipart/form-data with one field "file" (uploadWithProgress), answered with
//                     { url, appUrl, ufsUrl, fileHash, serverData } once the app's onUploadComplete is done
// and the file host: GET|HEAD /f/<key> and /a/<appId>/<key>.

export const KEY_PATH = /^\/([A-Za-z0-9]{8,128})$/;

function presigned(ctx: FakeContext, req: IncomingMessage): ReturnType<typeof checkPresignedUrl> {
  const host = header(req, 'host') ?? new URL(ctx.baseUrl).host;
  return checkPresignedUrl(`http://${host}${req.url ?? '/'}`, ctx.settings.apiKey, ctx.settings.appId);
}

export function handleOptions(req: IncomingMessage, res: ServerResponse): void {
  res.writeHead(204, { ...corsHeaders(req), 'Content-Length': '0' });
  res.end();
}

export function handleHead(ctx: FakeContext, req: IncomingMessage, res: ServerResponse): void {
  const check = presigned(ctx, req);
  if (!check.ok) {
    res.writeHead(check.status, corsHeaders(req));
    res.end();
    return;
  }
  // The fake keeps no partial uploads, so every upload starts from the first byte.
  res.writeHead(200, { ...corsHeaders(req), 'x-ut-range-start': '0', 'Content-Length': '0' });
  res.end();
}

export function fileUrls(ctx: FakeContext, key: string) {
  return {
    url: `${ctx.baseUrl}/f/${key}`,
    appUrl: `${ctx.baseUrl}/a/${ctx.settings.appId}/${key}`,
    ufsUrl: `${ctx.baseUrl}/f/${key}`,
  };
}

export async function handlePut(ctx: FakeContext, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const cors = corsHeaders(req);
  const check = presigned(ctx, req);
  if (!check.ok) {
    req.resume();
    sendJson(res, check.status, { error: check.reason }, cors);
    return;
  }
  const file = check.file;
  if (ctx.state.files.has(file.key)) {
    req.resume();
    sendJson(res, 409, { error: `File ${file.key} is already uploaded.` }, cors);
    return;
  }
  const range = /^bytes=(\d+)-$/.exec(header(req, 'range') ?? 'bytes=0-');
  if (!range || Number(range[1]) !== 0) {
    req.resume();
    sendJson(res, 416, { error: 'The fake does not resume uploads: send the whole file (Range: bytes=0-).' }, cors);
    return;
  }
  const registration = file.slug ? await ctx.state.waitForRegistration(file.key, ctx.settings.registrationWaitMs) : null;
  if (file.slug && !registration) {
    req.resume();
    sendJson(res, 400, { error: `No upload is registered for ${file.key}: the app never sent route metadata for it.` }, cors);
    return;
  }

  let bytes: Buffer;
  try {
    bytes = await readFilePart(req, file, ctx.settings.maxFileBytes);
  } catch (error) {
    const message = error instanceof BodyTooLarge ? `The file is larger than this ingest accepts (${ctx.settings.maxFileBytes} bytes).` : error instanceof Error ? error.message : String(error);
    if (registration) await sendHook(ctx, registration, 'error', JSON.stringify({ fileKey: file.key, error: message }));
    sendJson(res, error instanceof BodyTooLarge ? 413 : 400, { error: message }, cors);
    return;
  }

  const stored: StoredFile = {
    key: file.key,
    appId: file.appId,
    name: file.name,
    size: bytes.length,
    type: file.type,
    customId: file.customId,
    slug: file.slug,
    contentDisposition: file.contentDisposition,
    acl: file.acl,
    fileHash: md5Hex(bytes),
    uploadedAt: Date.now(),
    bytes,
  };
  ctx.state.files.set(file.key, stored);
  const urls = fileUrls(ctx, file.key);
  if (!registration) {
    // A server-side upload (UTApi.uploadFiles): no route, no callback.
    sendJson(res, 200, { ...urls, fileHash: stored.fileHash, serverData: null }, cors);
    return;
  }

  // The callback body, as handleCallbackRequest reads it: { status, file: UploadedFileData, origin, metadata }.
  const payload = JSON.stringify({
    status: 'uploaded',
    metadata: registration.metadata,
    file: {
      name: stored.name,
      size: stored.size,
      type: stored.type,
      customId: stored.customId,
      lastModified: stored.uploadedAt,
      key: stored.key,
      ...urls,
      fileHash: stored.fileHash,
    },
    origin: ctx.baseUrl,
  });
  const delivered = await sendHook(ctx, registration, 'callback', payload);
  if (!delivered.ok) {
    sendJson(res, 502, { error: `The app did not accept the upload callback: ${delivered.error}` }, cors);
    return;
  }
  let serverData: unknown = null;
  if (registration.awaitServerData) {
    const result = await ctx.state.waitForResult(file.key, ctx.settings.serverDataTimeoutMs);
    if (result?.error) {
      sendJson(res, 502, { error: result.error }, cors);
      return;
    }
    serverData = result?.callbackData ?? null;
  }
  sendJson(res, 200, { ...urls, fileHash: stored.fileHash, serverData }, cors);
}

async function readFilePart(req: IncomingMessage, file: PresignedFile, maxFileBytes: number): Promise<Buffer> {
  // Room for the multipart envelope around the file itself.
  const body = await readBody(req, maxFileBytes + 64 * 1024);
  const contentType = header(req, 'content-type') ?? '';
  if (!contentType.startsWith('multipart/form-data')) {
    throw new Error('The upload must be multipart/form-data with the file in a field named "file".');
  }
  let form: FormData;
  try {
    form = await new Response(new Uint8Array(body), { headers: { 'Content-Type': contentType } }).formData();
  } catch {
    throw new Error('The multipart body could not be read.');
  }
  const part = form.get('file');
  if (!part || typeof part === 'string') throw new Error('The multipart body has no file in a field named "file".');
  const bytes = Buffer.from(await part.arrayBuffer());
  if (bytes.length > maxFileBytes) throw new BodyTooLarge('too large');
  if (bytes.length !== file.size) {
    throw new Error(`The file is ${bytes.length} bytes, but the presigned URL is for ${file.size} bytes.`);
  }
  return bytes;
}

type Delivery = { ok: true } | { ok: false; error: string };

/** Sends a signed hook: down the dev stream, or POSTed to the app's callback URL with ?slug=. */
async function sendHook(ctx: FakeContext, registration: Registration, hook: 'callback' | 'error', payload: string): Promise<Delivery> {
  const signature = signPayload(payload, ctx.settings.apiKey);
  if (registration.isDev) {
    const stream = registration.stream;
    if (!stream || stream.res.writableEnded) {
      ctx.state.callbacks.push({ key: registration.key, hook, url: 'stream', status: null, error: 'the dev stream was already closed', at: Date.now() });
      return { ok: false, error: 'the app’s dev-mode stream (the /route-metadata answer) was already closed' };
    }
    stream.res.write(`${JSON.stringify({ payload, signature, hook })}\n`);
    stream.pending.delete(registration.key);
    if (stream.pending.size === 0) {
      clearTimeout(stream.timer);
      stream.res.end();
    }
    ctx.state.callbacks.push({ key: registration.key, hook, url: 'stream', status: null, error: null, at: Date.now() });
    return { ok: true };
  }
  const target = new URL(ctx.settings.callbackUrl ?? registration.callbackUrl);
  target.searchParams.set('slug', registration.callbackSlug);
  try {
    const response = await fetch(target, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'uploadthing-hook': hook, 'x-uploadthing-signature': signature },
      body: payload,
      signal: AbortSignal.timeout(ctx.settings.callbackTimeoutMs),
    });
    await response.arrayBuffer().catch(() => undefined);
    ctx.state.callbacks.push({ key: registration.key, hook, url: target.href, status: response.status, error: null, at: Date.now() });
    return response.ok ? { ok: true } : { ok: false, error: `HTTP ${response.status} from ${target.origin}${target.pathname}` };
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    ctx.state.callbacks.push({ key: registration.key, hook, url: target.href, status: null, error: message, at: Date.now() });
    return { ok: false, error: `${target.origin}${target.pathname} could not be reached (${message})` };
  }
}

/** GET or HEAD /f/<key> and /a/<appId>/<key>: the stored bytes, as a CDN would serve them. */
export function serveFile(ctx: FakeContext, req: IncomingMessage, res: ServerResponse, key: string): void {
  const file = ctx.state.files.get(key);
  if (!file) {
    sendJson(res, 404, { error: 'Not found' }, corsHeaders(req));
    return;
  }
  const disposition = file.contentDisposition === 'attachment' ? 'attachment' : 'inline';
  res.writeHead(200, {
    ...corsHeaders(req),
    'Content-Type': file.type,
    'Content-Length': String(file.bytes.length),
    'Content-Disposition': `${disposition}; filename*=UTF-8''${encodeURIComponent(file.name)}`,
    'Cache-Control': 'public, max-age=31536000',
    ETag: `"${file.fileHash}"`,
  });
  res.end(req.method === 'HEAD' ? undefined : file.bytes);
}
