import { execFile } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { promisify } from 'node:util';
import { expect, test } from '@playwright/test';
import { createTestBatch, withDb } from './support/db';

const run = promisify(execFile);
const BUYERS = 500;
const UNITS = 20;

test.describe('the opening second', () => {
  test(`${BUYERS} buyers from two processes race for ${UNITS} masks through the real route`, async ({ baseURL }, testInfo) => {
    test.setTimeout(120_000);
    const { batchId, finishId, stockId } = await createTestBatch({ opensInMs: -1_000, quantity: UNITS, name: 'Race' });

    // Each buyer is a real account with a signed-in session of its own.
    const tokens = Array.from({ length: BUYERS }, () => randomBytes(24).toString('hex'));
    await withDb(async (db) => {
      const run = randomBytes(4).toString('hex');
      const { rows } = await db.query(
        `INSERT INTO users (email, role) SELECT 'racer' || g || '.' || $1 || '@example.com', 'customer' FROM generate_series(1, $2) g RETURNING id`,
        [run, BUYERS],
      );
      await db.query(
        `INSERT INTO sessions (session_token, user_id, expires)
         SELECT t, u, now() + interval '1 hour' FROM unnest($1::text[], $2::uuid[]) AS x(t, u)`,
        [tokens, rows.map((r) => r.id)],
      );
    });

    const worker = path.join(__dirname, 'support/race-worker.mjs');
    const halves = [tokens.slice(0, BUYERS / 2), tokens.slice(BUYERS / 2)];
    const outputs = await Promise.all(
      halves.map((half) => run(process.execPath, [worker, baseURL!, batchId, finishId, JSON.stringify(half)], { maxBuffer: 10 * 1024 * 1024 })),
    );
    const results = outputs.flatMap((o) => JSON.parse(o.stdout) as { status: number; code: string | null; ms: number }[]);

    expect(results).toHaveLength(BUYERS);
    expect(results.filter((r) => r.status >= 500 || r.status === 0)).toEqual([]);
    expect(results.filter((r) => r.status === 201)).toHaveLength(UNITS);
    const refusals = results.filter((r) => r.status !== 201);
    expect(refusals).toHaveLength(BUYERS - UNITS);
    expect(new Set(refusals.map((r) => `${r.status} ${r.code}`))).toEqual(new Set(['409 sold_out']));

    const [stock] = await withDb(async (db) => (await db.query('SELECT quantity, held, sold, available FROM batch_stock WHERE id = $1', [stockId])).rows);
    expect(stock).toEqual({ quantity: UNITS, held: UNITS, sold: 0, available: 0 });
    const [{ count }] = await withDb(async (db) => (await db.query(`SELECT count(*)::int FROM holds WHERE batch_id = $1 AND state = 'active'`, [batchId])).rows);
    expect(count).toBe(UNITS);

    const sorted = results.map((r) => r.ms).sort((a, b) => a - b);
    testInfo.annotations.push({ type: 'latency', description: `p50 ${Math.round(sorted[BUYERS / 2]!)} ms, p99 ${Math.round(sorted[Math.floor(BUYERS * 0.99)]!)} ms` });
  });
});
