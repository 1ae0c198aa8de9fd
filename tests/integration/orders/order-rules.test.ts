import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { withAppDatabase } from '../support/app-database';

// The order ledger's rules are in the schema as well as the code: no path can write a total that does not
// add up, refund more than was paid, or mark a line oversold without saying why.
const db = withAppDatabase('order_rules', { seed: true });
let client: pg.Client;
let base: unknown[];

beforeAll(async () => {
  client = new pg.Client({ connectionString: db.current().url });
  await client.connect();
  // One transaction for the whole file, rolled back at the end; each attempt runs in a savepoint.
  await client.query('BEGIN');
  const { rows } = await client.query(`SELECT st.id AS studio, b.id AS batch FROM batches b JOIN designs d ON d.id = b.design_id JOIN studios st ON st.id = d.studio_id LIMIT 1`);
  base = [rows[0].studio, rows[0].batch];
});
afterAll(async () => {
  await client?.query('ROLLBACK');
  await client?.end();
});

async function violation(sql: string, params: unknown[]): Promise<string | undefined> {
  try {
    await client.query('SAVEPOINT attempt');
    await client.query(sql, params);
    await client.query('RELEASE SAVEPOINT attempt');
    return undefined;
  } catch (error) {
    await client.query('ROLLBACK TO SAVEPOINT attempt');
    return (error as { constraint?: string }).constraint;
  }
}

const insertOrder = `INSERT INTO orders (studio_id, batch_id, email, currency, lines_minor, shipping_minor, total_minor, tax_label, tax_rate_bp,
  tax_included_minor, shipping_country, shipping_label, shipping_min_days, shipping_max_days, chargeable_weight_g, state, paid_minor, refunded_minor, paid_at)
  VALUES ($1, $2, 'a@example.com', 'EUR', $3, $4, $5, 'VAT', 2300, $6, 'IE', 'Tracked post', 1, 3, 1000, $7, $8, $9, $10) RETURNING id`;

describe('the order ledger in the schema', () => {
  it('keeps total = lines + shipping and the included tax within the total', async () => {
    expect(await violation(insertOrder, [...base, 24_000, 950, 24_951, 4_000, 'awaiting_payment', 0, 0, null])).toBe('orders_amounts_sensible');
    expect(await violation(insertOrder, [...base, 24_000, 950, 24_950, 30_000, 'awaiting_payment', 0, 0, null])).toBe('orders_amounts_sensible');
    expect(await violation(insertOrder, [...base, 24_000, 950, 24_950, 4_665, 'awaiting_payment', 0, 0, null])).toBeUndefined();
  });

  it('never refunds more than was paid, and a paid order has its payment time', async () => {
    expect(await violation(insertOrder, [...base, 100, 0, 100, 0, 'refunded', 100, 101, new Date()])).toBe('orders_refund_within_payment');
    expect(await violation(insertOrder, [...base, 100, 0, 100, 0, 'paid', 100, 0, null])).toBe('orders_paid_has_time');
    expect(await violation(insertOrder, [...base, 100, 0, 100, 0, 'shipped_by_pigeon', 100, 0, new Date()])).toBe('orders_state_known');
  });

  it('marks a line oversold only with a reason, and an oversold line never counts in stock until an extra is confirmed', async () => {
    const { rows } = await client.query(insertOrder, [...base, 100, 0, 100, 0, 'paid', 100, 0, new Date()]);
    const { rows: stock } = await client.query(`SELECT id FROM batch_stock LIMIT 1`);
    const line = `INSERT INTO order_lines (order_id, position, batch_stock_id, design_name, finish_name, unit_price_minor, oversold, oversold_reason, counted_in_stock, oversold_resolution)
                  VALUES ($1, $2, $3, 'Ibex', 'Old Bone', 100, $4, $5, $6, $7)`;
    expect(await violation(line, [rows[0].id, 1, stock[0].id, true, null, false, null])).toBe('order_lines_oversold_reason');
    expect(await violation(line, [rows[0].id, 2, stock[0].id, true, 'stock_gone', true, null])).toBe('order_lines_oversold_not_in_stock');
    expect(await violation(line, [rows[0].id, 3, stock[0].id, true, 'stock_gone', true, 'extra_cast'])).toBeUndefined();
    expect(await violation(line, [rows[0].id, 4, stock[0].id, false, null, true, 'refunded'])).toBe('order_lines_resolution_known');
  });

  it('sends each e-mail once per cause', async () => {
    const mail = `INSERT INTO mail_outbox (dedupe_key, to_address, subject, html, text) VALUES ($1, 'a@example.com', 's', 'h', 't')`;
    expect(await violation(mail, ['order-confirmation:x'])).toBeUndefined();
    expect(await violation(mail, ['order-confirmation:x'])).toBe('mail_outbox_dedupe_key_key');
  });
});
