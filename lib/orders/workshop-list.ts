import 'server-only';
import { z } from 'zod';
import { AppError } from '@/lib/api/errors';
import { sql } from '@/lib/db/sql';
import { minorUnitDigits } from '@/lib/money';
import { lineStages } from '@/lib/production/stages';
import { orderStateLabels, orderStates, type OrderState } from './states';

// The workshop's orders table and its CSV: one query shape, read a page at a time or streamed in batches.

export const workshopOrderSorts = ['number', 'placed', 'total', 'state', 'country'] as const;
export type WorkshopOrderSort = (typeof workshopOrderSorts)[number];

// A form or a shared link sends an empty field as ""; that means "no filter", not a bad value.
const blank = (value: unknown) => (typeof value === 'string' && value.trim() === '' ? undefined : value);
const optional = <T extends z.ZodType>(schema: T) => z.preprocess(blank, schema.optional());
const wholeNumber = (name: string) => z.coerce.number({ error: `${name} must be a whole number.` }).int(`${name} must be a whole number.`);
const yesNo = (name: string) =>
  optional(z.enum(['true', 'false'], { error: `${name} must be true or false.` }).transform((value) => value === 'true'));

export const workshopOrdersQuerySchema = z.object({
  page: z.preprocess(blank, wholeNumber('page').min(1, 'page must be 1 or more.').default(1)),
  perPage: z.preprocess(blank, wholeNumber('perPage').min(10, 'perPage must be between 10 and 100.').max(100, 'perPage must be between 10 and 100.').default(25)),
  sort: z.preprocess(blank, z.enum(workshopOrderSorts, { error: 'sort must be one of number, placed, total, state or country.' }).default('placed')),
  dir: z.preprocess(blank, z.enum(['asc', 'desc'], { error: 'dir must be asc or desc.' }).default('desc')),
  batch: optional(z.uuid({ error: 'batch must be the id of a batch.' })),
  finish: optional(z.uuid({ error: 'finish must be the id of a finish.' })),
  // Without a state only orders that were paid are listed; "all" adds those awaiting payment and cancelled.
  state: optional(z.enum([...orderStates, 'all'], { error: `state must be all or one of ${orderStates.join(', ')}.` })),
  stage: optional(z.enum(lineStages, { error: `stage must be one of ${lineStages.join(', ')}.` })),
  oversold: yesNo('oversold'),
  refunded: yesNo('refunded'),
  country: optional(z.string().regex(/^[A-Z]{2}$/, 'country must be a two-letter country code in capitals, such as IE.')),
  q: optional(z.string().trim().max(100, 'Keep the search under 100 characters.')),
});
export type WorkshopOrdersQuery = z.output<typeof workshopOrdersQuerySchema>;

/** Parses a URL's query; bad values become one 400 naming each field, as parseBody does for bodies. */
export function parseWorkshopOrdersQuery(params: URLSearchParams): WorkshopOrdersQuery {
  const parsed = workshopOrdersQuerySchema.safeParse(Object.fromEntries(params));
  if (parsed.success) return parsed.data;
  const fields: Record<string, string[]> = {};
  for (const issue of parsed.error.issues) (fields[String(issue.path[0] ?? 'query')] ??= []).push(issue.message);
  throw new AppError('invalid_query', parsed.error.issues[0]?.message ?? 'Check the filters and try again.', 400, { fields });
}

export type WorkshopOrderRow = {
  id: string; number: string; state: OrderState; placedAt: string; paidAt: string | null; buyerName: string | null; email: string;
  country: string; currency: string; linesMinor: number; shippingMinor: number; taxIncludedMinor: number; totalMinor: number;
  paidMinor: number; refundedMinor: number; batchId: string; batchName: string; masks: number; oversoldOpen: number;
  items: { design: string; finish: string; count: number }[];
};

export type WorkshopOrdersPage = { rows: WorkshopOrderRow[]; total: number; page: number; perPage: number; pageCount: number };

type Row = {
  id: string; number: string; state: OrderState; created_at: Date; paid_at: Date | null; buyer_name: string | null; email: string;
  shipping_country: string; currency: string; lines_minor: number; shipping_minor: number; tax_included_minor: number; total_minor: number;
  paid_minor: number; refunded_minor: number; batch_id: string; batch_name: string; masks: number; oversold_open: number;
  items: WorkshopOrderRow['items']; keys: string[];
};

// Each sort is a list of (expression, type) keys ending in the order's id, so the order is total and a
// keyset ("after this row") can carry on from the last row of a batch. Keys travel as text so a
// timestamp keeps its microseconds.
const idKey = ['o.id', 'uuid'] as const;
const placedKey = ['o.created_at', 'timestamptz'] as const;
const sortKeys: Record<WorkshopOrderSort, (readonly [string, string])[]> = {
  placed: [placedKey, idKey],
  // DM-999 before DM-1000: shorter numbers first, then by text.
  number: [['length(o.number)', 'int'], ['o.number', 'text'], idKey],
  total: [['o.total_minor', 'int'], placedKey, idKey],
  // In the order an order lives through, not alphabetically.
  state: [[`array_position(ARRAY[${orderStates.map((s) => `'${s}'`).join(', ')}]::text[], o.state)`, 'int'], placedKey, idKey],
  country: [['o.shipping_country::text', 'text'], placedKey, idKey],
};

const rowSelect = (keys: string) => `
  SELECT o.id, o.number, o.state, o.created_at, o.paid_at, o.buyer_name, o.email, o.shipping_country, o.currency, o.lines_minor,
         o.shipping_minor, o.tax_included_minor, o.total_minor, o.paid_minor, o.refunded_minor, o.batch_id, b.name AS batch_name,
         li.masks, li.oversold_open, li.items, ARRAY[${keys}] AS keys
    FROM orders o JOIN batches b ON b.id = o.batch_id
   CROSS JOIN LATERAL (
     SELECT coalesce(sum(g.n), 0)::int AS masks, coalesce(sum(g.open), 0)::int AS oversold_open,
            coalesce(json_agg(json_build_object('design', g.design_name, 'finish', g.finish_name, 'count', g.n) ORDER BY g.first), '[]') AS items
       FROM (SELECT design_name, finish_name, count(*)::int AS n, min(position) AS first,
                    count(*) FILTER (WHERE oversold AND oversold_resolution IS NULL AND NOT refunded)::int AS open
               FROM order_lines WHERE order_id = o.id GROUP BY design_name, finish_name) g
   ) li`;

/** `%` and `_` in what a person typed are letters, not wildcards. */
export const escapeLike = (text: string) => text.replace(/[\\%_]/g, (c) => `\\${c}`);

function filterConditions(query: WorkshopOrdersQuery) {
  const bind: unknown[] = [];
  const param = (value: unknown) => `$${bind.push(value)}`;
  const conditions: string[] = [];
  if (query.state === undefined) conditions.push('o.paid_at IS NOT NULL');
  else if (query.state !== 'all') conditions.push(`o.state = ${param(query.state)}`);
  if (query.batch) conditions.push(`o.batch_id = ${param(query.batch)}`);
  if (query.finish) {
    conditions.push(`EXISTS (SELECT 1 FROM order_lines fl JOIN batch_stock bs ON bs.id = fl.batch_stock_id
                             WHERE fl.order_id = o.id AND bs.finish_id = ${param(query.finish)})`);
  }
  if (query.stage) conditions.push(`EXISTS (SELECT 1 FROM order_lines sl WHERE sl.order_id = o.id AND sl.stage = ${param(query.stage)})`);
  if (query.oversold !== undefined) {
    conditions.push(`${query.oversold ? '' : 'NOT '}EXISTS (SELECT 1 FROM order_lines ol WHERE ol.order_id = o.id AND ol.oversold)`);
  }
  if (query.refunded !== undefined) conditions.push(query.refunded ? 'o.refunded_minor > 0' : 'o.refunded_minor = 0');
  if (query.country) conditions.push(`o.shipping_country = ${param(query.country)}`);
  if (query.q) {
    const like = param(`%${escapeLike(query.q)}%`);
    conditions.push(`(o.number ILIKE ${like} ESCAPE '\\' OR o.buyer_name ILIKE ${like} ESCAPE '\\' OR o.email ILIKE ${like} ESCAPE '\\')`);
  }
  return { bind, param, conditions };
}

function orderBy(query: WorkshopOrdersQuery) {
  const keys = sortKeys[query.sort];
  const dir = query.dir === 'asc' ? 'ASC' : 'DESC';
  return {
    keys,
    select: keys.map(([expr]) => `(${expr})::text`).join(', '),
    clause: `ORDER BY ${keys.map(([expr]) => `${expr} ${dir}`).join(', ')}`,
  };
}

const toView = (r: Row): WorkshopOrderRow => ({
  id: r.id, number: r.number, state: r.state, placedAt: r.created_at.toISOString(), paidAt: r.paid_at?.toISOString() ?? null,
  buyerName: r.buyer_name, email: r.email, country: r.shipping_country, currency: r.currency, linesMinor: r.lines_minor,
  shippingMinor: r.shipping_minor, taxIncludedMinor: r.tax_included_minor, totalMinor: r.total_minor, paidMinor: r.paid_minor,
  refundedMinor: r.refunded_minor, batchId: r.batch_id, batchName: r.batch_name, masks: r.masks, oversoldOpen: r.oversold_open, items: r.items,
});

/** One page of the filtered, sorted orders and how many there are in all. */
export async function listWorkshopOrderPage(query: WorkshopOrdersQuery): Promise<WorkshopOrdersPage> {
  const { bind, param, conditions } = filterConditions(query);
  const where = conditions.length ? `WHERE ${conditions.join(' AND ')}` : '';
  const countBind = [...bind];
  const order = orderBy(query);
  const [rows, [count]] = await Promise.all([
    sql<Row>(`${rowSelect(order.select)} ${where} ${order.clause} LIMIT ${param(query.perPage)} OFFSET ${param((query.page - 1) * query.perPage)}`, bind),
    sql<{ total: number }>(`SELECT count(*)::int AS total FROM orders o ${where}`, countBind),
  ]);
  const total = count?.total ?? 0;
  return { rows: rows.map(toView), total, page: query.page, perPage: query.perPage, pageCount: Math.ceil(total / query.perPage) };
}

/**
 * Every order of the filtered view in its sort order, `batchSize` at a time. Each batch is its own short
 * query that starts after the last row of the one before (a keyset), so no connection or transaction is
 * held while the client downloads, and memory stays at one batch however many orders there are.
 */
export async function* streamWorkshopOrders(query: WorkshopOrdersQuery, batchSize = 500): AsyncGenerator<WorkshopOrderRow[]> {
  const order = orderBy(query);
  let after: string[] | null = null;
  for (;;) {
    const { bind, param, conditions } = filterConditions(query);
    if (after) {
      const last = after;
      const values = order.keys.map(([, type], i) => `${param(last[i])}::${type}`);
      conditions.push(`(${order.keys.map(([expr]) => expr).join(', ')}) ${query.dir === 'asc' ? '>' : '<'} (${values.join(', ')})`);
    }
    const where = conditions.length ? `WHERE ${conditions.join(' AND ')}` : '';
    const rows = await sql<Row>(`${rowSelect(order.select)} ${where} ${order.clause} LIMIT ${param(batchSize)}`, bind);
    if (rows.length > 0) yield rows.map(toView);
    if (rows.length < batchSize) return;
    after = rows[rows.length - 1]!.keys;
  }
}

/** An amount in minor units as a plain decimal in its currency's own digits: 24050 EUR → "240.50", 500 JPY → "500". */
export function minorToDecimal(amountMinor: number, currency: string): string {
  const digits = minorUnitDigits(currency);
  const sign = amountMinor < 0 ? '-' : '';
  const text = String(Math.abs(amountMinor)).padStart(digits + 1, '0');
  return digits === 0 ? `${sign}${text}` : `${sign}${text.slice(0, -digits)}.${text.slice(-digits)}`;
}

/** The export's columns, as a bookkeeper reads them: times in ISO 8601 UTC, amounts as decimals with the currency beside. */
export const csvColumns: [string, (row: WorkshopOrderRow) => string | number][] = [
  ['Order number', (r) => r.number],
  ['Placed at (UTC)', (r) => r.placedAt],
  ['Paid at (UTC)', (r) => r.paidAt ?? ''],
  ['Buyer name', (r) => r.buyerName ?? ''],
  ['Buyer e-mail', (r) => r.email],
  ['Country', (r) => r.country],
  ['State', (r) => orderStateLabels[r.state]],
  ['Masks', (r) => r.masks],
  ['Lines total', (r) => minorToDecimal(r.linesMinor, r.currency)],
  ['Shipping', (r) => minorToDecimal(r.shippingMinor, r.currency)],
  ['Tax included', (r) => minorToDecimal(r.taxIncludedMinor, r.currency)],
  ['Total', (r) => minorToDecimal(r.totalMinor, r.currency)],
  ['Paid', (r) => minorToDecimal(r.paidMinor, r.currency)],
  ['Refunded', (r) => minorToDecimal(r.refundedMinor, r.currency)],
  ['Net', (r) => minorToDecimal(r.paidMinor - r.refundedMinor, r.currency)],
  ['Currency', (r) => r.currency],
  ['Batch', (r) => r.batchName],
  ['Designs and finishes', (r) => r.items.map((i) => `${i.design} — ${i.finish} × ${i.count}`).join('; ')],
];
