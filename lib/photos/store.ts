import 'server-only';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import type { ProcessedPhoto } from './process';
import { MEDIA_FILE_PATTERN, mediaRelativePath, type Rendition } from './renditions';

// Files under MEDIA_DIR: `<hash>/<width>.<format>` once published. Work in progress lives in folders whose
// names start with a dot (`.staging`, `.trash`), which the media route's name check never matches, and on
// the same disk, so moving a file into place is one atomic rename.

type StagedFile = { temp: string; final: string; rendition: Rendition };
export type Staged = { mediaDir: string; hash: string; dir: string; files: StagedFile[]; created: string[] };

/** Writes every rendition under a temporary name; nothing is visible at its final path yet. */
export async function stageRenditions(mediaDir: string, photo: ProcessedPhoto): Promise<Staged> {
  const dir = path.join(mediaDir, '.staging', randomUUID());
  await fs.mkdir(dir, { recursive: true });
  const staged: Staged = { mediaDir, hash: photo.hash, dir, files: [], created: [] };
  try {
    for (const rendition of photo.renditions) {
      const relative = mediaRelativePath(photo.hash, rendition.width, rendition.format);
      const temp = path.join(dir, `${rendition.width}.${rendition.format}`);
      await fs.writeFile(temp, rendition.data, { flag: 'wx' });
      staged.files.push({
        temp,
        final: path.join(mediaDir, relative),
        rendition: { width: rendition.width, height: rendition.height, format: rendition.format, path: relative },
      });
    }
  } catch (error) {
    await fs.rm(dir, { recursive: true, force: true });
    throw error;
  }
  return staged;
}

/**
 * Moves the staged files to their final names. A file already there is the same content (the name is
 * the upload's content hash), belongs to another photo row, and is left alone; only files this call
 * moved are recorded in `created`, so a rollback removes exactly those.
 */
export async function publishStaged(staged: Staged): Promise<void> {
  await fs.mkdir(path.join(staged.mediaDir, staged.hash), { recursive: true });
  for (const file of staged.files) {
    if (await exists(file.final)) continue;
    await fs.rename(file.temp, file.final);
    staged.created.push(file.final);
  }
}

/** After the row is committed: only the temporary folder is left to remove. */
export async function finishStaged(staged: Staged): Promise<void> {
  await fs.rm(staged.dir, { recursive: true, force: true });
}

/** After a failure: removes the temporary files and whatever `publishStaged` had moved into place. */
export async function discardStaged(staged: Staged): Promise<void> {
  await Promise.all(staged.created.map((file) => fs.rm(file, { force: true })));
  await fs.rm(staged.dir, { recursive: true, force: true });
  await removeIfEmpty(path.join(staged.mediaDir, staged.hash));
}

/** Moves a photo's folder aside (undoable) before its row is deleted; null when there was none. */
export async function moveToTrash(mediaDir: string, hash: string): Promise<string | null> {
  const folder = path.join(mediaDir, hash);
  if (!(await exists(folder))) return null;
  const trash = path.join(mediaDir, '.trash', `${hash}-${randomUUID()}`);
  await fs.mkdir(path.dirname(trash), { recursive: true });
  await fs.rename(folder, trash);
  return trash;
}

export async function restoreFromTrash(mediaDir: string, hash: string, trash: string): Promise<void> {
  await fs.rename(trash, path.join(mediaDir, hash));
}

export async function emptyTrash(trash: string): Promise<void> {
  await fs.rm(trash, { recursive: true, force: true });
}

/**
 * The absolute path of a published file from the URL's segments, or null unless the segments are
 * exactly `<32 hex>/<width>.<webp|avif>`: no `..`, no dot folders, nothing but generated names.
 */
export function resolveMediaFile(mediaDir: string, segments: string[]): { file: string; format: 'webp' | 'avif' } | null {
  if (segments.length !== 2) return null;
  const relative = segments.join('/');
  const match = MEDIA_FILE_PATTERN.exec(relative);
  if (!match) return null;
  const root = path.resolve(mediaDir);
  const file = path.resolve(root, relative);
  if (!file.startsWith(root + path.sep)) return null;
  return { file, format: match[3] as 'webp' | 'avif' };
}

async function exists(file: string): Promise<boolean> {
  try {
    await fs.access(file);
    return true;
  } catch {
    return false;
  }
}

async function removeIfEmpty(folder: string): Promise<void> {
  try {
    await fs.rmdir(folder);
  } catch {
    /* not empty, or not there: either way nothing of ours is left in it */
  }
}
