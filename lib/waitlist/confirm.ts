import 'server-only';
import { timingSafeEqual } from 'node:crypto';
import { AppError } from '@/lib/api/errors';
import { consumeAllowance } from '@/lib/api/rate-limit';
import { inTransaction, sql } from '@/lib/db/sql';
import { kickMail } from '@/lib/mail/outbox';
import { loadStudioSettings } from '@/lib/settings/studio';
import { RESEND_GAP_MINUTES, WAITLIST_LIMITS, hashNonce, issueConfirmation } from './join';
import type { WaitlistState } from './schemas';
import { readToken } from './tokens';

/**
 * What a confirmation link can find:
 * - damaged: tampered with, cut short, or made for another purpose; unknown: its entry is gone;
 * - ready: pending and this is its current, unexpired link; confirmed: it was just used;
 * - expired / superseded: pending, but the link is past its time or a newer one was sent (a fresh one may be asked for);
 * - already_confirmed: used before; left: the entry was left, and an old link never puts it back.
 */
export type ConfirmOutcome = 'damaged' | 'unknown' | 'ready' | 'confirmed' | 'expired' | 'superseded' | 'already_confirmed' | 'left';
export type ConfirmLinkView = { outcome: ConfirmOutcome; designName?: string; designSlug?: string; email?: string };

type Entry = {
  id: string; email: string; state: WaitlistState; confirm_token_hash: string | null; confirm_expires_at: Date | null;
  design_name: string; design_slug: string;
};

const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function readConfirmToken(token: string | null | undefined): { entryId: string; nonce: string } | null {
  const payload = readToken('waitlist-confirm', token);
  if (!payload || typeof payload.e !== 'string' || !uuid.test(payload.e) || typeof payload.n !== 'string' || payload.n.length === 0) return null;
  return { entryId: payload.e, nonce: payload.n };
}

function sameHash(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

function judge(entry: Entry, nonce: string, now: number): ConfirmOutcome {
  if (entry.state === 'confirmed') return 'already_confirmed';
  if (entry.state === 'left') return 'left';
  if (!entry.confirm_token_hash || !sameHash(entry.confirm_token_hash, hashNonce(nonce))) return 'superseded';
  if (!entry.confirm_expires_at || entry.confirm_expires_at.getTime() <= now) return 'expired';
  return 'ready';
}

const entrySelect = `SELECT e.id, e.email, e.state, e.confirm_token_hash, e.confirm_expires_at, d.name AS design_name, d.slug AS design_slug
                       FROM waitlist_entries e JOIN designs d ON d.id = e.design_id WHERE e.id = $1`;

function view(outcome: ConfirmOutcome, entry?: Entry): ConfirmLinkView {
  return entry ? { outcome, designName: entry.design_name, designSlug: entry.design_slug, email: entry.email } : { outcome };
}

/** Reads a link without using it: the page shows what it would do before the buyer presses the button. */
export async function checkConfirmLink(token: string | null | undefined): Promise<ConfirmLinkView> {
  const read = readConfirmToken(token);
  if (!read) return { outcome: 'damaged' };
  const [entry] = await sql<Entry>(entrySelect, [read.entryId]);
  if (!entry) return { outcome: 'unknown' };
  return view(judge(entry, read.nonce, Date.now()), entry);
}

/**
 * Uses a confirmation link: a pending entry with this current, unexpired link becomes confirmed (the hash is
 * cleared so the link is spent) and is linked to the account that owns the address, if there is one.
 */
export async function confirmWaitlist(token: string | null | undefined): Promise<ConfirmLinkView> {
  const read = readConfirmToken(token);
  if (!read) return { outcome: 'damaged' };
  return inTransaction(async (tx) => {
    const [entry] = await sql<Entry>(`${entrySelect} FOR UPDATE OF e`, [read.entryId], tx);
    if (!entry) return { outcome: 'unknown' };
    const outcome = judge(entry, read.nonce, Date.now());
    if (outcome !== 'ready') return view(outcome, entry);
    await sql(
      `UPDATE waitlist_entries SET state = 'confirmed', confirmed_at = now(), confirm_token_hash = NULL, confirm_expires_at = NULL,
              user_id = coalesce(user_id, (SELECT id FROM users WHERE email = waitlist_entries.email)), updated_at = now()
        WHERE id = $1`,
      [entry.id],
      tx,
    );
    return view('confirmed', entry);
  });
}

export type ResendOutcome = 'sent' | 'sent_recently' | 'already_confirmed' | 'left';
const resendWords: Record<ResendOutcome, string> = {
  sent: 'We sent a fresh confirmation link. Check your inbox: only the newest link works.',
  sent_recently: `We sent a link less than ${RESEND_GAP_MINUTES} minutes ago. Check your inbox and spam folder for it.`,
  already_confirmed: 'You are already on the list: there is nothing to confirm.',
  left: 'You left this waitlist, so this link no longer works. Join again from the design’s page to get a new one.',
};

/**
 * A fresh link for a pending entry whose link expired or was replaced. The old token proves the request came
 * from the inbox; a new e-mail goes out at most once every few minutes, and the IP is counted like a join.
 */
export async function resendConfirmation(token: string | null | undefined, ip: string): Promise<{ outcome: ResendOutcome; message: string }> {
  const read = readConfirmToken(token);
  if (!read) throw new AppError('damaged_link', 'This confirmation link is damaged. Copy the whole link from the e-mail, or join the waitlist again.', 400);
  await consumeAllowance('waitlist-join-ip', WAITLIST_LIMITS.perIp, ip, 'Too many waitlist requests came from your network in the last minute.');
  const studio = await loadStudioSettings();
  const outcome = await inTransaction(async (tx): Promise<ResendOutcome> => {
    const [entry] = await sql<Entry & { confirm_sent_at: Date | null; finish_names: string[] }>(
      `SELECT e.id, e.email, e.state, e.confirm_token_hash, e.confirm_expires_at, e.confirm_sent_at, d.name AS design_name, d.slug AS design_slug,
              ARRAY(SELECT f.name FROM finishes f WHERE f.id = ANY(e.finish_ids) ORDER BY f.position) AS finish_names
         FROM waitlist_entries e JOIN designs d ON d.id = e.design_id WHERE e.id = $1 FOR UPDATE OF e`,
      [read.entryId],
      tx,
    );
    if (!entry) throw new AppError('damaged_link', 'This link no longer leads to a waitlist. Join again from the design’s page.', 400);
    if (entry.state === 'confirmed') return 'already_confirmed';
    if (entry.state === 'left') return 'left';
    if (entry.confirm_sent_at && Date.now() - entry.confirm_sent_at.getTime() < RESEND_GAP_MINUTES * 60_000) return 'sent_recently';
    await issueConfirmation({ id: entry.id, email: entry.email, designName: entry.design_name, finishNames: entry.finish_names }, studio, tx);
    return 'sent';
  });
  if (outcome === 'sent') kickMail();
  return { outcome, message: resendWords[outcome] };
}
