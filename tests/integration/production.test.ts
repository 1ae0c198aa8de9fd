import pg from 'pg';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import { pay, waitUntil, withCheckoutWorld } from './orders/support';

// The board's actions are called as Next.js calls them, with the session resolved to the person given here.
let signedIn: CurrentUser | null = null;
vi.mock('@/lib/auth/session', () => ({ getCurrentUser: async () => signedIn }));
vi.mock('next/cache', () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));

const world = withCheckoutWorld('production');

let kit: CurrentUser;
let owner: CurrentUser;
beforeAll(async () => {
  const [row] = await world.rows<{ id: string }>(`INSERT INTO users (email, name, role) VALUES ('kit@example.com', 'Kit Sorrel', 'staff') RETURNING id`);
  kit = { id: row!.id, email: 'kit@example.com', name: 'Kit Sorrel', role: 'staff' };
  const found = await world.owner();
  // The seeded owner's own name, as the messages and the audit log show it.
  const [named] = await world.rows<{ name: string | null }>(`SELECT name FROM users WHERE id = $1`, [found.id]);
  owner = { ...found, name: named!.name };
});

let buyers = 0;
/** A paid order of `quantity` masks, through the real checkout, the fake Stripe and its webhook. */
async function paidOrder(quantity = 1) {
  const { createHold } = await import('@/lib/drops/holds');
  const { startCheckout } = await import('@/lib/orders/checkout');
  const stock = await world.freshBatch(6, { perBuyerLimit: 3 });
  buyers += 1;
  const buyer = await world.buyer(`maker-board-${buyers}@example.com`);
  const hold = await createHold(buyer, { batchId: stock.batchId, finishId: stock.finishId, quantity });
  const checkout = await startCheckout(buyer, { holdId: hold.id, country: 'IE', shippingRateId: await world.irishRate(buyer, hold.id) });
  await pay(world.fake(), checkout.url);
  const order = (await waitUntil(() => world.order(hold.id), (o) => o?.state === 'paid'))!;
  const lines = await world.rows<{ id: string; position: number }>(`SELECT id, position FROM order_lines WHERE order_id = $1 ORDER BY position`, [order.id]);
  return { order, lines, batchId: stock.batchId };
}

const stageOf = async (lineId: string) => (await world.rows<{ stage: string }>(`SELECT stage FROM order_lines WHERE id = $1`, [lineId]))[0]!.stage;
const lineEvents = (orderId: string) =>
  world.rows<{ data: { lineId: string; from: string; to: string }; actor_user_id: string }>(
    `SELECT data, actor_user_id FROM order_events WHERE order_id = $1 AND type = 'line_stage' ORDER BY id`,
    [orderId],
  );
const audits = (lineId: string) =>
  world.rows<{ actor_label: string; before: unknown; after: unknown }>(
    `SELECT actor_label, before, after FROM audit_log WHERE action = 'line.stage_changed' AND subject_type = 'order_line' AND subject_id = $1 ORDER BY id`,
    [lineId],
  );

describe('moving masks through production', () => {
  it('a studio hand moves a mask one stage on: the line, an event, an audit entry, and the order is in production', async () => {
    const { moveLines } = await import('@/lib/production/move');
    const { order, lines } = await paidOrder();
    const line = lines[0]!;
    const result = await moveLines({ lineIds: [line.id], from: 'to_cast', to: 'cast', actor: kit });
    expect(result.moved).toBe(1);
    expect(result.startedOrders).toEqual([order.number]);
    expect(await stageOf(line.id)).toBe('cast');
    expect(await lineEvents(order.id)).toEqual([{ data: { lineId: line.id, from: 'to_cast', to: 'cast' }, actor_user_id: kit.id }]);
    expect(await audits(line.id)).toEqual([{ actor_label: 'Kit Sorrel', before: { stage: 'to_cast' }, after: { stage: 'cast' } }]);
    expect((await world.order(order.number))!.state).toBe('in_production');
    const changes = await world.rows(`SELECT from_state, to_state FROM order_events WHERE order_id = $1 AND type = 'state_changed' AND to_state = 'in_production'`, [order.id]);
    expect(changes).toEqual([{ from_state: 'paid', to_state: 'in_production' }]);

    // A slip is put right one step back; the order stays in production.
    await moveLines({ lineIds: [line.id], from: 'cast', to: 'to_cast', actor: kit });
    expect(await stageOf(line.id)).toBe('to_cast');
    expect((await world.order(order.number))!.state).toBe('in_production');
    expect(await lineEvents(order.id)).toHaveLength(2);
  });

  it('refuses a jump past a stage, and shipping from the board, and writes nothing', async () => {
    const { moveLines } = await import('@/lib/production/move');
    const { order, lines } = await paidOrder();
    const line = lines[0]!;
    await expect(moveLines({ lineIds: [line.id], from: 'to_cast', to: 'trimmed', actor: owner })).rejects.toMatchObject({
      code: 'lines_not_moved',
      status: 409,
      message: expect.stringContaining('one stage at a time'),
    });
    await world.rows(`UPDATE order_lines SET stage = 'packed' WHERE id = $1`, [line.id]);
    await expect(moveLines({ lineIds: [line.id], from: 'packed', to: 'shipped', actor: owner })).rejects.toMatchObject({ code: 'lines_not_moved' });
    expect(await stageOf(line.id)).toBe('packed');
    expect(await lineEvents(order.id)).toEqual([]);
    expect(await audits(line.id)).toEqual([]);
    expect((await world.order(order.number))!.state).toBe('paid');
  });

  it('only the owner marks a mask failed and sends it back for a spare pull', async () => {
    const { moveLines } = await import('@/lib/production/move');
    const { order, lines } = await paidOrder();
    const line = lines[0]!;
    await moveLines({ lineIds: [line.id], from: 'to_cast', to: 'cast', actor: kit });
    await expect(moveLines({ lineIds: [line.id], from: 'cast', to: 'failed_casting', actor: kit })).rejects.toMatchObject({
      message: expect.stringContaining('Only the owner'),
    });
    expect(await stageOf(line.id)).toBe('cast');
    await moveLines({ lineIds: [line.id], from: 'cast', to: 'failed_casting', actor: owner });
    await expect(moveLines({ lineIds: [line.id], from: 'failed_casting', to: 'to_cast', actor: kit })).rejects.toMatchObject({ code: 'lines_not_moved' });
    await moveLines({ lineIds: [line.id], from: 'failed_casting', to: 'to_cast', actor: owner });
    expect(await stageOf(line.id)).toBe('to_cast');
    expect((await lineEvents(order.id)).map((e) => e.data.to)).toEqual(['cast', 'failed_casting', 'to_cast']);
  });

  it('two people moving the same mask at once: exactly one wins, the other is told where it is now', async () => {
    const { moveLines } = await import('@/lib/production/move');
    const { order, lines } = await paidOrder();
    const line = lines[0]!;
    // A third connection holds the row for a moment, so both moves read "to cast" before either can write.
    const holder = new pg.Client({ connectionString: world.db.current().url });
    await holder.connect();
    await holder.query(`BEGIN`);
    await holder.query(`SELECT id FROM order_lines WHERE id = $1 FOR UPDATE`, [line.id]);
    const racing = Promise.allSettled([
      moveLines({ lineIds: [line.id], from: 'to_cast', to: 'cast', actor: kit }),
      moveLines({ lineIds: [line.id], from: 'to_cast', to: 'cast', actor: owner }),
    ]);
    await waitUntil(
      () => world.rows<{ n: number }>(`SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = current_database() AND wait_event_type = 'Lock'`),
      (rows) => rows[0]!.n >= 2,
    );
    await holder.query(`COMMIT`);
    await holder.end();
    const results = await racing;
    const won = results.filter((r) => r.status === 'fulfilled');
    const lost = results.filter((r): r is PromiseRejectedResult => r.status === 'rejected');
    expect(won).toHaveLength(1);
    expect(lost).toHaveLength(1);
    const winner = results[0]!.status === 'fulfilled' ? kit : owner;
    expect(lost[0]!.reason).toMatchObject({ code: 'lines_not_moved', message: expect.stringContaining(`Line 1 of ${order.number} is already at “Cast”`) });
    expect((lost[0]!.reason as Error).message).toContain(`moved by ${winner.name ?? winner.email}`);
    expect(await lineEvents(order.id)).toEqual([{ data: { lineId: line.id, from: 'to_cast', to: 'cast' }, actor_user_id: winner.id }]);
    expect(await audits(line.id)).toHaveLength(1);
    expect((await world.order(order.number))!.state).toBe('in_production');
    expect(await world.rows(`SELECT 1 FROM order_events WHERE order_id = $1 AND to_state = 'in_production'`, [order.id])).toHaveLength(1);

    // The same race to different stages: the loser names the stage the winner chose.
    const race = await Promise.allSettled([
      moveLines({ lineIds: [line.id], from: 'cast', to: 'trimmed', actor: kit }),
      moveLines({ lineIds: [line.id], from: 'cast', to: 'to_cast', actor: owner }),
    ]);
    expect(race.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
    const now = await stageOf(line.id);
    const loser = race.find((r): r is PromiseRejectedResult => r.status === 'rejected')!;
    expect((loser.reason as Error).message).toContain(`is now at “${now === 'trimmed' ? 'Trimmed' : 'To cast'}”`);
  });

  it('a bulk move is all or nothing, with a word for each mask that cannot go', async () => {
    const { moveLines } = await import('@/lib/production/move');
    const { order, lines } = await paidOrder(2);
    const [first, second] = lines as [(typeof lines)[0], (typeof lines)[0]];
    await moveLines({ lineIds: [second.id], from: 'to_cast', to: 'cast', actor: kit });
    const refused = await moveLines({ lineIds: [first.id, second.id], from: 'to_cast', to: 'cast', actor: kit }).catch((error) => error);
    expect(refused).toMatchObject({ code: 'lines_not_moved', message: expect.stringContaining('1 of the 2 masks') });
    expect(refused.details.fields.lines).toEqual([expect.stringContaining(`Line 2 of ${order.number} is already at “Cast”`)]);
    expect([await stageOf(first.id), await stageOf(second.id)]).toEqual(['to_cast', 'cast']);
    expect(await lineEvents(order.id)).toHaveLength(1);

    const done = await moveLines({ lineIds: [first.id, second.id], from: 'cast', to: 'trimmed', actor: kit }).catch((error) => error);
    expect(done).toMatchObject({ code: 'lines_not_moved' });
    await moveLines({ lineIds: [first.id], from: 'to_cast', to: 'cast', actor: kit });
    const both = await moveLines({ lineIds: [first.id, second.id], from: 'cast', to: 'trimmed', actor: kit });
    expect(both.moved).toBe(2);
    expect([await stageOf(first.id), await stageOf(second.id)]).toEqual(['trimmed', 'trimmed']);
    expect(await lineEvents(order.id)).toHaveLength(4);
  });

  it('refunded and undecided oversold masks stay put; a partly refunded order keeps its state', async () => {
    const { moveLines } = await import('@/lib/production/move');
    const { refundOrder } = await import('@/lib/orders/refunds');
    const { listBoardLines } = await import('@/lib/production/board');
    const { order, lines, batchId } = await paidOrder(2);
    const [refunded, kept] = lines as [(typeof lines)[0], (typeof lines)[0]];
    const refund = await refundOrder(owner, { mode: 'lines', orderId: order.id, lineIds: [refunded.id], reason: 'buyer_request', note: '', restock: false });
    expect(refund.status).toBe('succeeded');
    await waitUntil(() => world.order(order.number), (o) => o?.state === 'partly_refunded');
    await expect(moveLines({ lineIds: [refunded.id], from: 'to_cast', to: 'cast', actor: owner })).rejects.toMatchObject({ message: expect.stringContaining('refunded') });
    await moveLines({ lineIds: [kept.id], from: 'to_cast', to: 'cast', actor: kit });
    expect((await world.order(order.number))!.state).toBe('partly_refunded');
    expect((await listBoardLines({ batchId })).map((l) => l.id)).toEqual([kept.id]);

    const other = await paidOrder(1);
    const oversold = other.lines[0]!;
    await world.rows(`UPDATE order_lines SET oversold = true, oversold_reason = 'stock_gone', counted_in_stock = false WHERE id = $1`, [oversold.id]);
    await expect(moveLines({ lineIds: [oversold.id], from: 'to_cast', to: 'cast', actor: owner })).rejects.toMatchObject({ message: expect.stringContaining('oversold') });
    expect(await stageOf(oversold.id)).toBe('to_cast');
    expect((await world.order(other.order.number))!.state).toBe('paid');
    const board = await listBoardLines({ batchId: other.batchId });
    expect(board.map((l) => [l.id, l.oversoldOpen])).toEqual([[oversold.id, true]]);
  });

  it('the board’s forms: a bulk move of chosen masks, and the owner’s buttons refused to a studio hand', async () => {
    const { moveLinesAction, failLineAction, recastLineAction } = await import('@/app/workshop/production/actions');
    const { order, lines } = await paidOrder(2);
    const form = (fields: Record<string, string>) => {
      const data = new FormData();
      for (const [key, value] of Object.entries(fields)) data.set(key, value);
      return data;
    };
    signedIn = kit;
    const moved = await moveLinesAction(null, form({ lineIds: lines.map((l) => l.id).join(','), from: 'to_cast', to: 'cast' }));
    expect(moved).toEqual({ ok: true, message: `Moved 2 masks to “Cast”. ${order.number} is now in production.` });
    expect(await failLineAction(null, form({ lineId: lines[0]!.id, from: 'cast' }))).toMatchObject({ ok: false, error: { code: 'forbidden' } });

    // The owner sends the same move from a board that had not refreshed: each mask says where it is now.
    signedIn = owner;
    const stale = await moveLinesAction(null, form({ lineIds: lines.map((l) => l.id).join(','), from: 'to_cast', to: 'cast' }));
    expect(stale).toMatchObject({ ok: false, error: { code: 'lines_not_moved' } });
    expect(stale.ok ? [] : stale.error.fieldErrors?.lines).toEqual([
      expect.stringContaining('is already at “Cast” (moved by Kit Sorrel a moment ago)'),
      expect.stringContaining('is already at “Cast” (moved by Kit Sorrel a moment ago)'),
    ]);
    expect(await moveLinesAction(null, form({ lineIds: 'not-an-id', from: 'cast', to: 'trimmed' }))).toMatchObject({ ok: false, error: { code: 'invalid_input' } });

    expect(await failLineAction(null, form({ lineId: lines[0]!.id, from: 'cast' }))).toMatchObject({ ok: true });
    expect(await stageOf(lines[0]!.id)).toBe('failed_casting');
    expect(await recastLineAction(null, form({ lineId: lines[0]!.id, from: 'failed_casting' }))).toMatchObject({ ok: true });
    expect(await stageOf(lines[0]!.id)).toBe('to_cast');
    signedIn = null;
  });
});
