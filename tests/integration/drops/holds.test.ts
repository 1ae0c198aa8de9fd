import { beforeAll, describe, expect, it } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import { query } from '../support/database';
import { withAppDatabase } from '../support/app-database';

const db = withAppDatabase('holds', { seed: true });

type Stock = { id: string; batch_id: string; finish_id: string; quantity: number; held: number; sold: number; available: number };
let openBatch: string;
let stockRows: Stock[];

async function buyer(email: string): Promise<CurrentUser> {
  const { getDb } = await import('@/lib/db/connection');
  const user = await getDb().models.User.create({ email, name: null, emailVerified: null, role: 'customer' });
  return { id: user.id, email, name: null, role: 'customer' };
}

/** A fresh open batch of one finish with `quantity` units, so each test starts from known stock. */
async function freshBatch(quantity: number, perBuyerLimit = 1): Promise<{ batchId: string; finishId: string; stockId: string }> {
  const [batch] = await query<{ id: string; design_id: string }>(
    db.current().url,
    `INSERT INTO batches (design_id, name, status, per_buyer_limit, hold_minutes, opens_at, closes_at, ship_by)
     SELECT design_id, 'Test batch', 'scheduled', $1, 10, now() - interval '1 minute', now() + interval '1 day', current_date + 30
       FROM batches WHERE id = $2 RETURNING id, design_id`,
    [perBuyerLimit, openBatch],
  );
  const [stock] = await query<{ id: string; finish_id: string }>(
    db.current().url,
    `INSERT INTO batch_stock (batch_id, finish_id, quantity)
     SELECT $1, finish_id, $2 FROM batch_stock WHERE batch_id = $3 LIMIT 1 RETURNING id, finish_id`,
    [batch!.id, quantity, openBatch],
  );
  return { batchId: batch!.id, finishId: stock!.finish_id, stockId: stock!.id };
}

async function stockOf(stockId: string) {
  const [row] = await query<Stock>(db.current().url, 'SELECT * FROM batch_stock WHERE id = $1', [stockId]);
  return row!;
}

async function outcome(promise: Promise<unknown>): Promise<string> {
  try {
    await promise;
    return 'held';
  } catch (error) {
    return (error as { code?: string }).code ?? `unexpected: ${String(error)}`;
  }
}

beforeAll(async () => {
  stockRows = await query<Stock>(db.current().url, `SELECT s.* FROM batch_stock s JOIN batches b ON b.id = s.batch_id WHERE b.name = 'Winter batch'`);
  openBatch = stockRows[0]!.batch_id;
});

describe('holding a mask', () => {
  it('holds, lowers availability, and keeps quantity = available + held + sold', async () => {
    const { createHold } = await import('@/lib/drops/holds');
    const { getAvailability } = await import('@/lib/drops/availability');
    const { batchId, finishId, stockId } = await freshBatch(3);
    const hold = await createHold(await buyer('first@example.com'), { batchId, finishId, quantity: 1 });
    expect(new Date(hold.expiresAt).getTime()).toBeGreaterThan(Date.now() + 9 * 60_000);
    const row = await stockOf(stockId);
    expect(row).toMatchObject({ quantity: 3, held: 1, sold: 0, available: 2 });
    expect((await getAvailability(batchId))?.stock[0]).toMatchObject({ available: 2, held: 1 });
  });

  it('lets one buyer firing 50 holds at once take exactly the limit of 1', async () => {
    const { createHold } = await import('@/lib/drops/holds');
    const { batchId, finishId, stockId } = await freshBatch(10, 1);
    const me = await buyer('eager1@example.com');
    const results = await Promise.all(Array.from({ length: 50 }, () => outcome(createHold(me, { batchId, finishId, quantity: 1 }))));
    expect(results.filter((r) => r === 'held')).toHaveLength(1);
    expect(new Set(results.filter((r) => r !== 'held'))).toEqual(new Set(['limit_reached']));
    expect(await stockOf(stockId)).toMatchObject({ held: 1, available: 9 });
  });

  it('and exactly the limit of 2 with quantity 1 each', async () => {
    const { createHold } = await import('@/lib/drops/holds');
    const { batchId, finishId, stockId } = await freshBatch(10, 2);
    const me = await buyer('eager2@example.com');
    const results = await Promise.all(Array.from({ length: 50 }, () => outcome(createHold(me, { batchId, finishId, quantity: 1 }))));
    expect(results.filter((r) => r === 'held')).toHaveLength(2);
    expect(await stockOf(stockId)).toMatchObject({ held: 2, available: 8 });
  });

  it('never sells what does not exist: 30 buyers at once for 7 units', async () => {
    const { createHold } = await import('@/lib/drops/holds');
    const { batchId, finishId, stockId } = await freshBatch(7);
    const buyers = await Promise.all(Array.from({ length: 30 }, (_, i) => buyer(`crowd${i}@example.com`)));
    const results = await Promise.all(buyers.map((b) => outcome(createHold(b, { batchId, finishId, quantity: 1 }))));
    expect(results.filter((r) => r === 'held')).toHaveLength(7);
    expect(new Set(results.filter((r) => r !== 'held'))).toEqual(new Set(['sold_out']));
    const row = await stockOf(stockId);
    expect(row.quantity).toBe(row.available + row.held + row.sold);
    expect(row.available).toBe(0);
  });

  it('frees an expired hold’s unit for the next buyer, before and after the sweep', async () => {
    const { createHold, expireHolds } = await import('@/lib/drops/holds');
    const { getAvailability } = await import('@/lib/drops/availability');
    const { batchId, finishId, stockId } = await freshBatch(1);
    const first = await buyer('slow@example.com');
    const hold = await createHold(first, { batchId, finishId, quantity: 1 });
    await expect(createHold(await buyer('next@example.com'), { batchId, finishId, quantity: 1 })).rejects.toMatchObject({
      code: 'sold_out',
      details: { mayComeBack: true },
    });

    await query(db.current().url, `UPDATE holds SET expires_at = now() - interval '1 second' WHERE id = $1`, [hold.id]);
    // Before any sweep: the stock row still counts it held, but every read treats it as released.
    expect((await stockOf(stockId)).held).toBe(1);
    expect((await getAvailability(batchId))?.stock[0]).toMatchObject({ available: 1, held: 0 });
    const second = await buyer('second@example.com');
    await createHold(second, { batchId, finishId, quantity: 1 });
    const [ended] = await query<{ state: string }>(db.current().url, 'SELECT state FROM holds WHERE id = $1', [hold.id]);
    expect(ended!.state).toBe('expired');

    // After the sweep: an expired hold is returned once, not twice.
    await query(db.current().url, `UPDATE holds SET expires_at = now() - interval '1 second' WHERE user_id = $1`, [second.id]);
    expect(await expireHolds()).toBeGreaterThanOrEqual(1);
    expect(await expireHolds()).toBe(0);
    expect(await stockOf(stockId)).toMatchObject({ held: 0, available: 1 });
    // The first buyer's allowance came back with the expiry: they may hold again.
    await createHold(first, { batchId, finishId, quantity: 1 });
  });

  it('lets a buyer let go, and refuses to let go of someone else’s hold', async () => {
    const { createHold, releaseHold } = await import('@/lib/drops/holds');
    const { batchId, finishId, stockId } = await freshBatch(2);
    const owner = await buyer('owner-of-hold@example.com');
    const hold = await createHold(owner, { batchId, finishId, quantity: 1 });
    await expect(releaseHold(await buyer('thief@example.com'), hold.id)).rejects.toMatchObject({ code: 'hold_not_found', status: 404 });
    await releaseHold(owner, hold.id);
    expect(await stockOf(stockId)).toMatchObject({ held: 0, available: 2 });
    await expect(releaseHold(owner, hold.id)).rejects.toMatchObject({ status: 404 });
  });

  it('says why when it cannot hold: not open yet, early access, closed, unknown finish', async () => {
    const { createHold } = await import('@/lib/drops/holds');
    const url = db.current().url;
    const { batchId, finishId } = await freshBatch(2);
    const someone = await buyer('curious@example.com');
    await query(url, `UPDATE batches SET opens_at = now() + interval '1 hour' WHERE id = $1`, [batchId]);
    await expect(createHold(someone, { batchId, finishId, quantity: 1 })).rejects.toMatchObject({ code: 'not_open_yet', details: { opensAt: expect.any(String) } });
    await query(url, `UPDATE batches SET early_access_at = now() - interval '1 minute' WHERE id = $1`, [batchId]);
    await expect(createHold(someone, { batchId, finishId, quantity: 1 })).rejects.toMatchObject({ code: 'early_access_only', status: 403 });
    await query(url, 'INSERT INTO early_access_grants (batch_id, user_id) VALUES ($1, $2)', [batchId, someone.id]);
    await expect(outcome(createHold(someone, { batchId, finishId, quantity: 1 }))).resolves.toBe('held');
    await query(url, `UPDATE batches SET early_access_at = NULL, opens_at = now() - interval '2 hours', closes_at = now() - interval '1 hour' WHERE id = $1`, [batchId]);
    await expect(createHold(someone, { batchId, finishId, quantity: 1 })).rejects.toMatchObject({ code: 'batch_closed' });
    await expect(createHold(someone, { batchId: openBatch, finishId: '00000000-0000-4000-8000-000000000000', quantity: 1 })).rejects.toMatchObject({ code: 'finish_unknown' });
  });
});
