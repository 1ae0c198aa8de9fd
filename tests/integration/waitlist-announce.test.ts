import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import type { BatchForm } from '@/lib/drops/batch-schemas';
import { startFakeMail } from '../../fake-services/mail/index.mjs';
import { withAppDatabase } from './support/app-database';
import { query } from './support/database';

// Telling a design's waitlist about a batch, in one process: who hears of it, in which zone, corrections and
// reminders once each, a bounce suppressing its address, and the throttle pacing what is sent. Messages go to
// the fake SMTP server; the fan-out and the outbox are called directly, as the worker's jobs would.
const smtpPort = 1725;
const webPort = 1780;
process.env.SMTP_URL = `smtp://127.0.0.1:${smtpPort}`;
process.env.MAIL_RETRY_BASE_SECONDS = '1';
process.env.MAIL_CLAIM_LEASE_SECONDS = '5';

const db = withAppDatabase('waitlist_announce', { seed: true });
const rows = <T extends Record<string, unknown>>(text: string, params: unknown[] = []) => query<T>(db.current().url, text, params);

type FakeMail = { service: { stop: () => unknown }; inboxUrl: string };
let mail: FakeMail;
let owner: CurrentUser;
let ibex: { id: string; oldBone: string; other: string };

type Inbox = { messageId: string; subject: string; text: string; html: string; to: { address: string }[]; headers: Record<string, string> }[];
const inbox = async (to?: string): Promise<Inbox> => (await fetch(`${mail.inboxUrl}/api/email${to ? `?to=${encodeURIComponent(to)}` : ''}`)).json() as Promise<Inbox>;
const faults = (body: object) => fetch(`${mail.inboxUrl}/_control/faults`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });

const day = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
function form(overrides: Partial<BatchForm> = {}): BatchForm {
  return {
    batchId: undefined, plannedShipBy: undefined, designId: ibex.id, name: 'Waitlist batch', announcement: 'Twelve Ibex in Old Bone.',
    perBuyerLimit: 1, holdMinutes: 10, earlyAccessAt: `${day(10)}T18:00`, opensAt: `${day(10)}T19:00`, closesAt: `${day(12)}T19:00`,
    shipBy: day(60), intent: 'schedule', quantities: { [ibex.oldBone]: 12 }, ...overrides,
  };
}

async function entry(email: string, o: { state?: string; finishes?: string[]; zone?: string | null } = {}): Promise<string> {
  const state = o.state ?? 'confirmed';
  const [row] = await rows<{ id: string }>(
    `INSERT INTO waitlist_entries (design_id, email, finish_ids, state, source, time_zone, confirmed_at, left_at)
     VALUES ($1, $2, $3::uuid[], $4, 'design_page', $5, CASE WHEN $4 = 'confirmed' THEN now() END, CASE WHEN $4 = 'left' THEN now() END) RETURNING id`,
    [ibex.id, email, o.finishes ?? [], state, o.zone ?? null],
  );
  return row!.id;
}

async function until(check: () => Promise<boolean>, what: string, timeoutMs = 30_000) {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

const outboxOf = (announcementId: string) =>
  rows<{ to_address: string; text: string; html: string; headers: Record<string, string>; status: string; waitlist_entry_id: string }>(
    `SELECT to_address, text, html, headers, status, waitlist_entry_id FROM mail_outbox WHERE announcement_id = $1 ORDER BY to_address`,
    [announcementId],
  );
const announcements = (batchId: string) =>
  rows<{ id: string; kind: string; revision: number; state: string; detail: { reason?: string } }>(
    `SELECT id, kind, revision, state, detail FROM waitlist_announcements WHERE batch_id = $1 ORDER BY created_at, revision`,
    [batchId],
  );

beforeAll(async () => {
  mail = (await startFakeMail({ smtpPort, webPort, quiet: true })) as FakeMail;
  const [user] = await rows<{ id: string; email: string }>(`SELECT id, email FROM users WHERE role = 'owner' LIMIT 1`);
  owner = { id: user!.id, email: user!.email, name: 'Owner', role: 'owner' };
  const [design] = await rows<{ id: string }>(`SELECT id FROM designs WHERE slug = 'ibex'`);
  const finishes = await rows<{ id: string; slug: string }>(`SELECT id, slug FROM finishes WHERE design_id = $1 ORDER BY position`, [design!.id]);
  // Only this file's people on the Ibex list (the demo seed brings a few of its own).
  await rows(`DELETE FROM waitlist_entries WHERE design_id = $1`, [design!.id]);
  ibex = { id: design!.id, oldBone: finishes.find((f) => f.slug === 'old-bone')!.id, other: finishes.find((f) => f.slug !== 'old-bone')!.id };
});

afterAll(async () => {
  const { stopJobs } = await import('@/lib/jobs/queue');
  await stopJobs();
  await mail?.service.stop();
});

describe('announcing a batch', () => {
  let batchId = '';
  let announced = '';
  const ids: Record<string, string> = {};

  it('reaches confirmed entries whose finish choice the batch stocks, never pending, left or suppressed ones', async () => {
    ids.any = await entry('any-finish@example.com');
    ids.oldBone = await entry('old-bone@example.com', { finishes: [ibex.oldBone] });
    ids.otherOnly = await entry('other-only@example.com', { finishes: [ibex.other] });
    ids.both = await entry('both@example.com', { finishes: [ibex.other, ibex.oldBone] });
    await entry('pending@example.com', { state: 'pending' });
    await entry('left@example.com', { state: 'left' });
    await entry('suppressed@example.com');
    await rows(`INSERT INTO mail_suppressions (email, reason) VALUES ('suppressed@example.com', 'complained')`);
    ids.newYork = await entry('new-york@example.com', { zone: 'America/New_York' });
    ids.nonsense = await entry('no-such-zone@example.com', { zone: 'Mars/Olympus_Mons' });

    const { saveBatch } = await import('@/lib/drops/batches');
    batchId = (await saveBatch(owner, form())).batchId;
    const made = await announcements(batchId);
    expect(made.map((a) => [a.kind, a.revision])).toEqual([['announced', 1]]);
    announced = made[0]!.id;

    const { fanOutAnnouncement } = await import('@/lib/waitlist/announce');
    await fanOutAnnouncement(announced);
    // Run again, as a restarted worker would: nothing is queued twice.
    await fanOutAnnouncement(announced);
    const queued = await outboxOf(announced);
    expect(queued.map((m) => m.to_address)).toEqual(['any-finish@example.com', 'both@example.com', 'new-york@example.com', 'no-such-zone@example.com', 'old-bone@example.com']);
    const [state] = await rows<{ state: string; recipients: number }>(`SELECT state, recipients FROM waitlist_announcements WHERE id = $1`, [announced]);
    expect(state).toEqual({ state: 'queued_all', recipients: 5 });
  });

  it('gives each message its own links and the one-click unsubscribe headers', async () => {
    const { earlyAccessUrl, unsubscribePageUrl, waitlistHeaders } = await import('@/lib/waitlist/links');
    for (const message of await outboxOf(announced)) {
      expect(message.text).toContain(earlyAccessUrl(batchId, message.to_address));
      expect(message.text).toContain(unsubscribePageUrl(message.waitlist_entry_id));
      expect(message.html).toContain(earlyAccessUrl(batchId, message.to_address));
      expect(message.text).not.toMatch(/__DEMOLD_/);
      // RFC 8058 §3.1: List-Unsubscribe with an https (here http, local) URI plus List-Unsubscribe-Post: List-Unsubscribe=One-Click.
      expect(message.headers).toEqual(waitlistHeaders(message.waitlist_entry_id));
      expect(message.headers['List-Unsubscribe-Post']).toBe('List-Unsubscribe=One-Click');
    }
  });

  it('says the times in the reader’s zone where known, else in the studio’s, naming the zone', async () => {
    const [batch] = await rows<{ opens_at: Date; early_access_at: Date }>(`SELECT opens_at, early_access_at FROM batches WHERE id = $1`, [batchId]);
    const { labelledTime } = await import('@/lib/waitlist/announce');
    const byAddress = Object.fromEntries((await outboxOf(announced)).map((m) => [m.to_address, m.text]));
    const newYork = byAddress['new-york@example.com']!;
    expect(newYork).toContain(labelledTime(batch!.opens_at, 'America/New_York'));
    expect(newYork).toContain('your time zone, America/New_York');
    // The zone names come from Intl's IANA data: 19:00 in Dublin is 14:00 (or 15:00 near a clock change) in New York.
    expect(newYork).toMatch(/\b1[45]:00\b/);
    for (const address of ['any-finish@example.com', 'no-such-zone@example.com']) {
      expect(byAddress[address]).toContain(labelledTime(batch!.opens_at, 'Europe/Dublin'));
      expect(byAddress[address]).toContain('Marrowgate Studio’s time zone, Europe/Dublin');
      expect(byAddress[address]).toContain(labelledTime(batch!.early_access_at, 'Europe/Dublin'));
    }
  });

  it('sends a correction once per change of times, and a cancellation to those it told', async () => {
    const { saveBatch, cancelBatch } = await import('@/lib/drops/batches');
    const { fanOutAnnouncement, labelledTime } = await import('@/lib/waitlist/announce');
    await saveBatch(owner, form({ batchId, name: 'Waitlist batch (renamed)' }));
    expect((await announcements(batchId)).filter((a) => a.kind === 'correction')).toEqual([]);
    await saveBatch(owner, form({ batchId, earlyAccessAt: `${day(11)}T18:00`, opensAt: `${day(11)}T19:00` }));
    await saveBatch(owner, form({ batchId, earlyAccessAt: `${day(11)}T18:00`, opensAt: `${day(11)}T19:00` }));
    const corrections = (await announcements(batchId)).filter((a) => a.kind === 'correction');
    expect(corrections.map((a) => [a.revision, a.detail.reason])).toEqual([[1, 'moved']]);
    await fanOutAnnouncement(corrections[0]!.id);
    const moved = await outboxOf(corrections[0]!.id);
    expect(moved.map((m) => m.to_address)).toEqual((await outboxOf(announced)).map((m) => m.to_address));
    const [batch] = await rows<{ opens_at: Date }>(`SELECT opens_at FROM batches WHERE id = $1`, [batchId]);
    expect(moved.find((m) => m.to_address === 'new-york@example.com')!.text).toContain(labelledTime(batch!.opens_at, 'America/New_York'));

    // Someone who joins after the announcement was not told of the batch, so hears of no cancellation either.
    await entry('late-joiner@example.com');
    await until(async () => (await outboxOf(announced)).every((m) => m.status === 'sent'), 'the announcement to be sent');
    await cancelBatch(owner, batchId);
    const cancelled = (await announcements(batchId)).filter((a) => a.kind === 'correction');
    expect(cancelled.map((a) => [a.revision, a.detail.reason])).toEqual([[1, 'moved'], [2, 'cancelled']]);
    await fanOutAnnouncement(cancelled[1]!.id);
    const notices = await outboxOf(cancelled[1]!.id);
    expect(notices.map((m) => m.to_address)).not.toContain('late-joiner@example.com');
    expect(notices).toHaveLength(5);
    expect(notices[0]!.text).toContain('cancelled');
    // Invitations not yet sent when the batch was cancelled are never sent.
    const leftover = await rows(`SELECT 1 FROM mail_outbox WHERE announcement_id = $1 AND status = 'pending'`, [announced]);
    expect(leftover).toEqual([]);
  });
});

describe('the early-access reminder', () => {
  it('is queued once for a batch whose early access began within the hour', async () => {
    const { saveBatch } = await import('@/lib/drops/batches');
    const { queueDueReminders, fanOutAnnouncement } = await import('@/lib/waitlist/announce');
    const { batchId } = await saveBatch(owner, form({ name: 'Reminder batch' }));
    await queueDueReminders();
    expect((await announcements(batchId)).map((a) => a.kind)).toEqual(['announced']);
    // Early access began ten minutes ago (the save refuses past times, so the clock is moved in the row).
    await rows(`UPDATE batches SET early_access_at = now() - interval '10 minutes', opens_at = now() + interval '50 minutes' WHERE id = $1`, [batchId]);
    const first = await queueDueReminders();
    const second = await queueDueReminders();
    const reminders = (await announcements(batchId)).filter((a) => a.kind === 'early_access_reminder');
    expect(reminders).toHaveLength(1);
    expect(first).toContain(reminders[0]!.id);
    expect(second).not.toContain(reminders[0]!.id);
    await fanOutAnnouncement(reminders[0]!.id);
    const sent = await outboxOf(reminders[0]!.id);
    expect(sent.length).toBeGreaterThan(0);
    expect(sent[0]!.text).toContain('Early access');
  });
});

describe('sending', () => {
  async function queueDirect(addresses: string[], tag: string): Promise<void> {
    for (const [i, to] of addresses.entries()) {
      await rows(`INSERT INTO mail_outbox (dedupe_key, to_address, subject, html, text) VALUES ($1, $2, 'Test', '<p>t</p>', 't')`, [`test:${tag}:${i}`, to]);
    }
  }

  it('fails a message the server refuses for good, suppresses the address, and never retries it', async () => {
    const { drainOutbox } = await import('@/lib/mail/outbox');
    await until(async () => (await rows(`SELECT 1 FROM mail_outbox WHERE status = 'pending'`)).length === 0, 'earlier mail to go');
    await faults({ bounce: ['gone@example.com'] });
    await queueDirect(['gone@example.com', 'here@example.com'], 'bounce');
    await drainOutbox({ maxMs: 10_000 });
    await faults({});
    const [gone] = await rows<{ status: string; attempts: number; last_error: string }>(`SELECT status, attempts, last_error FROM mail_outbox WHERE dedupe_key = 'test:bounce:0'`);
    expect(gone).toMatchObject({ status: 'failed', attempts: 1 });
    expect(gone!.last_error).toMatch(/550/);
    const [suppressed] = await rows<{ reason: string }>(`SELECT reason FROM mail_suppressions WHERE email = 'gone@example.com'`);
    expect(suppressed).toEqual({ reason: 'bounced' });
    expect((await rows<{ status: string }>(`SELECT status FROM mail_outbox WHERE dedupe_key = 'test:bounce:1'`))[0]!.status).toBe('sent');

    // A later message to the address is failed with the reason, without reaching the server.
    await queueDirect(['gone@example.com'], 'bounce-again');
    await drainOutbox({ maxMs: 10_000 });
    const [again] = await rows<{ status: string; last_error: string }>(`SELECT status, last_error FROM mail_outbox WHERE dedupe_key = 'test:bounce-again:0'`);
    expect(again!.status).toBe('failed');
    expect(again!.last_error).toMatch(/suppressed/);
    expect(await inbox('gone@example.com')).toEqual([]);
  });

  it('does not send what was queued for someone who left the list before it went out', async () => {
    const { drainOutbox } = await import('@/lib/mail/outbox');
    await until(async () => (await rows(`SELECT 1 FROM mail_outbox WHERE status = 'pending'`)).length === 0, 'earlier mail to go');
    const stays = await entry('stays@example.com');
    const goes = await entry('goes@example.com');
    const [batch] = await rows<{ id: string }>(`SELECT id FROM batches ORDER BY created_at LIMIT 1`);
    const [a] = await rows<{ id: string }>(
      `INSERT INTO waitlist_announcements (batch_id, kind, revision) VALUES ($1, 'announced', 99) RETURNING id`,
      [batch!.id],
    );
    for (const [to, id] of [['stays@example.com', stays], ['goes@example.com', goes]] as const) {
      await rows(
        `INSERT INTO mail_outbox (dedupe_key, to_address, subject, html, text, announcement_id, waitlist_entry_id)
         VALUES ($1, $2, 'Announced', '<p>a</p>', 'a', $3, $4)`,
        [`test:left:${to}`, to, a!.id, id],
      );
    }
    // Leaving happens between the fan-out and the send.
    await rows(`UPDATE waitlist_entries SET state = 'left', left_at = now() WHERE id = $1`, [goes]);
    await drainOutbox({ maxMs: 10_000 });
    const sent = await rows<{ to_address: string; status: string; last_error: string | null }>(
      `SELECT to_address, status, last_error FROM mail_outbox WHERE announcement_id = $1 ORDER BY to_address`,
      [a!.id],
    );
    expect(sent).toEqual([
      { to_address: 'goes@example.com', status: 'failed', last_error: expect.stringMatching(/left the waitlist/) },
      { to_address: 'stays@example.com', status: 'sent', last_error: null },
    ]);
    expect(await inbox('goes@example.com')).toEqual([]);
  });

  it('keeps to the studio’s rate across senders', async () => {
    const { drainOutbox } = await import('@/lib/mail/outbox');
    const perMinute = 120;
    await rows(`UPDATE studios SET mail_per_minute = $1`, [perMinute]);
    // Start from an empty bucket, so the first second's burst does not blur the measurement.
    await rows(`UPDATE rate_limits SET points = 0, expire = (extract(epoch FROM clock_timestamp()) * 1000)::bigint WHERE key = 'mail-outbox:send'`);
    const n = 12;
    await queueDirect(Array.from({ length: n }, (_, i) => `paced-${i}@example.com`), 'paced');
    await Promise.all([drainOutbox({ maxMs: 20_000, limit: 5 }), drainOutbox({ maxMs: 20_000, limit: 5 })]);
    const sent = await rows<{ ms: number }>(
      `SELECT (extract(epoch FROM sent_at) * 1000)::float8 AS ms FROM mail_outbox WHERE dedupe_key LIKE 'test:paced:%' AND status = 'sent' ORDER BY sent_at`,
    );
    expect(sent).toHaveLength(n);
    const perSecond = perMinute / 60;
    const spanSeconds = (sent.at(-1)!.ms - sent[0]!.ms) / 1000;
    const measured = (n - 1) / spanSeconds;
    console.log(`throttle: ${n} messages at ${perMinute}/min took ${spanSeconds.toFixed(2)} s between first and last: ${measured.toFixed(2)} per second (limit ${perSecond})`);
    // A bucket that holds one second of sending can let through at most rate + one second's worth in any second.
    expect(measured).toBeLessThanOrEqual(perSecond * 1.2);
    for (const first of sent) {
      expect(sent.filter((s) => s.ms >= first.ms && s.ms < first.ms + 1000).length).toBeLessThanOrEqual(2 * perSecond);
    }
    await rows(`UPDATE studios SET mail_per_minute = 600`);
  });
});
