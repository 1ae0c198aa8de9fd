import 'server-only';
import { requestTime } from '@/lib/clock';
import { sql } from '@/lib/db/sql';
import { moldLife } from '@/lib/molds/life';
import { listMoldsByDesign } from '@/lib/molds/molds';
import { todayInZone } from '@/lib/planner/calendar';
import { lineStages, type LineStage } from '@/lib/production/stages';
import { loadStudioSettings } from '@/lib/settings/studio';
import { lastMonths, monthKeyInZone } from './months';

// The studio at a glance: money by month, the work in hand, what is late, which molds are wearing out and the
// drops either side of today. Read fresh on each visit; nothing here is stored.

export type MonthRevenue = { month: string; paidMinor: number; refundedMinor: number; netMinor: number; orders: number };
export type LateOrder = { number: string; buyerName: string; batchName: string; designName: string; shipBy: string; daysLate: number; masksLeft: number };
export type WornMold = { id: string; label: string; designName: string; pullsSoFar: number; expectedLifePulls: number; left: number };
export type DropSummary = {
  id: string; name: string; designName: string; status: 'draft' | 'scheduled' | 'cancelled';
  openedAt: string; closesAt: string; stock: number; sold: number;
};

export type StudioOverview = {
  currency: string;
  timeZone: string;
  today: string;
  /** The last 12 months in the studio's zone, oldest first, each with what its paid orders brought in. */
  revenue: MonthRevenue[];
  /** Masks of open orders at each production stage (refunded masks left out). */
  stages: Record<LineStage, number>;
  late: LateOrder[];
  wornMolds: WornMold[];
  /** Drops that have not closed yet, soonest first. */
  nextDrops: DropSummary[];
  /** Drops that have opened, latest first. */
  lastDrops: DropSummary[];
};

// An order still in hand: paid, not refunded in full or cancelled, and not shipped. A partly refunded order
// (shipping paid back, say) still has masks to make.
const openOrder = `o.paid_at IS NOT NULL AND o.state IN ('paid', 'in_production', 'partly_refunded')`;

const dropColumns = `b.id, b.name, d.name AS design_name, b.status, coalesce(b.early_access_at, b.opens_at) AS opened_at, b.closes_at,
  coalesce((SELECT sum(s.quantity) FROM batch_stock s WHERE s.batch_id = b.id), 0)::int AS stock,
  (SELECT count(*) FROM order_lines l JOIN orders o ON o.id = l.order_id WHERE o.batch_id = b.id AND o.paid_at IS NOT NULL AND NOT l.oversold)::int AS sold`;
type DropRow = { id: string; name: string; design_name: string; status: DropSummary['status']; opened_at: Date; closes_at: Date; stock: number; sold: number };
const toDrop = (r: DropRow): DropSummary => ({
  id: r.id, name: r.name, designName: r.design_name, status: r.status, openedAt: r.opened_at.toISOString(), closesAt: r.closes_at.toISOString(),
  stock: r.stock, sold: r.sold,
});

/**
 * Revenue by calendar month of the studio's zone: each order's payment less what was paid back on it, in the
 * month it was paid (so a month's figure is what its orders finally brought in). PostgreSQL's own IANA zone
 * data places each payment in its month.
 */
export async function revenueByMonth({ timeZone, now = requestTime(), months = 12 }: { timeZone: string; now?: number; months?: number }): Promise<MonthRevenue[]> {
  const keys = lastMonths(monthKeyInZone(new Date(now), timeZone), months);
  const rows = await sql<{ month: string; paid: string; refunded: string; orders: number }>(
    `SELECT to_char(o.paid_at AT TIME ZONE $1, 'YYYY-MM') AS month, sum(o.paid_minor)::text AS paid, sum(o.refunded_minor)::text AS refunded,
            count(*)::int AS orders
       FROM orders o
      WHERE o.paid_at IS NOT NULL AND o.paid_at >= $2::timestamptz - interval '2 days' AND o.paid_at <= $3
      GROUP BY 1`,
    // A loose lower bound for the index; the month keys decide what counts.
    [timeZone, new Date(Date.UTC(Number(keys[0]!.slice(0, 4)), Number(keys[0]!.slice(5, 7)) - 1, 1)), new Date(now)],
  );
  const byMonth = new Map(rows.map((r) => [r.month, r]));
  return keys.map((month) => {
    const row = byMonth.get(month);
    const paidMinor = Number(row?.paid ?? 0);
    const refundedMinor = Number(row?.refunded ?? 0);
    return { month, paidMinor, refundedMinor, netMinor: paidMinor - refundedMinor, orders: row?.orders ?? 0 };
  });
}

export async function loadStudioOverview({ now = requestTime() }: { now?: number } = {}): Promise<StudioOverview> {
  const settings = await loadStudioSettings();
  const timeZone = settings?.timeZone ?? 'UTC';
  const today = todayInZone(timeZone, new Date(now));
  const at = new Date(now);
  const [revenue, stageRows, lateRows, designs, nextRows, lastRows] = await Promise.all([
    revenueByMonth({ timeZone, now }),
    sql<{ stage: LineStage; n: number }>(
      `SELECT l.stage, count(*)::int AS n FROM order_lines l JOIN orders o ON o.id = l.order_id
        WHERE ${openOrder} AND NOT l.refunded GROUP BY l.stage`,
    ),
    sql<{ number: string; buyer_name: string; batch_name: string; design_name: string; ship_by: string; days_late: number; masks_left: number }>(
      `SELECT o.number, coalesce(nullif(o.buyer_name, ''), o.ship_to->>'name', o.email) AS buyer_name, b.name AS batch_name,
              d.name AS design_name, b.ship_by::text AS ship_by, ($1::date - b.ship_by)::int AS days_late,
              count(l.id)::int AS masks_left
         FROM orders o JOIN batches b ON b.id = o.batch_id JOIN designs d ON d.id = b.design_id
         JOIN order_lines l ON l.order_id = o.id AND NOT l.refunded AND l.stage <> 'shipped'
        WHERE ${openOrder} AND b.ship_by < $1::date
        GROUP BY o.id, b.id, d.id
        ORDER BY b.ship_by, o.paid_at, o.number
        LIMIT 100`,
      [today],
    ),
    listMoldsByDesign(),
    sql<DropRow>(
      `SELECT ${dropColumns} FROM batches b JOIN designs d ON d.id = b.design_id
        WHERE b.status = 'scheduled' AND b.closes_at > $1 ORDER BY coalesce(b.early_access_at, b.opens_at), b.name LIMIT 3`,
      [at],
    ),
    sql<DropRow>(
      `SELECT ${dropColumns} FROM batches b JOIN designs d ON d.id = b.design_id
        WHERE b.status <> 'draft' AND coalesce(b.early_access_at, b.opens_at) <= $1 ORDER BY coalesce(b.early_access_at, b.opens_at) DESC, b.name LIMIT 3`,
      [at],
    ),
  ]);

  const stages = Object.fromEntries(lineStages.map((stage) => [stage, 0])) as Record<LineStage, number>;
  for (const row of stageRows) stages[row.stage] = row.n;

  const wornMolds = designs
    .flatMap((design) =>
      design.molds
        .filter((m) => !m.retiredAt)
        .map((m) => ({ m, life: moldLife(m) }))
        .filter(({ life }) => life.nearEnd)
        .map(({ m, life }) => ({
          id: m.id, label: m.label, designName: design.name, pullsSoFar: m.pullsSoFar, expectedLifePulls: m.expectedLifePulls, left: life.left,
        })),
    )
    .sort((a, b) => a.left - b.left || a.designName.localeCompare(b.designName));

  return {
    currency: settings?.currency ?? 'EUR',
    timeZone,
    today,
    revenue,
    stages,
    late: lateRows.map((r) => ({
      number: r.number, buyerName: r.buyer_name, batchName: r.batch_name, designName: r.design_name, shipBy: r.ship_by, daysLate: r.days_late,
      masksLeft: r.masks_left,
    })),
    wornMolds,
    nextDrops: nextRows.map(toDrop),
    lastDrops: lastRows.map(toDrop),
  };
}
