import pg from 'pg';

/** A plain client on the database the app under test uses (the test command passes DATABASE_URL). */
export async function withDb<T>(fn: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

/** A new scheduled batch of the Hare design with one finish, opening `opensInMs` from now by the database clock. */
export async function createTestBatch(opts: { opensInMs: number; quantity: number; perBuyerLimit?: number; name: string }) {
  return withDb(async (db) => {
    const { rows: [batch] } = await db.query(
      `INSERT INTO batches (design_id, name, status, per_buyer_limit, hold_minutes, opens_at, closes_at, ship_by)
       SELECT id, $1, 'scheduled', $2, 10, now() + make_interval(secs => $3::float / 1000), now() + interval '1 day', current_date + 40
         FROM designs WHERE slug = 'hare' RETURNING id`,
      [opts.name, opts.perBuyerLimit ?? 1, opts.opensInMs],
    );
    const { rows: [stock] } = await db.query(
      `INSERT INTO batch_stock (batch_id, finish_id, quantity)
       SELECT $1, f.id, $2 FROM finishes f JOIN designs d ON d.id = f.design_id
        WHERE d.slug = 'hare' AND f.slug = 'old-bone' RETURNING id, finish_id`,
      [batch.id, opts.quantity],
    );
    return { batchId: batch.id as string, finishId: stock.finish_id as string, stockId: stock.id as string };
  });
}
