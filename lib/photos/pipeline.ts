import 'server-only';
import { z } from 'zod';
import { AppError } from '@/lib/api/errors';
import { getDb } from '@/lib/db/connection';
import { sql } from '@/lib/db/sql';
import { photoConfig, type PhotoConfig } from './config';
import { fetchUploadedFile } from './fetch-upload';
import { processPhoto } from './process';
import { mediaUrl, parseUploadedSrc, type Rendition } from './renditions';
import { discardStaged, emptyTrash, finishStaged, moveToTrash, publishStaged, restoreFromTrash, stageRenditions } from './store';
import { deleteUploadedSources } from './upload-service';

export type StoredPhoto = {
  id: string;
  designId: string;
  finishId: string | null;
  /** Set for a photo of one batch (shown on its drop page), null for the design's own gallery. */
  batchId: string | null;
  /** The design's address in the shop, for dropping its cached pages. */
  designSlug: string;
  src: string;
  alt: string;
  width: number;
  height: number;
  renditions: Rendition[];
  blurDataUrl: string;
  bytes: number;
  sourceKey: string | null;
};

type PhotoRow = {
  id: string;
  design_id: string;
  finish_id: string | null;
  batch_id: string | null;
  design_slug: string;
  src: string;
  alt: string;
  width: number;
  height: number;
  renditions: Rendition[];
  blur_data_url: string;
  bytes: number;
  source_key: string | null;
};

const RETURNING =
  'id, design_id, finish_id, batch_id, (SELECT slug FROM designs WHERE designs.id = photos.design_id) AS design_slug, src, alt, width, height, renditions, blur_data_url, bytes, source_key';

const toStored = (row: PhotoRow): StoredPhoto => ({
  id: row.id,
  designId: row.design_id,
  finishId: row.finish_id,
  batchId: row.batch_id,
  designSlug: row.design_slug,
  src: row.src,
  alt: row.alt,
  width: row.width,
  height: row.height,
  renditions: row.renditions,
  blurDataUrl: row.blur_data_url,
  bytes: row.bytes,
  sourceKey: row.source_key,
});

const targetSchema = z.object({
  designId: z.uuid({ error: 'designId must be a design’s id' }),
  finishId: z.uuid({ error: 'finishId must be a finish’s id' }).nullish(),
  batchId: z.uuid({ error: 'batchId must be a batch’s id' }).nullish(),
  alt: z.string().trim().min(1).max(300).optional(),
  /** The file's key at the upload service: one photo per key, however often the callback comes. */
  sourceKey: z.string().min(1).max(200).optional(),
});
const uploadSchema = targetSchema.extend({ url: z.url({ error: 'url must be the uploaded file’s address' }) });

export type PhotoTarget = z.input<typeof targetSchema>;
export type UploadToProcess = z.input<typeof uploadSchema>;

function parse<T extends z.ZodType>(schema: T, input: unknown): z.output<T> {
  const result = schema.safeParse(input);
  if (!result.success) {
    throw new AppError('invalid_input', result.error.issues.map((issue) => issue.message).join('; '), 400);
  }
  return result.data;
}

/** The design (and finish, and batch) a photo is for, or a 404/422 that says what is wrong. */
export async function findPhotoTarget(designId: string, finishId: string | null | undefined, batchId?: string | null) {
  const [row] = await sql<{
    design_name: string; design_slug: string; finish_name: string | null; finish_design_id: string | null; batch_name: string | null; batch_design_id: string | null;
  }>(
    `SELECT d.name AS design_name, d.slug AS design_slug, f.name AS finish_name, f.design_id AS finish_design_id,
            b.name AS batch_name, b.design_id AS batch_design_id
       FROM designs d LEFT JOIN finishes f ON f.id = $2 LEFT JOIN batches b ON b.id = $3
      WHERE d.id = $1`,
    [designId, finishId ?? null, batchId ?? null],
  );
  if (!row) throw new AppError('design_not_found', 'There is no such design: reload the page and try again.', 404);
  if (batchId && !row.batch_name) throw new AppError('batch_not_found', 'There is no such batch: reload the page and try again.', 404);
  if (finishId && !row.finish_name) throw new AppError('finish_not_found', 'There is no such finish: reload the page and try again.', 404);
  if (batchId && row.batch_design_id !== designId) {
    throw new AppError('batch_of_other_design', `That batch is of another design, not the ${row.design_name}: add its photos from the batch’s own page.`, 422);
  }
  if (finishId && row.finish_design_id !== designId) {
    throw new AppError('finish_of_other_design', `That finish belongs to another design, not the ${row.design_name}.`, 422);
  }
  return { designName: row.design_name, designSlug: row.design_slug, finishName: row.finish_name, batchName: row.batch_name };
}

/**
 * The whole pipeline for one uploaded file: fetch it from the upload service (time-limited, size-capped),
 * check and convert it, write the renditions and insert the photo row. A refused file (422) and anything
 * that fails leave no row and no files behind.
 */
export async function processUpload(input: UploadToProcess): Promise<StoredPhoto> {
  const upload = parse(uploadSchema, input);
  const config = photoConfig();
  await findPhotoTarget(upload.designId, upload.finishId, upload.batchId);
  if (upload.sourceKey) {
    const existing = await photoBySourceKey(upload.sourceKey);
    if (existing) return existing;
  }
  const bytes = await fetchUploadedFile(upload.url, { maxBytes: config.maxBytes, timeoutMs: config.fetchTimeoutMs });
  return savePhoto(bytes, upload, config);
}

/** The pipeline from the bytes on: for a file already in memory (and for tests, without the network). */
export async function savePhoto(bytes: Uint8Array, target: PhotoTarget, config: PhotoConfig = photoConfig()): Promise<StoredPhoto> {
  const { designId, finishId, batchId, alt, sourceKey } = parse(targetSchema, target);
  const names = await findPhotoTarget(designId, finishId, batchId);
  const processed = await processPhoto(bytes, config);

  const webp = processed.renditions.filter((r) => r.format === 'webp');
  const largest = webp[webp.length - 1]!;
  const subject = names.finishName ? `${names.designName} mask in the ${names.finishName} finish` : `${names.designName} mask`;
  const description = alt ?? `${subject}${names.batchName ? ` from the batch “${names.batchName}”` : ''}, studio photo.`;

  const staged = await stageRenditions(config.mediaDir, processed);
  const renditions = staged.files.map((file) => file.rendition);
  const src = mediaUrl(renditions.find((r) => r.format === 'webp' && r.width === largest.width)!.path);
  try {
    // The row and the files become visible together: the files are moved into place inside the
    // transaction, and anything that fails (the insert, a move, the commit) undoes both.
    const row = await getDb().sequelize.transaction(async (transaction) => {
      const [inserted] = await sql<PhotoRow>(
        `INSERT INTO photos (design_id, finish_id, batch_id, src, alt, width, height, position, renditions, blur_data_url, bytes, source_key)
         VALUES ($1, $2, $11, $3, $4, $5, $6,
                 COALESCE((SELECT max(position) + 1 FROM photos WHERE design_id = $1), 0),
                 $7::jsonb, $8, $9, $10)
         RETURNING ${RETURNING}`,
        [designId, finishId ?? null, src, description, largest.width, largest.height, JSON.stringify(renditions), processed.blurDataUrl, processed.bytes, sourceKey ?? null, batchId ?? null],
        transaction,
      );
      await publishStaged(staged);
      return inserted!;
    });
    await finishStaged(staged);
    return toStored(row);
  } catch (error) {
    await discardStaged(staged).catch((cleanup: unknown) => console.error('Could not remove the files of a photo that was not stored', { dir: staged.dir, cleanup }));
    // The same upload's callback, delivered twice at once: the other delivery stored it.
    if (sourceKey && (error as { original?: { code?: string } }).original?.code === '23505') {
      const existing = await photoBySourceKey(sourceKey);
      if (existing) return existing;
    }
    throw error;
  }
}

async function photoBySourceKey(sourceKey: string): Promise<StoredPhoto | null> {
  const [row] = await sql<PhotoRow>(`SELECT ${RETURNING} FROM photos WHERE source_key = $1`, [sourceKey]);
  return row ? toStored(row) : null;
}

/**
 * Removes a photo's row and its files (and its original at the upload service). The files are moved
 * aside first and put back if the row cannot be deleted; files another photo of the same upload still
 * uses stay. The caller decides who may do this (an owner-only action).
 */
export async function deletePhoto(photoId: string): Promise<{ deleted: boolean }> {
  const id = parse(z.uuid({ error: 'That is not a photo’s id.' }), photoId);
  const config = photoConfig();
  const moved: { hash: string; folder: string }[] = [];
  let result: { deleted: boolean; sourceKey: string | null };
  try {
    result = await getDb().sequelize.transaction(async (transaction) => {
      const [row] = await sql<{ src: string; source_key: string | null }>(`DELETE FROM photos WHERE id = $1 RETURNING src, source_key`, [id], transaction);
      if (!row) return { deleted: false, sourceKey: null };
      const uploaded = parseUploadedSrc(row.src);
      if (uploaded) {
        const [others] = await sql<{ n: number }>(`SELECT count(*)::int AS n FROM photos WHERE src LIKE $1`, [`/media/${uploaded.hash}/%`], transaction);
        if (!others?.n) {
          const folder = await moveToTrash(config.mediaDir, uploaded.hash);
          if (folder) moved.push({ hash: uploaded.hash, folder });
        }
      }
      return { deleted: true, sourceKey: row.source_key };
    });
  } catch (error) {
    // The row is still there: its files go back where they were.
    for (const { hash, folder } of moved) await restoreFromTrash(config.mediaDir, hash, folder);
    throw error;
  }
  for (const { folder } of moved) await emptyTrash(folder);
  if (result.sourceKey) await deleteUploadedSources([result.sourceKey]);
  return { deleted: result.deleted };
}

/**
 * For a caller that deletes the photo row itself inside its own transaction (the workshop's
 * `deletePhotoRecord(photoId, removeFiles)`): removes the files of the photo whose row that transaction
 * is deleting. It reads the row on its own connection, where the row is still there until the caller
 * commits, and never touches the row (it would wait on the caller's lock). The folder goes with one
 * rename, so a failure here changes nothing and lets the caller's transaction roll back.
 */
export async function removePhotoFiles(photo: { id: string }): Promise<void> {
  const id = parse(z.uuid({ error: 'That is not a photo’s id.' }), photo.id);
  const config = photoConfig();
  const [row] = await sql<{ src: string; source_key: string | null }>(`SELECT src, source_key FROM photos WHERE id = $1`, [id]);
  if (!row) return;
  const uploaded = parseUploadedSrc(row.src);
  if (uploaded) {
    const [others] = await sql<{ n: number }>(`SELECT count(*)::int AS n FROM photos WHERE src LIKE $1 AND id <> $2`, [`/media/${uploaded.hash}/%`, id]);
    if (!others?.n) {
      const folder = await moveToTrash(config.mediaDir, uploaded.hash);
      if (folder) await emptyTrash(folder).catch((error: unknown) => console.warn('Could not empty a deleted photo’s folder', { folder, error }));
    }
  }
  if (row.source_key) await deleteUploadedSources([row.source_key]);
}
