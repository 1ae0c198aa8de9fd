import 'server-only';
import { requestTime } from '@/lib/clock';
import { sql } from '@/lib/db/sql';
import { cardFeeMinor } from '@/lib/planner/materials';
import { loadStudioSettings } from '@/lib/settings/studio';
import { getWaitlistConversions, type WaitlistConversion } from '@/lib/waitlist/conversion';
import {
  buildSeries,
  chartEndMs,
  dropMoney,
  lastActivityMs,
  sellOutTimes,
  type DropMoney,
  type HoldSpan,
  type Sale,
  type SellOutTimes,
  type SellThroughSeries,
} from './sell-through';

// What one batch's drop sold, read from what the holds, orders, lines, events and refunds recorded. Nothing here
// is stored: the report is worked out again on each visit, so it always agrees with the orders pages.

export type FinishSales = { finishId: string; name: string; stock: number; sold: number; heldNow: number; refunded: number };

export type DropReport = {
  batch: {
    id: string; name: string; designName: string; status: 'draft' | 'scheduled' | 'cancelled'; timeZone: string; currency: string;
    earlyAccessAt: string | null; opensAt: string; closesAt: string;
  };
  /** When buyers could first hold: early access if the batch had it, else the public opening. */
  openedAt: string;
  /** False before the first buyer could hold (or for a draft): there is nothing to report yet. */
  opened: boolean;
  stock: number;
  /** Units sold: paid mask lines that took a unit of stock (an oversold line never did). */
  sold: number;
  series: SellThroughSeries;
  sellOut: SellOutTimes;
  holds: { total: number; expired: number; expiredUnits: number; released: number; runningNow: number };
  /** Payments that arrived after their hold had ended (their 'paid' event says late). */
  latePayments: number;
  oversold: { lines: number; refunded: number; extraCast: number; open: number };
  refunds: { count: number; amountMinor: number; pending: number };
  paidOrders: number;
  money: DropMoney;
  cardFee: { basisPoints: number; fixedMinor: number };
  finishes: FinishSales[];
  /** People the batch's announcement reached, and the paid orders that came from the design's waitlist. */
  waitlistConversion: WaitlistConversion;
};

type BatchRow = {
  id: string; name: string; design_name: string; status: DropReport['batch']['status']; time_zone: string; currency: string;
  early_access_at: Date | null; opens_at: Date; closes_at: Date;
};

/** The drop report of one batch at `now`, or null when there is no such batch. */
export async function getDropReport({ batchId, now = requestTime() }: { batchId: string; now?: number }): Promise<DropReport | null> {
  const [batch] = await sql<BatchRow>(
    `SELECT b.id, b.name, d.name AS design_name, b.status, st.time_zone, d.currency, b.early_access_at, b.opens_at, b.closes_at
       FROM batches b JOIN designs d ON d.id = b.design_id JOIN studios st ON st.id = d.studio_id WHERE b.id = $1`,
    [batchId],
  );
  if (!batch) return null;

  const [holdRows, saleRows, finishRows, orderRows, [events], [oversold], [refunds], settings, conversions] = await Promise.all([
    sql<{ created_at: Date; ended_at: Date | null; quantity: number; state: string }>(
      `SELECT created_at, ended_at, quantity, state FROM holds WHERE batch_id = $1`,
      [batchId],
    ),
    // One row per paid mask that took stock. A refund later does not undo the sale in the timeline.
    sql<{ paid_at: Date }>(
      `SELECT o.paid_at FROM order_lines l JOIN orders o ON o.id = l.order_id
        WHERE o.batch_id = $1 AND o.paid_at IS NOT NULL AND NOT l.oversold`,
      [batchId],
    ),
    sql<{ finish_id: string; name: string; quantity: number; held: number; sold: number; refunded: number }>(
      `SELECT s.finish_id, f.name, s.quantity, s.held,
              (SELECT count(*)::int FROM order_lines l JOIN orders o ON o.id = l.order_id
                WHERE l.batch_stock_id = s.id AND o.paid_at IS NOT NULL AND NOT l.oversold) AS sold,
              (SELECT count(*)::int FROM order_lines l JOIN orders o ON o.id = l.order_id
                WHERE l.batch_stock_id = s.id AND o.paid_at IS NOT NULL AND l.refunded) AS refunded
         FROM batch_stock s JOIN finishes f ON f.id = s.finish_id WHERE s.batch_id = $1 ORDER BY f.position, f.name`,
      [batchId],
    ),
    sql<{ paid_minor: number; refunded_minor: number }>(
      `SELECT paid_minor, refunded_minor FROM orders WHERE batch_id = $1 AND paid_at IS NOT NULL`,
      [batchId],
    ),
    sql<{ late: number }>(
      `SELECT count(*)::int AS late FROM order_events e JOIN orders o ON o.id = e.order_id
        WHERE o.batch_id = $1 AND e.type = 'paid' AND (e.data->>'late')::boolean IS TRUE`,
      [batchId],
    ),
    sql<{ lines: number; refunded: number; extra_cast: number; open: number }>(
      `SELECT count(*)::int AS lines,
              count(*) FILTER (WHERE l.oversold_resolution = 'refunded')::int AS refunded,
              count(*) FILTER (WHERE l.oversold_resolution = 'extra_cast')::int AS extra_cast,
              count(*) FILTER (WHERE l.oversold_resolution IS NULL)::int AS open
         FROM order_lines l JOIN orders o ON o.id = l.order_id WHERE o.batch_id = $1 AND l.oversold`,
      [batchId],
    ),
    sql<{ count: number; amount: number; pending: number }>(
      `SELECT count(*) FILTER (WHERE r.status = 'succeeded')::int AS count,
              coalesce(sum(r.amount_minor) FILTER (WHERE r.status = 'succeeded'), 0)::int AS amount,
              count(*) FILTER (WHERE r.status = 'pending')::int AS pending
         FROM refunds r JOIN orders o ON o.id = r.order_id WHERE o.batch_id = $1`,
      [batchId],
    ),
    loadStudioSettings(),
    getWaitlistConversions([batchId]),
  ]);

  const openedMs = (batch.early_access_at ?? batch.opens_at).getTime();
  const opened = batch.status !== 'draft' && openedMs <= now;
  const holds: HoldSpan[] = holdRows.map((h) => ({ startMs: h.created_at.getTime(), endMs: h.ended_at?.getTime() ?? null, quantity: h.quantity }));
  const sales: Sale[] = saleRows.map((s) => ({ paidMs: s.paid_at.getTime() }));
  const stock = finishRows.reduce((n, f) => n + f.quantity, 0);
  const untilMs = Math.min(now, batch.closes_at.getTime());
  const series = opened
    ? buildSeries({ openedMs, untilMs: chartEndMs(openedMs, untilMs, lastActivityMs(holds, sales)), holds, sales })
    : { bucketSeconds: 1, points: [] };

  const basisPoints = settings?.cardFeeBasisPoints ?? 0;
  const fixedMinor = settings?.cardFeeFixedMinor ?? 0;
  // A card payment's fee is charged on what was paid and is not given back when the payment is refunded
  // (common practice, no source: check your payment provider's terms).
  const paying = orderRows.filter((o) => o.paid_minor > 0);
  const money = dropMoney({
    grossMinor: orderRows.reduce((n, o) => n + o.paid_minor, 0),
    refundedMinor: orderRows.reduce((n, o) => n + o.refunded_minor, 0),
    cardFeesMinor: paying.reduce((n, o) => n + cardFeeMinor(o.paid_minor, basisPoints, fixedMinor), 0),
  });

  const units = (state: string) => holdRows.filter((h) => h.state === state);
  return {
    batch: {
      id: batch.id, name: batch.name, designName: batch.design_name, status: batch.status, timeZone: batch.time_zone, currency: batch.currency,
      earlyAccessAt: batch.early_access_at?.toISOString() ?? null, opensAt: batch.opens_at.toISOString(), closesAt: batch.closes_at.toISOString(),
    },
    openedAt: new Date(openedMs).toISOString(),
    opened,
    stock,
    sold: sales.length,
    series,
    sellOut: sellOutTimes({ openedMs, stock, holds, sales }),
    holds: {
      total: holdRows.length,
      expired: units('expired').length,
      expiredUnits: units('expired').reduce((n, h) => n + h.quantity, 0),
      released: units('released').length,
      runningNow: units('active').reduce((n, h) => n + h.quantity, 0),
    },
    latePayments: events?.late ?? 0,
    oversold: { lines: oversold?.lines ?? 0, refunded: oversold?.refunded ?? 0, extraCast: oversold?.extra_cast ?? 0, open: oversold?.open ?? 0 },
    refunds: { count: refunds?.count ?? 0, amountMinor: refunds?.amount ?? 0, pending: refunds?.pending ?? 0 },
    paidOrders: orderRows.length,
    money,
    cardFee: { basisPoints, fixedMinor },
    finishes: finishRows.map((f) => ({ finishId: f.finish_id, name: f.name, stock: f.quantity, sold: f.sold, heldNow: f.held, refunded: f.refunded })),
    waitlistConversion: conversions.get(batchId) ?? { announced: 0, buyers: 0 },
  };
}
