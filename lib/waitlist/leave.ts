import 'server-only';
import type { Transaction } from 'sequelize';
import { AppError } from '@/lib/api/errors';
import type { CurrentUser } from '@/lib/auth/session';
import { inTransaction, sql } from '@/lib/db/sql';
import { readToken } from './tokens';

// Leaving takes effect in the statement that answers: the entry is `left` before the response is sent, so
// no later announcement picks it. The answer never says whether there was anything to leave.

export type LeaveScope = 'entry' | 'all';
export const leaveWords: Record<LeaveScope, string> = {
  entry: 'You have left this waitlist. Nothing more will come about it.',
  all: 'You have left every waitlist of this address. Nothing more will come about them.',
};

const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export const damagedUnsubscribeLink = () =>
  new AppError('damaged_link', 'This unsubscribe link is damaged. Copy the whole link from the e-mail, or leave from your account page.', 400);

/** The entry id an unsubscribe token names, or null when it was tampered with or made for something else. */
export function readUnsubscribeToken(token: string | null | undefined): string | null {
  const payload = readToken('waitlist-unsubscribe', token);
  return payload && typeof payload.e === 'string' && uuid.test(payload.e) ? payload.e : null;
}

const leaveSet = `state = 'left', left_at = now(), confirm_token_hash = NULL, confirm_expires_at = NULL, updated_at = now()`;

async function leaveWhere(where: string, bind: unknown[], transaction?: Transaction): Promise<number> {
  const rows = await sql<{ id: string }>(`UPDATE waitlist_entries SET ${leaveSet} WHERE (${where}) AND state <> 'left' RETURNING id`, bind, transaction);
  return rows.length;
}

/** From an e-mail's link (the page's button or the RFC 8058 one-click POST): no session needed, the token is the proof. */
export async function leaveByToken(token: string | null | undefined, scope: LeaveScope = 'entry'): Promise<{ message: string }> {
  const entryId = readUnsubscribeToken(token);
  if (!entryId) throw damagedUnsubscribeLink();
  await inTransaction((tx) =>
    scope === 'all'
      ? leaveWhere(`email = (SELECT email FROM waitlist_entries WHERE id = $1)`, [entryId], tx)
      : leaveWhere(`id = $1`, [entryId], tx),
  );
  return { message: leaveWords[scope] };
}

/** The signed-in buyer leaves one of their entries (theirs by account or by address; anyone else's is untouched). */
export async function leaveEntryOfUser(user: Pick<CurrentUser, 'id' | 'email'>, entryId: string): Promise<{ message: string }> {
  await leaveWhere(`id = $1 AND (user_id = $2 OR email = $3)`, [entryId, user.id, user.email]);
  return { message: leaveWords.entry };
}

/** The signed-in buyer leaves every waitlist, by account and by address. */
export async function leaveAllOfUser(user: Pick<CurrentUser, 'id' | 'email'>): Promise<{ message: string; left: number }> {
  const left = await leaveWhere(`user_id = $1 OR email = $2`, [user.id, user.email]);
  return { message: left > 0 ? 'You have left all your waitlists.' : 'You are not on any waitlist.', left };
}
