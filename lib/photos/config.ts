import 'server-only';
import path from 'node:path';
import { z } from 'zod';
import { AppError } from '@/lib/api/errors';
import { DEFAULT_PHOTO_MAX_BYTES, DEFAULT_PHOTO_MAX_PIXELS } from './renditions';

// The photo pipeline's own settings, read from process.env here (lib/env.ts stays as it is). uploadthing
// reads its own UPLOADTHING_* variables itself; only the token is checked here, so that a missing or
// malformed one answers a clear 503 instead of the library's 500.

const unsetWhenEmpty = (value: unknown) => (value === '' ? undefined : value);

const photoEnvSchema = z.object({
  MEDIA_DIR: z.preprocess(unsetWhenEmpty, z.string().min(1).default('.data/media')),
  PHOTO_MAX_BYTES: z.preprocess(
    unsetWhenEmpty,
    z.coerce
      .number()
      .int('PHOTO_MAX_BYTES must be a whole number of bytes')
      .min(64 * 1024, 'PHOTO_MAX_BYTES below 64 KB would refuse ordinary photos')
      .max(256 * 1024 * 1024, 'PHOTO_MAX_BYTES above 256 MB is more than one photo needs')
      .default(DEFAULT_PHOTO_MAX_BYTES),
  ),
  PHOTO_MAX_PIXELS: z.preprocess(
    unsetWhenEmpty,
    z.coerce
      .number()
      .int('PHOTO_MAX_PIXELS must be a whole number of pixels')
      .min(1_000_000, 'PHOTO_MAX_PIXELS below one megapixel would refuse ordinary photos')
      // sharp's own default ceiling (0x3FFF × 0x3FFF), from sharp's documentation of limitInputPixels.
      .max(268_402_689, 'PHOTO_MAX_PIXELS above 268 megapixels is past sharp’s own default limit')
      .default(DEFAULT_PHOTO_MAX_PIXELS),
  ),
  PHOTO_FETCH_TIMEOUT_MS: z.preprocess(
    unsetWhenEmpty,
    z.coerce.number().int().min(1_000).max(300_000).default(30_000),
  ),
});

export type PhotoConfig = {
  /** Absolute. Relative values are under the project root (the directory the app runs from). */
  mediaDir: string;
  maxBytes: number;
  maxPixels: number;
  fetchTimeoutMs: number;
};

/** Reads the settings each time (cheap), so tests and scripts may change them between calls. */
export function photoConfig(source: Record<string, string | undefined> = process.env): PhotoConfig {
  const result = photoEnvSchema.safeParse(source);
  if (!result.success) {
    const problems = result.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
    throw new AppError('uploads_misconfigured', `Photo uploads are not set up correctly: ${problems.join('; ')}.`, 503, { problems });
  }
  const env = result.data;
  return {
    mediaDir: path.resolve(process.cwd(), env.MEDIA_DIR),
    maxBytes: env.PHOTO_MAX_BYTES,
    maxPixels: env.PHOTO_MAX_PIXELS,
    fetchTimeoutMs: env.PHOTO_FETCH_TIMEOUT_MS,
  };
}

// uploadthing's token: base64 of JSON { apiKey: "sk_…", appId, regions: [..] } (the shape its own
// UploadThingToken schema in uploadthing/dist/shared-schemas accepts).
const tokenPayload = z.object({
  apiKey: z.string().startsWith('sk_'),
  appId: z.string().min(1),
  regions: z.array(z.string().min(1)).min(1),
});

export type UploadthingSetup = { ok: true; appId: string } | { ok: false; message: string };

export function uploadthingSetup(source: Record<string, string | undefined> = process.env): UploadthingSetup {
  const token = source.UPLOADTHING_TOKEN?.trim();
  if (!token) {
    return { ok: false, message: 'Photo uploads are not set up on this server yet: UPLOADTHING_TOKEN is not set.' };
  }
  let decoded: unknown;
  try {
    decoded = JSON.parse(Buffer.from(token, 'base64').toString('utf8'));
  } catch {
    decoded = undefined;
  }
  const parsed = tokenPayload.safeParse(decoded);
  if (!parsed.success) {
    return {
      ok: false,
      message: 'Photo uploads are not set up correctly: UPLOADTHING_TOKEN is not an uploadthing token (base64 JSON with apiKey, appId and regions).',
    };
  }
  return { ok: true, appId: parsed.data.appId };
}

/** Throws the 503 that the upload route answers when uploads cannot work on this server. */
export function assertUploadsConfigured(source: Record<string, string | undefined> = process.env): void {
  const setup = uploadthingSetup(source);
  if (!setup.ok) throw new AppError('uploads_not_configured', setup.message, 503);
  photoConfig(source);
}
