// Plain data and pure functions about photo renditions: safe to import anywhere, client components and
// the next/image loader included. Nothing here touches the file system, the network or the database.

/** The widths every uploaded photo is written at, smallest first (never wider than the photo itself). */
export const RENDITION_WIDTHS = [320, 640, 960, 1280, 1920] as const;
export const RENDITION_FORMATS = ['webp', 'avif'] as const;
export type RenditionFormat = (typeof RENDITION_FORMATS)[number];

export type Rendition = { width: number; height: number; format: RenditionFormat; path: string };

/** The types a photo may arrive as, by their real bytes (never by the name or the declared type). */
export const PHOTO_MIME_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'image/avif'] as const;
export type PhotoMimeType = (typeof PHOTO_MIME_TYPES)[number];
export const PHOTO_TYPE_LABELS: Record<PhotoMimeType, string> = {
  'image/jpeg': 'JPEG',
  'image/png': 'PNG',
  'image/webp': 'WebP',
  'image/avif': 'AVIF',
};
/** For a file picker's `accept`: the types and the file name endings people's photos carry. */
export const PHOTO_ACCEPT: Record<PhotoMimeType, string[]> = {
  'image/jpeg': ['.jpg', '.jpeg'],
  'image/png': ['.png'],
  'image/webp': ['.webp'],
  'image/avif': ['.avif'],
};

export const DEFAULT_PHOTO_MAX_BYTES = 20 * 1024 * 1024;
export const DEFAULT_PHOTO_MAX_PIXELS = 40_000_000;
export const PHOTO_MAX_FILES = 10;

/** Where uploaded photos are served from: `/media/<content hash>/<width>.<format>`. */
export const MEDIA_URL_PREFIX = '/media/';
const HASH = '[a-f0-9]{32}';
/** One generated file, relative to MEDIA_DIR: the only names the media route will ever serve. */
export const MEDIA_FILE_PATTERN = new RegExp(`^(${HASH})/([1-9][0-9]{0,4})\\.(webp|avif)$`);
const UPLOADED_SRC = new RegExp(`^/media/(${HASH})/([1-9][0-9]{0,4})\\.(webp|avif)$`);

/**
 * The widths to write for a photo `sourceWidth` pixels wide (after EXIF rotation): the standard widths
 * below it, then the photo's own width (capped at the largest standard one). Never an upscale.
 */
export function renditionWidthsFor(sourceWidth: number): number[] {
  const largest = RENDITION_WIDTHS[RENDITION_WIDTHS.length - 1]!;
  const top = Math.min(Math.floor(sourceWidth), largest);
  if (top < 1) return [];
  return [...RENDITION_WIDTHS.filter((w) => w < top), top];
}

export function mediaRelativePath(hash: string, width: number, format: RenditionFormat): string {
  return `${hash}/${width}.${format}`;
}

export function mediaUrl(relativePath: string): string {
  return `${MEDIA_URL_PREFIX}${relativePath}`;
}

/** The parts of an uploaded photo's served path, or null for anything else (the demo's seeded photos). */
export function parseUploadedSrc(src: string): { hash: string; width: number; format: RenditionFormat } | null {
  const match = UPLOADED_SRC.exec(src);
  if (!match) return null;
  return { hash: match[1]!, width: Number(match[2]), format: match[3] as RenditionFormat };
}

/**
 * The rendition to fetch for an image shown `wanted` CSS pixels × density wide: the smallest written
 * width at least that wide, or the largest there is. `largest` is the photo's top width (in its src).
 */
export function pickRenditionWidth(largest: number, wanted: number): number {
  const written = renditionWidthsFor(largest);
  return written.find((w) => w >= wanted) ?? largest;
}

export function formatMegabytes(bytes: number): string {
  const mb = bytes / (1024 * 1024);
  return `${Number.isInteger(mb) ? mb : mb.toFixed(1)} MB`;
}
