import { describe, expect, it } from 'vitest';
import demo from '@/seeders/support/demo-people.json';
import { withAppDatabase } from './support/app-database';
import { query, sequelizeCli } from './support/database';

// The demo's sold-out Autumn batch, seeded the way the demo seeds it, read through the workshop's own queries.
const db = withAppDatabase('demo_orders', { seed: true });
const rows = <T extends object>(text: string, params: unknown[] = []) => query<T & Record<string, unknown>>(db.current().url, text, params);

async function autumnBatch() {
  const [batch] = await rows<{ id: string; opens_at: Date; closes_at: Date; studio_id: string }>(
    `SELECT b.id, b.opens_at, b.closes_at, d.studio_id FROM batches b JOIN designs d ON d.id = b.design_id WHERE b.name = 'Autumn batch'`,
  );
  return batch!;
}

type OrderRow = {
  id: string; number: string; state: string; user_id: string; email: string; lines_minor: number; shipping_minor: number; total_minor: number;
  tax_rate_bp: number; tax_included_minor: number; shipping_country: string; shipping_rate_id: string; chargeable_weight_g: number;
  paid_minor: number; refunded_minor: number; paid_at: Date; currency: string;
};
const ordersOf = (batchId: string) => rows<OrderRow>(`SELECT * FROM orders WHERE batch_id = $1 ORDER BY number`, [batchId]);
const linesOf = (batchId: string) =>
  rows<{ id: string; order_id: string; stage: string; unit_price_minor: number; batch_stock_id: string; counted_in_stock: boolean; refunded: boolean }>(
    `SELECT l.* FROM order_lines l JOIN orders o ON o.id = l.order_id WHERE o.batch_id = $1`,
    [batchId],
  );

describe('the demo orders of the sold-out Autumn batch', () => {
  it('puts masks in every board stage, plus shipped and a failed casting, on the board and in the orders table', async () => {
    const batch = await autumnBatch();
    const stages = new Set((await linesOf(batch.id)).map((line) => line.stage));
    for (const stage of ['to_cast', 'cast', 'trimmed', 'painted', 'packed', 'shipped', 'failed_casting']) expect(stages).toContain(stage);

    const { listBoardLines } = await import('@/lib/production/board');
    const { boardStages } = await import('@/lib/production/stages');
    const board = new Set((await listBoardLines({ batchId: batch.id })).map((line) => line.stage));
    for (const stage of boardStages) expect(board).toContain(stage);

    const { listWorkshopOrderPage, parseWorkshopOrdersQuery } = await import('@/lib/orders/workshop-list');
    const page = await listWorkshopOrderPage(parseWorkshopOrdersQuery(new URLSearchParams({ batch: batch.id, perPage: '100' })));
    expect(page.total).toBe((await ordersOf(batch.id)).length);
    expect(page.rows.map((row) => row.state)).toEqual(expect.arrayContaining(['paid', 'in_production', 'shipped', 'partly_refunded']));
  });

  it('prices every order as checkout does: the catalogue price per mask, the zone rate for the parcel, tax included', async () => {
    const { chargeableWeightG, parcelFor, quote, shippingOptionsFor, zoneFor } = await import('@/lib/checkout/pricing');
    const { loadShippingZones } = await import('@/lib/orders/shipping');
    const batch = await autumnBatch();
    const zones = await loadShippingZones(batch.studio_id);
    const [design] = await rows<{ length: number; width: number; height: number; weight: number; divisor: number }>(
      `SELECT d.parcel_length_mm AS length, d.parcel_width_mm AS width, d.parcel_height_mm AS height, d.parcel_weight_g AS weight,
              st.volumetric_divisor AS divisor
         FROM batches b JOIN designs d ON d.id = b.design_id JOIN studios st ON st.id = d.studio_id WHERE b.id = $1`,
      [batch.id],
    );
    const catalogue = await rows<{ stock_id: string; price: number }>(
      `SELECT s.id AS stock_id, d.base_price_minor + f.price_difference_minor AS price
         FROM batch_stock s JOIN finishes f ON f.id = s.finish_id JOIN designs d ON d.id = f.design_id WHERE s.batch_id = $1`,
      [batch.id],
    );
    const priceOf = new Map(catalogue.map((row) => [row.stock_id, row.price]));
    const lines = await linesOf(batch.id);
    const orders = await ordersOf(batch.id);
    expect(orders.length).toBeGreaterThan(0);

    for (const order of orders) {
      const own = lines.filter((line) => line.order_id === order.id);
      expect(own.length).toBeGreaterThanOrEqual(1);
      for (const line of own) expect(line.unit_price_minor).toBe(priceOf.get(line.batch_stock_id));
      expect(order.lines_minor).toBe(own.reduce((sum, line) => sum + line.unit_price_minor, 0));

      const parcel = parcelFor({ lengthMm: design!.length, widthMm: design!.width, heightMm: design!.height, weightG: design!.weight }, own.length);
      const weight = chargeableWeightG(parcel, design!.divisor);
      expect(order.chargeable_weight_g).toBe(weight);
      const option = shippingOptionsFor(zoneFor(zones, order.shipping_country)!, weight).find((o) => o.rateId === order.shipping_rate_id);
      expect(option, `${order.number} ships by a rate offered to ${order.shipping_country}`).toBeDefined();
      const priced = quote(order.currency, own.map((line) => ({ unitPriceMinor: line.unit_price_minor, quantity: 1 })), option!.amountMinor, order.tax_rate_bp);
      expect([order.shipping_minor, order.total_minor, order.tax_included_minor]).toEqual([priced.shippingMinor, priced.totalMinor, priced.taxIncludedMinor]);
      expect(order.total_minor).toBe(order.lines_minor + order.shipping_minor);
      expect(order.paid_minor).toBe(order.total_minor);
    }
    // Most buyers are in Ireland, some elsewhere in the EU and some outside it.
    const countries = orders.map((order) => order.shipping_country);
    expect(countries.filter((c) => c === 'IE').length).toBeGreaterThan(orders.length / 2);
    expect(new Set(countries.map((c) => zoneFor(zones, c)!.name)).size).toBeGreaterThanOrEqual(3);
  });

  it('sold out in the first minutes, numbered from the sequence in the order checkouts started', async () => {
    const batch = await autumnBatch();
    const orders = await rows<{ number: string; paid_at: Date; created_at: Date }>(
      `SELECT number, paid_at, created_at FROM orders WHERE batch_id = $1 ORDER BY created_at`,
      [batch.id],
    );
    for (const order of orders) {
      expect(order.number).toMatch(/^DM-\d{4,}$/);
      expect(order.paid_at.getTime()).toBeGreaterThan(batch.opens_at.getTime());
      expect(order.paid_at.getTime() - batch.opens_at.getTime()).toBeLessThan(15 * 60_000);
    }
    const numbers = orders.map((order) => Number(order.number.slice(3)));
    expect(numbers).toEqual([...numbers].sort((a, b) => a - b));
  });

  it('each order’s state and history follow its masks: paid, stage moves step by step, and the refund', async () => {
    const batch = await autumnBatch();
    const orders = await ordersOf(batch.id);
    const lines = await linesOf(batch.id);
    for (const order of orders) {
      const own = lines.filter((line) => line.order_id === order.id);
      const events = await rows<{ type: string; from_state: string | null; to_state: string | null; data: { lineId?: string; from?: string; to?: string; refundId?: string } }>(
        `SELECT type, from_state, to_state, data FROM order_events WHERE order_id = $1 ORDER BY created_at, id`,
        [order.id],
      );
      expect(events.filter((e) => e.type === 'paid').map((e) => e.to_state)).toEqual(['paid']);
      // Replaying the moves brings every mask from the mold queue to where it is now.
      for (const line of own) {
        let stage = 'to_cast';
        for (const move of events.filter((e) => e.type === 'line_stage' && e.data.lineId === line.id)) {
          expect(move.data.from).toBe(stage);
          stage = move.data.to!;
        }
        expect(stage).toBe(line.stage);
      }
      const refunds = await rows<{ id: string; amount_minor: number; status: string }>(`SELECT id, amount_minor, status FROM refunds WHERE order_id = $1`, [order.id]);
      expect(order.refunded_minor).toBe(refunds.filter((r) => r.status === 'succeeded').reduce((sum, r) => sum + r.amount_minor, 0));
      const started = own.some((line) => line.stage !== 'to_cast');
      const expected =
        order.refunded_minor >= order.paid_minor ? 'refunded'
        : order.refunded_minor > 0 ? 'partly_refunded'
        : own.every((line) => line.stage === 'shipped') ? 'shipped'
        : started ? 'in_production'
        : 'paid';
      expect(order.state, order.number).toBe(expected);
      // The last state an event records is the order's state now.
      expect(events.filter((e) => e.to_state !== null).at(-1)?.to_state).toBe(order.state);
      for (const refund of refunds) expect(events.some((e) => e.type === 'refunded' && e.data.refundId === refund.id)).toBe(true);
    }
    const partly = orders.filter((order) => order.state === 'partly_refunded');
    expect(partly.length).toBe(1);
    const { getOrderByNumber } = await import('@/lib/orders/queries');
    const view = (await getOrderByNumber(partly[0]!.number))!;
    expect(view.refunds.map((r) => r.status)).toEqual(['succeeded']);
    expect(view.refundedMinor).toBeLessThan(view.paidMinor);
  });

  it('records each shipped order’s parcel: the demo carrier, a tracking number and the link made from the carrier’s template', async () => {
    const { carriers } = await import('@/seeders/support/demo-settings.cjs');
    const batch = await autumnBatch();
    const orders = await rows<{ id: string; number: string; state: string; carrier_name: string | null; tracking_number: string | null; tracking_url: string | null; shipped_at: Date | null }>(
      `SELECT id, number, state, carrier_name, tracking_number, tracking_url, shipped_at FROM orders WHERE batch_id = $1 ORDER BY number`,
      [batch.id],
    );
    const shipped = orders.filter((order) => order.state === 'shipped');
    expect(shipped.length).toBeGreaterThan(0);
    // The carrier as the settings seed it, read back from the database.
    const [carrier] = await rows<{ name: string; tracking_url_template: string }>(`SELECT name, tracking_url_template FROM carriers WHERE name = 'Harbour Post'`);
    expect(carriers.map((c: { name: string }) => c.name)).toContain(carrier!.name);
    const numbers = new Set<string>();
    for (const order of shipped) {
      expect(order.carrier_name, order.number).toBe('Harbour Post');
      expect(order.tracking_number, order.number).toMatch(/^[A-Z0-9][A-Z0-9 -]{0,39}$/);
      numbers.add(order.tracking_number!);
      // Parsed by the WHATWG URL parser: the template's address, with the number as the query value it stands for.
      const url = new URL(order.tracking_url!);
      const template = new URL(carrier!.tracking_url_template.replace('{tracking}', 'N'));
      expect([url.protocol, url.host, url.pathname]).toEqual([template.protocol, template.host, template.pathname]);
      expect(url.searchParams.get([...template.searchParams.keys()][0]!)).toBe(order.tracking_number);
      const [event] = await rows<{ created_at: Date; data: Record<string, unknown> }>(
        `SELECT created_at, data FROM order_events WHERE order_id = $1 AND type = 'shipped'`,
        [order.id],
      );
      expect(event!.created_at.getTime()).toBe(order.shipped_at!.getTime());
      expect(event!.data).toMatchObject({ carrierName: 'Harbour Post', trackingNumber: order.tracking_number, trackingUrl: order.tracking_url });
    }
    expect(numbers.size).toBe(shipped.length);
    for (const order of orders.filter((o) => o.state !== 'shipped')) {
      expect([order.carrier_name, order.tracking_number, order.tracking_url, order.shipped_at], order.number).toEqual([null, null, null, null]);
    }
    // On a fresh database the rule "shipped has carrier and tracking" is checked for every row.
    const [rule] = await rows<{ convalidated: boolean }>(`SELECT convalidated FROM pg_constraint WHERE conname = 'orders_shipped_has_tracking'`);
    expect(rule!.convalidated).toBe(true);
  });

  it('counts every mask as sold in its finish, and keeps quantity = available + held + sold', async () => {
    const batch = await autumnBatch();
    const lines = await linesOf(batch.id);
    const stock = await rows<{ id: string; quantity: number; available: number; held: number; sold: number }>(
      `SELECT id, quantity, available, held, sold FROM batch_stock WHERE batch_id = $1`,
      [batch.id],
    );
    for (const row of stock) {
      expect(row.sold).toBe(lines.filter((line) => line.batch_stock_id === row.id && line.counted_in_stock).length);
      expect(row.quantity).toBe(row.available + row.held + row.sold);
    }
    expect(lines.every((line) => line.counted_in_stock)).toBe(true);
  });

  it('buys with invented customers at reserved e-mail domains, none of them a demo person', async () => {
    const batch = await autumnBatch();
    const buyers = await rows<{ email: string; name: string; role: string }>(
      `SELECT u.email, u.name, u.role FROM orders o JOIN users u ON u.id = o.user_id WHERE o.batch_id = $1`,
      [batch.id],
    );
    expect(buyers.length).toBe((await ordersOf(batch.id)).length);
    expect(new Set(buyers.map((b) => b.email)).size).toBe(buyers.length);
    const demoPeople = new Set(demo.people.flatMap((p) => [p.email, p.name]));
    for (const buyer of buyers) {
      expect(buyer.role).toBe('customer');
      expect(buyer.email).toMatch(/@(example\.(com|net|org)|[a-z0-9-]+\.example)$/);
      expect(demoPeople.has(buyer.email) || demoPeople.has(buyer.name)).toBe(false);
    }
    // The demo buyers' own accounts stay without orders.
    const demoBuyers = demo.people.filter((p) => p.role === 'customer').map((p) => p.email);
    expect(await rows(`SELECT o.id FROM orders o JOIN users u ON u.id = o.user_id WHERE u.email = ANY($1)`, [demoBuyers])).toEqual([]);
  });

  it('down removes exactly what up added, and up again gives the same data', async () => {
    const counts = async () =>
      (
        await rows<{ users: number; orders: number; lines: number; events: number; refunds: number; holds: number; allowances: number; sessions: number; stock: string }>(
          `SELECT (SELECT count(*) FROM users)::int AS users, (SELECT count(*) FROM orders)::int AS orders,
                  (SELECT count(*) FROM order_lines)::int AS lines, (SELECT count(*) FROM order_events)::int AS events,
                  (SELECT count(*) FROM refunds)::int AS refunds, (SELECT count(*) FROM holds)::int AS holds,
                  (SELECT count(*) FROM buyer_allowances)::int AS allowances, (SELECT count(*) FROM checkout_sessions)::int AS sessions,
                  (SELECT json_agg(s ORDER BY s.id) FROM (SELECT id, quantity, held, sold FROM batch_stock) s)::text AS stock`,
        )
      )[0]!;
    const before = await counts();
    expect(before.orders).toBeGreaterThan(0);

    sequelizeCli(db.current().url, ['db:seed:undo', '--seed', '20261204100000-demo-orders.cjs']);
    const after = await counts();
    // The seed has no other orders, holds or refunds, so none are left; the stock is untouched.
    expect(after).toEqual({ ...before, users: after.users, orders: 0, lines: 0, events: 0, refunds: 0, holds: 0, allowances: 0, sessions: 0 });
    expect(before.users - after.users).toBe(before.orders);

    sequelizeCli(db.current().url, ['db:seed', '--seed', '20261204100000-demo-orders.cjs']);
    expect(await counts()).toEqual(before);
  });
});
