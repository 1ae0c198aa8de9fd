import 'server-only';
import { AppError } from '@/lib/api/errors';
import { sql } from '@/lib/db/sql';
import { needsCustomsDeclaration } from '@/lib/settings/shipping-rules';
import type { StudioSettings } from '@/lib/settings/studio';

export { renderPackingSlips } from './packing-slips-pdf';

// Packing slips (one per parcel, for the person packing it) and, for parcels that leave the studio's
// customs area, a customs declaration summary to copy onto the carrier's form. Orders table columns:
// migrations/20261203090100-create-orders.cjs. Orders carry no buyer's note, so the slip has none.

/** At most this many orders in one PDF: a day's packing, and still a quick answer. */
export const maxSlipOrders = 200;

type ShipTo = { name?: string | null; address?: Record<string, string | null> | null };

export type SlipLine = {
  position: number;
  designName: string;
  finishName: string;
  unitPriceMinor: number;
  /** The mask's own weight in grams, for the declaration's net weight (see `netWeightIsPacked`). */
  netWeightG: number | null;
  /** True when only the packed weight was recorded, so the net weight shown is the packed one. */
  netWeightIsPacked: boolean;
};

export type SlipOrder = {
  id: string;
  number: string;
  state: string;
  placedAt: Date;
  paidAt: Date | null;
  buyerName: string | null;
  email: string;
  currency: string;
  shipTo: ShipTo | null;
  /** ISO 3166-1 alpha-2. */
  shippingCountry: string;
  shippingLabel: string;
  shippingMinor: number;
  /** The weight checkout priced the parcel by: the larger of the packed and the volumetric weight. */
  chargeableWeightG: number;
  /**
   * What the parcel really weighs, the declaration's gross weight: each mask's packed weight (the design's
   * parcel_weight_g, mask with box and padding, as the studio packs one mask a box), or null when a design has
   * none recorded. Customs asks for real weights, so the volumetric figure a courier charges by is never used.
   */
  grossWeightG: number | null;
  /** What the buyer asked the studio at checkout (a gift, a door code), or null. */
  buyerNote: string | null;
  /** The lines still to be sent: refunded ones are left out. */
  lines: SlipLine[];
};

type OrderRow = {
  id: string; number: string; state: string; created_at: Date; paid_at: Date | null; buyer_name: string | null; email: string;
  currency: string; ship_to: ShipTo | null; shipping_country: string; shipping_label: string; shipping_minor: number; chargeable_weight_g: number;
  buyer_note: string | null;
};
type LineRow = {
  order_id: string; position: number; design_name: string; finish_name: string; unit_price_minor: number;
  weight_g: number | null; parcel_weight_g: number | null;
};

/**
 * The orders with these numbers, in the order asked (each once), with their lines that are not refunded.
 * Numbers that match no order are simply absent: the caller names them.
 */
export async function loadSlipOrders(numbers: readonly string[]): Promise<SlipOrder[]> {
  const wanted = [...new Set(numbers)];
  if (wanted.length === 0) return [];
  const orders = await sql<OrderRow>(
    `SELECT id, number, state, created_at, paid_at, buyer_name, email, currency, ship_to, shipping_country, shipping_label,
            shipping_minor, chargeable_weight_g, buyer_note
       FROM orders WHERE number = ANY($1::text[])`,
    [wanted],
  );
  if (orders.length === 0) return [];
  // Net weight is the design's weight_g, the mask alone: customs asks for the goods without their packing.
  // parcel_weight_g is the packed weight (mask, box and padding) and stands in only where weight_g is not set.
  const lines = await sql<LineRow>(
    `SELECT l.order_id, l.position, l.design_name, l.finish_name, l.unit_price_minor, d.weight_g, d.parcel_weight_g
       FROM order_lines l
       JOIN batch_stock s ON s.id = l.batch_stock_id
       JOIN batches b ON b.id = s.batch_id
       JOIN designs d ON d.id = b.design_id
      WHERE l.order_id = ANY($1::uuid[]) AND NOT l.refunded
      ORDER BY l.position`,
    [orders.map((o) => o.id)],
  );
  const byNumber = new Map(orders.map((o) => [o.number, o]));
  return wanted.flatMap((number) => {
    const o = byNumber.get(number);
    if (!o) return [];
    const own = lines.filter((l) => l.order_id === o.id);
    const gross = own.every((l) => l.parcel_weight_g !== null) ? own.reduce((sum, l) => sum + l.parcel_weight_g!, 0) : null;
    return [{
      id: o.id,
      number: o.number,
      state: o.state,
      placedAt: o.created_at,
      paidAt: o.paid_at,
      buyerName: o.buyer_name,
      email: o.email,
      currency: o.currency.trim(),
      shipTo: o.ship_to,
      shippingCountry: o.shipping_country.trim(),
      shippingLabel: o.shipping_label,
      shippingMinor: o.shipping_minor,
      chargeableWeightG: o.chargeable_weight_g,
      buyerNote: o.buyer_note,
      grossWeightG: own.length > 0 ? gross : null,
      lines: own
        .map((l) => ({
          position: l.position,
          designName: l.design_name,
          finishName: l.finish_name,
          unitPriceMinor: l.unit_price_minor,
          netWeightG: l.weight_g ?? l.parcel_weight_g,
          netWeightIsPacked: l.weight_g === null && l.parcel_weight_g !== null,
        })),
    }];
  });
}

/** Whether this order's parcel leaves the studio's customs area and so travels with a declaration (the renderer asks the same rule). */
export function needsDeclaration(order: Pick<SlipOrder, 'shippingCountry'>, settings: StudioSettings): boolean {
  return needsCustomsDeclaration(settings.customs.area, settings.country, order.shippingCountry);
}

/** "DM-1001, DM-1002 and 3 more": a list short enough for a message. */
export const listed = (numbers: readonly string[]) =>
  numbers.length <= 5 ? numbers.join(', ') : `${numbers.slice(0, 5).join(', ')} and ${numbers.length - 5} more`;

/**
 * Refuses, with a message that says what to do, orders that cannot be packed yet (not paid, nothing left
 * to send, no address) and declarations the studio's settings cannot fill in yet.
 */
export function assertPrintable(orders: readonly SlipOrder[], settings: StudioSettings): void {
  const unpaid = orders.filter((o) => o.state === 'awaiting_payment' || o.state === 'cancelled').map((o) => o.number);
  if (unpaid.length > 0) {
    throw new AppError(
      'order_not_paid',
      `${listed(unpaid)} ${unpaid.length === 1 ? 'is' : 'are'} not paid, so there is nothing to pack yet. Leave ${unpaid.length === 1 ? 'it' : 'them'} out and print again.`,
      409,
      { numbers: unpaid },
    );
  }
  const empty = orders.filter((o) => o.lines.length === 0).map((o) => o.number);
  if (empty.length > 0) {
    throw new AppError(
      'nothing_to_pack',
      `Every mask of ${listed(empty)} was refunded, so there is nothing to pack. Leave ${empty.length === 1 ? 'it' : 'them'} out and print again.`,
      409,
      { numbers: empty },
    );
  }
  const homeless = orders.filter((o) => !o.shipTo?.address).map((o) => o.number);
  if (homeless.length > 0) {
    throw new AppError(
      'no_delivery_address',
      `${listed(homeless)} ${homeless.length === 1 ? 'has' : 'have'} no delivery address on record. Ask the buyer for one before packing.`,
      409,
      { numbers: homeless },
    );
  }
  const abroad = orders.filter((o) => needsDeclaration(o, settings)).map((o) => o.number);
  const missing = [
    ...(settings.customs.hsCode ? [] : ['the HS code']),
    ...(settings.customs.originCountry ? [] : ['the country of origin']),
  ];
  if (abroad.length > 0 && missing.length > 0) {
    throw new AppError(
      'customs_settings_missing',
      `${listed(abroad)} ${abroad.length === 1 ? 'leaves' : 'leave'} the studio's customs area and need${abroad.length === 1 ? 's' : ''} a customs declaration, ` +
        `but the studio has not chosen ${missing.join(' or ')} for its masks yet. An owner can set ${missing.length === 1 ? 'it' : 'them'} in Settings → Customs.`,
      409,
      { numbers: abroad, missing: missing.map((m) => (m === 'the HS code' ? 'hsCode' : 'originCountry')) },
    );
  }
}

/**
 * Notes on each order that its slip was printed. Best effort: the PDF is already made, and a failed note
 * must not take it away from the person at the bench.
 */
export async function recordSlipsPrinted(orders: readonly SlipOrder[], settings: StudioSettings, actorId: string): Promise<void> {
  try {
    // One statement, so either every order gets its note or none does.
    await sql(
      `INSERT INTO order_events (order_id, type, actor_user_id, data)
       SELECT id, 'packing_slip_printed', $2, jsonb_build_object('customsDeclaration', declared)
         FROM unnest($1::uuid[], $3::boolean[]) AS t(id, declared)
       RETURNING id`,
      [orders.map((o) => o.id), actorId, orders.map((o) => needsDeclaration(o, settings))],
    );
  } catch (error) {
    console.error('Noting printed packing slips failed; the PDF was sent anyway', { error: (error as Error).message });
  }
}
