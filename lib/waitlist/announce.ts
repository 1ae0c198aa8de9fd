import 'server-only';
import { randomBytes } from 'node:crypto';
import { render } from '@react-email/render';
import { createElement, type ReactElement } from 'react';
import type { Transaction } from 'sequelize';
import { inTransaction, sql } from '@/lib/db/sql';
import { formatInZone } from '@/lib/drops/phase';
import { jobNames, sendJob } from '@/lib/jobs/queue';
import { kickMail } from '@/lib/mail/outbox';
import { WaitlistAnnouncedEmail } from '@/emails/waitlist-announced';
import { WaitlistCorrectionEmail } from '@/emails/waitlist-correction';
import { WaitlistReminderEmail } from '@/emails/waitlist-reminder';
import { earlyAccessUrl, unsubscribePageUrl, waitlistHeaders } from './links';

// Telling a design's waitlist about a batch. One waitlist_announcements row per batch, kind and revision; a job
// walks the confirmed entries in pages and queues one outbox row per person under the key
// `waitlist:<announcementId>:<entryId>`, so a fan-out that dies part-way starts again from its cursor and an
// entry it reaches twice is queued once. The outbox then sends at the studio's rate.

export type AnnouncementKind = 'announced' | 'early_access_reminder' | 'correction';
export type CorrectionDetail = { reason: 'moved' | 'cancelled' };

const pageSize = 500;

/**
 * Records that a batch's waitlist is to hear `kind` (each kind and revision once) and queues its fan-out job.
 * Inside a transaction the job is queued after the commit, so the job never runs before its row exists; if the
 * process dies in between, the minute sweep finds the row still queued and starts it.
 * Returns the new announcement's id, or null when this kind and revision was already announced.
 */
export async function announceBatch(
  batchId: string,
  kind: AnnouncementKind,
  { revision = 1, detail = {}, transaction }: { revision?: number; detail?: Record<string, unknown>; transaction?: Transaction } = {},
): Promise<string | null> {
  const [row] = await sql<{ id: string }>(
    `INSERT INTO waitlist_announcements (batch_id, kind, revision, detail) VALUES ($1, $2, $3, $4::jsonb)
     ON CONFLICT (batch_id, kind, revision) DO NOTHING RETURNING id`,
    [batchId, kind, revision, JSON.stringify(detail)],
    transaction,
  );
  if (!row) return null;
  // Nobody on the list: the announcement is complete as it stands, and no job is needed.
  const [anyone] = await sql<{ any: boolean }>(
    `SELECT EXISTS (SELECT 1 FROM waitlist_entries e JOIN batches b ON b.design_id = e.design_id WHERE b.id = $1 AND e.state = 'confirmed') AS any`,
    [batchId],
    transaction,
  );
  if (!anyone!.any) {
    await sql(`UPDATE waitlist_announcements SET state = 'queued_all', recipients = 0, updated_at = now() WHERE id = $1`, [row.id], transaction);
    return row.id;
  }
  if (transaction) transaction.afterCommit(() => void queueFanOut(row.id));
  else await queueFanOut(row.id);
  return row.id;
}

/** The next correction's revision for a batch (1, 2, …); call inside the transaction that holds the batch's row. */
export async function nextCorrectionRevision(batchId: string, transaction: Transaction): Promise<number> {
  const [row] = await sql<{ next: number }>(
    `SELECT coalesce(max(revision), 0)::int + 1 AS next FROM waitlist_announcements WHERE batch_id = $1 AND kind = 'correction'`,
    [batchId],
    transaction,
  );
  return row!.next;
}

/** Whether the batch's waitlist has been told about it, i.e. whether a later change needs a correction. */
export async function wasAnnounced(batchId: string, transaction: Transaction): Promise<boolean> {
  const [row] = await sql<{ told: boolean }>(
    `SELECT EXISTS (SELECT 1 FROM waitlist_announcements WHERE batch_id = $1 AND kind = 'announced') AS told`,
    [batchId],
    transaction,
  );
  return row!.told;
}

/**
 * When a batch is cancelled: announcements still sending stop, and their unsent messages are failed with the
 * reason, so nobody gets an invitation to a drop that will not happen after the correction.
 */
export async function stopBatchAnnouncements(batchId: string, transaction: Transaction): Promise<void> {
  await sql(
    `UPDATE mail_outbox SET status = 'failed', last_error = 'Not sent: the batch was cancelled first.', updated_at = now()
      WHERE status = 'pending' AND announcement_id IN (SELECT id FROM waitlist_announcements WHERE batch_id = $1 AND kind <> 'correction')`,
    [batchId],
    transaction,
  );
  await sql(
    `UPDATE waitlist_announcements SET state = 'cancelled', updated_at = now() WHERE batch_id = $1 AND kind <> 'correction' AND state IN ('queued', 'fanning_out')`,
    [batchId],
    transaction,
  );
}

async function queueFanOut(announcementId: string): Promise<void> {
  try {
    await sendJob(jobNames.waitlistFanOut, { announcementId });
  } catch (error) {
    console.error('Queuing a waitlist fan-out failed; the minute sweep starts it', (error as Error).message);
  }
}

type AnnouncementRow = {
  id: string; batch_id: string; kind: AnnouncementKind; revision: number; state: string; detail: { reason?: string; cursor?: string };
  batch_name: string; batch_status: string; early_access_at: Date | null; opens_at: Date; announcement: string; design_id: string; design_name: string;
  finish_ids: string[]; finish_names: string[]; studio_name: string; postal_address: string; studio_zone: string;
};

type Rendered = { subject: string; html: string; text: string; earlyToken: string; unsubscribeToken: string };

function validZone(zone: string | null): string | null {
  if (!zone) return null;
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone: zone });
    return zone;
  } catch {
    return null;
  }
}

/** A moment for one reader: the zone's short name from Intl, then the IANA name, e.g. "Fri 15 Jan, 19:00 CET (Europe/Berlin)". */
export function labelledTime(at: Date, zone: string): string {
  return `${formatInZone(at, zone)} (${zone})`;
}

function zoneNote(zone: string, ownZone: boolean, studioName: string): string {
  return ownZone ? `Times are in your time zone, ${zone}.` : `Times are in ${studioName}’s time zone, ${zone}.`;
}

/**
 * One message of this announcement for everyone reading in `zone`, with placeholders where each person's own
 * links go. Rendering a react-email message takes milliseconds, and a waitlist can hold ten thousand people, so
 * each zone is rendered once and the personal parts (the early-access link and the unsubscribe link) are
 * substituted per recipient. The placeholders carry a random part, so no maker's text can contain them.
 */
async function renderForZone(a: AnnouncementRow, zone: string, ownZone: boolean): Promise<Rendered> {
  const nonce = randomBytes(6).toString('hex');
  const earlyToken = `__DEMOLD_EARLY_ACCESS_${nonce}__`;
  const unsubscribeToken = `__DEMOLD_UNSUBSCRIBE_${nonce}__`;
  const common = { studioName: a.studio_name, postalAddress: a.postal_address, designName: a.design_name, batchName: a.batch_name, unsubscribeUrl: unsubscribeToken };
  const note = zoneNote(zone, ownZone, a.studio_name);
  const early = a.early_access_at ? labelledTime(a.early_access_at, zone) : null;
  const opens = labelledTime(a.opens_at, zone);
  let subject: string;
  let body: ReactElement;
  if (a.kind === 'announced') {
    subject = `New batch of ${a.design_name}: ${a.batch_name}`;
    body = createElement(WaitlistAnnouncedEmail, {
      ...common, finishes: a.finish_names, earlyAccessAt: early, opensAt: opens, zoneNote: note, earlyAccessUrl: earlyToken, announcement: a.announcement,
    });
  } else if (a.kind === 'early_access_reminder') {
    subject = `Early access to ${a.design_name} is open`;
    body = createElement(WaitlistReminderEmail, { ...common, earlyAccessAt: early ?? opens, opensAt: opens, zoneNote: note, earlyAccessUrl: earlyToken });
  } else if (a.detail.reason === 'cancelled') {
    subject = `${a.batch_name} of ${a.design_name} is cancelled`;
    body = createElement(WaitlistCorrectionEmail, { ...common, change: { kind: 'cancelled' } });
  } else {
    subject = `New times for ${a.batch_name} of ${a.design_name}`;
    body = createElement(WaitlistCorrectionEmail, {
      ...common, change: { kind: 'moved', earlyAccessAt: early, opensAt: opens, zoneNote: note, earlyAccessUrl: earlyToken },
    });
  }
  const [html, text] = await Promise.all([render(body), render(body, { plainText: true })]);
  return { subject, html, text, earlyToken, unsubscribeToken };
}

const escapeHtml = (value: string) => value.replaceAll('&', '&amp;').replaceAll('"', '&quot;').replaceAll('<', '&lt;').replaceAll('>', '&gt;');

function personalise(message: Rendered, links: { early: string; unsubscribe: string }) {
  const fill = (s: string, escape: (v: string) => string) =>
    s.replaceAll(message.earlyToken, escape(links.early)).replaceAll(message.unsubscribeToken, escape(links.unsubscribe));
  return { html: fill(message.html, escapeHtml), text: fill(message.text, (v) => v) };
}

async function loadAnnouncement(announcementId: string): Promise<AnnouncementRow | null> {
  const [row] = await sql<AnnouncementRow>(
    `SELECT a.id, a.batch_id, a.kind, a.revision, a.state, a.detail, b.name AS batch_name, b.status AS batch_status, b.early_access_at, b.opens_at,
            b.announcement, d.id AS design_id, d.name AS design_name,
            ARRAY(SELECT s.finish_id FROM batch_stock s WHERE s.batch_id = b.id AND s.quantity > 0) AS finish_ids,
            ARRAY(SELECT f.name FROM batch_stock s JOIN finishes f ON f.id = s.finish_id WHERE s.batch_id = b.id AND s.quantity > 0 ORDER BY f.position, f.name) AS finish_names,
            st.name AS studio_name, st.postal_address, st.time_zone AS studio_zone
       FROM waitlist_announcements a JOIN batches b ON b.id = a.batch_id JOIN designs d ON d.id = b.design_id JOIN studios st ON st.id = d.studio_id
      WHERE a.id = $1`,
    [announcementId],
  );
  return row ?? null;
}

type Recipient = { id: string; email: string; time_zone: string | null };

/**
 * The people an announcement goes to, a page at a time after `cursor` (entry ids in order): confirmed entries of
 * the design whose finish choice (none = any) meets a finish the batch stocks, minus suppressed addresses.
 * A correction goes only to those the batch was announced to and who are still on the list.
 */
async function recipientsPage(a: AnnouncementRow, cursor: string | null): Promise<Recipient[]> {
  return sql<Recipient>(
    `SELECT e.id, e.email, e.time_zone FROM waitlist_entries e
      WHERE e.design_id = $1 AND e.state = 'confirmed' AND ($2::uuid IS NULL OR e.id > $2::uuid)
        AND (cardinality(e.finish_ids) = 0 OR e.finish_ids && $3::uuid[])
        AND NOT EXISTS (SELECT 1 FROM mail_suppressions s WHERE s.email = e.email)
        AND ($5::boolean IS FALSE OR EXISTS (
              SELECT 1 FROM mail_outbox m JOIN waitlist_announcements told ON told.id = m.announcement_id
               WHERE told.batch_id = $6 AND told.kind = 'announced' AND m.waitlist_entry_id = e.id AND m.status <> 'failed'))
      ORDER BY e.id LIMIT $4`,
    [a.design_id, cursor, a.finish_ids, pageSize, a.kind === 'correction', a.batch_id],
  );
}

/**
 * The fan-out job: queues this announcement's messages page by page, each page in one transaction with the
 * cursor, and kicks the outbox after each page so sending starts while the rest is queued.
 */
export async function fanOutAnnouncement(announcementId: string, { onPage }: { onPage?: (queued: number) => void } = {}): Promise<{ queued: number }> {
  const a = await loadAnnouncement(announcementId);
  if (!a || a.state === 'queued_all' || a.state === 'cancelled') return { queued: 0 };
  // A cancelled batch gets only its cancellation notice.
  if (a.batch_status === 'cancelled' && a.kind !== 'correction') {
    await sql(`UPDATE waitlist_announcements SET state = 'cancelled', updated_at = now() WHERE id = $1`, [a.id]);
    return { queued: 0 };
  }
  await sql(`UPDATE waitlist_announcements SET state = 'fanning_out', updated_at = now() WHERE id = $1 AND state = 'queued'`, [a.id]);
  const rendered = new Map<string, Promise<Rendered>>();
  let cursor = a.detail.cursor ?? null;
  let queued = 0;
  for (;;) {
    const page = await recipientsPage(a, cursor);
    if (page.length === 0) break;
    const rows = await Promise.all(
      page.map(async (r) => {
        const own = validZone(r.time_zone);
        const zone = own ?? a.studio_zone;
        const groupKey = `${own ? 'own' : 'studio'}:${zone}`;
        if (!rendered.has(groupKey)) rendered.set(groupKey, renderForZone(a, zone, own !== null));
        const message = await rendered.get(groupKey)!;
        const { html, text } = personalise(message, { early: earlyAccessUrl(a.batch_id, r.email), unsubscribe: unsubscribePageUrl(r.id) });
        return { key: `waitlist:${a.id}:${r.id}`, to: r.email, subject: message.subject, html, text, headers: JSON.stringify(waitlistHeaders(r.id)), entry: r.id };
      }),
    );
    cursor = page.at(-1)!.id;
    const stillGoing = await inTransaction(async (transaction) => {
      const [current] = await sql<{ state: string }>(`SELECT state FROM waitlist_announcements WHERE id = $1 FOR UPDATE`, [a.id], transaction);
      if (current?.state !== 'fanning_out') return false;
      const inserted = await sql<{ id: string }>(
        `INSERT INTO mail_outbox (dedupe_key, to_address, subject, html, text, headers, announcement_id, waitlist_entry_id)
         SELECT k, t, s, h, x, hd, $7::uuid, e FROM unnest($1::text[], $2::text[], $3::text[], $4::text[], $5::text[], $6::jsonb[], $8::uuid[]) AS r (k, t, s, h, x, hd, e)
         ON CONFLICT (dedupe_key) DO NOTHING RETURNING id`,
        [rows.map((r) => r.key), rows.map((r) => r.to), rows.map((r) => r.subject), rows.map((r) => r.html), rows.map((r) => r.text), rows.map((r) => r.headers), a.id, rows.map((r) => r.entry)],
        transaction,
      );
      queued += inserted.length;
      await sql(
        `UPDATE waitlist_announcements SET detail = detail || jsonb_build_object('cursor', $2::text), updated_at = now() WHERE id = $1`,
        [a.id, cursor],
        transaction,
      );
      return true;
    });
    if (!stillGoing) return { queued };
    onPage?.(queued);
    kickMail();
    if (page.length < pageSize) break;
  }
  await sql(
    `UPDATE waitlist_announcements SET state = 'queued_all', recipients = (SELECT count(*)::int FROM mail_outbox WHERE announcement_id = $1), updated_at = now()
      WHERE id = $1 AND state = 'fanning_out'`,
    [a.id],
  );
  return { queued };
}

/** The minute job: the early-access reminder for each batch whose early access began within the last hour. */
export async function queueDueReminders(): Promise<string[]> {
  const due = await sql<{ id: string }>(
    `SELECT b.id FROM batches b
      WHERE b.status = 'scheduled' AND b.early_access_at <= now() AND b.early_access_at > now() - interval '1 hour'
        AND NOT EXISTS (SELECT 1 FROM waitlist_announcements a WHERE a.batch_id = b.id AND a.kind = 'early_access_reminder')`,
  );
  const made: string[] = [];
  for (const batch of due) {
    const id = await announceBatch(batch.id, 'early_access_reminder');
    if (id) made.push(id);
  }
  return made;
}

/** Announcements whose fan-out never started or stopped part-way (a worker died): their ids, to queue again. */
export async function unfinishedAnnouncements(olderThanSeconds: number): Promise<string[]> {
  const rows = await sql<{ id: string }>(
    `SELECT id FROM waitlist_announcements WHERE state IN ('queued', 'fanning_out') AND updated_at <= now() - make_interval(secs => $1) ORDER BY created_at`,
    [olderThanSeconds],
  );
  return rows.map((r) => r.id);
}
