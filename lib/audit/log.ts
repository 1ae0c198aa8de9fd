import 'server-only';
import type { Transaction } from 'sequelize';
import { z } from 'zod';
import { sql } from '@/lib/db/sql';

/** Who did it: a signed-in person (their name or address is kept with the entry), or the system itself. */
export type AuditActor = { id: string; name: string | null; email: string } | 'system';

export type AuditEntry = {
  actor: AuditActor;
  /** `subject.verb`, e.g. `order.refunded`, `person.role_changed`, `batch.saved`. */
  action: string;
  subject: { type: string; id: string };
  /** One line a person reads in the log. */
  summary: string;
  before?: unknown;
  after?: unknown;
};

export const systemActorLabel = 'Demold (automatic)';

// Kept with the entry, so it still says who it was after their account is deleted.
const actorLabel = (actor: AuditActor) => (actor === 'system' ? systemActorLabel : actor.name?.trim() || actor.email);

/** At most `max` characters, counted as PostgreSQL counts them (code points, never half a pair). */
const clip = (text: string, max: number) => Array.from(text).slice(0, max).join('');

const asJson = (value: unknown) => (value === undefined || value === null ? null : JSON.stringify(value));

/**
 * Adds one entry to the audit log, in the caller's transaction: the entry is written if and only if the
 * change it describes is. Call it inside the same transaction as the change.
 */
export async function writeAudit(entry: AuditEntry, transaction: Transaction): Promise<void> {
  await sql(
    `INSERT INTO audit_log (actor_user_id, actor_label, action, subject_type, subject_id, summary, before, after)
     VALUES ($1, $2, $3, $4, $5, $6, $7::jsonb, $8::jsonb)`,
    [
      entry.actor === 'system' ? null : entry.actor.id,
      clip(actorLabel(entry.actor), 200),
      entry.action,
      entry.subject.type,
      entry.subject.id,
      clip(entry.summary, 500),
      asJson(entry.before),
      asJson(entry.after),
    ],
    transaction,
  );
}

/** The log page's query string: `?before=<id>` pages on to older entries. */
export const auditPageSchema = z.object({
  before: z
    .string({ error: 'That page of the log does not exist.' })
    .regex(/^[1-9]\d{0,17}$/, 'That page of the log does not exist. Start again from the newest entries.')
    .optional(),
});

export type AuditRow = {
  id: string;
  /** Null for the system, and for a person whose account has since been deleted. */
  actorUserId: string | null;
  actorLabel: string;
  action: string;
  subjectType: string;
  subjectId: string;
  summary: string;
  before: unknown;
  after: unknown;
  createdAt: string;
};

export type AuditPage = { entries: AuditRow[]; olderBefore: string | null };

/** The newest entries first, `limit` at a time, older than the entry id `before` when paging on. */
export async function listAudit({
  limit = 50,
  before,
  subject,
}: { limit?: number; before?: string; subject?: { type: string; id: string } } = {}): Promise<AuditPage> {
  const size = Math.min(Math.max(Math.trunc(limit), 1), 200);
  const rows = await sql<{
    id: string;
    actor_user_id: string | null;
    actor_label: string;
    action: string;
    subject_type: string;
    subject_id: string;
    summary: string;
    before: unknown;
    after: unknown;
    created_at: Date;
  }>(
    `SELECT id::text, actor_user_id, actor_label, action, subject_type, subject_id, summary, before, after, created_at
       FROM audit_log
      WHERE ($1::bigint IS NULL OR id < $1::bigint)
        AND ($2::text IS NULL OR (subject_type = $2 AND subject_id = $3))
      ORDER BY audit_log.id DESC
      LIMIT $4`,
    // The table's id, not the text column of the same name (which would sort "10" before "9").
    // One more than shown tells whether there is an older page.
    [before ?? null, subject?.type ?? null, subject?.id ?? null, size + 1],
  );
  const entries = rows.slice(0, size).map((row) => ({
    id: row.id,
    actorUserId: row.actor_user_id,
    actorLabel: row.actor_label,
    action: row.action,
    subjectType: row.subject_type,
    subjectId: row.subject_id,
    summary: row.summary,
    before: row.before,
    after: row.after,
    createdAt: new Date(row.created_at).toISOString(),
  }));
  return { entries, olderBefore: rows.length > size ? entries.at(-1)!.id : null };
}
