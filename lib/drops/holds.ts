import 'server-only';
import { QueryTypes } from 'sequelize';
import { AppError } from '@/lib/api/errors';
import { getDb } from '@/lib/db/connection';
import type { CreateHoldInput } from './schemas';

export type HoldView = {
  id: string;
  batchId: string;
  finishId: string;
  quantity: number;
  expiresAt: string;
  state: 'active' | 'converted' | 'released' | 'expired';
};

type Buyer = { id: string };

// The work is done by PostgreSQL functions (migration create-hold-functions): each hold, release or
// sweep is one round trip, so no lock waits on this process's event loop.

/** Returns the stock of active holds whose time is up; `scope` narrows it, the background sweep passes none. */
export async function expireHolds(scope: { limit?: number } = {}): Promise<number> {
  const [row] = await getDb().sequelize.query<{ n: number }>('SELECT expire_holds(NULL, NULL, NULL, $1) AS n', {
    bind: [scope.limit ?? 1000],
    type: QueryTypes.SELECT,
  });
  return row?.n ?? 0;
}

type Outcome = {
  outcome: 'held' | 'batch_not_found' | 'finish_unknown' | 'batch_closed' | 'not_open_yet' | 'early_access_only' | 'limit_reached' | 'sold_out';
  hold_id: string | null;
  expires_at: Date | null;
  early_access_at: Date | null;
  opens_at: Date | null;
  closes_at: Date | null;
  per_buyer_limit: number | null;
  may_come_back: boolean;
};

/**
 * Holds `quantity` of one finish in one batch for a buyer, or says why not in words they can act on.
 * The stock row changes by a conditional UPDATE and the per-buyer count by a conditional upsert, in one
 * transaction: no number of parallel requests can oversell or pass the limit.
 */
export async function createHold(buyer: Buyer, input: CreateHoldInput): Promise<HoldView> {
  const result = await withDeadlockRetry(() =>
    getDb().sequelize.query<Outcome>('SELECT * FROM hold_stock($1, $2, $3, $4)', {
      bind: [buyer.id, input.batchId, input.finishId, input.quantity],
      type: QueryTypes.SELECT,
    }),
  );
  const r = result[0];
  if (!r) throw new Error('hold_stock returned no row');
  switch (r.outcome) {
    case 'held':
      return {
        id: r.hold_id!,
        batchId: input.batchId,
        finishId: input.finishId,
        quantity: input.quantity,
        expiresAt: r.expires_at!.toISOString(),
        state: 'active',
      };
    case 'batch_not_found':
      throw new AppError('batch_not_found', 'There is no such batch in the shop.', 404);
    case 'finish_unknown':
      throw new AppError('finish_unknown', 'That finish is not offered in this batch. Pick one of the finishes shown.', 422);
    case 'batch_closed':
      throw new AppError('batch_closed', 'This drop has closed.', 409, { closedAt: r.closes_at?.toISOString() });
    case 'not_open_yet':
      throw new AppError('not_open_yet', 'This drop has not opened yet. Come back when the countdown ends.', 409, {
        opensAt: r.opens_at?.toISOString(),
        earlyAccessAt: r.early_access_at?.toISOString() ?? null,
      });
    case 'early_access_only':
      throw new AppError(
        'early_access_only',
        'Right now only people invited from the waitlist can hold. The drop opens to everyone at the time shown.',
        403,
        { opensAt: r.opens_at?.toISOString() },
      );
    case 'limit_reached':
      throw limitReached(r.per_buyer_limit ?? 1);
    case 'sold_out':
      throw new AppError(
        'sold_out',
        r.may_come_back
          ? 'Every mask in this finish is held by other buyers right now. Some may come back if a hold runs out: try again in a few minutes.'
          : 'This finish is sold out.',
        409,
        { mayComeBack: r.may_come_back },
      );
  }
}

/** PostgreSQL ends one side of a rare deadlock (a sweep meeting a hold); the other side simply runs again. */
async function withDeadlockRetry<T>(work: () => Promise<T>, attempts = 3): Promise<T> {
  for (let attempt = 1; ; attempt += 1) {
    try {
      return await work();
    } catch (error) {
      const code = (error as { original?: { code?: string } }).original?.code;
      if (attempt >= attempts || (code !== '40P01' && code !== '40001')) {
        if ((error as { original?: { constraint?: string } }).original?.constraint === 'buyer_allowances_within_limit') {
          throw limitReached(1);
        }
        throw error;
      }
    }
  }
}

function limitReached(limit: number): AppError {
  return new AppError(
    'limit_reached',
    `You already hold or bought ${limit === 1 ? 'the one mask' : `the ${limit} masks`} each buyer may have from this batch.`,
    409,
    { limit },
  );
}

/** Lets a buyer's own active hold go. Someone else's hold, or one already ended, is a 404. */
export async function releaseHold(buyer: Buyer, holdId: string): Promise<void> {
  const [row] = await withDeadlockRetry(() =>
    getDb().sequelize.query<{ released: boolean }>('SELECT release_hold($1, $2) AS released', {
      bind: [holdId, buyer.id],
      type: QueryTypes.SELECT,
    }),
  );
  if (!row?.released) throw new AppError('hold_not_found', 'That hold is not yours, or it has already ended.', 404);
}

export type MyHold = HoldView & { designName: string; finishName: string; batchName: string };

/** The buyer's holds that are still running (an expired one is over even before the sweep ends it). */
export async function listMyActiveHolds(buyer: Buyer): Promise<MyHold[]> {
  const rows = await getDb().sequelize.query<{
    id: string; batch_id: string; finish_id: string; quantity: number; expires_at: Date; design_name: string; finish_name: string; batch_name: string;
  }>(
    `SELECT h.id, h.batch_id, s.finish_id, h.quantity, h.expires_at, d.name AS design_name, f.name AS finish_name, b.name AS batch_name
       FROM holds h JOIN batch_stock s ON s.id = h.batch_stock_id JOIN finishes f ON f.id = s.finish_id
       JOIN batches b ON b.id = h.batch_id JOIN designs d ON d.id = b.design_id
      WHERE h.user_id = $1 AND h.state = 'active' AND h.expires_at > now()
      ORDER BY h.expires_at`,
    { bind: [buyer.id], type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({
    id: r.id,
    batchId: r.batch_id,
    finishId: r.finish_id,
    quantity: r.quantity,
    expiresAt: r.expires_at.toISOString(),
    state: 'active',
    designName: r.design_name,
    finishName: r.finish_name,
    batchName: r.batch_name,
  }));
}
