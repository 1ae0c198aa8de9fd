import 'server-only';
import { createHash, randomBytes } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { WaitlistConfirmEmail } from '@/emails/waitlist-confirm';
import { AppError } from '@/lib/api/errors';
import { consumeAllowance } from '@/lib/api/rate-limit';
import type { CurrentUser } from '@/lib/auth/session';
import { inTransaction, sql } from '@/lib/db/sql';
import { enqueueEmail, kickMail } from '@/lib/mail/outbox';
import { loadStudioSettings, type StudioSettings } from '@/lib/settings/studio';
import { confirmUrl, waitlistHeaders } from './links';
import type { WaitlistSource, WaitlistState } from './schemas';

// Our own choice: a person joins a few designs in a few tries; a script that sprays addresses from one
// network, or one address from many networks, is stopped within a minute or an hour.
export const WAITLIST_LIMITS = {
  perIp: { points: 20, duration: 60 },
  perAddress: { points: 10, duration: 60 * 60 },
} as const;
/** How long a confirmation link works. */
export const CONFIRM_HOURS = 72;
/** The least time between two confirmation e-mails to one entry, however often it is asked for. */
export const RESEND_GAP_MINUTES = 10;

export type JoinInput = {
  /** Ignored when `user` is given: a signed-in buyer joins with their own address. */
  email?: string;
  user?: CurrentUser | null;
  designIds: string[];
  finishIds?: string[];
  timeZone?: string;
  source: WaitlistSource;
  ip: string;
};

/** What the caller is told per design. `already_confirmed` is only ever told to the address's signed-in owner. */
export type JoinOutcome = 'confirmation_sent' | 'confirmation_already_sent' | 'already_confirmed';
export type JoinResult = {
  email: string;
  results: { designId: string; designName: string; outcome: JoinOutcome; message: string }[];
};

type EntryRow = {
  id: string; state: WaitlistState; confirm_sent_at: Date | null; confirm_expires_at: Date | null;
};

export const hashNonce = (nonce: string) => createHash('sha256').update(nonce).digest('hex');

type Design = { id: string; name: string };
type Finish = { id: string; design_id: string; name: string };

/**
 * Gives a pending entry a new one-time link (only its hash is kept) and queues the e-mail that carries it,
 * in the caller's transaction. Addresses the mail server refused for good get no e-mail, but the same answer.
 */
export async function issueConfirmation(
  entry: { id: string; email: string; designName: string; finishNames: string[] },
  studio: StudioSettings | null,
  transaction: Transaction,
): Promise<boolean> {
  const nonce = randomBytes(32).toString('base64url');
  await sql(
    `UPDATE waitlist_entries SET confirm_token_hash = $2, confirm_sent_at = now(),
            confirm_expires_at = now() + make_interval(hours => $3), updated_at = now() WHERE id = $1`,
    [entry.id, hashNonce(nonce), CONFIRM_HOURS],
    transaction,
  );
  const [suppressed] = await sql<{ reason: string }>(`SELECT reason FROM mail_suppressions WHERE email = $1`, [entry.email], transaction);
  if (suppressed) return false;
  const dedupeKey = `waitlist-confirm:${entry.id}:${nonce}`;
  const queued = await enqueueEmail(
    {
      dedupeKey,
      to: entry.email,
      subject: `Please confirm: the ${entry.designName} waitlist at ${studio?.name ?? 'Demold'}`,
      body: WaitlistConfirmEmail({
        studioName: studio?.name ?? 'Demold',
        postalAddress: studio?.postalAddress ?? '',
        designName: entry.designName,
        finishNames: entry.finishNames,
        confirmUrl: confirmUrl(entry.id, nonce),
        hoursValid: CONFIRM_HOURS,
      }),
      headers: waitlistHeaders(entry.id),
    },
    transaction,
  );
  // The outbox keeps which entry a message was for, so a left entry's mail can be told apart.
  await sql(`UPDATE mail_outbox SET waitlist_entry_id = $1 WHERE dedupe_key = $2`, [entry.id, dedupeKey], transaction);
  return queued;
}

type Internal = 'sent' | 'already_sent' | 'confirmed';

async function joinOne(
  input: { email: string; userId: string | null; design: Design; finishes: Finish[]; timeZone: string | null; source: WaitlistSource; owner: boolean },
  studio: StudioSettings | null,
): Promise<{ outcome: Internal; queued: boolean }> {
  const finishIds = input.finishes.map((f) => f.id);
  const mail = { email: input.email, designName: input.design.name, finishNames: input.finishes.map((f) => f.name) };
  return inTransaction(async (tx) => {
    const [created] = await sql<{ id: string }>(
      `INSERT INTO waitlist_entries (design_id, email, user_id, finish_ids, source, time_zone)
       VALUES ($1, $2, $3, $4::uuid[], $5, $6) ON CONFLICT (design_id, email) DO NOTHING RETURNING id`,
      [input.design.id, input.email, input.userId, finishIds, input.source, input.timeZone],
      tx,
    );
    if (created) return { outcome: 'sent', queued: await issueConfirmation({ id: created.id, ...mail }, studio, tx) };

    const [entry] = await sql<EntryRow>(
      `SELECT id, state, confirm_sent_at, confirm_expires_at FROM waitlist_entries WHERE design_id = $1 AND email = $2 FOR UPDATE`,
      [input.design.id, input.email],
      tx,
    );
    if (!entry) throw new Error('waitlist entry vanished inside its transaction');

    if (entry.state === 'confirmed') {
      // Only the address's owner may change what they wait for; a stranger's form changes nothing.
      if (input.owner) {
        await sql(
          `UPDATE waitlist_entries SET finish_ids = $2::uuid[], time_zone = coalesce($3, time_zone), user_id = coalesce(user_id, $4), updated_at = now() WHERE id = $1`,
          [entry.id, finishIds, input.timeZone, input.userId],
          tx,
        );
      }
      return { outcome: 'confirmed', queued: false };
    }

    const now = Date.now();
    if (entry.state === 'pending') {
      const stillValid = entry.confirm_expires_at !== null && entry.confirm_expires_at.getTime() > now;
      const sentRecently = entry.confirm_sent_at !== null && now - entry.confirm_sent_at.getTime() < RESEND_GAP_MINUTES * 60_000;
      if (stillValid || sentRecently) return { outcome: 'already_sent', queued: false };
    }

    // Left earlier, or pending with a dead link: pending again, with what was asked for now, and a new link.
    await sql(
      `UPDATE waitlist_entries SET state = 'pending', left_at = NULL, confirmed_at = NULL, finish_ids = $2::uuid[], source = $3,
              time_zone = coalesce($4, time_zone), user_id = coalesce(user_id, $5), updated_at = now() WHERE id = $1`,
      [entry.id, finishIds, input.source, input.timeZone, input.userId],
      tx,
    );
    return { outcome: 'sent', queued: await issueConfirmation({ id: entry.id, ...mail }, studio, tx) };
  });
}

function describe(outcome: Internal, owner: boolean, designName: string, email: string): { outcome: JoinOutcome; message: string } {
  if (outcome === 'already_sent') {
    return {
      outcome: 'confirmation_already_sent',
      message: `We sent you a confirmation for ${designName} already. Check your inbox (and spam folder) at ${email} and use its link.`,
    };
  }
  if (outcome === 'confirmed' && owner) return { outcome: 'already_confirmed', message: `You are already on the waitlist for ${designName}.` };
  // A stranger typing someone's address learns nothing from the answer: a confirmed entry reads as a new one.
  return { outcome: 'confirmation_sent', message: `Check your inbox to confirm: we sent a link for ${designName} to ${email}.` };
}

/** Joins one address to the waitlists of 1–10 designs, each in its own transaction; see the module comment. */
export async function joinWaitlist(input: JoinInput): Promise<JoinResult> {
  const email = input.user?.email ?? input.email;
  if (!email) throw new AppError('email_missing', 'Enter your e-mail address.', 400, { fields: { email: ['Enter your e-mail address.'] } });
  const owner = Boolean(input.user && input.user.email === email);

  await consumeAllowance('waitlist-join-ip', WAITLIST_LIMITS.perIp, input.ip, 'Too many waitlist sign-ups came from your network in the last minute.');
  await consumeAllowance(
    'waitlist-join-address',
    WAITLIST_LIMITS.perAddress,
    email,
    'This address has joined waitlists many times in the last hour. Check your inbox for the confirmations already sent.',
  );

  const designIds = [...new Set(input.designIds)];
  const designs = await sql<Design>(`SELECT id, name FROM designs WHERE id = ANY($1::uuid[]) AND status = 'published'`, [designIds]);
  if (designs.length !== designIds.length) {
    throw new AppError('design_not_found', 'One of the designs you chose is no longer offered. Reload the page and choose again.', 404, {
      fields: { designIds: ['One of these designs is no longer offered.'] },
    });
  }
  const finishIds = [...new Set(input.finishIds ?? [])];
  const finishes = finishIds.length
    ? await sql<Finish>(`SELECT id, design_id, name FROM finishes WHERE id = ANY($1::uuid[]) AND status = 'published' ORDER BY position`, [finishIds])
    : [];
  if (finishes.length !== finishIds.length || finishes.some((f) => !designIds.includes(f.design_id))) {
    throw new AppError('finish_not_offered', 'A finish you chose is not offered for the designs you picked. Untick it or reload the page.', 422, {
      fields: { finishIds: ['Choose only finishes of the designs you picked.'] },
    });
  }

  const studio = await loadStudioSettings();
  // Linking a stranger-typed address to its account waits for the confirmation; the signed-in owner is linked now.
  const userId = owner ? input.user!.id : null;
  const ordered = designIds.map((id) => designs.find((d) => d.id === id)!);
  const results: JoinResult['results'] = [];
  let queued = false;
  for (const design of ordered) {
    const done = await joinOne(
      { email, userId, design, finishes: finishes.filter((f) => f.design_id === design.id), timeZone: input.timeZone ?? null, source: input.source, owner },
      studio,
    );
    queued ||= done.queued;
    results.push({ designId: design.id, designName: design.name, ...describe(done.outcome, owner, design.name, email) });
  }
  if (queued) kickMail();
  return { email, results };
}
