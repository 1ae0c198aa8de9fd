import 'server-only';
import { render } from '@react-email/render';
import type { ReactElement } from 'react';
import type { Transaction } from 'sequelize';
import { z } from 'zod';
import { inTransaction, sql } from '@/lib/db/sql';
import { getEnv } from '@/lib/env';
import { getMailTransport } from './transport';

export type QueuedEmail = {
  /** One message per cause: a second enqueue with the same key does nothing. */
  dedupeKey: string;
  to: string;
  subject: string;
  body: ReactElement;
  headers?: Record<string, string>;
};

/**
 * Records a rendered message in the outbox inside the caller's transaction, so the message exists if and
 * only if the change it reports was committed. Returns false when a message with this key was already queued.
 */
export async function enqueueEmail(email: QueuedEmail, transaction: Transaction): Promise<boolean> {
  const [html, text] = await Promise.all([render(email.body), render(email.body, { plainText: true })]);
  const rows = await sql<{ id: string }>(
    `INSERT INTO mail_outbox (dedupe_key, to_address, subject, html, text, headers)
     VALUES ($1, $2, $3, $4, $5, $6) ON CONFLICT (dedupe_key) DO NOTHING RETURNING id`,
    [email.dedupeKey, email.to, email.subject, html, text, JSON.stringify(email.headers ?? {})],
    transaction,
  );
  return rows.length > 0;
}

// Knobs for sending, read from the environment once. Tests shorten the back-off and the claim lease so that a
// refused or interrupted send comes round again within seconds instead of minutes.
const sendingSchema = z.object({
  MAIL_RETRY_BASE_SECONDS: z.coerce.number().min(0.1).max(3600).default(60),
  // How long a claimed message is left to its sender before another worker may take it again. It must be longer
  // than one claimed batch takes to send, or a slow batch is sent twice.
  MAIL_CLAIM_LEASE_SECONDS: z.coerce.number().min(1).max(3600).default(300),
  MAIL_SEND_CONCURRENCY: z.coerce.number().int().min(1).max(64).default(4),
});
let sending: z.infer<typeof sendingSchema> | undefined;
function sendingConfig() {
  sending ??= sendingSchema.parse(process.env);
  return sending;
}

/** Back-off between attempts for a message the SMTP server refused or did not take: 1, 2, 4 … 60 times the base. */
export function retryDelaySeconds(attempts: number, baseSeconds = sendingConfig().MAIL_RETRY_BASE_SECONDS): number {
  return Math.min(baseSeconds * 2 ** Math.max(0, attempts - 1), baseSeconds * 60);
}

const maxAttempts = 8;

type Claimed = {
  id: string; to_address: string; subject: string; html: string; text: string; headers: Record<string, string>; attempts: number; suppressed: string | null;
  /** A waitlist message whose person is no longer on the list (left, or back to pending for an announcement). */
  off_list: boolean | null;
};

// The throttle: one token bucket for the studio's sending, kept as a row of rate_limits (key, points, expire) so
// every process shares it. `points` holds thousandths of a message, `expire` the millisecond it was last filled.
// The bucket holds at most one second of sending (never less than one message) and fills at mail_per_minute.
// Taking tokens and claiming messages happen in one transaction that holds the bucket's row lock, so two workers
// can never both spend the same second.
const bucketKey = 'mail-outbox:send';

async function claimWithinRate(limit: number, leaseSeconds: number): Promise<{ claimed: Claimed[]; throttled: boolean }> {
  return inTransaction(async (transaction) => {
    const [{ rate }] = (await sql<{ rate: number }>(
      `SELECT coalesce((SELECT mail_per_minute FROM studios ORDER BY created_at LIMIT 1), 600) AS rate`,
      [],
      transaction,
    )) as [{ rate: number }];
    const capacity = Math.max(1000, Math.floor((rate * 1000) / 60));
    await sql(
      `INSERT INTO rate_limits (key, points, expire) VALUES ($1, $2, (extract(epoch FROM clock_timestamp()) * 1000)::bigint) ON CONFLICT (key) DO NOTHING`,
      [bucketKey, capacity],
      transaction,
    );
    const [bucket] = await sql<{ available: string; now_ms: string }>(
      `SELECT least($2::bigint, points + greatest(0, n.now_ms - coalesce(expire, n.now_ms)) * $3::bigint / 60)::text AS available, n.now_ms::text AS now_ms
         FROM rate_limits, (SELECT (extract(epoch FROM clock_timestamp()) * 1000)::bigint AS now_ms) n
        WHERE key = $1 FOR UPDATE OF rate_limits`,
      [bucketKey, capacity, rate],
      transaction,
    );
    const available = Number(bucket!.available);
    const allowed = Math.min(limit, Math.floor(available / 1000));
    const claimed =
      allowed > 0
        ? await sql<Claimed>(
            `UPDATE mail_outbox m SET attempts = attempts + 1, next_attempt_at = now() + make_interval(secs => $2), updated_at = now()
              WHERE id IN (SELECT id FROM mail_outbox WHERE status = 'pending' AND next_attempt_at <= now()
                            ORDER BY next_attempt_at LIMIT $1 FOR UPDATE SKIP LOCKED)
              RETURNING id, to_address, subject, html, text, headers, attempts,
                        (SELECT reason FROM mail_suppressions s WHERE s.email = lower(btrim(m.to_address))) AS suppressed,
                        (SELECT CASE WHEN m.announcement_id IS NOT NULL THEN w.state <> 'confirmed' ELSE w.state = 'left' END
                           FROM waitlist_entries w WHERE w.id = m.waitlist_entry_id) AS off_list`,
            [allowed, leaseSeconds],
            transaction,
          )
        : [];
    await sql(`UPDATE rate_limits SET points = $2, expire = $3 WHERE key = $1`, [bucketKey, available - claimed.length * 1000, bucket!.now_ms], transaction);
    return { claimed, throttled: allowed < limit };
  });
}

/** A permanent refusal for the recipient: an SMTP 5xx reply, or the server listing the address as rejected. */
function permanentRefusal(error: unknown): string | null {
  const e = error as { responseCode?: number; rejected?: unknown[]; response?: string; message?: string };
  if ((typeof e.responseCode === 'number' && e.responseCode >= 500) || (Array.isArray(e.rejected) && e.rejected.length > 0)) {
    return (e.response ?? e.message ?? 'refused').slice(0, 500);
  }
  return null;
}

/** What this process sent since it started, for the worker's log line. */
export const outboxCounters = { sent: 0, retried: 0, failed: 0, suppressed: 0 };

export type DeliveryRound = { sent: number; failed: number; retried: number; claimed: number; throttled: boolean };

/**
 * Sends what is due, within the studio's rate. Each message is claimed by pushing its next attempt past a lease
 * (so another worker skips it) before it is sent, then marked sent once (the round's sends in one statement). A crash between the two sends it again
 * after the lease: at least once, with a Message-ID fixed per message so a receiver can tell a repeat.
 * A 4xx or a failed connection comes back after a growing delay; a 5xx for the recipient fails the message and
 * suppresses the address, and nothing is ever sent to a suppressed address.
 */
export async function deliverOutbox({ limit = 50 }: { limit?: number } = {}): Promise<DeliveryRound> {
  const config = sendingConfig();
  const { claimed, throttled } = await claimWithinRate(Math.max(limit, config.MAIL_SEND_CONCURRENCY), config.MAIL_CLAIM_LEASE_SECONDS);
  const delivered: { id: string; messageId: string }[] = [];
  const round: DeliveryRound = { sent: 0, failed: 0, retried: 0, claimed: claimed.length, throttled };
  const domain = new URL(getEnv().APP_URL).hostname || 'demold.local';

  const sendOne = async (message: Claimed) => {
    // Leaving a waitlist takes effect at once: what was queued for that person before they left is not sent.
    if (message.off_list) {
      await sql(`UPDATE mail_outbox SET status = 'failed', last_error = $2, updated_at = now() WHERE id = $1 AND status = 'pending'`, [
        message.id,
        'Not sent: the person left the waitlist after this was queued.',
      ]);
      round.failed += 1;
      return;
    }
    if (message.suppressed) {
      await sql(`UPDATE mail_outbox SET status = 'failed', last_error = $2, updated_at = now() WHERE id = $1 AND status = 'pending'`, [
        message.id,
        `Not sent: the address is suppressed (${message.suppressed}).`,
      ]);
      round.failed += 1;
      outboxCounters.suppressed += 1;
      return;
    }
    try {
      const info = await getMailTransport().sendMail({
        from: getEnv().MAIL_FROM,
        to: message.to_address,
        subject: message.subject,
        html: message.html,
        text: message.text,
        headers: message.headers,
        messageId: `<${message.id}@${domain}>`,
      });
      if (info.rejected?.length) throw Object.assign(new Error(`Recipient rejected: ${String(info.response ?? '')}`), { rejected: info.rejected });
      delivered.push({ id: message.id, messageId: info.messageId });
    } catch (error) {
      const refusal = permanentRefusal(error);
      if (refusal) {
        await inTransaction(async (transaction) => {
          await sql(`UPDATE mail_outbox SET status = 'failed', last_error = $2, updated_at = now() WHERE id = $1 AND status = 'pending'`, [message.id, refusal], transaction);
          await sql(
            `INSERT INTO mail_suppressions (email, reason, detail) VALUES (lower(btrim($1)), 'bounced', $2) ON CONFLICT (email) DO NOTHING`,
            [message.to_address, refusal],
            transaction,
          );
        });
        round.failed += 1;
        outboxCounters.failed += 1;
        return;
      }
      const reason = error instanceof Error ? error.message.slice(0, 500) : String(error);
      const giveUp = message.attempts >= maxAttempts;
      await sql(
        `UPDATE mail_outbox SET status = $2, last_error = $3, next_attempt_at = now() + make_interval(secs => $4), updated_at = now() WHERE id = $1 AND status = 'pending'`,
        [message.id, giveUp ? 'failed' : 'pending', reason, retryDelaySeconds(message.attempts)],
      );
      if (giveUp) {
        round.failed += 1;
        outboxCounters.failed += 1;
      } else {
        round.retried += 1;
        outboxCounters.retried += 1;
      }
    }
  };

  // A few sends at once: one SMTP connection per message is slow on its own, and the bucket already paced the claim.
  let next = 0;
  await Promise.all(
    Array.from({ length: Math.min(config.MAIL_SEND_CONCURRENCY, claimed.length) }, async () => {
      while (next < claimed.length) await sendOne(claimed[next++]!);
    }),
  );
  // One statement marks the round's sent messages: a commit per message made each send wait for the disk. The
  // window in which a crash leaves a sent message unmarked (and so sent again, under the same Message-ID) is
  // therefore one claimed round.
  if (delivered.length > 0) {
    const marked = await sql<{ id: string }>(
      `UPDATE mail_outbox m SET status = 'sent', sent_at = now(), message_id = d.message_id, last_error = NULL, updated_at = now()
         FROM unnest($1::uuid[], $2::text[]) AS d (id, message_id) WHERE m.id = d.id AND m.status = 'pending' RETURNING m.id`,
      [delivered.map((d) => d.id), delivered.map((d) => d.messageId)],
    );
    round.sent += marked.length;
    outboxCounters.sent += marked.length;
  }
  return round;
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * Sends round after round until nothing is due before `maxMs` runs out: waits for the bucket when throttled, and
 * for the next retry or lease when that falls inside the time left. `shouldStop` ends it between rounds.
 */
export async function drainOutbox({ maxMs = 55_000, limit = 50, shouldStop = () => false }: { maxMs?: number; limit?: number; shouldStop?: () => boolean } = {}) {
  const deadline = Date.now() + maxMs;
  const total = { sent: 0, failed: 0, retried: 0 };
  while (Date.now() < deadline && !shouldStop()) {
    const round = await deliverOutbox({ limit });
    total.sent += round.sent;
    total.failed += round.failed;
    total.retried += round.retried;
    if (round.claimed > 0 && !round.throttled) continue;
    const [due] = await sql<{ wait_ms: number | null }>(
      `SELECT (extract(epoch FROM min(next_attempt_at) - now()) * 1000)::int AS wait_ms FROM mail_outbox WHERE status = 'pending'`,
    );
    const waitMs = due?.wait_ms ?? null;
    if (waitMs === null || Date.now() + waitMs > deadline) break;
    // Throttled with work due: a token comes back within a second at any rate above one a minute.
    await sleep(Math.min(1_000, Math.max(round.throttled ? 50 : 20, waitMs)));
  }
  return total;
}

const globalForDrain = globalThis as typeof globalThis & { __demoldDrain?: { running: Promise<void> | null; again: boolean; stopping: boolean } };
const drainState = () => (globalForDrain.__demoldDrain ??= { running: null, again: false, stopping: false });

/**
 * Sends what is due now, without making the caller wait; the minute sweep catches whatever this misses. One drain
 * per process at a time: a kick while one runs makes it look again once it ends.
 */
export function kickMail(): void {
  const state = drainState();
  if (state.stopping) return;
  if (state.running) {
    state.again = true;
    return;
  }
  state.running = (async () => {
    do {
      state.again = false;
      await drainOutbox({ maxMs: 30_000, shouldStop: () => state.stopping });
    } while (state.again && !state.stopping);
  })()
    .catch((error) => console.error('Sending queued mail failed; the sweep retries', (error as Error).message))
    .finally(() => {
      state.running = null;
    });
}

/** Stops this process's sending after the round in flight; resolves once that round is marked. */
export async function stopSending(): Promise<void> {
  const state = drainState();
  state.stopping = true;
  await state.running;
}

export const sendingStopped = () => drainState().stopping;
