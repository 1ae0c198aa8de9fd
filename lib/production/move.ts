import 'server-only';
import type { Transaction } from 'sequelize';
import { AppError } from '@/lib/api/errors';
import { writeAudit } from '@/lib/audit/log';
import type { CurrentUser } from '@/lib/auth/session';
import { inTransaction, sql } from '@/lib/db/sql';
import { recordOrderEvent } from '@/lib/orders/checkout';
import { queueInProductionEmail } from '@/lib/orders/notify';
import { nextState, type OrderState } from '@/lib/orders/states';
import { moveLinesSchema } from './schemas';
import { checkMove, quoteStage, type LineStage } from './stages';

export type MoveOutcome = { moved: number; message: string; startedOrders: string[] };

type LineRow = {
  id: string; position: number; stage: LineStage; refunded: boolean; oversold_open: boolean; design_name: string; finish_name: string;
  order_id: string; number: string; state: OrderState; paid: boolean;
};

const lineSelect = `
  SELECT l.id, l.position, l.stage, l.refunded, (l.oversold AND l.oversold_resolution IS NULL) AS oversold_open,
         l.design_name, l.finish_name, o.id AS order_id, o.number, o.state, o.paid_at IS NOT NULL AS paid
    FROM order_lines l JOIN orders o ON o.id = l.order_id`;

const lineName = (line: Pick<LineRow, 'position' | 'number'>) => `Line ${line.position} of ${line.number}`;
const onBoard = (line: LineRow) => line.paid && line.state !== 'refunded' && line.state !== 'cancelled';

function ago(seconds: number): string {
  if (seconds < 90) return 'a moment ago';
  if (seconds < 3600) return `${Math.round(seconds / 60)} minutes ago`;
  if (seconds < 36 * 3600) return `${Math.round(seconds / 3600)} hours ago`;
  return `${Math.round(seconds / 86400)} days ago`;
}

/** Says where a mask is now, and who last moved it, when it is not where the person saw it. */
async function whereNow(lineId: string, wanted: LineStage, actor: CurrentUser, transaction: Transaction): Promise<string> {
  // A new statement sees what the other person committed, even inside this transaction.
  const [line] = await sql<LineRow>(`${lineSelect} WHERE l.id = $1`, [lineId], transaction);
  if (!line || !onBoard(line)) return 'One of the chosen masks is not on the board any more: its order was refunded or cancelled.';
  if (line.refunded) return `${lineName(line)} was refunded, so it is not made any more.`;
  const [last] = await sql<{ who: string | null; mine: boolean; seconds: number }>(
    `SELECT coalesce(u.name, u.email) AS who, e.actor_user_id = $3 AS mine, extract(epoch FROM now() - e.created_at)::int AS seconds
       FROM order_events e LEFT JOIN users u ON u.id = e.actor_user_id
      WHERE e.order_id = $1 AND e.type = 'line_stage' AND e.data->>'lineId' = $2 ORDER BY e.id DESC LIMIT 1`,
    [line.order_id, line.id, actor.id],
    transaction,
  );
  const by = last ? ` (moved by ${last.mine ? 'you' : (last.who ?? 'someone')} ${ago(Math.max(last.seconds, 0))})` : '';
  const where = line.stage === wanted ? `is already at ${quoteStage(line.stage)}` : `is now at ${quoteStage(line.stage)}`;
  return `${lineName(line)} ${where}${by}. Reload the board to see it.`;
}

/**
 * A paid order whose first mask leaves the mold queue is in production, and its buyer is told; refunded or
 * partly refunded ones keep their state.
 */
async function startProduction(orderId: string, actor: CurrentUser, transaction: Transaction): Promise<string | null> {
  const [order] = await sql<{ number: string; state: OrderState; paid_minor: number; refunded_minor: number }>(
    `SELECT number, state, paid_minor, refunded_minor FROM orders WHERE id = $1 FOR UPDATE`,
    [orderId],
    transaction,
  );
  if (!order || order.state !== 'paid' || nextState({ ...order, state: 'in_production' }) !== 'in_production') return null;
  await sql(`UPDATE orders SET state = 'in_production', updated_at = now() WHERE id = $1`, [orderId], transaction);
  await recordOrderEvent(orderId, 'state_changed', { from: 'paid', to: 'in_production', actor: actor.id }, transaction);
  // The buyer hears of it once per order (the outbox key sees to that), and only if this move is committed.
  await queueInProductionEmail(orderId, transaction);
  return order.number;
}

/**
 * Moves masks to another stage, all of them or none. Each line changes only if it is still at the stage
 * the person saw (`from`, or where it is now when no stage is given), so when two people move the same
 * mask at once the second is told where it went instead of overwriting it. Every move is an order event
 * and an audit entry, in the same transaction.
 */
export async function moveLines({ actor, ...input }: { lineIds: string[]; from?: LineStage; to: LineStage; actor: CurrentUser }): Promise<MoveOutcome> {
  const parsed = moveLinesSchema.safeParse(input);
  if (!parsed.success) throw new AppError('invalid_input', parsed.error.issues[0]?.message ?? 'Choose masks and a stage.', 422);
  const { from, to } = parsed.data;
  // One order of rows for every caller, so two bulk moves never wait on each other in a circle.
  const ids = [...new Set(parsed.data.lineIds)].sort();

  return inTransaction(async (transaction) => {
    const rows = await sql<LineRow>(`${lineSelect} WHERE l.id = ANY($1::uuid[])`, [ids], transaction);
    const byId = new Map(rows.map((row) => [row.id, row]));
    const problems: string[] = [];
    const moved: { line: LineRow; from: LineStage }[] = [];

    for (const id of ids) {
      const line = byId.get(id);
      if (!line || !onBoard(line)) {
        problems.push('One of the chosen masks is not on the board any more: its order was refunded or cancelled.');
        continue;
      }
      const expected = from ?? line.stage;
      if (line.stage !== expected) {
        problems.push(await whereNow(id, to, actor, transaction));
        continue;
      }
      const check = checkMove(expected, to, actor.role, { refunded: line.refunded, oversoldOpen: line.oversold_open });
      if (!check.ok) {
        problems.push(`${lineName(line)}: ${check.message}`);
        continue;
      }
      // Once one mask is refused nothing will be written; the rest are only checked, to list every problem.
      if (problems.length > 0) continue;
      const [updated] = await sql<{ id: string }>(
        `UPDATE order_lines SET stage = $3, updated_at = now()
          WHERE id = $1 AND stage = $2 AND NOT refunded AND NOT (oversold AND oversold_resolution IS NULL) RETURNING id`,
        [id, expected, to],
        transaction,
      );
      if (!updated) problems.push(await whereNow(id, to, actor, transaction));
      else moved.push({ line, from: expected });
    }

    if (problems.length > 0) {
      const message =
        problems.length === 1 && ids.length === 1
          ? `Nothing was moved. ${problems[0]}`
          : `Nothing was moved: ${problems.length} of the ${ids.length} masks cannot go to ${quoteStage(to)}.`;
      throw new AppError('lines_not_moved', message, 409, { fields: { lines: problems } });
    }

    for (const { line, from: was } of moved) {
      await recordOrderEvent(line.order_id, 'line_stage', { actor: actor.id, data: { lineId: line.id, from: was, to } }, transaction);
      await writeAudit(
        {
          actor,
          action: 'line.stage_changed',
          subject: { type: 'order_line', id: line.id },
          summary: `${lineName(line)} (${line.design_name} — ${line.finish_name}): ${quoteStage(was)} → ${quoteStage(to)}`,
          before: { stage: was },
          after: { stage: to },
        },
        transaction,
      );
    }
    const starting = [...new Set(moved.filter((m) => m.from === 'to_cast').map((m) => m.line.order_id))].sort();
    const startedOrders: string[] = [];
    for (const orderId of starting) {
      const number = await startProduction(orderId, actor, transaction);
      if (number) startedOrders.push(number);
    }

    const first = moved[0]!.line;
    const message =
      (moved.length === 1 ? `${lineName(first)} is now at ${quoteStage(to)}.` : `Moved ${moved.length} masks to ${quoteStage(to)}.`) +
      (startedOrders.length ? ` ${startedOrders.join(', ')} ${startedOrders.length === 1 ? 'is' : 'are'} now in production.` : '');
    return { moved: moved.length, message, startedOrders };
  });
}
