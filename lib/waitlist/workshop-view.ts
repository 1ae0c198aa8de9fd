import 'server-only';
import { z } from 'zod';
import { AppError } from '@/lib/api/errors';
import { sql } from '@/lib/db/sql';
import { getWaitlistConversions, type WaitlistConversion } from './conversion';

// What the workshop's waitlist page reads: people per design, how announcements are sending, how the lists
// turned into orders, and the export. Read fresh on each visit; nothing here is stored.

export type DesignWaitlist = { designId: string; designName: string; confirmed: number; pending: number; left: number; leftLast30Days: number };
/** One row per day (in the studio's zone): confirmed people on each design's list at the end of that day. */
export type DailyConfirmed = { day: string; counts: Record<string, number> };

export const waitlistDays = 60;

export async function getWaitlistDesigns(): Promise<DesignWaitlist[]> {
  const rows = await sql<{ design_id: string; design_name: string; confirmed: number; pending: number; left: number; left_30: number }>(
    `SELECT d.id AS design_id, d.name AS design_name,
            count(e.id) FILTER (WHERE e.state = 'confirmed')::int AS confirmed,
            count(e.id) FILTER (WHERE e.state = 'pending')::int AS pending,
            count(e.id) FILTER (WHERE e.state = 'left')::int AS left,
            count(e.id) FILTER (WHERE e.state = 'left' AND e.left_at > now() - interval '30 days')::int AS left_30
       FROM designs d LEFT JOIN waitlist_entries e ON e.design_id = d.id
      WHERE d.status <> 'retired' GROUP BY d.id, d.name, d.position ORDER BY d.position, d.name`,
  );
  return rows.map((r) => ({ designId: r.design_id, designName: r.design_name, confirmed: r.confirmed, pending: r.pending, left: r.left, leftLast30Days: r.left_30 }));
}

export async function getDailyConfirmed(timeZone: string, days = waitlistDays): Promise<DailyConfirmed[]> {
  const rows = await sql<{ day: string; design_id: string; n: number }>(
    `WITH days AS (
       SELECT generate_series((now() AT TIME ZONE $1)::date - ($2::int - 1), (now() AT TIME ZONE $1)::date, interval '1 day')::date AS day
     )
     SELECT to_char(days.day, 'YYYY-MM-DD') AS day, d.id AS design_id,
            (SELECT count(*)::int FROM waitlist_entries e
              WHERE e.design_id = d.id AND e.confirmed_at IS NOT NULL AND (e.confirmed_at AT TIME ZONE $1)::date <= days.day
                AND (e.left_at IS NULL OR (e.left_at AT TIME ZONE $1)::date > days.day)) AS n
       FROM days CROSS JOIN designs d WHERE d.status <> 'retired' ORDER BY days.day`,
    [timeZone, days],
  );
  const byDay = new Map<string, Record<string, number>>();
  for (const r of rows) {
    const counts = byDay.get(r.day) ?? {};
    counts[r.design_id] = r.n;
    byDay.set(r.day, counts);
  }
  return [...byDay].map(([day, counts]) => ({ day, counts }));
}

export type AnnouncementProgress = {
  id: string; batchId: string; batchName: string; designName: string; kind: 'announced' | 'early_access_reminder' | 'correction'; revision: number;
  state: 'queued' | 'fanning_out' | 'queued_all' | 'cancelled'; reason: string | null; createdAt: string;
  queued: number; sent: number; failed: number;
  /** Still queuing people, or messages still waiting to go. */
  unfinished: boolean;
};

export async function listAnnouncementProgress(limit = 30): Promise<AnnouncementProgress[]> {
  const rows = await sql<{
    id: string; batch_id: string; batch_name: string; design_name: string; kind: AnnouncementProgress['kind']; revision: number; state: AnnouncementProgress['state'];
    reason: string | null; created_at: Date; pending: number; sent: number; failed: number;
  }>(
    `SELECT a.id, a.batch_id, b.name AS batch_name, d.name AS design_name, a.kind, a.revision, a.state, a.detail->>'reason' AS reason, a.created_at,
            coalesce(m.pending, 0) AS pending, coalesce(m.sent, 0) AS sent, coalesce(m.failed, 0) AS failed
       FROM waitlist_announcements a JOIN batches b ON b.id = a.batch_id JOIN designs d ON d.id = b.design_id
       LEFT JOIN LATERAL (
         SELECT count(*) FILTER (WHERE status = 'pending')::int AS pending, count(*) FILTER (WHERE status = 'sent')::int AS sent,
                count(*) FILTER (WHERE status = 'failed')::int AS failed
           FROM mail_outbox WHERE announcement_id = a.id) m ON true
      ORDER BY a.created_at DESC LIMIT $1`,
    [limit],
  );
  return rows.map((r) => ({
    id: r.id, batchId: r.batch_id, batchName: r.batch_name, designName: r.design_name, kind: r.kind, revision: r.revision, state: r.state,
    reason: r.reason, createdAt: r.created_at.toISOString(), queued: r.pending, sent: r.sent, failed: r.failed,
    unfinished: r.state === 'queued' || r.state === 'fanning_out' || r.pending > 0,
  }));
}

export type BatchConversion = { batchId: string; batchName: string; designName: string; opensAt: string; paidOrders: number } & WaitlistConversion;

export async function listBatchConversions(limit = 20): Promise<BatchConversion[]> {
  const batches = await sql<{ id: string; name: string; design_name: string; opens_at: Date; paid: number }>(
    `SELECT b.id, b.name, d.name AS design_name, b.opens_at,
            (SELECT count(*)::int FROM orders o WHERE o.batch_id = b.id AND o.paid_at IS NOT NULL) AS paid
       FROM batches b JOIN designs d ON d.id = b.design_id WHERE b.status <> 'draft' ORDER BY b.opens_at DESC LIMIT $1`,
    [limit],
  );
  const conversions = await getWaitlistConversions(batches.map((b) => b.id));
  return batches.map((b) => ({
    batchId: b.id, batchName: b.name, designName: b.design_name, opensAt: b.opens_at.toISOString(), paidOrders: b.paid,
    ...(conversions.get(b.id) ?? { announced: 0, buyers: 0 }),
  }));
}

export const waitlistExportQuerySchema = z.object({
  design: z.uuid({ error: 'Choose a design from the list, or leave it out for every design.' }).optional(),
  state: z.enum(['pending', 'confirmed', 'left'], { error: 'State must be pending, confirmed or left.' }).optional(),
});
export type WaitlistExportQuery = z.infer<typeof waitlistExportQuerySchema>;

type ExportRow = {
  id: string; email: string; design_name: string; finishes: string[]; state: string; source: string;
  created_at: Date; confirmed_at: Date | null; left_at: Date | null;
};

const iso = (at: Date | null) => (at ? at.toISOString() : '');

/** The export's columns: header and how each cell is read from a row. */
export const waitlistCsvColumns: [string, (row: ExportRow) => string][] = [
  ['email', (r) => r.email],
  ['design', (r) => r.design_name],
  ['finishes', (r) => (r.finishes.length ? r.finishes.join('; ') : 'any')],
  ['state', (r) => r.state],
  ['joined', (r) => iso(r.created_at)],
  ['confirmed', (r) => iso(r.confirmed_at)],
  ['left', (r) => iso(r.left_at)],
  ['source', (r) => r.source],
];

/** Every matching entry, in pages by id, so a list of many thousands never sits in memory at once. */
export async function* streamWaitlistEntries(query: WaitlistExportQuery, pageSize = 1000): AsyncGenerator<ExportRow[]> {
  let cursor: string | null = null;
  for (;;) {
    const page: ExportRow[] = await sql<ExportRow>(
      `SELECT e.id, e.email, d.name AS design_name, e.state, e.source, e.created_at, e.confirmed_at, e.left_at,
              ARRAY(SELECT f.name FROM finishes f WHERE f.id = ANY(e.finish_ids) ORDER BY f.position, f.name) AS finishes
         FROM waitlist_entries e JOIN designs d ON d.id = e.design_id
        WHERE ($1::uuid IS NULL OR e.design_id = $1) AND ($2::text IS NULL OR e.state = $2) AND ($3::uuid IS NULL OR e.id > $3)
        ORDER BY e.id LIMIT $4`,
      [query.design ?? null, query.state ?? null, cursor, pageSize],
    );
    if (page.length === 0) return;
    yield page;
    if (page.length < pageSize) return;
    cursor = page.at(-1)!.id;
  }
}

/** The export's filters from a query string; anything else is a 400 that names the field. */
export function parseWaitlistExportQuery(params: URLSearchParams): WaitlistExportQuery {
  const parsed = waitlistExportQuerySchema.safeParse(Object.fromEntries(params));
  if (parsed.success) return parsed.data;
  const fields: Record<string, string[]> = {};
  for (const issue of parsed.error.issues) (fields[String(issue.path[0] ?? 'query')] ??= []).push(issue.message);
  throw new AppError('invalid_query', parsed.error.issues[0]?.message ?? 'Check the filters and try again.', 400, { fields });
}
