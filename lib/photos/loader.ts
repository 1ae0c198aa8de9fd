import type { ImageLoaderProps } from 'next/image';
import {
  mediaRelativePath,
  mediaUrl,
  parseUploadedSrc,
  pickRenditionWidth,
  renditionWidthsFor,
  type RenditionFormat,
} from './renditions';

// Pure functions, no server imports: usable from client components (next/image calls the loader in the
// browser). A server component cannot hand a function to <Image>, so pages that use the loader render
// the image from a small client component.

/**
 * A next/image loader for uploaded photos: `/media/<hash>/<largest>.webp` becomes the written rendition
 * nearest above the width next/image asks for, so no request is ever resized on the fly. Any other src
 * (the demo's seeded photos in public/media/demo) is returned as it is, with the width as a query
 * parameter that static files ignore, so next/image sees a width-aware loader.
 */
export function photoLoader({ src, width }: ImageLoaderProps): string {
  const uploaded = parseUploadedSrc(src);
  if (!uploaded) return `${src}${src.includes('?') ? '&' : '?'}w=${width}`;
  return mediaUrl(mediaRelativePath(uploaded.hash, pickRenditionWidth(uploaded.width, width), uploaded.format));
}

/** A `srcset` for one format of an uploaded photo, for `<picture><source type="image/avif" …>`; null otherwise. */
export function photoSrcSet(src: string, format: RenditionFormat): string | null {
  const uploaded = parseUploadedSrc(src);
  if (!uploaded) return null;
  return renditionWidthsFor(uploaded.width)
    .map((width) => `${mediaUrl(mediaRelativePath(uploaded.hash, width, format))} ${width}w`)
    .join(', ');
}
