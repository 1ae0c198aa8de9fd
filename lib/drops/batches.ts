import 'server-only';
import type { Transaction } from 'sequelize';
import { AppError } from '@/lib/api/errors';
import { writeAudit, type AuditActor } from '@/lib/audit/log';
import { inTransaction, sql } from '@/lib/db/sql';
import type { BatchForm } from './batch-schemas';
import { localTimeToUtc } from './local-time';
import { announceBatch, nextCorrectionRevision, stopBatchAnnouncements, wasAnnounced } from '@/lib/waitlist/announce';

type Actor = Exclude<AuditActor, 'system'>;

const fieldError = (field: string, message: string, code = 'invalid_input') =>
  new AppError(code, message, 422, { fields: { [field]: [message] } });

type DesignRow = { id: string; name: string; status: string; time_zone: string };

function toInstant(field: string, local: string, timeZone: string): Date {
  const result = localTimeToUtc(local, timeZone);
  if (result.kind !== 'ok') throw fieldError(field, result.message);
  return result.at;
}

export type SaveBatchResult = { batchId: string; status: 'draft' | 'scheduled'; message: string; warning: string | null };

/**
 * Creates or edits a batch with its stock per finish, in one transaction. Times are entered in the
 * studio's zone. Before the drop opens everything may change; once holds exist a finish's quantity can
 * only grow (never below what is held and sold), and once the drop has opened its opening times stay.
 */
export async function saveBatch(actor: Actor, form: BatchForm): Promise<SaveBatchResult> {
  return inTransaction(async (transaction) => {
    const [design] = await sql<DesignRow>(
      `SELECT d.id, d.name, d.status, st.time_zone FROM designs d JOIN studios st ON st.id = d.studio_id WHERE d.id = $1`,
      [form.designId],
      transaction,
    );
    if (!design) throw fieldError('designId', 'There is no such design.');
    if (form.intent === 'schedule' && design.status !== 'published') {
      throw fieldError('designId', `${design.name} is not published yet: publish it before scheduling a batch, or save this batch as a draft.`);
    }
    const zone = design.time_zone;
    const opensAt = toInstant('opensAt', form.opensAt, zone);
    const closesAt = toInstant('closesAt', form.closesAt, zone);
    const earlyAccessAt = form.earlyAccessAt ? toInstant('earlyAccessAt', form.earlyAccessAt, zone) : null;
    if (closesAt <= opensAt) throw fieldError('closesAt', 'The drop must close after it opens.');
    if (earlyAccessAt && earlyAccessAt >= opensAt) throw fieldError('earlyAccessAt', 'Early access must start before the public opening.');

    const finishes = await sql<{ id: string; name: string; status: string }>(
      `SELECT id, name, status FROM finishes WHERE design_id = $1`,
      [design.id],
      transaction,
    );
    for (const [finishId, quantity] of Object.entries(form.quantities)) {
      const finish = finishes.find((f) => f.id === finishId);
      if (!finish) throw fieldError(`qty.${finishId}`, 'That finish is not part of this design.');
      if (quantity > 0 && form.intent === 'schedule' && finish.status !== 'published') {
        throw fieldError(`qty.${finishId}`, `${finish.name} is not published: publish it, or set its quantity to 0.`);
      }
    }

    const [{ now }] = (await sql<{ now: Date }>(`SELECT now() AS now`, [], transaction)) as [{ now: Date }];
    const status = form.intent === 'schedule' ? 'scheduled' : 'draft';
    let batchId = form.batchId;
    let previousStatus: string | null = null;
    let previousTimes: PreviousTimes | null = null;
    if (!batchId) {
      if (status === 'scheduled' && opensAt <= now) throw fieldError('opensAt', 'A new batch must open in the future.');
      const [created] = await sql<{ id: string }>(
        `INSERT INTO batches (design_id, name, status, per_buyer_limit, hold_minutes, early_access_at, opens_at, closes_at, ship_by, planned_ship_by, announcement)
         VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11) RETURNING id`,
        [design.id, form.name, status, form.perBuyerLimit, form.holdMinutes, earlyAccessAt, opensAt, closesAt, form.shipBy, form.plannedShipBy ?? null, form.announcement],
        transaction,
      );
      batchId = created!.id;
    } else {
      previousTimes = await updateExisting(batchId, design.id, form, { status, opensAt, closesAt, earlyAccessAt, now }, transaction);
      previousStatus = previousTimes.status;
    }
    const stock = await saveStock(batchId, form.quantities, transaction);
    const total = Object.values(stock.after).reduce((sum, n) => sum + n, 0);
    const masks = `${total} mask${total === 1 ? '' : 's'}`;
    await writeAudit(
      {
        actor,
        action: 'batch.saved',
        subject: { type: 'batch', id: batchId },
        summary:
          status === 'scheduled'
            ? `Scheduled ${form.name} of ${design.name} (${masks})`
            : `Saved ${form.name} of ${design.name} as a draft (${masks})`,
        before: previousStatus === null ? null : { status: previousStatus, stock: stock.before },
        after: { status, stock: stock.after },
      },
      transaction,
    );
    if (status === 'scheduled') await tellWaitlist(batchId, previousTimes, { opensAt, earlyAccessAt }, transaction);
    const warning =
      form.plannedShipBy && form.shipBy < form.plannedShipBy
        ? `The ship-by date ${form.shipBy} is earlier than the plan's ${form.plannedShipBy}: buyers will be promised a date the plan says is not reachable.`
        : null;
    return {
      batchId,
      status,
      warning,
      message: status === 'scheduled' ? `${form.name} is scheduled and shows in the shop.` : `${form.name} is saved as a draft; the shop does not show it.`,
    };
  });
}

type PreviousTimes = { status: string; opensAt: Date; earlyAccessAt: Date | null };

/**
 * The waitlist hears of a batch when it becomes scheduled, and again (a correction, with the next revision) when
 * the times it was told change. Both are queued with the save, so a save that fails tells nobody.
 */
async function tellWaitlist(batchId: string, before: PreviousTimes | null, after: { opensAt: Date; earlyAccessAt: Date | null }, transaction: Transaction) {
  const announced = await wasAnnounced(batchId, transaction);
  if (!announced) {
    await announceBatch(batchId, 'announced', { transaction });
    return;
  }
  const moved = !before || before.opensAt.getTime() !== after.opensAt.getTime() || (before.earlyAccessAt?.getTime() ?? null) !== (after.earlyAccessAt?.getTime() ?? null);
  if (moved) {
    const revision = await nextCorrectionRevision(batchId, transaction);
    await announceBatch(batchId, 'correction', { revision, detail: { reason: 'moved', opensAt: after.opensAt.toISOString() }, transaction });
  }
}

async function updateExisting(
  batchId: string,
  designId: string,
  form: BatchForm,
  t: { status: string; opensAt: Date; closesAt: Date; earlyAccessAt: Date | null; now: Date },
  transaction: Transaction,
): Promise<PreviousTimes> {
  const [current] = await sql<{ id: string; design_id: string; status: string; opens_at: Date; closes_at: Date; early_access_at: Date | null }>(
    `SELECT id, design_id, status, opens_at, closes_at, early_access_at FROM batches WHERE id = $1 FOR UPDATE`,
    [batchId],
    transaction,
  );
  if (!current) throw new AppError('batch_not_found', 'There is no such batch.', 404);
  if (current.design_id !== designId) throw fieldError('designId', 'A batch stays with the design it was made for.');
  if (current.status === 'cancelled') throw new AppError('batch_cancelled', 'This batch is cancelled and can no longer be edited.', 409);
  if (current.closes_at <= t.now) throw new AppError('batch_closed', 'This drop has closed; its batch can no longer be edited.', 409);
  const started = (current.early_access_at ?? current.opens_at) <= t.now && current.status === 'scheduled';
  if (started) {
    const same = (a: Date | null, b: Date | null) => (a?.getTime() ?? null) === (b?.getTime() ?? null);
    if (!same(current.opens_at, t.opensAt) || !same(current.early_access_at, t.earlyAccessAt)) {
      throw fieldError('opensAt', 'The drop has already opened, so its opening times stay as they are.');
    }
    if (t.status === 'draft') throw new AppError('batch_open', 'An open drop cannot go back to being a draft; cancel it instead.', 409);
  } else if (t.status === 'scheduled' && (t.earlyAccessAt ?? t.opensAt) <= t.now) {
    throw fieldError('opensAt', 'The opening must be in the future.');
  }
  await sql(
    `UPDATE batches SET name = $2, status = $3, per_buyer_limit = $4, hold_minutes = $5, early_access_at = $6, opens_at = $7, closes_at = $8,
            ship_by = $9, planned_ship_by = $10, announcement = $11, updated_at = now() WHERE id = $1`,
    [batchId, form.name, t.status, form.perBuyerLimit, form.holdMinutes, t.earlyAccessAt, t.opensAt, t.closesAt, form.shipBy, form.plannedShipBy ?? null, form.announcement],
    transaction,
  );
  return { status: current.status, opensAt: current.opens_at, earlyAccessAt: current.early_access_at };
}

/** Quantities by finish name, before and after the save, for the audit log. */
type StockChange = { before: Record<string, number>; after: Record<string, number> };

async function saveStock(batchId: string, quantities: Record<string, number>, transaction: Transaction): Promise<StockChange> {
  const existing = await sql<{ id: string; finish_id: string; quantity: number; held: number; sold: number; name: string }>(
    `SELECT s.id, s.finish_id, s.quantity, s.held, s.sold, f.name FROM batch_stock s JOIN finishes f ON f.id = s.finish_id WHERE s.batch_id = $1 FOR UPDATE OF s`,
    [batchId],
    transaction,
  );
  const [{ any }] = (await sql<{ any: boolean }>(`SELECT EXISTS (SELECT 1 FROM holds WHERE batch_id = $1) AS any`, [batchId], transaction)) as [{ any: boolean }];
  for (const row of existing) {
    const wanted = quantities[row.finish_id] ?? 0;
    if (any && wanted < row.quantity) {
      throw fieldError(`qty.${row.finish_id}`, `Buyers have already held from this batch, so ${row.name} can only grow: keep it at ${row.quantity} or more.`);
    }
    if (wanted < row.held + row.sold) {
      throw fieldError(`qty.${row.finish_id}`, `${row.held + row.sold} of ${row.name} are held or sold already.`);
    }
    if (wanted === 0 && !any) {
      await sql(`DELETE FROM batch_stock WHERE id = $1`, [row.id], transaction);
    } else if (wanted !== row.quantity) {
      await sql(`UPDATE batch_stock SET quantity = $2, updated_at = now() WHERE id = $1`, [row.id, wanted], transaction);
    }
  }
  for (const [finishId, quantity] of Object.entries(quantities)) {
    if (quantity > 0 && !existing.some((row) => row.finish_id === finishId)) {
      await sql(`INSERT INTO batch_stock (batch_id, finish_id, quantity) VALUES ($1, $2, $3)`, [batchId, finishId, quantity], transaction);
    }
  }
  const after = await sql<{ name: string; quantity: number }>(
    `SELECT f.name, s.quantity FROM batch_stock s JOIN finishes f ON f.id = s.finish_id WHERE s.batch_id = $1 ORDER BY f.position, f.name`,
    [batchId],
    transaction,
  );
  if (after.reduce((sum, row) => sum + row.quantity, 0) === 0) throw fieldError('quantities', 'Put at least one mask in the batch.');
  return {
    before: Object.fromEntries(existing.map((row) => [row.name, row.quantity])),
    after: Object.fromEntries(after.map((row) => [row.name, row.quantity])),
  };
}

/**
 * Cancels a batch that has not sold anything: running holds are let go and the drop page says it is
 * cancelled. A batch with paid orders must have them refunded first (telling its waitlist comes later).
 */
export async function cancelBatch(actor: Actor, batchId: string): Promise<{ name: string; releasedHolds: number }> {
  return inTransaction(async (transaction) => {
    const [batch] = await sql<{ id: string; name: string; status: string }>(`SELECT id, name, status FROM batches WHERE id = $1 FOR UPDATE`, [batchId], transaction);
    if (!batch) throw new AppError('batch_not_found', 'There is no such batch.', 404);
    if (batch.status === 'cancelled') throw new AppError('batch_cancelled', 'This batch is already cancelled.', 409);
    const [paid] = await sql<{ n: number }>(
      `SELECT count(*)::int AS n FROM orders WHERE batch_id = $1 AND paid_at IS NOT NULL AND state NOT IN ('refunded')`,
      [batchId],
      transaction,
    );
    if (paid!.n > 0) {
      throw new AppError('batch_has_orders', `${paid!.n} paid order(s) come from this batch: refund them before cancelling it.`, 409, { orders: paid!.n });
    }
    const holds = await sql<{ id: string; user_id: string }>(`SELECT id, user_id FROM holds WHERE batch_id = $1 AND state = 'active' ORDER BY id`, [batchId], transaction);
    for (const hold of holds) await sql(`SELECT release_hold($1, $2) AS released`, [hold.id, hold.user_id], transaction);
    await sql(`UPDATE batches SET status = 'cancelled', cancelled_at = now(), updated_at = now() WHERE id = $1`, [batchId], transaction);
    // Whoever was told of the batch is told it is off; unsent invitations to it are not sent.
    if (await wasAnnounced(batchId, transaction)) {
      await stopBatchAnnouncements(batchId, transaction);
      const revision = await nextCorrectionRevision(batchId, transaction);
      await announceBatch(batchId, 'correction', { revision, detail: { reason: 'cancelled' }, transaction });
    }
    await writeAudit(
      {
        actor,
        action: 'batch.cancelled',
        subject: { type: 'batch', id: batch.id },
        summary: `Cancelled ${batch.name}${holds.length ? ` and let go of ${holds.length} running hold${holds.length === 1 ? '' : 's'}` : ''}`,
        before: { status: batch.status, runningHolds: holds.length },
        after: { status: 'cancelled', runningHolds: 0 },
      },
      transaction,
    );
    return { name: batch.name, releasedHolds: holds.length };
  });
}

export type WorkshopBatch = {
  id: string; name: string; status: 'draft' | 'scheduled' | 'cancelled'; designId: string; designSlug: string; designName: string;
  perBuyerLimit: number; holdMinutes: number; earlyAccessAt: string | null; opensAt: string; closesAt: string; shipBy: string;
  plannedShipBy: string | null; announcement: string; timeZone: string; quantity: number; held: number; sold: number;
  stock: { finishId: string; quantity: number; held: number; sold: number }[]; hasHolds: boolean;
};

export async function listWorkshopBatches(batchId?: string): Promise<WorkshopBatch[]> {
  const rows = await sql<{
    id: string; name: string; status: WorkshopBatch['status']; design_id: string; design_slug: string; design_name: string; per_buyer_limit: number;
    hold_minutes: number; early_access_at: Date | null; opens_at: Date; closes_at: Date; ship_by: string; planned_ship_by: string | null;
    announcement: string; time_zone: string; stock: { finishId: string; quantity: number; held: number; sold: number }[] | null; has_holds: boolean;
  }>(
    `SELECT b.id, b.name, b.status, d.id AS design_id, d.slug AS design_slug, d.name AS design_name, b.per_buyer_limit, b.hold_minutes,
            b.early_access_at, b.opens_at, b.closes_at, b.ship_by::text, b.planned_ship_by::text, b.announcement, st.time_zone,
            (SELECT json_agg(json_build_object('finishId', s.finish_id, 'quantity', s.quantity, 'held', s.held, 'sold', s.sold)) FROM batch_stock s WHERE s.batch_id = b.id) AS stock,
            EXISTS (SELECT 1 FROM holds h WHERE h.batch_id = b.id) AS has_holds
       FROM batches b JOIN designs d ON d.id = b.design_id JOIN studios st ON st.id = d.studio_id
      WHERE ($1::uuid IS NULL OR b.id = $1)
      ORDER BY b.opens_at DESC`,
    [batchId ?? null],
  );
  return rows.map((r) => {
    const stock = r.stock ?? [];
    return {
      id: r.id, name: r.name, status: r.status, designId: r.design_id, designSlug: r.design_slug, designName: r.design_name,
      perBuyerLimit: r.per_buyer_limit, holdMinutes: r.hold_minutes, earlyAccessAt: r.early_access_at?.toISOString() ?? null,
      opensAt: r.opens_at.toISOString(), closesAt: r.closes_at.toISOString(), shipBy: r.ship_by, plannedShipBy: r.planned_ship_by,
      announcement: r.announcement, timeZone: r.time_zone, stock, hasHolds: r.has_holds,
      quantity: stock.reduce((n, s) => n + s.quantity, 0), held: stock.reduce((n, s) => n + s.held, 0), sold: stock.reduce((n, s) => n + s.sold, 0),
    };
  });
}

export type DesignForBatch = { id: string; slug: string; name: string; status: string; timeZone: string; finishes: { id: string; name: string; status: string }[] };

export async function listDesignsForBatches(): Promise<DesignForBatch[]> {
  const rows = await sql<{ id: string; slug: string; name: string; status: string; time_zone: string; finishes: DesignForBatch['finishes'] | null }>(
    `SELECT d.id, d.slug, d.name, d.status, st.time_zone,
            (SELECT json_agg(json_build_object('id', f.id, 'name', f.name, 'status', f.status) ORDER BY f.position) FROM finishes f WHERE f.design_id = d.id AND f.status <> 'retired') AS finishes
       FROM designs d JOIN studios st ON st.id = d.studio_id WHERE d.status <> 'retired' ORDER BY d.position, d.name`,
  );
  return rows.map((r) => ({ id: r.id, slug: r.slug, name: r.name, status: r.status, timeZone: r.time_zone, finishes: r.finishes ?? [] }));
}
