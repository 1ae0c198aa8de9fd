import 'server-only';
import { AppError } from '@/lib/api/errors';
import { PhotoRefusedError } from './process';
import { formatMegabytes } from './renditions';

const LOOPBACK = new Set(['127.0.0.1', 'localhost', '[::1]']);

/**
 * Fetches an uploaded file from the upload service's file URL, with a deadline for the whole transfer
 * and a size cap counted while the bytes stream in (a missing or lying Content-Length changes nothing).
 * Plain http is only for loopback, where the local fake of the upload service runs.
 */
export async function fetchUploadedFile(url: string, { maxBytes, timeoutMs }: { maxBytes: number; timeoutMs: number }): Promise<Buffer> {
  let target: URL;
  try {
    target = new URL(url);
  } catch {
    throw new AppError('photo_source_invalid', 'The upload service sent a file address that is not a URL.', 502);
  }
  const loopback = LOOPBACK.has(target.hostname) || target.hostname.startsWith('127.');
  if (!(target.protocol === 'https:' || (target.protocol === 'http:' && loopback))) {
    throw new AppError('photo_source_invalid', 'The upload service sent a file address this server will not fetch (https only).', 502);
  }

  const signal = AbortSignal.timeout(timeoutMs);
  const tooLarge = (bytes: number) =>
    new PhotoRefusedError('photo_too_large', `The photo is over ${formatMegabytes(maxBytes)}${bytes > 0 ? ` (${formatMegabytes(bytes)} or more)` : ''}; the limit is ${formatMegabytes(maxBytes)}. Export it smaller and try again.`, {
      maxBytes,
    });
  try {
    const response = await fetch(target, { signal, redirect: 'error' });
    if (response.status !== 200 || !response.body) {
      await response.body?.cancel();
      throw new AppError('photo_fetch_failed', `The uploaded file could not be fetched from the upload service (HTTP ${response.status}). Try the upload again.`, 502);
    }
    const declared = Number(response.headers.get('content-length') ?? NaN);
    if (Number.isFinite(declared) && declared > maxBytes) {
      await response.body.cancel();
      throw tooLarge(declared);
    }
    const chunks: Buffer[] = [];
    let total = 0;
    const reader = response.body.getReader();
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      total += value.byteLength;
      if (total > maxBytes) {
        await reader.cancel();
        throw tooLarge(total);
      }
      chunks.push(Buffer.from(value.buffer, value.byteOffset, value.byteLength));
    }
    return Buffer.concat(chunks, total);
  } catch (error) {
    if (error instanceof AppError) throw error;
    if (signal.aborted) {
      throw new AppError('photo_fetch_timeout', `The uploaded file took longer than ${Math.round(timeoutMs / 1000)} s to fetch from the upload service. Try again.`, 504);
    }
    throw new AppError('photo_fetch_failed', 'The uploaded file could not be fetched from the upload service. Try the upload again.', 502);
  }
}
