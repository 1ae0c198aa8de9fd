import 'server-only';
import { createHash } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { AppError } from '@/lib/api/errors';
import {
  formatMegabytes,
  PHOTO_MIME_TYPES,
  renditionWidthsFor,
  type PhotoMimeType,
  type RenditionFormat,
} from './renditions';

/** A photo the pipeline will not take, with a message the maker can act on. Always a 422. */
export class PhotoRefusedError extends AppError {
  constructor(code: string, message: string, details?: Record<string, unknown>) {
    super(code, message, 422, details);
    this.name = 'PhotoRefusedError';
  }
}

export type PhotoLimits = { maxBytes: number; maxPixels: number };

export type RenditionFile = { width: number; height: number; format: RenditionFormat; data: Buffer };

export type ProcessedPhoto = {
  /** First 128 bits of the SHA-256 of the uploaded bytes, as hex: the folder the renditions go in. */
  hash: string;
  sourceType: PhotoMimeType;
  bytes: number;
  /** The photo as it is meant to be seen (EXIF orientation applied), before any resizing. */
  sourceWidth: number;
  sourceHeight: number;
  /** Every width in both formats, smallest first, WebP before AVIF at each width. */
  renditions: RenditionFile[];
  /** A 16-pixel-wide WebP as a data URL, for next/image's `placeholder="blur"`. */
  blurDataUrl: string;
};

type SharpMetadata = Awaited<ReturnType<ReturnType<typeof sharp>['metadata']>>;
type RawPixels = { data: Buffer; info: { width: number; height: number; channels: 1 | 2 | 3 | 4 } };

const QUALITY = { webp: 80, avif: 55 } as const;
const ALLOWED_LIST = 'JPEG, PNG, WebP or AVIF';

function refuse(code: string, message: string, details?: Record<string, unknown>): never {
  throw new PhotoRefusedError(code, message, details);
}

/**
 * Checks and converts one uploaded photo held in memory, without the network, the database or the disk:
 * the size, the real type from the bytes, the pixel count; then EXIF rotation applied, every piece of
 * metadata left behind (renditions are encoded from decoded pixels, never from the original file), and
 * the responsive widths in WebP and AVIF, never wider than the photo.
 */
export async function processPhoto(input: Uint8Array, limits: PhotoLimits): Promise<ProcessedPhoto> {
  const bytes = Buffer.isBuffer(input) ? input : Buffer.from(input.buffer, input.byteOffset, input.byteLength);
  if (bytes.length === 0) refuse('photo_empty', 'The file is empty: choose the photo again.');
  if (bytes.length > limits.maxBytes) {
    refuse('photo_too_large', `The photo is ${formatMegabytes(bytes.length)}; the limit is ${formatMegabytes(limits.maxBytes)}. Export it smaller and try again.`, {
      bytes: bytes.length,
      maxBytes: limits.maxBytes,
    });
  }

  // The type comes from the bytes (magic numbers), never from the name or what the browser declared.
  // file-type recognises no text formats, so an SVG (script or not) or a renamed text file finds nothing.
  const detected = await fileTypeFromBuffer(bytes);
  const sourceType = PHOTO_MIME_TYPES.find((mime) => mime === detected?.mime);
  if (!sourceType) {
    refuse(
      'photo_unsupported_type',
      detected
        ? `This file is ${detected.ext.toUpperCase()} (${detected.mime}); only ${ALLOWED_LIST} photos can be added.`
        : `This file is not a photo we can read; only ${ALLOWED_LIST} photos can be added (SVG drawings and renamed documents are refused).`,
      { detected: detected?.mime ?? null },
    );
  }

  const decodeOptions = { limitInputPixels: limits.maxPixels, failOn: 'error' as const };
  let metadata: SharpMetadata;
  try {
    // Reads the header only (nothing is decoded), with sharp's pixel limit lifted so that an oversized
    // photo gets its own message below rather than looking unreadable.
    metadata = await sharp(bytes, { ...decodeOptions, limitInputPixels: false }).metadata();
  } catch {
    refuse('photo_unreadable', 'The photo could not be read: the file may be damaged. Export it again and retry.');
  }
  const { width, height } = metadata;
  if (!width || !height) refuse('photo_unreadable', 'The photo could not be read: it has no size. Export it again and retry.');
  if (width * height > limits.maxPixels) {
    refuse(
      'photo_too_many_pixels',
      `The photo is ${width} × ${height} pixels (${(width * height / 1e6).toFixed(1)} megapixels); the limit is ${(limits.maxPixels / 1e6).toFixed(0)} megapixels. Resize it and try again.`,
      { width, height, maxPixels: limits.maxPixels },
    );
  }
  // EXIF orientations 5–8 turn the picture a quarter: its displayed width is the stored height.
  const quarterTurn = (metadata.orientation ?? 1) >= 5;
  const sourceWidth = quarterTurn ? height : width;
  const sourceHeight = quarterTurn ? width : height;
  const widths = renditionWidthsFor(sourceWidth);
  const top = widths[widths.length - 1]!;

  let pixels: RawPixels;
  try {
    // One decode: rotated upright by its EXIF orientation, at the largest width needed, as plain sRGB
    // pixels. Raw pixels carry no EXIF, XMP, IPTC or ICC at all, so nothing can leak into the renditions.
    pixels = await sharp(bytes, decodeOptions)
      .rotate()
      .resize({ width: top, withoutEnlargement: true })
      .toColourspace('srgb')
      .raw({ depth: 'uchar' })
      .toBuffer({ resolveWithObject: true });
  } catch (error) {
    if (error instanceof Error && /pixel limit/i.test(error.message)) {
      refuse('photo_too_many_pixels', `The photo has more than ${(limits.maxPixels / 1e6).toFixed(0)} megapixels. Resize it and try again.`);
    }
    refuse('photo_unreadable', 'The photo could not be read: the file may be damaged. Export it again and retry.');
  }
  const raw = { raw: { width: pixels.info.width, height: pixels.info.height, channels: pixels.info.channels } };

  const renditions: RenditionFile[] = [];
  for (const w of widths) {
    for (const format of ['webp', 'avif'] as const) {
      const resized = sharp(pixels.data, raw).resize({ width: w, withoutEnlargement: true });
      const encoded = format === 'webp' ? resized.webp({ quality: QUALITY.webp, effort: 4 }) : resized.avif({ quality: QUALITY.avif, effort: 4 });
      const { data, info } = await encoded.toBuffer({ resolveWithObject: true });
      renditions.push({ width: info.width, height: info.height, format, data });
    }
  }

  const blur = await sharp(pixels.data, raw).resize({ width: 16 }).webp({ quality: 40 }).toBuffer();

  return {
    hash: createHash('sha256').update(bytes).digest('hex').slice(0, 32),
    sourceType,
    bytes: bytes.length,
    sourceWidth,
    sourceHeight,
    renditions,
    blurDataUrl: `data:image/webp;base64,${blur.toString('base64')}`,
  };
}
