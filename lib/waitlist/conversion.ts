import 'server-only';
import { sql } from '@/lib/db/sql';

/**
 * How a batch's waitlist turned into orders: `announced` is how many people its announcement reached (messages
 * sent), `buyers` how many of the batch's paid orders came from someone who was on the design's waitlist when the
 * drop opened (a confirmed entry from before the opening, not left by then), matched by address or account.
 */
export type WaitlistConversion = { announced: number; buyers: number };

/** The conversion of each batch asked for (all batches when `batchIds` is omitted), keyed by batch id. */
export async function getWaitlistConversions(batchIds?: string[]): Promise<Map<string, WaitlistConversion>> {
  const rows = await sql<{ batch_id: string; announced: number; buyers: number }>(
    `SELECT b.id AS batch_id,
            (SELECT count(*)::int FROM mail_outbox m JOIN waitlist_announcements a ON a.id = m.announcement_id
              WHERE a.batch_id = b.id AND a.kind = 'announced' AND m.status = 'sent') AS announced,
            (SELECT count(*)::int FROM orders o
              WHERE o.batch_id = b.id AND o.paid_at IS NOT NULL
                AND EXISTS (SELECT 1 FROM waitlist_entries e
                             WHERE e.design_id = b.design_id AND e.confirmed_at IS NOT NULL
                               AND e.confirmed_at < coalesce(b.early_access_at, b.opens_at)
                               AND (e.left_at IS NULL OR e.left_at > coalesce(b.early_access_at, b.opens_at))
                               AND (e.email = lower(btrim(o.email)) OR (o.user_id IS NOT NULL AND e.user_id = o.user_id)))) AS buyers
       FROM batches b WHERE ($1::uuid[] IS NULL OR b.id = ANY($1::uuid[]))`,
    [batchIds ?? null],
  );
  return new Map(rows.map((r) => [r.batch_id, { announced: r.announced, buyers: r.buyers }]));
}
