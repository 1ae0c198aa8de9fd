import { parse } from 'csv-parse/sync';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import { minorUnitDigits } from '@/lib/money';
import { pay, waitUntil, withCheckoutWorld } from './orders/support';

let currentUser: CurrentUser | null = null;
vi.mock('@/lib/auth/session', () => ({ getCurrentUser: async () => currentUser }));

const world = withCheckoutWorld('workshop_orders');

type Batch = Awaited<ReturnType<typeof world.freshBatch>>;
type Made = { id: string; number: string };

async function paidOrder(email: string, quantity: number, batch: Batch): Promise<Made> {
  const { createHold } = await import('@/lib/drops/holds');
  const { startCheckout } = await import('@/lib/orders/checkout');
  const buyer = await world.buyer(email);
  const hold = await createHold(buyer, { batchId: batch.batchId, finishId: batch.finishId, quantity });
  const checkout = await startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: await world.irishRate(buyer, hold.id) });
  await pay(world.fake(), checkout.url);
  const order = await waitUntil(() => world.order(hold.id), (o) => o?.state === 'paid');
  return { id: order!.id, number: order!.number };
}

// Payment sets the name and e-mail the payment page collected; each order gets its own here.
const setBuyer = (order: Made, name: string, email: string) =>
  world.rows(`UPDATE orders SET buyer_name = $2, email = $3 WHERE id = $1`, [order.id, name, email]);

const HYPERLINK = '=HYPERLINK("http://example.com/x","open")';
const orders = {} as Record<'refunded' | 'formula' | 'painted' | 'oversold' | 'unpaid', Made>;
let batchA: Batch;
let batchB: Batch;
let staff: CurrentUser;
let customer: CurrentUser;

async function call(path: string, who: CurrentUser | null = staff) {
  currentUser = who;
  const url = new URL(path, 'http://127.0.0.1');
  const route = url.pathname.endsWith('/export')
    ? await import('@/app/api/workshop/orders/export/route')
    : await import('@/app/api/workshop/orders/route');
  return route.GET(new Request(url), undefined);
}

async function list(query: string) {
  const response = await call(`/api/workshop/orders?${query}`);
  expect(response.status, await response.clone().text()).toBe(200);
  return (await response.json()) as import('@/lib/orders/workshop-list').WorkshopOrdersPage;
}
const numbers = async (query: string) => (await list(`perPage=100&${query}`)).rows.map((r) => r.number);

beforeAll(async () => {
  // The expected lists below are this test's own ledger: the demo's seeded orders are cleared first.
  await world.rows(`DELETE FROM refunds WHERE order_id IS NOT NULL`);
  await world.rows(`DELETE FROM orders`);
  const { createHold } = await import('@/lib/drops/holds');
  const { startCheckout } = await import('@/lib/orders/checkout');
  const { refundOrder } = await import('@/lib/orders/refunds');
  batchA = await world.freshBatch(20, { perBuyerLimit: 3 });
  batchB = await world.freshBatch(20, { perBuyerLimit: 3 });

  orders.refunded = await paidOrder('ada@example.com', 2, batchA);
  await setBuyer(orders.refunded, 'Ada Marsh', 'ada@example.com');
  const [line] = await world.rows<{ id: string }>(`SELECT id FROM order_lines WHERE order_id = $1 ORDER BY position LIMIT 1`, [orders.refunded.id]);
  const refund = await refundOrder(await world.owner(), {
    mode: 'lines', orderId: orders.refunded.id, lineIds: [line!.id], reason: 'buyer_request', note: '', restock: false,
  });
  expect(refund.status).toBe('succeeded');

  orders.formula = await paidOrder('formula@example.com', 1, batchA);
  await setBuyer(orders.formula, HYPERLINK, '+formula@example.com');
  await world.rows(`UPDATE orders SET shipping_country = 'DE' WHERE id = $1`, [orders.formula.id]);

  orders.painted = await paidOrder('pct@example.com', 1, batchB);
  await setBuyer(orders.painted, '100% Cast_Iron', 'pct@example.com');
  // Production stages are moved by another part of the workshop; here the line is simply put there.
  await world.rows(`UPDATE order_lines SET stage = 'painted' WHERE order_id = $1`, [orders.painted.id]);

  orders.oversold = await paidOrder('late@example.com', 1, batchB);
  await setBuyer(orders.oversold, 'Bram Ostrander', 'late@example.com');
  await world.rows(`UPDATE order_lines SET oversold = true, oversold_reason = 'stock_gone', counted_in_stock = false WHERE order_id = $1`, [orders.oversold.id]);
  // The demo studio sells in euros; an order in a currency without minor units checks the CSV's decimals.
  await world.rows(`UPDATE orders SET currency = 'JPY' WHERE id = $1`, [orders.oversold.id]);

  const buyer = await world.buyer('unpaid@example.com');
  const hold = await createHold(buyer, { batchId: batchA.batchId, finishId: batchA.finishId, quantity: 1 });
  await startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: await world.irishRate(buyer, hold.id) });
  const unpaid = (await world.order(hold.id))!;
  orders.unpaid = { id: unpaid.id, number: unpaid.number };

  // Twelve more paid orders copied from one (same total, so sorting by total has ties to break), for paging.
  await world.rows(
    `WITH made AS (
       INSERT INTO orders (studio_id, batch_id, user_id, state, email, buyer_name, currency, lines_minor, shipping_minor, total_minor,
                           tax_label, tax_rate_bp, tax_included_minor, shipping_country, shipping_label, shipping_min_days, shipping_max_days,
                           chargeable_weight_g, paid_minor, paid_at, created_at)
       SELECT o.studio_id, o.batch_id, o.user_id, 'paid', 'copy' || n || '@example.com', 'Copy ' || n, o.currency, o.lines_minor, o.shipping_minor,
              o.total_minor, o.tax_label, o.tax_rate_bp, o.tax_included_minor, o.shipping_country, o.shipping_label, o.shipping_min_days,
              o.shipping_max_days, o.chargeable_weight_g, o.paid_minor, o.paid_at, o.created_at + n * interval '1 minute'
         FROM orders o, generate_series(1, 12) n WHERE o.id = $1
       RETURNING id)
     INSERT INTO order_lines (order_id, position, batch_stock_id, design_name, finish_name, unit_price_minor)
     SELECT made.id, l.position, l.batch_stock_id, l.design_name, l.finish_name, l.unit_price_minor FROM made, order_lines l WHERE l.order_id = $1`,
    [orders.painted.id],
  );

  const [hand] = await world.rows<{ id: string }>(`INSERT INTO users (email, name, role) VALUES ('hand@example.com', 'Studio Hand', 'staff') RETURNING id`);
  staff = { id: hand!.id, email: 'hand@example.com', name: 'Studio Hand', role: 'staff' };
  customer = await world.buyer('nosy@example.com');
}, 300_000);

const paidNumbers = async () => (await world.rows<{ number: string }>(`SELECT number FROM orders WHERE paid_at IS NOT NULL`)).map((r) => r.number).sort();

describe('the workshop orders list', () => {
  it('lists paid orders by default and adds unpaid ones only when asked', async () => {
    const page = await list('perPage=100');
    expect(page.rows.map((r) => r.number).sort()).toEqual(await paidNumbers());
    expect(page.total).toBe((await paidNumbers()).length);
    expect(page.rows.map((r) => r.number)).not.toContain(orders.unpaid.number);
    expect(await numbers('state=all')).toContain(orders.unpaid.number);
    expect(await numbers('state=awaiting_payment')).toEqual([orders.unpaid.number]);
    expect(await numbers('state=partly_refunded')).toEqual([orders.refunded.number]);
  });

  it('filters by batch, finish, stage, oversold, refunded and country', async () => {
    expect((await numbers('batch=' + batchA.batchId)).sort()).toEqual([orders.refunded.number, orders.formula.number].sort());
    const [otherFinish] = await world.rows<{ id: string }>(
      `SELECT f.id FROM finishes f JOIN designs d ON d.id = f.design_id WHERE d.slug = 'ibex' AND f.id <> $1 LIMIT 1`,
      [batchA.finishId],
    );
    expect((await numbers(`finish=${batchA.finishId}`)).sort()).toEqual(await paidNumbers());
    expect(await numbers(`finish=${otherFinish!.id}`)).toEqual([]);
    expect(await numbers('stage=painted')).toEqual([orders.painted.number]);
    expect(await numbers('oversold=true')).toEqual([orders.oversold.number]);
    expect(await numbers('oversold=false')).not.toContain(orders.oversold.number);
    expect((await numbers('oversold=false')).length).toBe((await paidNumbers()).length - 1);
    expect(await numbers('refunded=true')).toEqual([orders.refunded.number]);
    expect(await numbers('country=DE')).toEqual([orders.formula.number]);
    expect(await numbers(`country=DE&batch=${batchB.batchId}`)).toEqual([]);
  });

  it('sorts by each column in either direction, the same as the database would', async () => {
    const byTotal = (await list('perPage=100&sort=total&dir=asc')).rows;
    const expected = await world.rows<{ number: string }>(
      `SELECT number FROM orders WHERE paid_at IS NOT NULL ORDER BY total_minor, created_at, id`,
    );
    expect(byTotal.map((r) => r.number)).toEqual(expected.map((r) => r.number));
    const newest = await world.rows<{ number: string }>(`SELECT number FROM orders WHERE paid_at IS NOT NULL ORDER BY created_at DESC, id DESC`);
    expect(await numbers('')).toEqual(newest.map((r) => r.number));
    const up = await numbers('sort=number&dir=asc');
    expect(up).toEqual([...up].sort((a, b) => Number(a.slice(3)) - Number(b.slice(3))));
    expect(await numbers('sort=number&dir=desc')).toEqual([...up].reverse());
    const countries = (await list('perPage=100&sort=country&dir=desc')).rows.map((r) => r.country);
    expect(countries).toEqual([...countries].sort().reverse());
    expect(countries[countries.length - 1]).toBe('DE');
    const states = (await list('perPage=100&sort=state&dir=asc')).rows.map((r) => r.state);
    expect(states[states.length - 1]).toBe('partly_refunded');
  });

  it('pages through the whole view with the right totals, each order once', async () => {
    const all = await paidNumbers();
    const first = await list('perPage=10&sort=total&dir=desc');
    const second = await list('perPage=10&sort=total&dir=desc&page=2');
    expect(first).toMatchObject({ total: all.length, page: 1, perPage: 10, pageCount: Math.ceil(all.length / 10) });
    expect(first.rows).toHaveLength(10);
    expect(second.rows).toHaveLength(all.length - 10);
    expect([...first.rows, ...second.rows].map((r) => r.number).sort()).toEqual(all);
    const past = await list('perPage=10&page=9');
    expect(past).toMatchObject({ rows: [], total: all.length });
  });

  it('searches number, name and e-mail, treating % and _ as letters', async () => {
    expect(await numbers('q=%25')).toEqual([orders.painted.number]);
    expect(await numbers('q=_')).toEqual([orders.painted.number]);
    expect(await numbers('q=' + encodeURIComponent('  ADA@EXAMPLE '))).toEqual([orders.refunded.number]);
    expect(await numbers('q=ostrander')).toEqual([orders.oversold.number]);
    expect(await numbers('q=' + orders.formula.number)).toContain(orders.formula.number);
    expect(await numbers('q=nobody-by-this-name')).toEqual([]);
  });

  it('refuses people who are not studio staff, on both routes', async () => {
    for (const path of ['/api/workshop/orders', '/api/workshop/orders/export']) {
      const anonymous = await call(path, null);
      expect(anonymous.status).toBe(401);
      expect((await anonymous.json()).error.code).toBe('unauthorized');
      const buyer = await call(path, customer);
      expect(buyer.status).toBe(403);
      expect((await buyer.json()).error.code).toBe('forbidden');
    }
  });

  it('answers a bad query with 400 and a message for each field', async () => {
    for (const path of ['/api/workshop/orders', '/api/workshop/orders/export']) {
      const response = await call(`${path}?perPage=5&page=0&sort=price&dir=up&batch=nope&state=lost&stage=glazed&oversold=maybe&country=ie&q=${'x'.repeat(101)}`);
      expect(response.status).toBe(400);
      const body = await response.json();
      expect(body.error.code).toBe('invalid_query');
      const fields = body.error.details.fields as Record<string, string[]>;
      expect(Object.keys(fields).sort()).toEqual(['batch', 'country', 'dir', 'oversold', 'page', 'perPage', 'q', 'sort', 'stage', 'state']);
      expect(fields.perPage![0]).toMatch(/between 10 and 100/);
      expect(fields.country![0]).toMatch(/two-letter/);
    }
  });
});

describe('the CSV export', () => {
  async function exportCsv(query = '') {
    const response = await call(`/api/workshop/orders/export${query ? `?${query}` : ''}`);
    expect(response.status).toBe(200);
    return { response, records: parse(await response.text(), { bom: true, columns: true }) as Record<string, string>[] };
  }
  const toMinor = (value: string, currency: string) => {
    const digits = minorUnitDigits(currency);
    expect(value).toMatch(digits === 0 ? /^\d+$/ : new RegExp(`^\\d+\\.\\d{${digits}}$`));
    return Number(value.replace('.', ''));
  };

  it('is a download with a header row and one row per order of the view, ignoring paging', async () => {
    const { response, records } = await exportCsv('perPage=10&page=2');
    expect(response.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    expect(response.headers.get('content-disposition')).toMatch(/^attachment; filename="demold-orders-\d{4}-\d{2}-\d{2}\.csv"$/);
    expect(Object.keys(records[0]!)).toEqual([
      'Order number', 'Placed at (UTC)', 'Paid at (UTC)', 'Buyer name', 'Buyer e-mail', 'Country', 'State', 'Masks', 'Lines total',
      'Shipping', 'Tax included', 'Total', 'Paid', 'Refunded', 'Net', 'Currency', 'Batch', 'Designs and finishes',
    ]);
    expect(records.map((r) => r['Order number']).sort()).toEqual(await paidNumbers());
    const refunded = records.find((r) => r['Order number'] === orders.refunded.number)!;
    expect(refunded['Placed at (UTC)']).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);
    expect(refunded).toMatchObject({ State: 'Partly refunded', Masks: '2', Country: 'IE', 'Buyer e-mail': 'ada@example.com' });
    expect(refunded['Designs and finishes']).toMatch(/× 2$/);
    expect((await exportCsv('country=DE')).records.map((r) => r['Order number'])).toEqual([orders.formula.number]);
  });

  it('adds up to the ledger to the cent, currency by currency', async () => {
    const { records } = await exportCsv();
    const ledger = await world.rows<{ currency: string; lines: string; shipping: string; tax: string; total: string; paid: string; refunded: string; orders: string }>(
      `SELECT currency, sum(lines_minor) AS lines, sum(shipping_minor) AS shipping, sum(tax_included_minor) AS tax, sum(total_minor) AS total,
              sum(paid_minor) AS paid, sum(refunded_minor) AS refunded, count(*) AS orders
         FROM orders WHERE paid_at IS NOT NULL GROUP BY currency`,
    );
    expect(ledger.map((l) => l.currency).sort()).toEqual(['EUR', 'JPY']);
    for (const l of ledger) {
      const rows = records.filter((r) => r.Currency === l.currency);
      const sum = (column: string) => rows.reduce((total, r) => total + toMinor(r[column]!, l.currency), 0);
      expect(rows).toHaveLength(Number(l.orders));
      expect(sum('Lines total')).toBe(Number(l.lines));
      expect(sum('Shipping')).toBe(Number(l.shipping));
      expect(sum('Tax included')).toBe(Number(l.tax));
      expect(sum('Total')).toBe(Number(l.total));
      expect(sum('Paid')).toBe(Number(l.paid));
      expect(sum('Refunded')).toBe(Number(l.refunded));
      expect(sum('Net')).toBe(Number(l.paid) - Number(l.refunded));
    }
    expect(ledger.find((l) => l.currency === 'EUR')!.refunded).not.toBe('0');
  });

  it('defuses cells a spreadsheet would run as a formula', async () => {
    const { records } = await exportCsv('country=DE');
    expect(records[0]!['Buyer name']).toBe(`'${HYPERLINK}`);
    expect(records[0]!['Buyer e-mail']).toBe("'+formula@example.com");
  });

  it('streams in keyset batches that give the same rows, in the same order, as the table', async () => {
    const { parseWorkshopOrdersQuery, streamWorkshopOrders } = await import('@/lib/orders/workshop-list');
    for (const view of ['sort=total&dir=asc', 'sort=total&dir=desc', 'sort=number&dir=asc', 'sort=state&dir=desc', 'sort=country&dir=asc', '']) {
      const streamed: string[] = [];
      for await (const batch of streamWorkshopOrders(parseWorkshopOrdersQuery(new URLSearchParams(view)), 3)) {
        expect(batch.length).toBeLessThanOrEqual(3);
        streamed.push(...batch.map((r) => r.number));
      }
      expect(streamed, view).toEqual(await numbers(view));
    }
  });
});
