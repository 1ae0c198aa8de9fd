import { beforeAll, describe, expect, it } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import type { BatchForm } from '@/lib/drops/batch-schemas';
import { withAppDatabase } from '../support/app-database';
import { query } from '../support/database';

const db = withAppDatabase('batches', { seed: true });
let owner: CurrentUser;
let ibex: { id: string; finishes: { id: string; slug: string; status: string }[] };

/** A wall-clock time in the studio's zone (Europe/Dublin), `days` from now at `hh:mm`. */
function studioTime(days: number, hhmm: string): string {
  const date = new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
  return `${date}T${hhmm}`;
}

function form(overrides: Partial<BatchForm> = {}): BatchForm {
  const oldBone = ibex.finishes.find((f) => f.slug === 'old-bone')!.id;
  return {
    batchId: undefined,
    earlyAccessAt: undefined,
    plannedShipBy: undefined,
    designId: ibex.id,
    name: 'Spring batch',
    announcement: 'Thirty Ibex in three finishes.',
    perBuyerLimit: 1,
    holdMinutes: 10,
    opensAt: studioTime(10, '19:00'),
    closesAt: studioTime(12, '19:00'),
    shipBy: studioTime(60, '00:00').slice(0, 10),
    intent: 'schedule',
    quantities: { [oldBone]: 12 },
    ...overrides,
  };
}

async function code(promise: Promise<unknown>): Promise<{ code?: string; fields?: string[] }> {
  try {
    await promise;
    return {};
  } catch (error) {
    const e = error as { code?: string; details?: { fields?: Record<string, string[]> } };
    return { code: e.code, fields: Object.keys(e.details?.fields ?? {}) };
  }
}

beforeAll(async () => {
  const [row] = await query<{ id: string; email: string }>(db.current().url, `SELECT id, email FROM users WHERE role = 'owner' LIMIT 1`);
  owner = { id: row!.id, email: row!.email, name: 'Owner', role: 'owner' };
  const [design] = await query<{ id: string }>(db.current().url, `SELECT id FROM designs WHERE slug = 'ibex'`);
  const finishes = await query<{ id: string; slug: string; status: string }>(db.current().url, `SELECT id, slug, status FROM finishes WHERE design_id = $1`, [design!.id]);
  ibex = { id: design!.id, finishes };
});

describe('opening a batch', () => {
  it('schedules a batch with its stock; the times are the studio’s wall clock; the drop list shows it', async () => {
    const { saveBatch } = await import('@/lib/drops/batches');
    const result = await saveBatch(owner, form());
    expect(result.status).toBe('scheduled');
    const [batch] = await query<{ status: string; opens_at: Date; announcement: string }>(db.current().url, `SELECT status, opens_at, announcement FROM batches WHERE id = $1`, [result.batchId]);
    expect(batch!.status).toBe('scheduled');
    // 19:00 in Dublin is 18:00 or 19:00 UTC depending on summer time; Intl's IANA data decides.
    const expected = new Intl.DateTimeFormat('en-GB', { timeZone: 'Europe/Dublin', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(batch!.opens_at);
    expect(expected).toBe('19:00');
    const stock = await query<{ quantity: number; available: number }>(db.current().url, `SELECT quantity, available FROM batch_stock WHERE batch_id = $1`, [result.batchId]);
    expect(stock).toEqual([{ quantity: 12, available: 12 }]);
    const { listWorkshopBatches } = await import('@/lib/drops/batches');
    expect((await listWorkshopBatches(result.batchId))[0]).toMatchObject({ quantity: 12, status: 'scheduled' });
  });

  it('refuses an opening after the closing, a DST gap, and a batch with no masks, writing nothing', async () => {
    const { saveBatch } = await import('@/lib/drops/batches');
    const { batchFormSchema } = await import('@/lib/drops/batch-schemas');
    const before = await query<{ n: number }>(db.current().url, `SELECT count(*)::int AS n FROM batches`);
    expect(await code(saveBatch(owner, form({ opensAt: studioTime(12, '19:00'), closesAt: studioTime(10, '19:00') })))).toEqual({ code: 'invalid_input', fields: ['closesAt'] });
    // The EU's clocks go forward at 01:00 UTC on the last Sunday of March (Directive 2000/84/EC): 01:30 that night does not exist in Dublin.
    const year = new Date().getUTCFullYear() + 1;
    const lastSundayOfMarch = [31, 30, 29, 28, 27, 26, 25].find((d) => new Date(Date.UTC(year, 2, d)).getUTCDay() === 0)!;
    const gap = `${year}-03-${lastSundayOfMarch}T01:30`;
    expect(await code(saveBatch(owner, form({ opensAt: gap, closesAt: `${year}-04-02T19:00` })))).toEqual({ code: 'invalid_input', fields: ['opensAt'] });
    const empty = batchFormSchema.safeParse({ designId: ibex.id, name: 'x', perBuyerLimit: '1', holdMinutes: '10', opensAt: form().opensAt, closesAt: form().closesAt, shipBy: form().shipBy, intent: 'schedule', [`qty.${ibex.finishes[0]!.id}`]: '0' });
    expect(empty.success).toBe(false);
    for (const bad of ['-1', '2.5', 'ten']) {
      const parsed = batchFormSchema.safeParse({ designId: ibex.id, name: 'x', perBuyerLimit: '1', holdMinutes: '10', opensAt: form().opensAt, closesAt: form().closesAt, shipBy: form().shipBy, intent: 'schedule', [`qty.${ibex.finishes[0]!.id}`]: bad });
      expect(parsed.success, bad).toBe(false);
    }
    const after = await query<{ n: number }>(db.current().url, `SELECT count(*)::int AS n FROM batches`);
    expect(after[0]!.n).toBe(before[0]!.n);
  });

  it('once buyers have held, a finish can only grow, and the opening stays once the drop is open', async () => {
    const { saveBatch } = await import('@/lib/drops/batches');
    const { createHold } = await import('@/lib/drops/holds');
    const oldBone = ibex.finishes.find((f) => f.slug === 'old-bone')!.id;
    const created = await saveBatch(owner, form({ opensAt: studioTime(1, '09:00') }));
    await query(db.current().url, `UPDATE batches SET opens_at = date_trunc('minute', now()) - interval '1 minute' WHERE id = $1`, [created.batchId]);
    const [buyer] = await query<{ id: string }>(db.current().url, `INSERT INTO users (email, role) VALUES ('holder@example.com', 'customer') RETURNING id`);
    await createHold({ id: buyer!.id }, { batchId: created.batchId, finishId: oldBone, quantity: 1 });
    const { listWorkshopBatches } = await import('@/lib/drops/batches');
    const [batch] = await listWorkshopBatches(created.batchId);
    const { utcToLocalInput } = await import('@/lib/drops/local-time');
    const same = { batchId: created.batchId, opensAt: utcToLocalInput(new Date(batch!.opensAt), 'Europe/Dublin'), closesAt: utcToLocalInput(new Date(batch!.closesAt), 'Europe/Dublin') };
    expect(await code(saveBatch(owner, form({ ...same, quantities: { [oldBone]: 11 } })))).toEqual({ code: 'invalid_input', fields: [`qty.${oldBone}`] });
    expect(await saveBatch(owner, form({ ...same, quantities: { [oldBone]: 20 } }))).toMatchObject({ status: 'scheduled' });
    expect(await code(saveBatch(owner, form({ ...same, opensAt: studioTime(3, '19:00'), quantities: { [oldBone]: 20 } })))).toEqual({ code: 'invalid_input', fields: ['opensAt'] });
    const stock = await query<{ quantity: number; held: number; available: number }>(db.current().url, `SELECT quantity, held, available FROM batch_stock WHERE batch_id = $1`, [created.batchId]);
    expect(stock).toEqual([{ quantity: 20, held: 1, available: 19 }]);
  });

  it('warns when the ship-by date is earlier than the plan, and a draft needs no published design', async () => {
    const { saveBatch } = await import('@/lib/drops/batches');
    const result = await saveBatch(owner, form({ plannedShipBy: studioTime(70, '00:00').slice(0, 10), intent: 'draft' }));
    expect(result.status).toBe('draft');
    expect(result.warning).toMatch(/earlier than the plan/);
  });

  it('cancels a batch without paid orders and lets its holds go; refuses one with paid orders', async () => {
    const { saveBatch, cancelBatch } = await import('@/lib/drops/batches');
    const { createHold } = await import('@/lib/drops/holds');
    const oldBone = ibex.finishes.find((f) => f.slug === 'old-bone')!.id;
    const created = await saveBatch(owner, form());
    await query(db.current().url, `UPDATE batches SET opens_at = date_trunc('minute', now()) - interval '1 minute' WHERE id = $1`, [created.batchId]);
    const [buyer] = await query<{ id: string }>(db.current().url, `INSERT INTO users (email, role) VALUES ('cancelled@example.com', 'customer') RETURNING id`);
    await createHold({ id: buyer!.id }, { batchId: created.batchId, finishId: oldBone, quantity: 1 });
    expect(await cancelBatch(owner, created.batchId)).toMatchObject({ releasedHolds: 1 });
    const stock = await query<{ held: number }>(db.current().url, `SELECT held FROM batch_stock WHERE batch_id = $1`, [created.batchId]);
    expect(stock).toEqual([{ held: 0 }]);
    expect(await code(cancelBatch(owner, created.batchId))).toMatchObject({ code: 'batch_cancelled' });
    // The demo's sold-out batch has paid orders only if some were made; make one paid order and try.
    const other = await saveBatch(owner, form());
    await query(
      db.current().url,
      `INSERT INTO orders (studio_id, batch_id, email, currency, lines_minor, shipping_minor, total_minor, tax_label, tax_rate_bp, tax_included_minor,
         shipping_country, shipping_label, shipping_min_days, shipping_max_days, chargeable_weight_g, state, paid_minor, paid_at, payment_intent_id)
       SELECT d.studio_id, $1, 'p@example.com', 'EUR', 100, 0, 100, 'VAT', 2300, 19, 'IE', 'Tracked post', 1, 3, 1000, 'paid', 100, now(), 'pi_test_x'
         FROM designs d WHERE d.id = $2`,
      [other.batchId, ibex.id],
    );
    expect(await code(cancelBatch(owner, other.batchId))).toMatchObject({ code: 'batch_has_orders' });
  });
});
