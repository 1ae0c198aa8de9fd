import 'server-only';
import { sql } from '@/lib/db/sql';
import type { LineStage } from './stages';

export type BoardLine = {
  id: string; position: number; stage: LineStage; designName: string; finishName: string; oversoldOpen: boolean;
  orderNumber: string; buyerName: string; batchId: string; batchName: string; shipBy: string; timeZone: string;
};

export type BoardBatch = { id: string; name: string; designName: string; shipBy: string; timeZone: string };

// The board's masks: those of paid orders that are not refunded or cancelled, and not refunded themselves.
const boardOrders = `o.paid_at IS NOT NULL AND o.state NOT IN ('refunded', 'cancelled')`;

/**
 * The masks on the production board, oldest orders first. Shipped masks only come with a chosen batch
 * (for its summary): across every batch they would only grow.
 */
export async function listBoardLines({ batchId }: { batchId?: string } = {}): Promise<BoardLine[]> {
  const rows = await sql<{
    id: string; position: number; stage: LineStage; design_name: string; finish_name: string; oversold_open: boolean;
    number: string; buyer_name: string; batch_id: string; batch_name: string; ship_by: string; time_zone: string;
  }>(
    `SELECT l.id, l.position, l.stage, l.design_name, l.finish_name, (l.oversold AND l.oversold_resolution IS NULL) AS oversold_open,
            o.number, coalesce(nullif(o.buyer_name, ''), o.ship_to->>'name', o.email) AS buyer_name,
            b.id AS batch_id, b.name AS batch_name, b.ship_by::text AS ship_by, st.time_zone
       FROM order_lines l JOIN orders o ON o.id = l.order_id JOIN batches b ON b.id = o.batch_id JOIN studios st ON st.id = o.studio_id
      WHERE ${boardOrders} AND NOT l.refunded
        AND ($1::uuid IS NULL OR o.batch_id = $1) AND (l.stage <> 'shipped' OR $1::uuid IS NOT NULL)
      ORDER BY o.paid_at, o.number, l.position
      LIMIT 2000`,
    [batchId ?? null],
  );
  return rows.map((r) => ({
    id: r.id, position: r.position, stage: r.stage, designName: r.design_name, finishName: r.finish_name, oversoldOpen: r.oversold_open,
    orderNumber: r.number, buyerName: r.buyer_name, batchId: r.batch_id, batchName: r.batch_name, shipBy: r.ship_by, timeZone: r.time_zone,
  }));
}

/** Batches with masks to make, for the board's filter, soonest ship-by first. */
export async function listBoardBatches(): Promise<BoardBatch[]> {
  const rows = await sql<{ id: string; name: string; design_name: string; ship_by: string; time_zone: string }>(
    `SELECT b.id, b.name, d.name AS design_name, b.ship_by::text AS ship_by, st.time_zone
       FROM batches b JOIN designs d ON d.id = b.design_id JOIN studios st ON st.id = d.studio_id
      WHERE EXISTS (SELECT 1 FROM orders o JOIN order_lines l ON l.order_id = o.id WHERE o.batch_id = b.id AND ${boardOrders} AND NOT l.refunded)
      ORDER BY b.ship_by, b.name`,
  );
  return rows.map((r) => ({ id: r.id, name: r.name, designName: r.design_name, shipBy: r.ship_by, timeZone: r.time_zone }));
}
