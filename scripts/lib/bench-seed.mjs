// The benchmark's rows, written straight into its own database: a batch open already, its buyers with
// signed-in sessions (as tests/e2e/race.spec.ts makes them), and the checks run after each burst.
import { randomBytes } from 'node:crypto';

// Hare: a published demo design with exactly three published finishes.
const DESIGN = 'hare';
const FINISHES = ['old-bone', 'bog-oak', 'verdigris'];

/** Splits `units` over the finishes, the remainder going to the first ones (40 → 14/13/13). */
export function splitUnits(units, parts = FINISHES.length) {
  return Array.from({ length: parts }, (_, i) => Math.floor(units / parts) + (i < units % parts ? 1 : 0));
}

/** A new batch of the Hare, open since a minute ago by the database's clock, limit 1 per buyer. */
export async function createBatch(db, { name, units }) {
  const {
    rows: [batch],
  } = await db.query(
    `INSERT INTO batches (design_id, name, status, per_buyer_limit, hold_minutes, opens_at, closes_at, ship_by)
     SELECT id, $1, 'scheduled', 1, 10, now() - interval '1 minute', now() + interval '1 day', current_date + 40
       FROM designs WHERE slug = $2 AND status = 'published' RETURNING id, hold_minutes`,
    [name, DESIGN],
  );
  if (!batch) throw new Error(`The seeded catalogue has no published "${DESIGN}" design`);
  const quantities = splitUnits(units);
  const { rows: stock } = await db.query(
    `INSERT INTO batch_stock (batch_id, finish_id, quantity)
     SELECT $1, f.id, q.quantity
       FROM unnest($3::text[], $4::int[]) AS q(slug, quantity)
       JOIN finishes f ON f.slug = q.slug JOIN designs d ON d.id = f.design_id AND d.slug = $2
     RETURNING id AS "stockId", finish_id AS "finishId", quantity`,
    [batch.id, DESIGN, FINISHES, quantities],
  );
  if (stock.length !== FINISHES.length) throw new Error(`The "${DESIGN}" design lacks one of ${FINISHES.join(', ')}`);
  return { batchId: batch.id, holdMinutes: batch.hold_minutes, stock };
}

/** `count` buyer accounts, each with a session token valid for an hour (two statements, however many). */
export async function createBuyers(db, count, label) {
  const tokens = Array.from({ length: count }, () => randomBytes(24).toString('hex'));
  const run = `${label}.${randomBytes(4).toString('hex')}`;
  const { rows } = await db.query(
    `INSERT INTO users (email, role)
     SELECT 'bench' || g || '.' || $1 || '@example.com', 'customer' FROM generate_series(1, $2) g ORDER BY g RETURNING id`,
    [run, count],
  );
  await db.query(
    `INSERT INTO sessions (session_token, user_id, expires)
     SELECT t, u, now() + interval '1 hour' FROM unnest($1::text[], $2::uuid[]) AS x(t, u)`,
    [tokens, rows.map((r) => r.id)],
  );
  return rows.map((r, i) => ({ userId: r.id, token: tokens[i] }));
}

/**
 * What the database says after a burst: active holds, oversell, and whether every stock row keeps
 * quantity = available + held + sold and held = the units of its active holds.
 */
export async function checkBatch(db, batchId, units) {
  const { rows: stock } = await db.query(
    `SELECT s.id, s.quantity, s.available, s.held, s.sold,
            (SELECT coalesce(sum(h.quantity), 0)::int FROM holds h WHERE h.batch_stock_id = s.id AND h.state = 'active') AS holding
       FROM batch_stock s WHERE s.batch_id = $1`,
    [batchId],
  );
  const holds = stock.reduce((sum, s) => sum + s.holding, 0);
  return {
    holdsInDb: holds,
    oversell: Math.max(0, holds - units),
    stockRuleHolds: stock.every((s) => s.quantity === s.available + s.held + s.sold && s.available >= 0),
    heldMatchesHolds: stock.every((s) => s.held === s.holding),
  };
}
