// The raw PostgreSQL ceiling: the very call lib/drops/holds.ts (createHold) makes, the hold_stock()
// function, sent straight from a pg.Pool, without HTTP, sessions or rate limits.
import { now, runAll } from './bench-stats.mjs';

/** One hold attempt as the app makes it; answers like the route would (201 / 409 code). */
async function attempt(pool, { batchId, userId, finishId }) {
  const start = now();
  try {
    const { rows } = await pool.query('SELECT outcome FROM hold_stock($1, $2, $3, 1)', [userId, batchId, finishId]);
    const outcome = rows[0]?.outcome;
    return outcome === 'held' ? { status: 201, code: null, start, end: now() } : { status: 409, code: outcome, start, end: now() };
  } catch (error) {
    return { status: 500, code: error.code ?? error.message, start, end: now() };
  }
}

/**
 * A pool of `poolSize` with its connections open already (as the app's warm-up opens its own). `run`
 * sends `attempts` ({ userId, finishId }) for one batch, at most `concurrency` in flight; `close` ends the
 * pool, and must come after the CPU meter stops: the backends' CPU time leaves with them.
 */
export async function openRaw(pg, { url, poolSize, statementTimeoutMs }) {
  const pool = new pg.Pool({
    connectionString: url,
    max: poolSize,
    application_name: `demold-bench-raw-${poolSize}`,
    statement_timeout: statementTimeoutMs,
  });
  const warm = await Promise.all(Array.from({ length: poolSize }, () => pool.connect()));
  for (const client of warm) client.release();
  return {
    run: ({ batchId }, attempts, concurrency) =>
      runAll(attempts.length, concurrency, (i) => attempt(pool, { batchId, ...attempts[i] })),
    close: () => pool.end(),
  };
}
