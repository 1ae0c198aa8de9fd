import 'server-only';
import { AppError } from '@/lib/api/errors';
import type { CurrentUser } from '@/lib/auth/session';
import { sql } from '@/lib/db/sql';
import { moveLines } from '@/lib/production/move';
import { isFailed, nextStage, quoteStage, type LineStage } from '@/lib/production/stages';

export const maxOrdersPerAdvance = 50;

export type AdvanceSummary = { moved: number; movedOrders: string[]; refused: string[]; message: string };

type Line = { id: string; order_id: string; number: string; stage: LineStage; refunded: boolean; oversold_open: boolean; on_board: boolean };

const masks = (n: number) => (n === 1 ? '1 mask' : `${n} masks`);

/** Why a mask of the order does not step on from the orders table, or null when it can. */
function heldBack(line: Line): string | null {
  if (!line.on_board) return 'is not paid, or is refunded or cancelled';
  if (line.refunded) return null; // A refunded mask is simply not made; it is not worth a word.
  if (line.oversold_open) return 'has an oversold mask waiting for the owner’s decision';
  if (line.stage === 'shipped') return null;
  if (line.stage === 'packed') return 'is packed and waits for shipping';
  if (isFailed(line.stage)) return `has a mask at ${quoteStage(line.stage)}, which only the owner sends back`;
  return null;
}

/**
 * Moves every mask of the chosen orders one stage on, through the production board's own `moveLines`
 * (so the same rules, events, audit entries and e-mails apply). Each order and stage is its own move, so
 * one order that cannot move does not hold the others back; the summary says what moved and what did not.
 */
export async function advanceOrders(actor: CurrentUser, orderIds: string[]): Promise<AdvanceSummary> {
  const ids = [...new Set(orderIds)];
  if (ids.length === 0) throw new AppError('invalid_input', 'Choose at least one order.', 422);
  if (ids.length > maxOrdersPerAdvance) throw new AppError('invalid_input', `Advance at most ${maxOrdersPerAdvance} orders at a time.`, 422);
  const lines = await sql<Line>(
    `SELECT l.id, l.order_id, o.number, l.stage, l.refunded, (l.oversold AND l.oversold_resolution IS NULL) AS oversold_open,
            (o.paid_at IS NOT NULL AND o.state NOT IN ('refunded', 'cancelled')) AS on_board
       FROM order_lines l JOIN orders o ON o.id = l.order_id WHERE o.id = ANY($1::uuid[]) ORDER BY length(o.number), o.number, l.position`,
    [ids],
  );
  const byOrder = new Map<string, Line[]>();
  for (const line of lines) byOrder.set(line.order_id, [...(byOrder.get(line.order_id) ?? []), line]);

  let moved = 0;
  const movedOrders: string[] = [];
  const refused: string[] = [];
  if (byOrder.size < ids.length) refused.push(`${ids.length - byOrder.size === 1 ? 'One order' : `${ids.length - byOrder.size} orders`} could not be found; reload the list.`);

  for (const own of byOrder.values()) {
    const number = own[0]!.number;
    const reasons = [...new Set(own.map(heldBack).filter((r): r is string => r !== null))];
    for (const reason of reasons) refused.push(`${number} ${reason}.`);
    const steps = new Map<LineStage, string[]>();
    for (const line of own) {
      if (heldBack(line) !== null || line.refunded || !nextStage(line.stage)) continue;
      steps.set(line.stage, [...(steps.get(line.stage) ?? []), line.id]);
    }
    if (steps.size === 0) {
      if (reasons.length === 0) refused.push(`${number} has nothing left to move on.`);
      continue;
    }
    let orderMoved = 0;
    for (const [from, lineIds] of steps) {
      try {
        const result = await moveLines({ lineIds, from, to: nextStage(from)!, actor });
        orderMoved += result.moved;
      } catch (error) {
        if (!(error instanceof AppError)) throw error;
        refused.push(`${number}: ${error.message}`);
      }
    }
    if (orderMoved > 0) {
      moved += orderMoved;
      movedOrders.push(number);
    }
  }

  const movedWords = moved > 0 ? `Moved ${masks(moved)} of ${movedOrders.join(', ')} one stage on.` : 'Nothing was moved.';
  const refusedWords = refused.length > 0 ? ` Not moved: ${refused.join(' ')}` : '';
  return { moved, movedOrders, refused, message: `${movedWords}${refusedWords}` };
}
