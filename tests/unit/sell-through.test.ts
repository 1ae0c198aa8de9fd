import { describe, expect, it } from 'vitest';
import { lastMonths, monthKeyInZone } from '@/lib/reports/months';
import {
  buildSeries,
  chartEndMs,
  chooseBucketSeconds,
  dropMoney,
  formatElapsed,
  lastActivityMs,
  sellOutTimes,
  type HoldSpan,
  type Sale,
} from '@/lib/reports/sell-through';

const opened = Date.parse('2027-03-28T18:00:00Z');
const s = (seconds: number) => opened + seconds * 1000;

/**
 * A batch of 10, worked by hand (seconds after the opening; every hold is of 1 mask unless said):
 *   holds at 5, 10, 15, 20, 25, 30 s are paid at 60, 65, 70, 75, 80, 85 s (each hold ends as its sale lands);
 *   holds at 35 and 40 s are never paid and expire at 635 and 640 s (10-minute holds);
 *   a hold of 2 at 95 s is paid (2 masks) at 150 s;
 *   after the two expiries, a hold of 2 at 700 s is paid (2 masks) at 760 s.
 * held + sold:  at 40 s 8 + 0 = 8;  at 85 s 2 + 6 = 8;  at 95 s 4 + 6 = 10 → sold out at 95 s.
 * sold alone reaches 10 only at 760 s (6 + 2 + 2).
 */
const converted = (start: number, paid: number, quantity = 1): { hold: HoldSpan; sales: Sale[] } => ({
  hold: { startMs: s(start), endMs: s(paid), quantity },
  sales: Array.from({ length: quantity }, () => ({ paidMs: s(paid) })),
});
const paidHolds = [
  converted(5, 60),
  converted(10, 65),
  converted(15, 70),
  converted(20, 75),
  converted(25, 80),
  converted(30, 85),
  converted(95, 150, 2),
  converted(700, 760, 2),
];
const expired: HoldSpan[] = [
  { startMs: s(35), endMs: s(635), quantity: 1 },
  { startMs: s(40), endMs: s(640), quantity: 1 },
];
const holds = [...paidHolds.map((p) => p.hold), ...expired];
const sales = paidHolds.flatMap((p) => p.sales);

describe('time to sell out', () => {
  it('is the first moment held + sold reaches the stock; "all paid" is when sold alone does', () => {
    expect(sellOutTimes({ openedMs: opened, stock: 10, holds, sales })).toEqual({ soldOutSeconds: 95, allPaidSeconds: 760 });
  });

  it('is never for a batch that did not sell out, or has no stock', () => {
    // Stock of 11: at most 10 were ever held or sold at once.
    expect(sellOutTimes({ openedMs: opened, stock: 11, holds, sales })).toEqual({ soldOutSeconds: null, allPaidSeconds: null });
    expect(sellOutTimes({ openedMs: opened, stock: 0, holds, sales })).toEqual({ soldOutSeconds: null, allPaidSeconds: null });
  });

  it('counts a slow sale the same way: one mask a day for three days', () => {
    const day = 86_400;
    const slow = [converted(day - 60, day), converted(2 * day - 60, 2 * day), converted(3 * day - 60, 3 * day)];
    // The third hold, 60 s before the third day ends, makes held + sold = 2 + 1 = 3.
    expect(sellOutTimes({ openedMs: opened, stock: 3, holds: slow.map((x) => x.hold), sales: slow.flatMap((x) => x.sales) })).toEqual({
      soldOutSeconds: 3 * day - 60,
      allPaidSeconds: 3 * day,
    });
  });
});

describe('bucket choice', () => {
  it('keeps a two-minute sell-out to the second and a three-day sale to half-hours', () => {
    expect(chooseBucketSeconds(120)).toBe(1);
    // 240 one-second points is the most allowed; 241 s needs 2 s steps (121 points).
    expect(chooseBucketSeconds(240)).toBe(1);
    expect(chooseBucketSeconds(241)).toBe(2);
    // 3 days = 259,200 s: 259,200 / 900 = 288 points is too many, 259,200 / 1,800 = 144 fits.
    expect(chooseBucketSeconds(3 * 86_400)).toBe(1800);
    // Past the largest step: whole days.
    expect(chooseBucketSeconds(400 * 86_400)).toBe(2 * 86_400);
  });
});

describe('the series', () => {
  it('ends a little after the last change: 760 s + max(60 s, 10%) = 836 s, not at the close three days on', () => {
    const last = lastActivityMs(holds, sales);
    expect(last).toBe(s(760));
    expect(chartEndMs(opened, s(3 * 86_400), last)).toBe(s(836));
    // …but never past the close (or now, for a drop still open).
    expect(chartEndMs(opened, s(700), last)).toBe(s(700));
  });

  it('samples held and sold at each step: 836 s in 5 s steps (836 / 2 = 418 points is too many, 836 / 5 → 168)', () => {
    const series = buildSeries({ openedMs: opened, untilMs: s(836), holds, sales });
    expect(series.bucketSeconds).toBe(5);
    expect(series.points).toHaveLength(169); // 0, 5, …, 840
    const at = (t: number) => series.points.find((p) => p.t === t);
    expect(at(0)).toEqual({ t: 0, held: 0, sold: 0 });
    expect(at(40)).toEqual({ t: 40, held: 8, sold: 0 });
    // At 60 s the first hold has become the first sale.
    expect(at(60)).toEqual({ t: 60, held: 7, sold: 1 });
    expect(at(90)).toEqual({ t: 90, held: 2, sold: 6 });
    expect(at(95)).toEqual({ t: 95, held: 4, sold: 6 });
    expect(at(150)).toEqual({ t: 150, held: 2, sold: 8 });
    // The 35 s hold expired at 635 s, the 40 s one at 640 s.
    expect(at(635)).toEqual({ t: 635, held: 1, sold: 8 });
    expect(at(640)).toEqual({ t: 640, held: 0, sold: 8 });
    expect(at(760)).toEqual({ t: 760, held: 0, sold: 10 });
    expect(series.points.every((p) => p.held + p.sold <= 10)).toBe(true);
  });

  it('counts a hold that still runs as held to the end', () => {
    const series = buildSeries({ openedMs: opened, untilMs: s(10), holds: [{ startMs: s(3), endMs: null, quantity: 2 }], sales: [], bucketSeconds: 5 });
    expect(series.points).toEqual([
      { t: 0, held: 0, sold: 0 },
      { t: 5, held: 2, sold: 0 },
      { t: 10, held: 2, sold: 0 },
    ]);
  });
});

describe('drop money', () => {
  it('is paid less refunded less card fees, to the cent', () => {
    // Six orders of €197.00 paid (118,200 cents); one refunded in full (19,700) and one's €12.00 shipping (1,200);
    // card fees of 1.5% + €0.25 on each: 19,700 × 0.015 = 295.5 → 296 (half up) + 25 = 321, × 6 = 1,926.
    // Net: 118,200 − 20,900 − 1,926 = 95,374.
    expect(dropMoney({ grossMinor: 118_200, refundedMinor: 20_900, cardFeesMinor: 1_926 })).toEqual({
      grossMinor: 118_200,
      refundedMinor: 20_900,
      cardFeesMinor: 1_926,
      netMinor: 95_374,
    });
  });

  it('refuses amounts that are not whole minor units', () => {
    expect(() => dropMoney({ grossMinor: 100.5, refundedMinor: 0, cardFeesMinor: 0 })).toThrow(RangeError);
    expect(() => dropMoney({ grossMinor: 100, refundedMinor: -1, cardFeesMinor: 0 })).toThrow(RangeError);
  });
});

describe('words and months', () => {
  it('says a stretch of time plainly', () => {
    expect(formatElapsed(45)).toBe('45 s');
    expect(formatElapsed(95)).toBe('1 min 35 s');
    expect(formatElapsed(120)).toBe('2 min');
    expect(formatElapsed(7500)).toBe('2 h 5 min');
    expect(formatElapsed(3 * 86_400 + 4 * 3600 + 59)).toBe('3 d 4 h');
  });

  it('puts a payment in the studio zone’s month', () => {
    // IANA tz database, zone Europe/Dublin: Irish Standard Time (UTC+1) from 01:00 UTC on the last Sunday of March,
    // 29 March in 2026. So 23:30 UTC on 31 March is 00:30 on 1 April in Dublin, while 22:30 UTC is still 31 March.
    expect(monthKeyInZone(new Date('2026-03-31T23:30:00Z'), 'Europe/Dublin')).toBe('2026-04');
    expect(monthKeyInZone(new Date('2026-03-31T22:30:00Z'), 'Europe/Dublin')).toBe('2026-03');
    expect(monthKeyInZone(new Date('2026-03-31T23:30:00Z'), 'UTC')).toBe('2026-03');
    // In winter Dublin keeps UTC: 23:30 UTC on 31 January is still January there.
    expect(monthKeyInZone(new Date('2026-01-31T23:30:00Z'), 'Europe/Dublin')).toBe('2026-01');
  });

  it('lists the last months across a year’s end', () => {
    expect(lastMonths('2027-02', 3)).toEqual(['2026-12', '2027-01', '2027-02']);
    expect(lastMonths('2026-12', 12)).toHaveLength(12);
    expect(lastMonths('2026-12', 12)[0]).toBe('2026-01');
  });
});
