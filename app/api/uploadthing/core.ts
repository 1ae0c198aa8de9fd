import { revalidateTag } from 'next/cache';
import { createUploadthing, type FileRouter } from 'uploadthing/next';
import { UploadThingError } from 'uploadthing/server';
import { z } from 'zod';
import { AppError } from '@/lib/api/errors';
import { hasRole } from '@/lib/auth/roles';
import { getCurrentUser } from '@/lib/auth/session';
import { catalogueTag } from '@/lib/catalogue/cached';
import { dropTags } from '@/lib/drops/catalogue';
import { photoConfig } from '@/lib/photos/config';
import { findPhotoTarget, processUpload, type StoredPhoto } from '@/lib/photos/pipeline';
import { DEFAULT_PHOTO_MAX_BYTES, formatMegabytes, PHOTO_ACCEPT, PHOTO_MAX_FILES, PHOTO_MIME_TYPES } from '@/lib/photos/renditions';
import { deleteUploadedSources } from '@/lib/photos/upload-service';

// The workshop's one upload route. uploadthing's handler runs the middleware before it signs anything,
// so a caller who may not upload gets no upload URL; the upload service then calls back (signed with the
// API key) and `onUploadComplete` runs the photo pipeline, whose answer goes back to the browser.

const ALLOWED = 'JPEG, PNG, WebP or AVIF';

function maxBytes(): number {
  try {
    return photoConfig().maxBytes;
  } catch {
    // A broken setting makes the route answer 503 before uploadthing runs; the default only fills the type.
    return DEFAULT_PHOTO_MAX_BYTES;
  }
}

/** uploadthing's type lists powers of two only; its parser (fileSizeToBytes) takes any whole number + unit. */
const asFileSize = (bytes: number) => `${bytes}B` as '1B';

export const photoUploadInput = z.object({
  designId: z.uuid({ error: 'Choose the design the photos are of (its id is missing or wrong).' }),
  finishId: z.uuid({ error: 'The finish is not one of this design’s finishes.' }).nullish(),
  /** Photos of one batch: they show on its drop page, not in the design's own gallery. */
  batchId: z.uuid({ error: 'The batch’s id is missing or wrong: reload the batch’s page and try again.' }).nullish(),
});

/** What the browser receives for each file once the pipeline has run (uploadthing's `serverData`). */
export type PhotoUploadResult =
  | { ok: true; photoId: string; src: string; width: number; height: number }
  | { ok: false; code: string; message: string };

type Shaped = { message: string; error: { code: string; message: string } };
const shaped = (code: string, message: string): Shaped => ({ message, error: { code, message } });

/**
 * Every error the route answers, in words. `message` is what uploadthing's client shows; `error` is the
 * app's own error shape, so the same body reads right to both.
 */
function formatUploadError(error: UploadThingError): Shaped {
  if (error.message.startsWith('Invalid config: FileSizeMismatch')) {
    return shaped('photo_too_large', `A photo is over the ${formatMegabytes(maxBytes())} limit: export it smaller and try again.`);
  }
  if (error.message.startsWith('Invalid config: FileCountMismatch')) {
    return shaped('too_many_photos', `Choose at most ${PHOTO_MAX_FILES} photos at a time.`);
  }
  if (error.message.startsWith('Invalid config: InvalidFileType') || error.message.startsWith('Invalid config: UnknownFileType')) {
    return shaped('photo_unsupported_type', `Only ${ALLOWED} photos can be added.`);
  }
  if (error.message === 'Invalid input') {
    // Our own input schema's messages are written for people; uploadthing's parse errors are not.
    if (error.cause instanceof z.ZodError) {
      return shaped('invalid_input', `The upload request was not understood: ${error.cause.issues.map((issue) => issue.message).join(' ')}`);
    }
    return shaped('invalid_input', 'The upload request was not understood: send it from the photo uploader, which names the route (?slug=designPhoto) and the files.');
  }
  if (error.message === 'Invalid signature') {
    return shaped('signature_invalid', 'The upload callback’s signature is not valid, so it was ignored.');
  }
  if (error.message.startsWith('No file route found')) {
    return shaped('not_found', 'There is no such upload route: photos go to “designPhoto”.');
  }
  const message = error.message.length > 10 ? error.message : `The upload could not go ahead (${error.code.toLowerCase()}).`;
  return shaped(error.code.toLowerCase(), message);
}

const f = createUploadthing({ errorFormatter: formatUploadError });

/**
 * The shop pages that may show the new photo, expired at once. This runs in the upload service's callback,
 * a route handler, where `updateTag` is not available; `expire: 0` means the next visitor waits for fresh
 * data rather than being served the page without the photo. The photo is stored whatever happens here, so
 * a failure is logged, not reported as a failed upload (the caches also run out on their own).
 */
function expireShopPages(photo: StoredPhoto) {
  const tags = [catalogueTag, `design:${photo.designSlug}`, dropTags.all, ...(photo.batchId ? [dropTags.batch(photo.batchId)] : [])];
  try {
    for (const tag of tags) revalidateTag(tag, { expire: 0 });
  } catch (error) {
    console.error('A photo was stored but the shop’s cached pages could not be expired', { photoId: photo.id, tags, error });
  }
}

const acceptedName = (name: string) => Object.values(PHOTO_ACCEPT).some((endings) => endings.some((ending) => name.toLowerCase().endsWith(ending)));

export const photoFileRouter = {
  designPhoto: f(
    { image: { maxFileSize: asFileSize(maxBytes()), maxFileCount: PHOTO_MAX_FILES, minFileCount: 1 } },
    // The browser waits for the pipeline's answer, so refusals reach the person who chose the file.
    { awaitServerData: true },
  )
    .input(photoUploadInput)
    .middleware(async ({ input, files }) => {
      const user = await getCurrentUser();
      if (!user) throw new UploadThingError({ code: 'FORBIDDEN', message: 'Sign in as the studio’s maker to add photos.' });
      if (!hasRole(user.role, 'owner')) {
        throw new UploadThingError({ code: 'FORBIDDEN', message: 'Only the studio’s maker (an owner) can add photos of designs.' });
      }
      for (const file of files) {
        // What the browser declares is only a first filter; the pipeline reads the real type from the bytes.
        const declared = PHOTO_MIME_TYPES.some((mime) => mime === file.type) || (file.type === '' && acceptedName(file.name));
        if (!declared) {
          throw new UploadThingError({ code: 'BAD_REQUEST', message: `“${file.name}” is not a ${ALLOWED} photo, so nothing was uploaded.` });
        }
      }
      try {
        await findPhotoTarget(input.designId, input.finishId, input.batchId);
      } catch (error) {
        if (error instanceof AppError) {
          throw new UploadThingError({ code: error.status === 404 ? 'NOT_FOUND' : 'BAD_REQUEST', message: error.message });
        }
        throw error;
      }
      return { uploadedBy: user.id, designId: input.designId, finishId: input.finishId ?? null, batchId: input.batchId ?? null };
    })
    .onUploadComplete(async ({ metadata, file }): Promise<PhotoUploadResult> => {
      try {
        const photo = await processUpload({ url: file.ufsUrl, designId: metadata.designId, finishId: metadata.finishId, batchId: metadata.batchId, sourceKey: file.key });
        expireShopPages(photo);
        return { ok: true, photoId: photo.id, src: photo.src, width: photo.width, height: photo.height };
      } catch (error) {
        if (error instanceof AppError) {
          // A refused file is of no use to anyone: it goes from the upload service too.
          if (error.status === 422) await deleteUploadedSources([file.key]);
          return { ok: false, code: error.code, message: error.message };
        }
        console.error('The photo pipeline failed on an uploaded file', { key: file.key, error });
        return { ok: false, code: 'internal_error', message: `“${file.name}” arrived but could not be processed. Try it again in a moment.` };
      }
    }),
} satisfies FileRouter;

export type PhotoFileRouter = typeof photoFileRouter;
