import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import { formatMoney } from '@/lib/money';
import { withAppDatabase } from './support/app-database';
import { query } from './support/database';

// The route handler is called as Next.js calls it, with the session resolved to the person given here;
// the PDF it answers is read back with pdfjs, as a viewer would read it.
let signedIn: CurrentUser | null = null;
vi.mock('@/lib/auth/session', () => ({ getCurrentUser: async () => signedIn }));

const db = withAppDatabase('packing_slips', { seed: true });
const rows = <T extends object>(text: string, params: unknown[] = []) => query<T & Record<string, unknown>>(db.current().url, text, params);

type Address = { line1: string; line2: string | null; city: string; postal_code: string; state: string | null; country: string };
type Order = { id: string; number: string; shipping_country: string; currency: string; paid_at: Date; ship_to: { name: string; address: Address } };

let staff: CurrentUser;
let owner: CurrentUser;
let buyer: CurrentUser;
let customsArea: string[];
let studioCountry: string;
let timeZone: string;
let demoOrders: Order[];
/** Demo orders picked by where they ship: two inside the studio's customs area, two outside it. */
const picked = {} as Record<'home' | 'eu' | 'gb' | 'us', Order>;

async function person(email: string): Promise<CurrentUser> {
  const [row] = await rows<CurrentUser>(`SELECT id, email, name, role FROM users WHERE email = $1`, [email]);
  return row!;
}

async function call(numbers: string[] | string, who: CurrentUser | null = staff) {
  signedIn = who;
  const url = new URL('http://127.0.0.1/api/workshop/orders/packing-slips');
  for (const n of Array.isArray(numbers) ? numbers : [numbers]) url.searchParams.append('number', n);
  const { GET } = await import('@/app/api/workshop/orders/packing-slips/route');
  return GET(new Request(url), undefined);
}

const clean = (s: string) => s.replace(/\u00a0/g, ' ').replace(/\s+/g, ' ').trim();

/** Each page's text, pieces joined by spaces, runs of white space made one. */
async function pdfPages(response: Response): Promise<string[]> {
  const data = new Uint8Array(await response.arrayBuffer());
  const pdf = await getDocument({ data, useSystemFonts: false, isEvalSupported: false }).promise;
  const pages: string[] = [];
  for (let i = 1; i <= pdf.numPages; i += 1) {
    const content = await (await pdf.getPage(i)).getTextContent();
    pages.push(clean(content.items.map((item) => ('str' in item ? item.str : '')).join(' ')));
  }
  await pdf.destroy();
  return pages;
}

async function printed(numbers: string[]) {
  const response = await call(numbers);
  expect(response.status, response.status === 200 ? '' : await response.clone().text()).toBe(200);
  return pdfPages(response);
}

const slipOf = (pages: string[], number: string) => pages.filter((p) => p.includes('Packing slip') && p.includes(`Order ${number}`));
const customsOf = (pages: string[], number: string) =>
  pages.filter((p) => p.includes('Customs declaration summary') && p.includes(`Order ${number}`));
const linesOf = (orderId: string) =>
  rows<{ design_name: string; finish_name: string; unit_price_minor: number; refunded: boolean }>(
    `SELECT design_name, finish_name, unit_price_minor, refunded FROM order_lines WHERE order_id = $1 ORDER BY position`,
    [orderId],
  );
const hsCode = async () => (await rows<{ customs_hs_code: string | null }>(`SELECT customs_hs_code FROM studios`))[0]!.customs_hs_code;
const errorOf = async (response: Response) => ((await response.json()) as { error: { code: string; message: string; details?: Record<string, unknown> } }).error;

beforeAll(async () => {
  [staff, owner, buyer] = await Promise.all([person('kit@marrowgate.example'), person('ines@marrowgate.example'), person('juno@example.com')]);
  const [studio] = await rows<{ customs_area: string[]; country: string; time_zone: string }>(`SELECT customs_area, country, time_zone FROM studios`);
  customsArea = studio!.customs_area.map((c) => c.trim());
  studioCountry = studio!.country.trim();
  timeZone = studio!.time_zone;
  demoOrders = (await rows<Order>(`SELECT id, number, shipping_country, currency, paid_at, ship_to FROM orders ORDER BY number`)).map((o) => ({
    ...o,
    shipping_country: o.shipping_country.trim(),
    currency: o.currency.trim(),
  }));
  const by = (test: (o: Order) => boolean, what: string) => {
    const found = demoOrders.find(test);
    if (!found) throw new Error(`The demo has no order that ${what}`);
    return found;
  };
  picked.home = by((o) => o.shipping_country === studioCountry, 'stays in the studio’s country');
  picked.eu = by((o) => o.shipping_country !== studioCountry && customsArea.includes(o.shipping_country), 'goes elsewhere in the customs area');
  picked.gb = by((o) => o.shipping_country === 'GB', 'goes to GB');
  picked.us = by((o) => o.shipping_country === 'US', 'goes to the US');
  // GB and US are outside the EU customs union (recalled from memory); the seed's customs area says so too.
  expect(customsArea).not.toContain('GB');
  expect(customsArea).not.toContain('US');
});

describe('packing slips and customs summaries as one PDF', () => {
  it('prints a slip per order and a customs summary only for the parcels that leave the customs area', async () => {
    const numbers = [picked.home, picked.gb, picked.eu, picked.us].map((o) => o.number);
    const response = await call(numbers);
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('application/pdf');
    expect(response.headers.get('content-disposition')).toBe(`inline; filename="packing-slips-${numbers[0]}.pdf"`);
    const pages = await pdfPages(response);

    // One slip page each (one mask per demo order), plus one declaration each for GB and US.
    expect(pages).toHaveLength(4 + 2);
    const countries = new Intl.DisplayNames(['en'], { type: 'region' });
    for (const order of [picked.home, picked.gb, picked.eu, picked.us]) {
      const [slip, ...more] = slipOf(pages, order.number);
      expect(more).toEqual([]);
      const a = order.ship_to.address;
      for (const line of [order.ship_to.name, a.line1, a.line2, `${a.postal_code} ${a.city}`, a.state, countries.of(a.country)]) {
        if (line) expect(slip).toContain(line);
      }
      const placed = new Intl.DateTimeFormat('en-IE', { day: 'numeric', month: 'long', year: 'numeric', timeZone }).format(order.paid_at);
      expect(slip).toContain(`Placed ${placed}`);
      for (const line of await linesOf(order.id)) {
        expect(slip).toContain(line.design_name);
        expect(slip).toContain(line.finish_name);
      }
      const declared = !customsArea.includes(order.shipping_country) && order.shipping_country !== studioCountry;
      expect(customsOf(pages, order.number)).toHaveLength(declared ? 1 : 0);
      expect(slip).toContain(`${order.number} · Page 1 of ${declared ? 2 : 1}`);
    }
    const [gbCustoms] = customsOf(pages, picked.gb.number);
    expect(gbCustoms).toContain(`${picked.gb.number} · Page 2 of 2`);
    expect(gbCustoms).toContain('Nature of the shipment: Sale of goods');
    expect(gbCustoms).toContain('Country of origin: Ireland (IE)');
  });

  it('prints names and addresses in any Latin, Greek or Cyrillic script as written', async () => {
    const order = picked.eu;
    await rows(
      `UPDATE orders SET buyer_name = 'Åsa Ní Bhriain',
              ship_to = jsonb_set(jsonb_set(ship_to, '{name}', '"Åsa Ní Bhriain"'), '{address,line2}', '"Οδός Ερμού 3, кв. Жёлтая"')
        WHERE id = $1`,
      [order.id],
    );
    const [slip] = slipOf(await printed([order.number]), order.number);
    expect(slip).toContain('Åsa Ní Bhriain');
    expect(slip).toContain('Οδός Ερμού 3, кв. Жёлтая');
  });

  it('puts the buyer’s note on the slip for the packer, and nothing when there is none', async () => {
    const order = picked.eu;
    expect(slipOf(await printed([order.number]), order.number)[0]).not.toContain('Note from the buyer');
    await rows(`UPDATE orders SET buyer_note = 'A gift: no price inside, please.' WHERE id = $1`, [order.id]);
    expect(slipOf(await printed([order.number]), order.number)[0]).toContain(clean('Note from the buyer: A gift: no price inside, please.'));
    await rows(`UPDATE orders SET buyer_note = NULL WHERE id = $1`, [order.id]);
  });

  it('declares the lines still to be sent, valued in the order’s currency, with the HS code from the settings', async () => {
    const order = picked.us;
    // A second mask, and a third that was refunded: the declaration counts only what is in the parcel.
    await rows(
      `INSERT INTO order_lines (order_id, position, batch_stock_id, design_name, finish_name, unit_price_minor, refunded)
       SELECT order_id, 2, batch_stock_id, design_name, 'Old Bone', 21550, false FROM order_lines WHERE order_id = $1 AND position = 1
       UNION ALL
       SELECT order_id, 3, batch_stock_id, design_name, 'Verdigris', 19900, true FROM order_lines WHERE order_id = $1 AND position = 1`,
      [order.id],
    );
    const lines = await linesOf(order.id);
    const sent = lines.filter((l) => !l.refunded);
    expect(sent).toHaveLength(2);
    const total = sent.reduce((sum, l) => sum + l.unit_price_minor, 0);

    const before = await hsCode();
    expect(before).toMatch(/^\d{6,10}$/);
    let pages = await printed([order.number]);
    expect(pages).toHaveLength(2);
    const [slip] = slipOf(pages, order.number);
    const [customs] = customsOf(pages, order.number);
    expect(slip).toContain('In this parcel: 2 masks');
    expect(slip).not.toContain('Verdigris');
    expect(customs).not.toContain('Verdigris');
    expect(customs).toContain(`HS code: ${before}`);
    expect(customs).toContain(`Total quantity: 2`);
    expect(customs).toContain(clean(`Total value: ${formatMoney({ amountMinor: total, currency: order.currency })} ${order.currency}`));
    for (const line of sent) expect(customs).toContain(clean(`${formatMoney({ amountMinor: line.unit_price_minor, currency: order.currency })} ${order.currency}`));
    // The gross weight is what the parcel weighs, the masks' packed weights, not the volumetric weight checkout charged by.
    const [weights] = await rows<{ gross: number; chargeable: number }>(
      `SELECT sum(d.parcel_weight_g)::int AS gross, min(o.chargeable_weight_g) AS chargeable
         FROM orders o JOIN order_lines l ON l.order_id = o.id AND NOT l.refunded
         JOIN batch_stock s ON s.id = l.batch_stock_id JOIN batches b ON b.id = s.batch_id JOIN designs d ON d.id = b.design_id
        WHERE o.id = $1`,
      [order.id],
    );
    const { gross, chargeable } = weights!;
    expect(customs).toContain(clean(`Total gross weight: ${new Intl.NumberFormat('en-IE').format(gross)} g`));
    if (gross !== chargeable) expect(customs).not.toContain(clean(`Total gross weight: ${new Intl.NumberFormat('en-IE').format(chargeable)} g`));

    await rows(`UPDATE studios SET customs_hs_code = '39264000'`);
    pages = await printed([order.number]);
    expect(customsOf(pages, order.number)[0]).toContain('HS code: 39264000');
    expect(customsOf(pages, order.number)[0]).not.toContain(`HS code: ${before}`);
    await rows(`UPDATE studios SET customs_hs_code = $1`, [before]);
  });

  it('asks the owner to choose an HS code before a declaration is needed, but still prints parcels that stay inside', async () => {
    const before = await hsCode();
    await rows(`UPDATE studios SET customs_hs_code = NULL`);
    try {
      const refused = await call([picked.home.number, picked.gb.number]);
      expect(refused.status).toBe(409);
      const error = await errorOf(refused);
      expect(error.code).toBe('customs_settings_missing');
      expect(error.message).toContain(picked.gb.number);
      expect(error.message).toContain('Settings → Customs');
      expect(error.details).toMatchObject({ numbers: [picked.gb.number], missing: ['hsCode'] });

      expect(await printed([picked.home.number, picked.eu.number])).toHaveLength(2);
    } finally {
      await rows(`UPDATE studios SET customs_hs_code = $1`, [before]);
    }
  });

  it('notes on each order that its slip was printed, by whom', async () => {
    const order = picked.home;
    const count = async () =>
      (await rows<{ n: number }>(`SELECT count(*)::int AS n FROM order_events WHERE order_id = $1 AND type = 'packing_slip_printed' AND actor_user_id = $2`, [order.id, owner.id]))[0]!.n;
    const was = await count();
    const response = await call([order.number], owner);
    expect(response.status).toBe(200);
    expect(await count()).toBe(was + 1);
  });
});

describe('what the packing-slip route refuses', () => {
  it('is for the studio: sign in first, and buyers may not print', async () => {
    expect((await call(picked.home.number, null)).status).toBe(401);
    const forbidden = await call(picked.home.number, buyer);
    expect(forbidden.status).toBe(403);
    expect((await errorOf(forbidden)).code).toBe('forbidden');
  });

  it('needs at least one order number, each shaped like one', async () => {
    const none = await call([]);
    expect(none.status).toBe(400);
    expect((await errorOf(none)).message).toMatch(/at least one order/);

    const malformed = await call([picked.home.number, 'DM-10x1']);
    expect(malformed.status).toBe(400);
    const error = await errorOf(malformed);
    expect(error.code).toBe('invalid_query');
    expect(error.message).toContain('"DM-10x1"');
    expect((await call('1001')).status).toBe(400);
  });

  it('prints at most 200 orders at a time', async () => {
    const many = Array.from({ length: 201 }, (_, i) => `DM-${9000 + i}`);
    const refused = await call(many);
    expect(refused.status).toBe(400);
    expect((await errorOf(refused)).message).toContain('at most 200');
    // 200 is allowed: these are simply unknown.
    expect((await call(many.slice(0, 200))).status).toBe(404);
  });

  it('names the numbers that match no order', async () => {
    const response = await call([picked.home.number, 'DM-0000', 'DM-99999']);
    expect(response.status).toBe(404);
    const error = await errorOf(response);
    expect(error.code).toBe('order_not_found');
    expect(error.message).toContain('DM-0000');
    expect(error.message).toContain('DM-99999');
    expect(error.message).not.toContain(picked.home.number);
    expect(error.details).toEqual({ numbers: ['DM-0000', 'DM-99999'] });
  });

  it('refuses an order that was never paid: there is nothing to pack', async () => {
    const spare = demoOrders.find((o) => !Object.values(picked).some((p) => p.id === o.id))!;
    await rows(
      `UPDATE orders SET state = 'cancelled', paid_at = NULL, paid_minor = 0, refunded_minor = 0, cancelled_at = now() WHERE id = $1`,
      [spare.id],
    );
    const response = await call([picked.home.number, spare.number]);
    expect(response.status).toBe(409);
    const error = await errorOf(response);
    expect(error.code).toBe('order_not_paid');
    expect(error.message).toContain(spare.number);
  });
});
