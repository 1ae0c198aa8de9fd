import { createHash, createHmac, timingSafeEqual } from 'node:crypto';

// The parts of uploadthing's wire protocol the fake has to agree on with the real packages, written from
// reading uploadthing 7.7.4 and @uploadthing/shared 7.1.10 (node_modules/@uploadthing/shared/dist/index.js:
// signPayload, verifySignature, generateSignedURL; node_modules/uploadthing/dist/upload-builder-*.js:
// handleUploadAction, handleCallbackRequest). The fake does not import them: it is a second, independent
// implementation, so a test passing against it means the two agree.

export const SIGNATURE_PREFIX = 'hmac-sha256=';

/** `hmac-sha256=<hex>`: HMAC-SHA256 keyed with the API key (its UTF-8 bytes) over the payload's UTF-8. */
export function signPayload(payload: string, apiKey: string): string {
  return SIGNATURE_PREFIX + createHmac('sha256', apiKey).update(payload, 'utf8').digest('hex');
}

export function verifyPayload(payload: string, signature: string | null | undefined, apiKey: string): boolean {
  if (!signature?.startsWith(SIGNATURE_PREFIX)) return false;
  const given = Buffer.from(signature.slice(SIGNATURE_PREFIX.length), 'hex');
  const expected = createHmac('sha256', apiKey).update(payload, 'utf8').digest();
  return given.length === expected.length && timingSafeEqual(given, expected);
}

export function md5Hex(bytes: Buffer): string {
  return createHash('md5').update(bytes).digest('hex');
}

/** What a presigned ingest URL says about the file it may carry (values from its `x-ut-*` parameters). */
export type PresignedFile = {
  key: string;
  expiresAt: number;
  appId: string;
  name: string;
  size: number;
  type: string;
  slug: string | null;
  customId: string | null;
  contentDisposition: string;
  acl: string | null;
};

export type PresignedCheck = { ok: true; file: PresignedFile } | { ok: false; status: number; reason: string };

/**
 * Checks a presigned ingest URL exactly as it was signed: generateSignedURL appends `expires`, then each
 * `x-ut-*` value (encodeURIComponent'd once, then form-encoded again by URLSearchParams), signs the whole
 * URL string, and appends `signature` last. So the signed text is the requested URL up to `&signature=`.
 */
export function checkPresignedUrl(fullUrl: string, apiKey: string, appId: string, now = Date.now()): PresignedCheck {
  const at = fullUrl.lastIndexOf('&signature=');
  if (at < 0) return { ok: false, status: 403, reason: 'The URL is not signed (no signature parameter).' };
  const signed = fullUrl.slice(0, at);
  const url = new URL(fullUrl);
  const signature = url.searchParams.get('signature');
  if (url.searchParams.getAll('signature').length !== 1 || !fullUrl.endsWith(`signature=${encodeURIComponent(signature ?? '')}`)) {
    return { ok: false, status: 403, reason: 'The signature must be the URL’s last parameter, given once.' };
  }
  if (!verifyPayload(signed, signature, apiKey)) return { ok: false, status: 403, reason: 'Invalid signature: the URL was not signed with this app’s API key, or it was changed.' };
  const param = (name: string) => {
    const raw = url.searchParams.get(name);
    if (raw === null) return null;
    try {
      return decodeURIComponent(raw);
    } catch {
      return raw;
    }
  };
  const expiresAt = Number(param('expires'));
  if (!Number.isFinite(expiresAt)) return { ok: false, status: 400, reason: 'The URL has no expiry (expires).' };
  if (expiresAt < now) return { ok: false, status: 403, reason: 'The presigned URL has expired: ask the app for a new one.' };
  const identifier = param('x-ut-identifier');
  if (identifier !== appId) return { ok: false, status: 403, reason: `The URL is for app "${identifier}", not this one.` };
  const size = Number(param('x-ut-file-size'));
  const name = param('x-ut-file-name');
  if (!name || !Number.isInteger(size) || size < 0) return { ok: false, status: 400, reason: 'The URL lacks the file’s name or size.' };
  const key = decodeURIComponent(url.pathname.replace(/^\//, ''));
  return {
    ok: true,
    file: {
      key,
      expiresAt,
      appId,
      name,
      size,
      type: param('x-ut-file-type') ?? 'application/octet-stream',
      slug: param('x-ut-slug'),
      customId: param('x-ut-custom-id'),
      contentDisposition: param('x-ut-content-disposition') ?? 'inline',
      acl: param('x-ut-acl'),
    },
  };
}

/** UPLOADTHING_TOKEN: base64 of `{ apiKey, appId, regions }` (uploadthing's UploadThingToken schema). */
export function makeToken(apiKey: string, appId: string, regions: string[] = ['fake-local']): string {
  return Buffer.from(JSON.stringify({ apiKey, appId, regions })).toString('base64');
}
