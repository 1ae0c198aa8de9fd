// How a drop sold, worked out from plain timestamps: no database, safe to import anywhere (the chart's client
// component and unit tests included). Times are milliseconds since the epoch; the series is in whole seconds
// since the drop opened.

/** A hold's life: it counts as held from `startMs` until `endMs` (null while it still runs). */
export type HoldSpan = { startMs: number; endMs: number | null; quantity: number };
/** One unit of stock sold at `paidMs` (one paid mask line). */
export type Sale = { paidMs: number };

export type SellThroughPoint = {
  /** Seconds since the drop opened. */
  t: number;
  /** Units in running holds at that moment. */
  held: number;
  /** Units paid for up to and including that moment. */
  sold: number;
};

export type SellThroughSeries = { bucketSeconds: number; points: SellThroughPoint[] };

/** Steps a chart can have, in seconds: a second up to a day. */
export const bucketSteps = [1, 2, 5, 10, 15, 30, 60, 120, 300, 600, 900, 1800, 3600, 7200, 10_800, 21_600, 43_200, 86_400] as const;
/** Enough points to draw a smooth step line at a workshop screen's width, few enough to list in a table. */
export const maxPoints = 240;

/** The smallest step that keeps a span of `spanSeconds` within `maxPoints` steps (a day a step beyond that). */
export function chooseBucketSeconds(spanSeconds: number, limit = maxPoints): number {
  const span = Math.max(0, spanSeconds);
  for (const step of bucketSteps) if (Math.ceil(span / step) <= limit) return step;
  return Math.ceil(span / limit / 86_400) * 86_400;
}

type Change = { ms: number; held: number; sold: number };

/** Every moment something changed, in time order, with what changed (ties kept together). */
function changes(holds: HoldSpan[], sales: Sale[]): Change[] {
  const list: Change[] = [];
  for (const hold of holds) {
    list.push({ ms: hold.startMs, held: hold.quantity, sold: 0 });
    if (hold.endMs !== null) list.push({ ms: hold.endMs, held: -hold.quantity, sold: 0 });
  }
  for (const sale of sales) list.push({ ms: sale.paidMs, held: 0, sold: 1 });
  return list.sort((a, b) => a.ms - b.ms);
}

/** The last moment anything happened, or null when nothing did. */
export function lastActivityMs(holds: HoldSpan[], sales: Sale[]): number | null {
  const all = changes(holds, sales);
  return all.length ? all[all.length - 1]!.ms : null;
}

/**
 * Held and sold at each step from the opening to `untilMs`: the state at the step's own instant, with
 * everything that happened at or before it applied (a hold that ends in the same instant a payment lands has
 * already moved from held to sold). Holds made before the opening (none should be) count from the start.
 */
export function buildSeries(input: { openedMs: number; untilMs: number; holds: HoldSpan[]; sales: Sale[]; bucketSeconds?: number }): SellThroughSeries {
  const { openedMs, holds, sales } = input;
  const spanSeconds = Math.max(0, Math.ceil((input.untilMs - openedMs) / 1000));
  const bucketSeconds = input.bucketSeconds ?? chooseBucketSeconds(spanSeconds);
  const steps = Math.ceil(spanSeconds / bucketSeconds);
  const all = changes(holds, sales);
  const points: SellThroughPoint[] = [];
  let held = 0;
  let sold = 0;
  let next = 0;
  for (let i = 0; i <= steps; i += 1) {
    const t = i * bucketSeconds;
    const at = openedMs + t * 1000;
    while (next < all.length && all[next]!.ms <= at) {
      held += all[next]!.held;
      sold += all[next]!.sold;
      next += 1;
    }
    points.push({ t, held, sold });
  }
  return { bucketSeconds, points };
}

/**
 * Where the chart ends: a little after the last thing that happened, so a two-minute sell-out is not squashed
 * into the left edge of a three-day window, but never past `untilMs` (the close, or now for a drop still open).
 * At least a minute, so a drop with one early sale still has a line to draw.
 */
export function chartEndMs(openedMs: number, untilMs: number, lastMs: number | null): number {
  if (untilMs <= openedMs) return openedMs;
  const last = Math.max(lastMs ?? openedMs, openedMs);
  const withMargin = last + Math.max(60_000, (last - openedMs) * 0.1);
  return Math.min(untilMs, withMargin);
}

export type SellOutTimes = {
  /**
   * "Sold out": the first moment nothing was left to hold — units held plus units sold reached the stock — in
   * seconds since opening. A hold that expires afterwards puts a unit back, but the drop had sold out by then.
   */
  soldOutSeconds: number | null;
  /** The first moment every unit was paid for (sold reached the stock), in seconds since opening. */
  allPaidSeconds: number | null;
};

/** Both sell-out moments, exact to the millisecond (not rounded to the chart's steps). */
export function sellOutTimes(input: { openedMs: number; stock: number; holds: HoldSpan[]; sales: Sale[] }): SellOutTimes {
  const { openedMs, stock } = input;
  if (stock <= 0) return { soldOutSeconds: null, allPaidSeconds: null };
  const all = changes(input.holds, input.sales);
  let held = 0;
  let sold = 0;
  let soldOut: number | null = null;
  let allPaid: number | null = null;
  for (let i = 0; i < all.length; i += 1) {
    held += all[i]!.held;
    sold += all[i]!.sold;
    // Only once every change of this instant is applied: a conversion is an end and a sale at the same time.
    if (i + 1 < all.length && all[i + 1]!.ms === all[i]!.ms) continue;
    const seconds = Math.max(0, (all[i]!.ms - openedMs) / 1000);
    if (soldOut === null && held + sold >= stock) soldOut = seconds;
    if (allPaid === null && sold >= stock) allPaid = seconds;
    if (soldOut !== null && allPaid !== null) break;
  }
  return { soldOutSeconds: soldOut, allPaidSeconds: allPaid };
}

export type DropMoney = { grossMinor: number; refundedMinor: number; cardFeesMinor: number; netMinor: number };

/** Net = what was paid, less what was paid back, less the card fees (which are not returned with a refund). */
export function dropMoney(input: { grossMinor: number; refundedMinor: number; cardFeesMinor: number }): DropMoney {
  const { grossMinor, refundedMinor, cardFeesMinor } = input;
  for (const [name, value] of Object.entries(input)) {
    if (!Number.isSafeInteger(value) || value < 0) throw new RangeError(`${name} must be a whole number ≥ 0, got ${value}`);
  }
  return { grossMinor, refundedMinor, cardFeesMinor, netMinor: grossMinor - refundedMinor - cardFeesMinor };
}

/** "45 s", "1 min 35 s", "2 h 5 min", "3 d 4 h": a stretch of time since the opening, for people. */
export function formatElapsed(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  if (s < 60) return `${s} s`;
  const days = Math.floor(s / 86_400);
  const hours = Math.floor((s % 86_400) / 3600);
  const minutes = Math.floor((s % 3600) / 60);
  const rest = s % 60;
  if (days > 0) return hours > 0 ? `${days} d ${hours} h` : `${days} d`;
  if (hours > 0) return minutes > 0 ? `${hours} h ${minutes} min` : `${hours} h`;
  return rest > 0 ? `${minutes} min ${rest} s` : `${minutes} min`;
}

/** A short axis label for seconds since opening: "0:45", "12:05", "3 h", "2 d 6 h". */
export function formatElapsedTick(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  if (s < 3600) return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
  if (s < 86_400) {
    const minutes = Math.floor((s % 3600) / 60);
    return minutes ? `${Math.floor(s / 3600)} h ${minutes}` : `${Math.floor(s / 3600)} h`;
  }
  const hours = Math.floor((s % 86_400) / 3600);
  return hours ? `${Math.floor(s / 86_400)} d ${hours} h` : `${Math.floor(s / 86_400)} d`;
}
