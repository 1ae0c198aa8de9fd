import 'server-only';
import { sql } from '@/lib/db/sql';

export type BatchPhoto = { id: string; src: string; alt: string; width: number; height: number };

/** A batch's own photos, first shown first (the drop's cover). */
export async function listBatchPhotos(batchId: string): Promise<BatchPhoto[]> {
  return sql<BatchPhoto>(`SELECT id, src, alt, width, height FROM photos WHERE batch_id = $1 ORDER BY position, created_at, id`, [batchId]);
}
