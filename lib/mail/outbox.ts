import 'server-only';
import { render } from '@react-email/render';
import type { ReactElement } from 'react';
import type { Transaction } from 'sequelize';
import { sql } from '@/lib/db/sql';
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

/** Back-off between attempts for a message the SMTP server refused or did not take: 1, 2, 4 … 60 minutes. */
export function retryDelaySeconds(attempts: number): number {
  return Math.min(60 * 2 ** Math.max(0, attempts - 1), 3600);
}

const maxAttempts = 8;

type Claimed = { id: string; to_address: string; subject: string; html: string; text: string; headers: Record<string, string>; attempts: number };

/**
 * Sends what is due. Each message is claimed by pushing its next attempt into the future (so another
 * worker skips it) before it is sent, then marked sent. A crash between the two sends it again on the
 * next run: at least once, with a Message-ID fixed per message so a receiver can tell a repeat.
 */
export async function deliverOutbox({ limit = 50 }: { limit?: number } = {}): Promise<{ sent: number; failed: number }> {
  const claimed = await sql<Claimed>(
    `UPDATE mail_outbox SET attempts = attempts + 1, next_attempt_at = now() + interval '5 minutes', updated_at = now()
      WHERE id IN (SELECT id FROM mail_outbox WHERE status = 'pending' AND next_attempt_at <= now()
                    ORDER BY next_attempt_at LIMIT $1 FOR UPDATE SKIP LOCKED)
      RETURNING id, to_address, subject, html, text, headers, attempts`,
    [limit],
  );
  let sent = 0;
  let failed = 0;
  const domain = new URL(getEnv().APP_URL).hostname || 'demold.local';
  for (const message of claimed) {
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
      await sql(`UPDATE mail_outbox SET status = 'sent', sent_at = now(), message_id = $2, last_error = NULL, updated_at = now() WHERE id = $1`, [
        message.id,
        info.messageId,
      ]);
      sent += 1;
    } catch (error) {
      failed += 1;
      const reason = error instanceof Error ? error.message.slice(0, 500) : String(error);
      const giveUp = message.attempts >= maxAttempts;
      await sql(
        `UPDATE mail_outbox SET status = $2, last_error = $3, next_attempt_at = now() + make_interval(secs => $4), updated_at = now() WHERE id = $1`,
        [message.id, giveUp ? 'failed' : 'pending', reason, retryDelaySeconds(message.attempts)],
      );
    }
  }
  return { sent, failed };
}

/** Sends what is due now, without making the caller wait; the minute sweep catches whatever this misses. */
export function kickMail(): void {
  deliverOutbox().catch((error) => console.error('Sending queued mail failed; the sweep retries', (error as Error).message));
}
