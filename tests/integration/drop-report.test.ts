import { beforeAll, describe, expect, it } from 'vitest';
import { withAppDatabase } from './support/app-database';
import { query } from './support/database';

// The drop report and the studio overview, read from rows written here with known times, in a database seeded
// the way the demo is (its Europe/Dublin studio, its designs and its sold-out Autumn batch).
// The label becomes part of a database name, so an underscore, not a hyphen.
const db = withAppDatabase('drop_report', { seed: true });
const rows = <T extends Record<string, unknown>>(text: string, params: unknown[] = []) => query<T>(db.current().url, text, params);

const reports = () => import('@/lib/reports/drop-report');
const overview = () => import('@/lib/reports/overview');

// A drop of the Moth: 3 Old Bone and 2 Verdigris, opened at T0, closed three days later.
const T0 = Date.parse('2026-06-10T17:00:00Z');
const at = (seconds: number) => new Date(T0 + seconds * 1000);
const now = Date.parse('2026-12-02T12:00:00Z');
const unitPrice = 18_500;
const shipping = 1_200;
const total = unitPrice + shipping;

let studioId = '';
let batchId = '';
const stock: Record<'oldBone' | 'verdigris', string> = { oldBone: '', verdigris: '' };
const numbers: Record<string, string> = {};

let buyers = 0;
async function buyer(): Promise<string> {
  buyers += 1;
  const [user] = await rows<{ id: string }>(`INSERT INTO users (email, name, role) VALUES ($1, $2, 'customer') RETURNING id`, [
    `report-buyer-${buyers}@example.com`,
    `Report Buyer ${buyers}`,
  ]);
  return user!.id;
}

type Hold = { stockId: string; start: number; end: number; state: 'converted' | 'expired' };
async function hold(user: string, h: Hold): Promise<string> {
  const [row] = await rows<{ id: string }>(
    `INSERT INTO holds (user_id, batch_id, batch_stock_id, quantity, state, reason, expires_at, ended_at, created_at, updated_at)
     VALUES ($1, $2, $3, 1, $4, $5, $6, $7, $8, $7) RETURNING id`,
    [user, batchId, h.stockId, h.state, h.state === 'converted' ? 'paid' : 'expired', at(h.start + 300), at(h.end), at(h.start)],
  );
  return row!.id;
}

type Order = {
  key: string; batch?: string; user: string; holdId: string | null; stockId: string; paidAt: Date; late: boolean; state: string;
  paid?: number; refunded?: number; oversold?: boolean;
};
async function order(o: Order): Promise<string> {
  const paid = o.paid ?? total;
  const [row] = await rows<{ id: string; number: string }>(
    `INSERT INTO orders (studio_id, batch_id, user_id, hold_id, state, email, buyer_name, currency, lines_minor, shipping_minor, total_minor,
                         tax_label, tax_rate_bp, tax_included_minor, shipping_country, shipping_label, shipping_min_days, shipping_max_days,
                         chargeable_weight_g, payment_intent_id, paid_minor, refunded_minor, paid_at, created_at, updated_at)
     VALUES ($1, $2, $3, $4, $5, $6, 'Report Buyer', 'EUR', $7, $8, $9, 'VAT', 0, 0, 'IE', 'Tracked post', 2, 4, 900, $10, $11, $12, $13, $13, $13)
     RETURNING id, number`,
    [studioId, o.batch ?? batchId, o.user, o.holdId, o.state, `${o.key}@example.com`, paid - shipping, shipping, paid, `pi_report_${o.key}`, paid, o.refunded ?? 0, o.paidAt],
  );
  numbers[o.key] = row!.number;
  await rows(
    `INSERT INTO order_lines (order_id, position, batch_stock_id, design_name, finish_name, unit_price_minor, counted_in_stock, oversold,
                              oversold_reason, oversold_resolution, refunded, created_at, updated_at)
     VALUES ($1, 1, $2, 'Moth', 'Old Bone', $3, $4, $5, $6, $7, $8, $9, $9)`,
    [row!.id, o.stockId, paid - shipping, !o.oversold, !!o.oversold, o.oversold ? 'stock_gone' : null, o.oversold ? 'refunded' : null, !!o.oversold, o.paidAt],
  );
  await rows(
    `INSERT INTO order_events (order_id, type, from_state, to_state, data, created_at) VALUES ($1, 'paid', 'awaiting_payment', 'paid', $2::jsonb, $3)`,
    [row!.id, JSON.stringify({ paymentIntentId: `pi_report_${o.key}`, amountMinor: paid, late: o.late, oversoldLines: o.oversold ? 1 : 0 }), o.paidAt],
  );
  return row!.id;
}

async function refund(orderId: string, key: string, amount: number, reason: string, when: Date) {
  await rows(
    `INSERT INTO refunds (order_id, payment_intent_id, stripe_refund_id, amount_minor, currency, reason, status, created_at, updated_at)
     VALUES ($1, $2, $3, $4, 'EUR', $5, 'succeeded', $6, $6)`,
    [orderId, `pi_report_${key}`, `re_report_${key}`, amount, reason, when],
  );
}

beforeAll(async () => {
  const [studio] = await rows<{ id: string }>(`SELECT id FROM studios ORDER BY created_at LIMIT 1`);
  studioId = studio!.id;
  // The card fee rate the report must use: 1.5% + €0.25 a payment.
  await rows(`UPDATE studios SET planner_defaults = planner_defaults || '{"cardFeeBasisPoints": 150, "cardFeeFixedMinor": 25}'::jsonb WHERE id = $1`, [studioId]);
  const [batch] = await rows<{ id: string }>(
    `INSERT INTO batches (design_id, name, status, per_buyer_limit, hold_minutes, opens_at, closes_at, ship_by)
     SELECT id, 'Report batch', 'scheduled', 1, 5, $1, $2, '2026-07-31' FROM designs WHERE slug = 'moth' RETURNING id`,
    [at(0), at(3 * 86_400)],
  );
  batchId = batch!.id;
  const stockRows = await rows<{ id: string; slug: string }>(
    `INSERT INTO batch_stock (batch_id, finish_id, quantity, sold)
     SELECT $1, f.id, CASE f.slug WHEN 'old-bone' THEN 3 ELSE 2 END, CASE f.slug WHEN 'old-bone' THEN 3 ELSE 2 END
       FROM finishes f JOIN designs d ON d.id = f.design_id WHERE d.slug = 'moth' AND f.slug IN ('old-bone', 'verdigris')
     RETURNING id, (SELECT slug FROM finishes WHERE id = finish_id) AS slug`,
    [batchId],
  );
  stock.oldBone = stockRows.find((r) => r.slug === 'old-bone')!.id;
  stock.verdigris = stockRows.find((r) => r.slug === 'verdigris')!.id;

  // Seconds after opening (5-minute holds):
  //   A holds Old Bone at +1 s, pays at +40 s.        B holds Old Bone at +2 s, pays at +70 s (its €12 shipping refunded later).
  //   C holds Old Bone at +3 s; the hold expires at +300 s; C pays late at +320 s, but F holds that mask since +305 s,
  //     so C's mask is oversold, and refunded in full.
  //   D holds Verdigris at +10 s, pays at +95 s.       E holds Verdigris at +20 s, pays at +130 s.
  //   F holds Old Bone at +305 s (the mask C's expired hold gave back), pays at +340 s.
  const [a, b, c, d, e, f] = [await buyer(), await buyer(), await buyer(), await buyer(), await buyer(), await buyer()];
  const ob = stock.oldBone;
  const vg = stock.verdigris;
  await order({ key: 'a', user: a, holdId: await hold(a, { stockId: ob, start: 1, end: 40, state: 'converted' }), stockId: ob, paidAt: at(40), late: false, state: 'paid' });
  const bOrder = await order({
    key: 'b', user: b, holdId: await hold(b, { stockId: ob, start: 2, end: 70, state: 'converted' }), stockId: ob, paidAt: at(70), late: false,
    state: 'partly_refunded', refunded: shipping,
  });
  await refund(bOrder, 'b', shipping, 'other', at(5 * 86_400));
  const cOrder = await order({
    key: 'c', user: c, holdId: await hold(c, { stockId: ob, start: 3, end: 300, state: 'expired' }), stockId: ob, paidAt: at(320), late: true,
    state: 'refunded', refunded: total, oversold: true,
  });
  await refund(cOrder, 'c', total, 'oversold', at(3600));
  await order({ key: 'd', user: d, holdId: await hold(d, { stockId: vg, start: 10, end: 95, state: 'converted' }), stockId: vg, paidAt: at(95), late: false, state: 'paid' });
  await order({ key: 'e', user: e, holdId: await hold(e, { stockId: vg, start: 20, end: 130, state: 'converted' }), stockId: vg, paidAt: at(130), late: false, state: 'paid' });
  await order({ key: 'f', user: f, holdId: await hold(f, { stockId: ob, start: 305, end: 340, state: 'converted' }), stockId: ob, paidAt: at(340), late: false, state: 'paid' });
});

describe('the drop report of a batch with known times', () => {
  it('says when it sold out, by which rule, and what expired, came late and was oversold', async () => {
    const report = (await (await reports()).getDropReport({ batchId, now }))!;
    expect(report.opened).toBe(true);
    expect(report.openedAt).toBe(at(0).toISOString());
    expect(report.stock).toBe(5);
    // held + sold: +1 s 1, +2 s 2, +3 s 3, +10 s 4, +20 s 5 = the stock → sold out 20 s after opening.
    // Sold alone: A +40, B +70, D +95, E +130 (4); C's +320 s payment took no stock; F +340 s makes 5.
    expect(report.sellOut).toEqual({ soldOutSeconds: 20, allPaidSeconds: 340 });
    expect(report.sold).toBe(5);
    expect(report.holds).toEqual({ total: 6, expired: 1, expiredUnits: 1, released: 0, runningNow: 0 });
    expect(report.latePayments).toBe(1);
    expect(report.oversold).toEqual({ lines: 1, refunded: 1, extraCast: 0, open: 0 });
    expect(report.refunds).toEqual({ count: 2, amountMinor: total + shipping, pending: 0 });
    // Nobody was on the Moth's waitlist for this batch.
    expect(report.waitlistConversion).toEqual({ announced: 0, buyers: 0 });
  });

  it('counts the paid orders that came from the waitlist as it stood at the opening', async () => {
    const [design] = await rows<{ id: string }>(`SELECT design_id AS id FROM batches WHERE id = $1`, [batchId]);
    const [userD] = await rows<{ id: string }>(`SELECT user_id AS id FROM orders WHERE number = $1`, [numbers.d]);
    const entry = (email: string, confirmedAt: Date, o: { userId?: string; leftAt?: Date } = {}) =>
      rows<{ id: string }>(
        `INSERT INTO waitlist_entries (design_id, email, user_id, state, source, confirmed_at, left_at)
         VALUES ($1, $2, $3, $4, 'design_page', $5, $6) RETURNING id`,
        [design!.id, email, o.userId ?? null, o.leftAt ? 'left' : 'confirmed', confirmedAt, o.leftAt ?? null],
      ).then((r) => r[0]!.id);
    // A and B by address, D by account under another address: on the list a day before the opening.
    const onList = [await entry('a@example.com', at(-86_400)), await entry('b@example.com', at(-86_400)), await entry('d-other@example.com', at(-86_400), { userId: userD!.id })];
    // E joined only after the opening, F had left before it: neither bought as a waitlisted person.
    await entry('e@example.com', at(60));
    await entry('f@example.com', at(-86_400), { leftAt: at(-60) });
    const [announcement] = await rows<{ id: string }>(
      `INSERT INTO waitlist_announcements (batch_id, kind, state, recipients) VALUES ($1, 'announced', 'queued_all', 4) RETURNING id`,
      [batchId],
    );
    for (const [i, entryId] of [...onList, null].entries()) {
      await rows(
        `INSERT INTO mail_outbox (dedupe_key, to_address, subject, html, text, status, sent_at, announcement_id, waitlist_entry_id)
         VALUES ($1, $2, 'New batch', '', '', $3, $4, $5, $6)`,
        [`waitlist:${announcement!.id}:${i}`, `person-${i}@example.com`, i < 3 ? 'sent' : 'failed', i < 3 ? at(-3600) : null, announcement!.id, entryId],
      );
    }
    const report = (await (await reports()).getDropReport({ batchId, now }))!;
    // Three messages went out (the fourth failed); orders A, B and D came from the list.
    expect(report.waitlistConversion).toEqual({ announced: 3, buyers: 3 });
  });

  it('charts held and sold at chosen seconds', async () => {
    const { series } = (await (await reports()).getDropReport({ batchId, now }))!;
    // The last change is at +340 s; the chart runs a minute past it (10% of 340 s is less), to +400 s: 400 / 240 points
    // needs a 2 s step (1 s would be 400 points).
    expect(series.bucketSeconds).toBe(2);
    expect(series.points.at(-1)!.t).toBe(400);
    const point = (t: number) => series.points.find((p) => p.t === t);
    expect(point(0)).toEqual({ t: 0, held: 0, sold: 0 });
    expect(point(2)).toEqual({ t: 2, held: 2, sold: 0 });
    expect(point(20)).toEqual({ t: 20, held: 5, sold: 0 });
    expect(point(40)).toEqual({ t: 40, held: 4, sold: 1 });
    expect(point(100)).toEqual({ t: 100, held: 2, sold: 3 });
    // C's hold expired at +300 s and E paid at +130 s: nothing is held, four are sold.
    expect(point(302)).toEqual({ t: 302, held: 0, sold: 4 });
    // F holds from +305 s; C's late payment at +320 s is oversold and does not count as sold.
    expect(point(320)).toEqual({ t: 320, held: 1, sold: 4 });
    expect(point(340)).toEqual({ t: 340, held: 0, sold: 5 });
  });

  it('adds up the money at the configured card fee rate, to the cent', async () => {
    const report = (await (await reports()).getDropReport({ batchId, now }))!;
    // Six payments of €197.00: 118,200 cents. Refunded: C's 19,700 and B's 1,200 = 20,900.
    // Card fee on each: 19,700 × 150 / 10,000 = 295.5 → 296 (half up, as the planner rounds) + 25 = 321; × 6 = 1,926.
    // Net: 118,200 − 20,900 − 1,926 = 95,374.
    expect(report.cardFee).toEqual({ basisPoints: 150, fixedMinor: 25 });
    expect(report.money).toEqual({ grossMinor: 118_200, refundedMinor: 20_900, cardFeesMinor: 1_926, netMinor: 95_374 });
    expect(report.paidOrders).toBe(6);
  });

  it('counts stock and sales by finish', async () => {
    const report = (await (await reports()).getDropReport({ batchId, now }))!;
    expect(report.finishes.map(({ name, stock: s, sold, refunded }) => ({ name, stock: s, sold, refunded }))).toEqual([
      { name: 'Old Bone', stock: 3, sold: 3, refunded: 1 },
      { name: 'Verdigris', stock: 2, sold: 2, refunded: 0 },
    ]);
  });

  it('reports the demo’s Autumn batch as its seed data times it', async () => {
    const [autumn] = await rows<{ id: string }>(`SELECT id FROM batches WHERE name = 'Autumn batch'`);
    const report = (await (await reports()).getDropReport({ batchId: autumn!.id }))!;
    // seeders/support/demo-orders.cjs: 12 masks, one per buyer. Each paid before the last hold (Maeve's, at +410 s),
    // so held + sold first reaches 12 then; her payment 163 s later (+573 s) is the last.
    expect(report.stock).toBe(12);
    expect(report.sold).toBe(12);
    expect(report.sellOut).toEqual({ soldOutSeconds: 410, allPaidSeconds: 573 });
    expect(report.latePayments).toBe(0);
    expect(report.holds.expired).toBe(0);
    expect(report.refunds.count).toBe(1);
    expect(report.paidOrders).toBe(12);
  });

  it('has nothing to show before a drop opens, and no report for a batch that does not exist', async () => {
    const [later] = await rows<{ id: string }>(
      `INSERT INTO batches (design_id, name, status, opens_at, closes_at, ship_by)
       SELECT id, 'Later batch', 'scheduled', $1, $2, '2027-03-01' FROM designs WHERE slug = 'moth' RETURNING id`,
      [new Date(now + 86_400_000), new Date(now + 4 * 86_400_000)],
    );
    const report = (await (await reports()).getDropReport({ batchId: later!.id, now }))!;
    expect(report.opened).toBe(false);
    expect(report.series.points).toEqual([]);
    expect(report.sellOut).toEqual({ soldOutSeconds: null, allPaidSeconds: null });
    expect(await (await reports()).getDropReport({ batchId: '00000000-0000-4000-8000-000000000000', now })).toBeNull();
  });
});

describe('the studio overview', () => {
  it('puts revenue in the studio zone’s months, across the end of March', async () => {
    const { revenueByMonth } = await overview();
    const before = await revenueByMonth({ timeZone: 'Europe/Dublin', now });
    // IANA tz database, Europe/Dublin: Irish Standard Time (UTC+1) began at 01:00 UTC on Sunday 29 March 2026. So a payment at
    // 22:30 UTC on 31 March is 23:30 in Dublin (March), one at 23:30 UTC is 00:30 on 1 April (April). Intl's copy of the same
    // data agrees, which is checked here too, since the report groups months in PostgreSQL.
    const dublinMonth = (iso: string) =>
      new Intl.DateTimeFormat('en-CA', { timeZone: 'Europe/Dublin', year: 'numeric', month: '2-digit' }).format(new Date(iso)).slice(0, 7);
    expect(dublinMonth('2026-03-31T22:30:00Z')).toBe('2026-03');
    expect(dublinMonth('2026-03-31T23:30:00Z')).toBe('2026-04');

    const [other] = await rows<{ id: string }>(
      `INSERT INTO batches (design_id, name, status, opens_at, closes_at, ship_by)
       SELECT id, 'Spring batch', 'scheduled', '2026-03-30T17:00:00Z', '2026-04-02T17:00:00Z', '2026-05-30' FROM designs WHERE slug = 'moth' RETURNING id`,
    );
    const user = await buyer();
    await order({ key: 'march', batch: other!.id, user, holdId: null, stockId: stock.oldBone, paidAt: new Date('2026-03-31T22:30:00Z'), late: false, state: 'paid', paid: 10_000 });
    await order({
      key: 'april', batch: other!.id, user, holdId: null, stockId: stock.oldBone, paidAt: new Date('2026-03-31T23:30:00Z'), late: false,
      state: 'partly_refunded', paid: 20_000, refunded: 5_000,
    });
    const after = await revenueByMonth({ timeZone: 'Europe/Dublin', now });

    expect(after.map((m) => m.month)).toEqual(before.map((m) => m.month));
    expect(after).toHaveLength(12);
    expect(after[0]!.month).toBe('2026-01');
    expect(after.at(-1)!.month).toBe('2026-12');
    const change = (month: string) => {
      const was = before.find((m) => m.month === month)!;
      const is = after.find((m) => m.month === month)!;
      return { paid: is.paidMinor - was.paidMinor, refunded: is.refundedMinor - was.refundedMinor, net: is.netMinor - was.netMinor, orders: is.orders - was.orders };
    };
    expect(change('2026-03')).toEqual({ paid: 10_000, refunded: 0, net: 10_000, orders: 1 });
    expect(change('2026-04')).toEqual({ paid: 20_000, refunded: 5_000, net: 15_000, orders: 1 });
    // Nowhere else moved.
    const moved = after.filter((m) => m.month !== '2026-03' && m.month !== '2026-04' && change(m.month).net !== 0);
    expect(moved).toEqual([]);
  });

  it('lists open orders past their ship-by date', async () => {
    const result = await (await overview()).loadStudioOverview({ now });
    expect(result.today).toBe('2026-12-02');
    const late = result.late.filter((o) => o.batchName === 'Report batch');
    // C was refunded in full: not open. The others ship by 31 July, 124 days before 2 December (31 + 30 + 31 + 30 + 2).
    expect(late.map((o) => o.number).sort()).toEqual([numbers.a, numbers.b, numbers.d, numbers.e, numbers.f].sort());
    expect(late.every((o) => o.daysLate === 124 && o.masksLeft === 1)).toBe(true);
  });

  it('shows the latest drop that opened before a moment, and leaves closed drops out of the next ones', async () => {
    // Ten days after the Report batch opened (and a week after it closed); the demo's own drops are timed from the
    // moment it was seeded, months later.
    const result = await (await overview()).loadStudioOverview({ now: T0 + 10 * 86_400_000 });
    expect(result.lastDrops[0]).toMatchObject({ name: 'Report batch', stock: 5, sold: 5, openedAt: at(0).toISOString() });
    expect(result.nextDrops.map((d) => d.name)).not.toContain('Report batch');
    expect(result.nextDrops.every((d) => Date.parse(d.closesAt) > T0 + 10 * 86_400_000)).toBe(true);
  });
});
