import 'server-only';
import { QueryTypes } from 'sequelize';
import { getDb } from '@/lib/db/connection';
import { dropPhase, type DropPhase } from './phase';

export type StockLine = { finishId: string; quantity: number; available: number; held: number; sold: number };
export type Availability = {
  batchId: string;
  /** The database's clock: phases and countdowns follow it, not the browser's or the instance's. */
  now: string;
  phase: DropPhase;
  earlyAccessAt: string | null;
  opensAt: string;
  closesAt: string;
  stock: StockLine[];
};

/**
 * Live stock of one batch in one query. Holds whose time is up count as released here already, so stock
 * never looks gone because the sweep has not run yet. Null for a batch the shop does not show.
 */
export async function getAvailability(batchId: string): Promise<Availability | null> {
  const rows = await getDb().sequelize.query<{
    now: Date; status: 'draft' | 'scheduled' | 'cancelled'; early_access_at: Date | null; opens_at: Date; closes_at: Date;
    finish_id: string; quantity: number; held: number; sold: number;
  }>(
    `SELECT now() AS now, b.status, b.early_access_at, b.opens_at, b.closes_at,
            s.finish_id, s.quantity, s.sold, s.held - coalesce(x.stale, 0) AS held
       FROM batches b JOIN batch_stock s ON s.batch_id = b.id
       LEFT JOIN LATERAL (
         SELECT sum(h.quantity)::int AS stale FROM holds h
          WHERE h.batch_stock_id = s.id AND h.state = 'active' AND h.expires_at <= now()) x ON true
      WHERE b.id = $1 AND b.status <> 'draft'
      ORDER BY s.finish_id`,
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  const first = rows[0];
  if (!first) return null;
  const stock = rows.map((r) => ({
    finishId: r.finish_id,
    quantity: r.quantity,
    held: r.held,
    sold: r.sold,
    available: r.quantity - r.held - r.sold,
  }));
  const totals = stock.reduce((sum, s) => ({ available: sum.available + s.available, held: sum.held + s.held }), { available: 0, held: 0 });
  const times = { status: first.status, earlyAccessAt: first.early_access_at, opensAt: first.opens_at, closesAt: first.closes_at };
  return {
    batchId,
    now: first.now.toISOString(),
    phase: dropPhase(times, first.now, totals),
    earlyAccessAt: first.early_access_at?.toISOString() ?? null,
    opensAt: first.opens_at.toISOString(),
    closesAt: first.closes_at.toISOString(),
    stock,
  };
}
