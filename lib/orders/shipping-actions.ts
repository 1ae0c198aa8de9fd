import 'server-only';
import type { Transaction } from 'sequelize';
import { AppError } from '@/lib/api/errors';
import { writeAudit } from '@/lib/audit/log';
import { hasRole } from '@/lib/auth/roles';
import type { CurrentUser } from '@/lib/auth/session';
import { inTransaction, sql } from '@/lib/db/sql';
import { isFailed, quoteStage, type LineStage } from '@/lib/production/stages';
import { trackingUrl } from '@/lib/settings/shipping-rules';
import { loadStudioSettings } from '@/lib/settings/studio';
import { recordOrderEvent } from './checkout';
import { orderMailKeys, queueOrderConfirmation, queueShippedEmail } from './notify';
import type { ShipTo } from './queries';
import { emailKindLabels, orderNoteSchema, shipOrderSchema, shipToSchema, type EmailKind, type ShipOrderInput, type ShipToInput } from './shipping-schemas';
import { nextState, type OrderState } from './states';

// The studio's work on one order after production: shipping it, its address, its notes and its e-mails.
// Each change is one transaction with its order event and audit entry, and the buyer's e-mail goes into
// the outbox in that same transaction.

type OrderRow = {
  id: string; number: string; state: OrderState; paid_minor: number; refunded_minor: number; email: string;
  shipped_at: Date | null; carrier_name: string | null; tracking_number: string | null; ship_to: ShipTo | null; shipping_country: string;
};
type LineRow = { id: string; position: number; stage: LineStage; refunded: boolean; design_name: string; finish_name: string };

function invalid(issues: { path: PropertyKey[]; message: string }[], fallback: string): AppError {
  const fields: Record<string, string[]> = {};
  for (const issue of issues) (fields[String(issue.path[0] ?? 'form')] ??= []).push(issue.message);
  return new AppError('invalid_input', issues[0]?.message ?? fallback, 422, { fields });
}

function requireStaff(actor: CurrentUser) {
  if (!hasRole(actor.role, 'staff')) throw new AppError('forbidden', 'Only the studio works on orders.', 403);
}

async function lockOrder(number: string, transaction: Transaction): Promise<OrderRow> {
  const [order] = await sql<OrderRow>(
    `SELECT id, number, state, paid_minor, refunded_minor, email, shipped_at, carrier_name, tracking_number, ship_to, shipping_country::text
       FROM orders WHERE number = $1 FOR UPDATE`,
    [number],
    transaction,
  );
  if (!order) throw new AppError('order_not_found', 'There is no such order.', 404);
  return order;
}

const maskName = (line: LineRow) => `mask ${line.position} (${line.design_name} — ${line.finish_name})`;
const joinWithAnd = (items: string[]) => (items.length <= 1 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items.at(-1)}`);

function ago(seconds: number): string {
  if (seconds < 90) return 'a moment ago';
  if (seconds < 3600) return `${Math.round(seconds / 60)} minutes ago`;
  if (seconds < 36 * 3600) return `${Math.round(seconds / 3600)} hours ago`;
  return `${Math.round(seconds / 86400)} days ago`;
}

/** Who shipped the order and when, for the person who tried to ship it again. */
async function alreadyShipped(order: OrderRow, actor: CurrentUser, transaction: Transaction): Promise<AppError> {
  const [last] = await sql<{ who: string | null; mine: boolean; seconds: number }>(
    `SELECT coalesce(u.name, u.email) AS who, e.actor_user_id = $2 AS mine, extract(epoch FROM now() - e.created_at)::int AS seconds
       FROM order_events e LEFT JOIN users u ON u.id = e.actor_user_id WHERE e.order_id = $1 AND e.type = 'shipped' ORDER BY e.id DESC LIMIT 1`,
    [order.id, actor.id],
    transaction,
  );
  const by = last ? ` by ${last.mine ? 'you' : (last.who ?? 'someone')} ${ago(Math.max(last.seconds, 0))}` : '';
  return new AppError(
    'already_shipped',
    `${order.number} was already shipped${by}, with ${order.carrier_name ?? 'a carrier'} (tracking number ${order.tracking_number ?? 'not recorded'}). Nothing was changed.`,
    409,
  );
}

export type ShipResult = { message: string; trackingUrl: string; emailQueued: boolean };

/**
 * Marks an order shipped: every mask that is still to go (not refunded, not failed) must be packed; they
 * all move to shipped, the order records the carrier, tracking number and link as they are now, and the
 * buyer's "shipped" e-mail is queued once. The order row is locked first, so when two people ship the same
 * order at once the second waits, then finds it shipped and is told by whom.
 */
export async function shipOrder(actor: CurrentUser, input: ShipOrderInput): Promise<ShipResult> {
  requireStaff(actor);
  const parsed = shipOrderSchema.safeParse(input);
  if (!parsed.success) throw invalid(parsed.error.issues, 'Choose a carrier and enter the tracking number.');
  const { number, carrierId, trackingNumber } = parsed.data;

  return inTransaction(async (transaction) => {
    const settings = await loadStudioSettings(transaction);
    const carrier = settings?.carriers.find((c) => c.id === carrierId);
    if (!carrier) {
      throw new AppError('carrier_unknown', 'That carrier is not one of the studio’s any more. Reload the page and choose again.', 422, {
        fields: { carrierId: ['Choose one of the carriers listed.'] },
      });
    }
    const link = trackingUrl(carrier.trackingUrlTemplate, trackingNumber);
    if (new URL(link).protocol !== 'https:') throw new AppError('carrier_link_broken', `${carrier.name}’s tracking link is not a web address; the owner can fix it in the settings.`, 422);

    const order = await lockOrder(number, transaction);
    if (order.shipped_at) throw await alreadyShipped(order, actor, transaction);
    if (order.paid_minor <= 0) throw new AppError('order_not_paid', `${order.number} is not paid, so it does not ship.`, 409);
    if (order.state === 'refunded' || order.state === 'cancelled') {
      throw new AppError('order_closed', `${order.number} is ${order.state === 'refunded' ? 'refunded in full' : 'cancelled'}, so nothing of it ships.`, 409);
    }

    const lines = await sql<LineRow>(
      `SELECT id, position, stage, refunded, design_name, finish_name FROM order_lines WHERE order_id = $1 ORDER BY position FOR UPDATE`,
      [order.id],
      transaction,
    );
    const going = lines.filter((line) => !line.refunded && !isFailed(line.stage));
    if (going.length === 0) throw new AppError('nothing_to_ship', `${order.number} has no mask left to ship: each is refunded or failed.`, 409);
    if (going.every((line) => line.stage === 'shipped')) {
      throw new AppError('already_shipped', `${order.number} was shipped before carriers and tracking numbers were recorded here. Nothing was changed.`, 409);
    }
    const waiting = going.filter((line) => line.stage !== 'packed');
    if (waiting.length > 0) {
      const words = waiting.map((line) => `${maskName(line)} is at ${quoteStage(line.stage)}`);
      throw new AppError(
        'not_packed',
        `Not shipped: ${joinWithAnd(words)}. Pack every mask of ${order.number} first, then mark it shipped.`,
        409,
        { fields: { lines: words } },
      );
    }

    const moved = await sql<{ id: string }>(
      `UPDATE order_lines SET stage = 'shipped', updated_at = now() WHERE id = ANY($1::uuid[]) AND stage = 'packed' AND NOT refunded RETURNING id`,
      [going.map((line) => line.id)],
      transaction,
    );
    if (moved.length !== going.length) throw new AppError('lines_changed', `The masks of ${order.number} changed meanwhile. Reload the order and try again.`, 409);

    // A partly refunded order keeps that state when it ships; one in production (or paid) becomes shipped.
    const to = nextState({ ...order, state: 'shipped' });
    const [shipped] = await sql<{ shipped_at: Date }>(
      `UPDATE orders SET state = $2, carrier_name = $3, tracking_number = $4, tracking_url = $5, shipped_at = now(), updated_at = now()
        WHERE id = $1 AND state = $6 AND shipped_at IS NULL RETURNING shipped_at`,
      [order.id, to, carrier.name, trackingNumber, link, order.state],
      transaction,
    );
    if (!shipped) throw await alreadyShipped(await lockOrder(number, transaction), actor, transaction);

    for (const line of going) {
      await recordOrderEvent(order.id, 'line_stage', { actor: actor.id, data: { lineId: line.id, from: 'packed', to: 'shipped' } }, transaction);
    }
    const parcel = { carrierName: carrier.name, trackingNumber, trackingUrl: link, lines: going.length };
    await recordOrderEvent(order.id, 'shipped', { from: order.state, to: to !== order.state ? to : null, actor: actor.id, data: parcel }, transaction);
    const left = lines.filter((line) => !line.refunded && isFailed(line.stage));
    await writeAudit(
      {
        actor,
        action: 'order.shipped',
        subject: { type: 'order', id: order.id },
        summary: `Shipped ${order.number} (${going.length === 1 ? '1 mask' : `${going.length} masks`}) with ${carrier.name}, tracking number ${trackingNumber}`,
        before: { state: order.state, stage: 'packed' },
        after: { state: to, stage: 'shipped', ...parcel },
      },
      transaction,
    );
    const emailQueued = await queueShippedEmail(order.id, transaction);
    const behind = left.length > 0 ? ` ${joinWithAnd(left.map(maskName))} stayed behind (failed).` : '';
    return { message: `${order.number} is shipped with ${carrier.name}, tracking number ${trackingNumber}. The buyer gets an e-mail with the tracking link.${behind}`, trackingUrl: link, emailQueued };
  });
}

/** Why the address can no longer change, or null while it can: once a mask is packed the label may be printed. */
export function addressLockedReason(lines: { position: number; stage: string; refunded: boolean }[], shipped: boolean): string | null {
  if (shipped) return 'The order has shipped, so its address is as it went.';
  const packed = lines.filter((line) => !line.refunded && (line.stage === 'packed' || line.stage === 'shipped'));
  if (packed.length === 0) return null;
  const which = packed.length === 1 ? `Mask ${packed[0]!.position} is packed` : `Masks ${joinWithAnd(packed.map((line) => String(line.position)))} are packed`;
  return `${which}, so its label may already be on the box: the address cannot change here any more.`;
}

/**
 * Changes where an order goes, while no mask of it is packed. The change is an order event with the old and
 * new address, and an audit entry. The country stays the one the shipping was priced for.
 */
export async function updateShipTo(actor: CurrentUser, input: { number: string; shipTo: Record<string, unknown> }): Promise<string> {
  requireStaff(actor);
  const parsed = shipToSchema.safeParse(input.shipTo);
  if (!parsed.success) throw invalid(parsed.error.issues, 'Please check the address.');
  const address: ShipToInput = parsed.data;

  return inTransaction(async (transaction) => {
    const order = await lockOrder(input.number, transaction);
    if (order.paid_minor <= 0 || order.state === 'cancelled') throw new AppError('order_not_paid', `${order.number} is not paid; its address comes with the payment.`, 409);
    // Shared locks: a mask cannot be packed while the address changes, nor the address change as one is packed.
    const lines = await sql<{ position: number; stage: string; refunded: boolean }>(
      `SELECT position, stage, refunded FROM order_lines WHERE order_id = $1 ORDER BY position FOR SHARE`,
      [order.id],
      transaction,
    );
    const locked = addressLockedReason(lines, order.shipped_at !== null);
    if (locked) throw new AppError('address_locked', `Not changed. ${locked}`, 409);
    if (address.country !== order.shipping_country.trim()) {
      throw new AppError('country_fixed', `The shipping was paid for ${order.shipping_country.trim()}; the parcel cannot go to another country from here.`, 422, {
        fields: { country: [`Keep ${order.shipping_country.trim()}: the shipping was priced for it.`] },
      });
    }
    const before = order.ship_to;
    const after: ShipTo = { name: address.name, address: { line1: address.line1, line2: address.line2, city: address.city, postal_code: address.postal_code, state: address.state, country: address.country } };
    if (JSON.stringify(before) === JSON.stringify(after)) return 'The address is as it was: nothing to change.';
    await sql(`UPDATE orders SET ship_to = $2::jsonb, updated_at = now() WHERE id = $1`, [order.id, JSON.stringify(after)], transaction);
    await recordOrderEvent(order.id, 'address_changed', { actor: actor.id, data: { before, after } }, transaction);
    await writeAudit(
      { actor, action: 'order.address_changed', subject: { type: 'order', id: order.id }, summary: `Changed the shipping address of ${order.number}`, before, after },
      transaction,
    );
    return `The shipping address of ${order.number} is changed.`;
  });
}

/** Adds one of the studio's notes to an order; the buyer never sees them. */
export async function addOrderNote(actor: CurrentUser, input: { number: string; body: string }): Promise<string> {
  requireStaff(actor);
  const parsed = orderNoteSchema.safeParse(input);
  if (!parsed.success) throw invalid(parsed.error.issues, 'Write the note first.');
  return inTransaction(async (transaction) => {
    const order = await lockOrder(parsed.data.number, transaction);
    await sql(
      `INSERT INTO order_notes (order_id, author_user_id, author_label, body) VALUES ($1, $2, $3, $4)`,
      [order.id, actor.id, (actor.name?.trim() || actor.email).slice(0, 200), parsed.data.body],
      transaction,
    );
    return 'Note added.';
  });
}

/**
 * Sends the buyer an e-mail of this order again. A resend is a new message with a key of its own (the key
 * of the order's message plus the id of the event that records the resend), so it goes out even though the
 * first one was sent, and each resend exactly once.
 */
export async function resendOrderEmail(actor: CurrentUser, input: { number: string; kind: EmailKind }): Promise<string> {
  requireStaff(actor);
  return inTransaction(async (transaction) => {
    const order = await lockOrder(input.number, transaction);
    if (order.paid_minor <= 0) throw new AppError('order_not_paid', `${order.number} is not paid, so it has no confirmation to send.`, 409);
    if (input.kind === 'shipped' && !order.shipped_at) throw new AppError('order_not_shipped', `${order.number} has not shipped yet, so there is no shipped e-mail to send.`, 409);
    const [event] = await sql<{ id: string }>(
      `INSERT INTO order_events (order_id, type, actor_user_id, data) VALUES ($1, 'email_resent', $2, $3) RETURNING id::text`,
      [order.id, actor.id, JSON.stringify({ kind: input.kind, to: order.email })],
      transaction,
    );
    const base = input.kind === 'shipped' ? orderMailKeys.shipped(order.id) : orderMailKeys.confirmation(order.id);
    const dedupeKey = `${base}:resend:${event!.id}`;
    if (input.kind === 'shipped') await queueShippedEmail(order.id, transaction, { dedupeKey });
    else await queueOrderConfirmation(order.id, transaction, { dedupeKey });
    return `The ${emailKindLabels[input.kind]} is on its way to ${order.email} again.`;
  });
}
