import { afterAll, beforeAll, expect, it } from 'vitest';
import { createScratchDatabase, query, sequelizeCli, type ScratchDatabase } from './support/database';

let db: ScratchDatabase;

beforeAll(async () => {
  db = await createScratchDatabase('migrations');
});

afterAll(async () => {
  await db?.drop();
});

/** Tables, columns, types, defaults and constraints: what a migration is responsible for. */
async function schemaOf(url: string) {
  const columns = await query(
    url,
    `SELECT table_name, column_name, data_type, is_nullable, column_default
       FROM information_schema.columns WHERE table_schema = 'public'
      ORDER BY table_name, column_name`,
  );
  const constraints = await query(
    url,
    `SELECT conrelid::regclass::text AS table_name, conname, pg_get_constraintdef(oid) AS definition
       FROM pg_constraint WHERE connamespace = 'public'::regnamespace
      ORDER BY 1, 2`,
  );
  const indexes = await query(
    url,
    `SELECT tablename, indexname, indexdef FROM pg_indexes WHERE schemaname = 'public' ORDER BY 1, 2`,
  );
  return { columns, constraints, indexes };
}

it('runs every migration down and up again to the same schema', async () => {
  sequelizeCli(db.url, ['db:migrate']);
  const first = await schemaOf(db.url);
  expect(first.columns.length).toBeGreaterThan(0);

  sequelizeCli(db.url, ['db:migrate:undo:all']);
  const tables = await query<{ table_name: string }>(
    db.url,
    `SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' ORDER BY 1`,
  );
  // Only the CLI's own ledger may remain, and it must be empty.
  expect(tables.map((t) => t.table_name)).toEqual(['sequelize_meta']);
  expect(await query(db.url, 'SELECT * FROM sequelize_meta')).toEqual([]);

  sequelizeCli(db.url, ['db:migrate']);
  expect(await schemaOf(db.url)).toEqual(first);
});
