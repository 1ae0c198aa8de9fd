import 'server-only';
import { UTApi } from 'uploadthing/server';
import { uploadthingSetup } from './config';

// The upload service's server API (uploadthing's UTApi), configured by the UPLOADTHING_* variables only:
// UPLOADTHING_TOKEN, and UPLOADTHING_API_URL where a local fake stands in for the service.

const TIMEOUT_MS = 10_000;

/**
 * Removes uploaded originals from the upload service: a refused file, or a deleted photo's source. Best
 * effort: the studio's own copies are what pages use, so a failure here is logged and goes no further.
 */
export async function deleteUploadedSources(keys: string[]): Promise<void> {
  if (keys.length === 0 || !uploadthingSetup().ok) return;
  try {
    const api = new UTApi({
      fetch: (input, init) => {
        const given = (init as RequestInit | undefined)?.signal;
        const timeout = AbortSignal.timeout(TIMEOUT_MS);
        return fetch(input, { ...(init as RequestInit), signal: given ? AbortSignal.any([given, timeout]) : timeout });
      },
    });
    await api.deleteFiles(keys);
  } catch (error) {
    console.warn('Could not remove uploaded files from the upload service', { keys, error: error instanceof Error ? error.message : error });
  }
}
