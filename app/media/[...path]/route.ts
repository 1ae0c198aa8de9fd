import fs from 'node:fs/promises';
import { AppError } from '@/lib/api/errors';
import { apiHandler } from '@/lib/api/handler';
import { photoConfig } from '@/lib/photos/config';
import { resolveMediaFile } from '@/lib/photos/store';

type Context = { params: Promise<{ path: string[] }> };

const CONTENT_TYPES = { webp: 'image/webp', avif: 'image/avif' } as const;

const notFound = () => new AppError('not_found', 'There is no such photo file: it may have been deleted.', 404);

/**
 * Uploaded photos' renditions from MEDIA_DIR. Only generated names are served (`<32 hex>/<width>.webp`
 * or `.avif`), so no other path under the folder, nor outside it, can be asked for. A name is the
 * upload's content hash, so a file never changes: it may be cached for a year. The demo's seeded photos
 * are plain files in public/media/demo, which Next.js serves before this route is consulted.
 */
export const GET = apiHandler(async (_request: Request, context: Context) => {
  const { path: segments } = await context.params;
  const { mediaDir } = photoConfig();
  const resolved = resolveMediaFile(mediaDir, segments);
  if (!resolved) throw notFound();
  let data: Buffer;
  try {
    data = await fs.readFile(resolved.file);
  } catch {
    throw notFound();
  }
  return new Response(new Uint8Array(data), {
    headers: {
      'Content-Type': CONTENT_TYPES[resolved.format],
      'Content-Length': String(data.length),
      'Cache-Control': 'public, max-age=31536000, immutable',
      'X-Content-Type-Options': 'nosniff',
    },
  });
});
