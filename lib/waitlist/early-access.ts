import 'server-only';
import type { CurrentUser } from '@/lib/auth/session';
import { sql } from '@/lib/db/sql';
import { maskEmail } from './schemas';
import { readToken } from './tokens';

// An early-access link is personal: it names one batch and one address, signed, and gives a grant only
// to the account of that address. Anyone else who holds the link (a forwarded e-mail) is told whose it is.

export type EarlyAccessOutcome =
  | { outcome: 'damaged' }
  | { outcome: 'unknown_batch' }
  | { outcome: 'cancelled' | 'closed' | 'already_public' | 'no_early_access'; batchId: string; batchName: string; designName: string; opensAt: string }
  | { outcome: 'sign_in'; batchId: string; email: string; maskedEmail: string; batchName: string; designName: string }
  | { outcome: 'wrong_account'; batchId: string; maskedEmail: string; batchName: string; designName: string }
  | { outcome: 'granted'; batchId: string; batchName: string; designName: string; earlyAccessAt: string; opensAt: string };

const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The batch and address a token names, or null for anything tampered with, cut short or made for another purpose. */
export function readEarlyAccessToken(token: string | null | undefined): { batchId: string; email: string } | null {
  const payload = readToken('early-access', token);
  if (!payload || typeof payload.b !== 'string' || !uuid.test(payload.b) || typeof payload.a !== 'string' || !payload.a.includes('@')) return null;
  return { batchId: payload.b.toLowerCase(), email: payload.a };
}

/**
 * Redeems a link for the signed-in person. The grant is written only for the address's own account, only
 * while early access can still matter (before the public opening), and at most once (ON CONFLICT DO NOTHING).
 */
export async function redeemEarlyAccess(
  token: string | null | undefined,
  user: Pick<CurrentUser, 'id' | 'email'> | null,
  { batchId }: { batchId?: string } = {},
): Promise<EarlyAccessOutcome> {
  const read = readEarlyAccessToken(token);
  // A link opened under another batch's address was edited: as damaged as a broken signature.
  if (!read || (batchId !== undefined && batchId.toLowerCase() !== read.batchId)) return { outcome: 'damaged' };
  const [batch] = await sql<{ id: string; name: string; status: string; early_access_at: Date | null; opens_at: Date; closes_at: Date; design_name: string }>(
    `SELECT b.id, b.name, b.status, b.early_access_at, b.opens_at, b.closes_at, d.name AS design_name
       FROM batches b JOIN designs d ON d.id = b.design_id WHERE b.id = $1 AND b.status <> 'draft'`,
    [read.batchId],
  );
  if (!batch) return { outcome: 'unknown_batch' };
  const about = { batchId: batch.id, batchName: batch.name, designName: batch.design_name };
  const now = Date.now();
  const timed = { ...about, opensAt: batch.opens_at.toISOString() };
  if (batch.status === 'cancelled') return { outcome: 'cancelled', ...timed };
  if (now >= batch.closes_at.getTime()) return { outcome: 'closed', ...timed };
  if (now >= batch.opens_at.getTime()) return { outcome: 'already_public', ...timed };
  if (!batch.early_access_at) return { outcome: 'no_early_access', ...timed };

  const maskedEmail = maskEmail(read.email);
  if (!user) return { outcome: 'sign_in', ...about, email: read.email, maskedEmail };
  if (user.email.toLowerCase() !== read.email.toLowerCase()) return { outcome: 'wrong_account', ...about, maskedEmail };
  await sql(`INSERT INTO early_access_grants (batch_id, user_id) VALUES ($1, $2) ON CONFLICT DO NOTHING RETURNING batch_id`, [batch.id, user.id]);
  return { outcome: 'granted', ...about, earlyAccessAt: batch.early_access_at.toISOString(), opensAt: batch.opens_at.toISOString() };
}

/** Whether this person may hold in the batch's early-access window (their grant exists). */
export async function hasEarlyAccess(batchId: string, userId: string): Promise<boolean> {
  const rows = await sql<{ one: number }>(`SELECT 1 AS one FROM early_access_grants WHERE batch_id = $1 AND user_id = $2`, [batchId, userId]);
  return rows.length > 0;
}
