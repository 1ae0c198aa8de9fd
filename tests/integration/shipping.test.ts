import pg from 'pg';
import { beforeAll, describe, expect, it } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import { withAppDatabase } from './support/app-database';
import { query } from './support/database';

// Shipping an order and telling its buyer, against the seeded demo studio (its carriers and the sold-out
// Autumn batch). Each test makes its own paid order, modelled on a demo one, with masks at the stages it needs.
const db = withAppDatabase('shipping', { seed: true });
const rows = <T extends object>(text: string, params: unknown[] = []) => query<T & Record<string, unknown>>(db.current().url, text, params);

let kit: CurrentUser;
let ines: CurrentUser;
let carrier: { id: string; name: string; tracking_url_template: string };
beforeAll(async () => {
  const people = await rows<CurrentUser>(`SELECT id, email, name, role FROM users WHERE email IN ('kit@marrowgate.example', 'ines@marrowgate.example')`);
  kit = people.find((p) => p.email === 'kit@marrowgate.example')!;
  ines = people.find((p) => p.email === 'ines@marrowgate.example')!;
  expect([kit?.role, ines?.role]).toEqual(['staff', 'owner']);
  carrier = (await rows<typeof carrier>(`SELECT id, name, tracking_url_template FROM carriers WHERE name = 'Harbour Post'`))[0]!;
  expect(carrier).toBeDefined();
});

type Order = { id: string; number: string; lineIds: string[] };

/** A paid order like the demo's packed one, with one mask per given stage. */
async function orderWith(stages: string[], state = 'in_production'): Promise<Order> {
  const [order] = await rows<{ id: string; number: string }>(
    `INSERT INTO orders (studio_id, batch_id, user_id, state, email, buyer_name, currency, lines_minor, shipping_minor, total_minor, tax_label,
                         tax_rate_bp, tax_included_minor, shipping_country, shipping_rate_id, shipping_label, shipping_min_days, shipping_max_days,
                         chargeable_weight_g, ship_to, paid_minor, paid_at)
     SELECT studio_id, batch_id, user_id, $1, email, buyer_name, currency, lines_minor, shipping_minor, total_minor, tax_label, tax_rate_bp,
            tax_included_minor, shipping_country, shipping_rate_id, shipping_label, shipping_min_days, shipping_max_days, chargeable_weight_g,
            ship_to, total_minor, paid_at
       FROM orders WHERE email = 'sive.marlow@example.com' AND hold_id IS NOT NULL RETURNING id, number`,
    [state],
  );
  const lineIds: string[] = [];
  for (const [index, stage] of stages.entries()) {
    const [line] = await rows<{ id: string }>(
      `INSERT INTO order_lines (order_id, position, batch_stock_id, design_name, finish_name, unit_price_minor, stage)
       SELECT $1, $2, l.batch_stock_id, l.design_name, l.finish_name, l.unit_price_minor, $3
         FROM order_lines l JOIN orders o ON o.id = l.order_id WHERE o.email = 'sive.marlow@example.com' AND o.hold_id IS NOT NULL RETURNING id`,
      [order!.id, index + 1, stage],
    );
    lineIds.push(line!.id);
  }
  return { ...order!, lineIds };
}

const stagesOf = async (order: Order) => (await rows<{ stage: string }>(`SELECT stage FROM order_lines WHERE order_id = $1 ORDER BY position`, [order.id])).map((r) => r.stage);
const orderRow = async (order: Order) =>
  (await rows<{ state: string; carrier_name: string | null; tracking_number: string | null; tracking_url: string | null; shipped_at: Date | null; ship_to: unknown }>(
    `SELECT state, carrier_name, tracking_number, tracking_url, shipped_at, ship_to FROM orders WHERE id = $1`,
    [order.id],
  ))[0]!;
const eventsOf = (order: Order, type: string) =>
  rows<{ from_state: string | null; to_state: string | null; actor_user_id: string | null; data: Record<string, unknown> }>(
    `SELECT from_state, to_state, actor_user_id, data FROM order_events WHERE order_id = $1 AND type = $2 ORDER BY id`,
    [order.id, type],
  );
const auditsOf = (order: Order, action: string) =>
  rows<{ actor_label: string; before: unknown; after: Record<string, unknown> }>(
    `SELECT actor_label, before, after FROM audit_log WHERE action = $2 AND subject_type = 'order' AND subject_id = $1 ORDER BY id`,
    [order.id, action],
  );
const mailsOf = (order: Order, prefix: string) =>
  rows<{ dedupe_key: string; to_address: string; subject: string; text: string; html: string }>(
    `SELECT dedupe_key, to_address, subject, text, html FROM mail_outbox WHERE dedupe_key LIKE $1 || ':' || $2 || '%' ORDER BY id`,
    [prefix, order.id],
  );

/** Every absolute https link in a text, parsed by the WHATWG URL parser (Node's global URL). */
const linksIn = (text: string) => [...text.matchAll(/https:\/\/[^\s\]<>"]+/g)].map((m) => new URL(m[0]));

describe('shipping an order', () => {
  it('is refused until every mask still to go is packed, naming what is not, and writes nothing', async () => {
    const { shipOrder } = await import('@/lib/orders/shipping-actions');
    const order = await orderWith(['packed', 'painted']);
    await expect(shipOrder(kit, { number: order.number, carrierId: carrier.id, trackingNumber: 'HP 1000 0001 IE' })).rejects.toMatchObject({
      code: 'not_packed',
      status: 409,
      message: expect.stringMatching(/mask 2 \(.+\) is at “Painted”/),
    });
    expect(await stagesOf(order)).toEqual(['packed', 'painted']);
    expect(await orderRow(order)).toMatchObject({ state: 'in_production', carrier_name: null, tracking_number: null, shipped_at: null });
    expect(await eventsOf(order, 'line_stage')).toEqual([]);
    expect(await eventsOf(order, 'shipped')).toEqual([]);
    expect(await mailsOf(order, 'order-shipped')).toEqual([]);
  });

  it('leaves a refunded mask out of the rule: the packed rest ships', async () => {
    const { shipOrder } = await import('@/lib/orders/shipping-actions');
    const order = await orderWith(['packed', 'trimmed']);
    await rows(`UPDATE order_lines SET refunded = true WHERE id = $1`, [order.lineIds[1]]);
    await shipOrder(kit, { number: order.number, carrierId: carrier.id, trackingNumber: 'HP 1000 0002 IE' });
    expect(await stagesOf(order)).toEqual(['shipped', 'trimmed']);
  });

  it('refuses control characters and other stray characters in the tracking number, with words a person can act on', async () => {
    const { shipOrder } = await import('@/lib/orders/shipping-actions');
    const order = await orderWith(['packed']);
    const attempt = (trackingNumber: string) => shipOrder(kit, { number: order.number, carrierId: carrier.id, trackingNumber });
    // U+0009 (tab) and U+0000 (NUL) are in Unicode's Cc category; U+200B is not, but it is not a letter or digit either.
    await expect(attempt('HP\t1000')).rejects.toMatchObject({ code: 'invalid_input', status: 422, message: expect.stringContaining('U+0009') });
    await expect(attempt('HP1000\u0000')).rejects.toMatchObject({ message: expect.stringContaining('invisible character') });
    await expect(attempt('HP#1000')).rejects.toMatchObject({ message: expect.stringContaining('remove “#”') });
    await expect(attempt('   ')).rejects.toMatchObject({ message: expect.stringContaining('Enter the tracking number') });
    await expect(attempt('X'.repeat(41))).rejects.toMatchObject({ message: expect.stringContaining('at most 40') });
    expect(await stagesOf(order)).toEqual(['packed']);
    expect((await orderRow(order)).tracking_number).toBeNull();

    // Spaces around it go, runs of spaces become one, and letters are taken in capitals.
    await attempt('  hp  1000-2 ie ');
    expect((await orderRow(order)).tracking_number).toBe('HP 1000-2 IE');
  });

  it('moves the masks and the order to shipped, records the events and the audit entry, and queues one e-mail with the tracking link', async () => {
    const { shipOrder } = await import('@/lib/orders/shipping-actions');
    const order = await orderWith(['packed', 'packed']);
    const trackingNumber = 'HP 2207 5555 IE';
    const result = await shipOrder(kit, { number: order.number, carrierId: carrier.id, trackingNumber });

    expect(await stagesOf(order)).toEqual(['shipped', 'shipped']);
    const row = await orderRow(order);
    expect(row).toMatchObject({ state: 'shipped', carrier_name: carrier.name, tracking_number: trackingNumber });
    expect(row.shipped_at).toBeInstanceOf(Date);
    expect(row.tracking_url).toBe(result.trackingUrl);

    expect(await eventsOf(order, 'line_stage')).toEqual(
      order.lineIds.map((lineId) => ({ from_state: null, to_state: null, actor_user_id: kit.id, data: { lineId, from: 'packed', to: 'shipped' } })),
    );
    expect(await eventsOf(order, 'shipped')).toEqual([
      {
        from_state: 'in_production',
        to_state: 'shipped',
        actor_user_id: kit.id,
        data: { carrierName: carrier.name, trackingNumber, trackingUrl: row.tracking_url, lines: 2 },
      },
    ]);
    const [audit, ...moreAudits] = await auditsOf(order, 'order.shipped');
    expect(moreAudits).toEqual([]);
    expect(audit).toMatchObject({ actor_label: kit.name, before: { state: 'in_production' }, after: { state: 'shipped', trackingNumber } });

    const mails = await mailsOf(order, 'order-shipped');
    expect(mails.map((m) => m.dedupe_key)).toEqual([`order-shipped:${order.id}`]);
    expect(mails[0]!.subject).toContain(order.number);
    // The link in the e-mail is the carrier's template with this number in it, percent-encoded by the template's rule.
    const template = new URL(carrier.tracking_url_template.replace('{tracking}', 'PLACEHOLDER'));
    const tracking = linksIn(mails[0]!.text).find((url) => url.host === template.host);
    expect(tracking, 'the plain text carries the tracking link').toBeDefined();
    expect(tracking!.protocol).toBe('https:');
    expect(tracking!.pathname).toBe(template.pathname);
    const param = [...template.searchParams.entries()].find(([, value]) => value === 'PLACEHOLDER')![0];
    expect(tracking!.searchParams.get(param)).toBe(trackingNumber);
    expect(tracking!.href).toBe(row.tracking_url);
    // The studio's contact address is in it, from the settings.
    const [studio] = await rows<{ contact_email: string }>(`SELECT contact_email FROM studios LIMIT 1`);
    expect(mails[0]!.text).toContain(studio!.contact_email);

    // Shipping it again changes nothing and sends nothing.
    await expect(shipOrder(ines, { number: order.number, carrierId: carrier.id, trackingNumber: 'HP 9' })).rejects.toMatchObject({
      code: 'already_shipped',
      message: expect.stringContaining(`already shipped by ${kit.name}`),
    });
    expect(await mailsOf(order, 'order-shipped')).toHaveLength(1);
    expect((await orderRow(order)).tracking_number).toBe(trackingNumber);
  });

  it('two people shipping the same order at once: one ships it, the other is told, nothing is doubled', async () => {
    const { shipOrder } = await import('@/lib/orders/shipping-actions');
    const order = await orderWith(['packed']);
    // A third connection holds the order for a moment, so both calls are under way before either can write.
    const holder = new pg.Client({ connectionString: db.current().url });
    await holder.connect();
    await holder.query(`BEGIN`);
    await holder.query(`SELECT id FROM orders WHERE id = $1 FOR UPDATE`, [order.id]);
    const racing = Promise.allSettled([
      shipOrder(kit, { number: order.number, carrierId: carrier.id, trackingNumber: 'HP 3000 0001 IE' }),
      shipOrder(ines, { number: order.number, carrierId: carrier.id, trackingNumber: 'HP 3000 0002 IE' }),
    ]);
    // Asked on another connection: inside the holder's transaction pg_stat_activity would stay as first read.
    for (let waited = 0; waited < 10_000; waited += 50) {
      const [{ waiting }] = (await rows<{ waiting: number }>(
        `SELECT count(*)::int AS waiting FROM pg_stat_activity WHERE datname = current_database() AND wait_event_type = 'Lock'`,
      )) as [{ waiting: number }];
      if (waiting >= 2) break;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    await holder.query(`COMMIT`);
    await holder.end();
    const results = await racing;

    const won = results.filter((r) => r.status === 'fulfilled');
    const lost = results.filter((r): r is PromiseRejectedResult => r.status === 'rejected');
    expect(won).toHaveLength(1);
    expect(lost).toHaveLength(1);
    expect(lost[0]!.reason).toMatchObject({ code: 'already_shipped', message: expect.stringContaining('already shipped by') });
    expect(await eventsOf(order, 'line_stage')).toHaveLength(1);
    expect(await eventsOf(order, 'shipped')).toHaveLength(1);
    expect(await auditsOf(order, 'order.shipped')).toHaveLength(1);
    expect(await mailsOf(order, 'order-shipped')).toHaveLength(1);
  });

  it('sends an e-mail again as a new message of its own, recorded on the order', async () => {
    const { resendOrderEmail, shipOrder } = await import('@/lib/orders/shipping-actions');
    const order = await orderWith(['packed']);
    await expect(resendOrderEmail(kit, { number: order.number, kind: 'shipped' })).rejects.toMatchObject({ code: 'order_not_shipped' });
    await shipOrder(kit, { number: order.number, carrierId: carrier.id, trackingNumber: 'HP 4000' });
    await resendOrderEmail(kit, { number: order.number, kind: 'shipped' });
    await resendOrderEmail(kit, { number: order.number, kind: 'confirmation' });
    const resent = await eventsOf(order, 'email_resent');
    expect(resent.map((e) => e.data.kind)).toEqual(['shipped', 'confirmation']);
    const shipped = await mailsOf(order, 'order-shipped');
    expect(shipped).toHaveLength(2);
    expect(new Set(shipped.map((m) => m.dedupe_key)).size).toBe(2);
    expect(shipped[1]!.text).toContain('HP 4000');
    expect(await mailsOf(order, 'order-confirmation')).toHaveLength(1);
  });
});

describe('the shipping address', () => {
  const address = { name: 'Sive Marlow', line1: '9 Ropewalk Terrace', line2: '', city: 'Cork', postal_code: 'T12 Z9Z9', state: '', country: 'IE' };

  it('can change before any mask is packed, recorded with before and after; not after, and not to another country', async () => {
    const { updateShipTo } = await import('@/lib/orders/shipping-actions');
    const order = await orderWith(['trimmed', 'painted']);
    const before = (await orderRow(order)).ship_to;

    await expect(updateShipTo(kit, { number: order.number, shipTo: { ...address, country: 'FR' } })).rejects.toMatchObject({ code: 'country_fixed' });
    await expect(updateShipTo(kit, { number: order.number, shipTo: { ...address, line1: '' } })).rejects.toMatchObject({
      code: 'invalid_input',
      details: { fields: { line1: ['Enter the first address line.'] } },
    });
    expect((await orderRow(order)).ship_to).toEqual(before);

    await updateShipTo(kit, { number: order.number, shipTo: address });
    const after = { name: 'Sive Marlow', address: { line1: '9 Ropewalk Terrace', line2: null, city: 'Cork', postal_code: 'T12 Z9Z9', state: null, country: 'IE' } };
    expect((await orderRow(order)).ship_to).toEqual(after);
    expect(await eventsOf(order, 'address_changed')).toEqual([{ from_state: null, to_state: null, actor_user_id: kit.id, data: { before, after } }]);
    expect(await auditsOf(order, 'order.address_changed')).toEqual([{ actor_label: kit.name, before, after }]);

    const { moveLines } = await import('@/lib/production/move');
    await moveLines({ lineIds: [order.lineIds[1]!], from: 'painted', to: 'packed', actor: kit });
    await expect(updateShipTo(ines, { number: order.number, shipTo: { ...address, line1: '1 Elsewhere Lane' } })).rejects.toMatchObject({
      code: 'address_locked',
      message: expect.stringContaining('Mask 2 is packed'),
    });
    expect((await orderRow(order)).ship_to).toEqual(after);
    expect(await eventsOf(order, 'address_changed')).toHaveLength(1);
  });
});

describe('notes on an order', () => {
  it('are kept with their author and time, oldest first', async () => {
    const { addOrderNote } = await import('@/lib/orders/shipping-actions');
    const { listOrderNotes } = await import('@/lib/orders/queries');
    const order = await orderWith(['cast']);
    await expect(addOrderNote(kit, { number: order.number, body: '   ' })).rejects.toMatchObject({ code: 'invalid_input' });
    await addOrderNote(kit, { number: order.number, body: 'Buyer asked for a spare strap.' });
    await addOrderNote(ines, { number: order.number, body: 'Strap cut.\nPut it in with the mask.' });
    const notes = await listOrderNotes(order.id);
    expect(notes.map((n) => [n.authorName, n.body])).toEqual([
      [kit.name, 'Buyer asked for a spare strap.'],
      [ines.name, 'Strap cut.\nPut it in with the mask.'],
    ]);
    expect(Number.isNaN(Date.parse(notes[0]!.createdAt))).toBe(false);
  });
});

describe('telling the buyer that the masks are being made', () => {
  it('queues the e-mail once, when the first mask leaves the mold queue, and not again for the second', async () => {
    const { moveLines } = await import('@/lib/production/move');
    const order = await orderWith(['to_cast', 'to_cast'], 'paid');

    const first = await moveLines({ lineIds: [order.lineIds[0]!], from: 'to_cast', to: 'cast', actor: kit });
    expect(first.startedOrders).toEqual([order.number]);
    const mails = await mailsOf(order, 'order-in-production');
    expect(mails.map((m) => m.dedupe_key)).toEqual([`order-in-production:${order.id}`]);
    expect(mails[0]!.subject).toContain(order.number);
    expect(mails[0]!.to_address).toBe('sive.marlow@example.com');

    const second = await moveLines({ lineIds: [order.lineIds[1]!], from: 'to_cast', to: 'cast', actor: kit });
    expect(second.startedOrders).toEqual([]);
    // Back to the queue and out again: still in production, still one e-mail.
    await moveLines({ lineIds: [order.lineIds[0]!], from: 'cast', to: 'to_cast', actor: kit });
    await moveLines({ lineIds: [order.lineIds[0]!], from: 'to_cast', to: 'cast', actor: kit });
    expect(await mailsOf(order, 'order-in-production')).toHaveLength(1);
  });

  it('writes no e-mail when the move is refused', async () => {
    const { moveLines } = await import('@/lib/production/move');
    const order = await orderWith(['to_cast'], 'paid');
    await expect(moveLines({ lineIds: [order.lineIds[0]!], from: 'to_cast', to: 'trimmed', actor: kit })).rejects.toMatchObject({ code: 'lines_not_moved' });
    expect(await mailsOf(order, 'order-in-production')).toEqual([]);
  });
});

describe('advancing orders from the orders table', () => {
  it('moves each chosen order’s masks one stage on and says what did not move', async () => {
    const { advanceOrders } = await import('@/lib/orders/bulk-advance');
    const moving = await orderWith(['cast', 'trimmed']);
    const packed = await orderWith(['packed']);
    const summary = await advanceOrders(kit, [moving.id, packed.id]);
    expect(await stagesOf(moving)).toEqual(['trimmed', 'painted']);
    expect(await stagesOf(packed)).toEqual(['packed']);
    expect(summary.moved).toBe(2);
    expect(summary.movedOrders).toEqual([moving.number]);
    expect(summary.refused).toEqual([`${packed.number} is packed and waits for shipping.`]);
    expect(summary.message).toContain(`Moved 2 masks of ${moving.number}`);
  });
});
