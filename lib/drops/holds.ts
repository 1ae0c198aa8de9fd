import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { AppError } from '@/lib/api/errors';
import { getDb } from '@/lib/db/connection';
import { dropPhase } from './phase';
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

// Every change below takes its locks in one order: hold rows, then buyer allowances, then stock rows.
// That order is what keeps concurrent holds, releases and sweeps from deadlocking each other.

/**
 * Returns the stock and allowances of active holds whose time is up, in a transaction of its own.
 * `scope` narrows it to what one hold attempt needs; the background sweep passes none.
 */
export async function expireHolds(scope: { batchStockId?: string; userId?: string; batchId?: string; limit?: number } = {}): Promise<number> {
  const { sequelize } = getDb();
  const where = `state = 'active' AND expires_at <= now()
    AND ($1::uuid IS NULL OR batch_stock_id = $1 OR (user_id = $2 AND batch_id = $3))`;
  const bind = [scope.batchStockId ?? null, scope.userId ?? null, scope.batchId ?? null];
  // Nearly always there is nothing to do: find that out with one cheap indexed read, outside a transaction.
  const [any] = await sequelize.query(`SELECT 1 FROM holds WHERE ${where} LIMIT 1`, { bind, type: QueryTypes.SELECT });
  if (!any) return 0;
  return sequelize.transaction(async (transaction) => {
    const expired = await sequelize.query<{ user_id: string; batch_id: string; batch_stock_id: string; quantity: number }>(
      `UPDATE holds SET state = 'expired', reason = 'time ran out', ended_at = now(), updated_at = now()
        WHERE id IN (
          SELECT id FROM holds WHERE ${where} ORDER BY id LIMIT $4 FOR UPDATE SKIP LOCKED)
        RETURNING user_id, batch_id, batch_stock_id, quantity`,
      {
        bind: [...bind, scope.limit ?? 1000],
        type: QueryTypes.SELECT,
        transaction,
      },
    );
    if (expired.length === 0) return 0;
    await giveBack(expired, transaction);
    return expired.length;
  });
}

/** Returns ended holds' units to their buyers' allowances and to the stock, in the lock order above. */
async function giveBack(ended: { user_id: string; batch_id: string; batch_stock_id: string; quantity: number }[], transaction: Transaction) {
  const { sequelize } = getDb();
  const rows = JSON.stringify(ended);
  await sequelize.query(
    `UPDATE buyer_allowances a SET taken = a.taken - e.q
       FROM (SELECT user_id, batch_id, sum(quantity)::int AS q
               FROM json_to_recordset($1::json) AS x(user_id uuid, batch_id uuid, batch_stock_id uuid, quantity int)
              GROUP BY 1, 2 ORDER BY 1, 2) e
      WHERE a.user_id = e.user_id AND a.batch_id = e.batch_id`,
    { bind: [rows], transaction },
  );
  await sequelize.query(
    `UPDATE batch_stock s SET held = s.held - e.q, updated_at = now()
       FROM (SELECT batch_stock_id, sum(quantity)::int AS q
               FROM json_to_recordset($1::json) AS x(user_id uuid, batch_id uuid, batch_stock_id uuid, quantity int)
              GROUP BY 1 ORDER BY 1) e
      WHERE s.id = e.batch_stock_id`,
    { bind: [rows], transaction },
  );
}

type Target = {
  now: Date;
  status: 'draft' | 'scheduled' | 'cancelled';
  early_access_at: Date | null;
  opens_at: Date;
  closes_at: Date;
  per_buyer_limit: number;
  hold_minutes: number;
  stock_id: string | null;
  granted: boolean;
};

/**
 * Holds `quantity` of one finish in one batch for a buyer. The stock row is changed by a conditional
 * UPDATE and the per-buyer limit by a conditional upsert of the buyer's allowance row, both in one
 * transaction: nothing is read first and written after, so no number of parallel requests can oversell
 * or pass the limit. Refusals come back as AppErrors a buyer can act on.
 */
export async function createHold(buyer: Buyer, input: CreateHoldInput): Promise<HoldView> {
  const { sequelize } = getDb();
  const [target] = await sequelize.query<Target>(
    `SELECT now() AS now, b.status, b.early_access_at, b.opens_at, b.closes_at, b.per_buyer_limit, b.hold_minutes,
            s.id AS stock_id,
            EXISTS (SELECT 1 FROM early_access_grants g WHERE g.batch_id = b.id AND g.user_id = $3) AS granted
       FROM batches b LEFT JOIN batch_stock s ON s.batch_id = b.id AND s.finish_id = $2
      WHERE b.id = $1 AND b.status <> 'draft'`,
    { bind: [input.batchId, input.finishId, buyer.id], type: QueryTypes.SELECT },
  );
  if (!target) throw new AppError('batch_not_found', 'There is no such batch in the shop.', 404);
  if (!target.stock_id) throw new AppError('finish_unknown', 'That finish is not offered in this batch. Pick one of the finishes shown.', 422);

  const times = { status: target.status, earlyAccessAt: target.early_access_at, opensAt: target.opens_at, closesAt: target.closes_at };
  const phase = dropPhase(times, target.now, { available: 1, held: 0 });
  if (phase === 'cancelled') throw new AppError('batch_closed', 'This batch was cancelled.', 409);
  if (phase === 'closed') throw new AppError('batch_closed', 'This drop has closed.', 409, { closedAt: target.closes_at.toISOString() });
  if (phase === 'upcoming') {
    throw new AppError('not_open_yet', 'This drop has not opened yet. Come back when the countdown ends.', 409, {
      opensAt: target.opens_at.toISOString(),
      earlyAccessAt: target.early_access_at?.toISOString() ?? null,
    });
  }
  if (phase === 'early_access' && !target.granted) {
    throw new AppError('early_access_only', 'Right now only people invited from the waitlist can hold. The drop opens to everyone at the time shown.', 403, {
      opensAt: target.opens_at.toISOString(),
    });
  }
  if (input.quantity > target.per_buyer_limit) throw limitReached(target.per_buyer_limit);

  // Stale holds of this finish, and the buyer's own in this batch, count as released from here on.
  await expireHolds({ batchStockId: target.stock_id, userId: buyer.id, batchId: input.batchId, limit: 200 });

  try {
    return await sequelize.transaction(async (transaction) => {
      const allowance = await sequelize.query(
        `INSERT INTO buyer_allowances (batch_id, user_id, taken, per_buyer_limit) VALUES ($1, $2, $3, $4)
         ON CONFLICT (batch_id, user_id) DO UPDATE SET taken = buyer_allowances.taken + EXCLUDED.taken
          WHERE buyer_allowances.taken + EXCLUDED.taken <= buyer_allowances.per_buyer_limit
         RETURNING taken`,
        { bind: [input.batchId, buyer.id, input.quantity, target.per_buyer_limit], type: QueryTypes.SELECT, transaction },
      );
      if (allowance.length === 0) throw limitReached(target.per_buyer_limit);

      const taken = await sequelize.query<{ sold: number; quantity: number }>(
        `UPDATE batch_stock SET held = held + $2, updated_at = now()
          WHERE id = $1 AND available >= $2
          RETURNING sold, quantity`,
        { bind: [target.stock_id, input.quantity], type: QueryTypes.SELECT, transaction },
      );
      if (taken.length === 0) throw await soldOut(target.stock_id!, transaction);

      const [hold] = await sequelize.query<{ id: string; expires_at: Date }>(
        `INSERT INTO holds (user_id, batch_id, batch_stock_id, quantity, expires_at)
         VALUES ($1, $2, $3, $4, now() + make_interval(mins => $5)) RETURNING id, expires_at`,
        { bind: [buyer.id, input.batchId, target.stock_id, input.quantity, target.hold_minutes], type: QueryTypes.SELECT, transaction },
      );
      return {
        id: hold!.id,
        batchId: input.batchId,
        finishId: input.finishId,
        quantity: input.quantity,
        expiresAt: hold!.expires_at.toISOString(),
        state: 'active' as const,
      };
    });
  } catch (error) {
    // The CHECK on buyer_allowances is the limit's last line: a breach there is the same refusal.
    if ((error as { original?: { constraint?: string } }).original?.constraint === 'buyer_allowances_within_limit') {
      throw limitReached(target.per_buyer_limit);
    }
    throw error;
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

async function soldOut(stockId: string, transaction: Transaction): Promise<AppError> {
  const [row] = await getDb().sequelize.query<{ held: number }>('SELECT held FROM batch_stock WHERE id = $1', {
    bind: [stockId],
    type: QueryTypes.SELECT,
    transaction,
  });
  const mayComeBack = (row?.held ?? 0) > 0;
  return new AppError(
    'sold_out',
    mayComeBack
      ? 'Every mask in this finish is held by other buyers right now. Some may come back if a hold runs out: try again in a few minutes.'
      : 'This finish is sold out.',
    409,
    { mayComeBack },
  );
}

/** Lets a buyer's own active hold go. Someone else's hold, or one already ended, is a 404. */
export async function releaseHold(buyer: Buyer, holdId: string): Promise<void> {
  const { sequelize } = getDb();
  const released = await sequelize.transaction(async (transaction) => {
    const ended = await sequelize.query<{ user_id: string; batch_id: string; batch_stock_id: string; quantity: number }>(
      `UPDATE holds SET state = CASE WHEN expires_at <= now() THEN 'expired' ELSE 'released' END,
              reason = CASE WHEN expires_at <= now() THEN 'time ran out' ELSE 'let go by the buyer' END,
              ended_at = now(), updated_at = now()
        WHERE id = $1 AND user_id = $2 AND state = 'active'
        RETURNING user_id, batch_id, batch_stock_id, quantity`,
      { bind: [holdId, buyer.id], type: QueryTypes.SELECT, transaction },
    );
    if (ended.length > 0) await giveBack(ended, transaction);
    return ended.length > 0;
  });
  if (!released) throw new AppError('hold_not_found', 'That hold is not yours, or it has already ended.', 404);
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
