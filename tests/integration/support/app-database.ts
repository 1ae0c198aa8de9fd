import { afterAll, beforeAll } from 'vitest';
import { createScratchDatabase, sequelizeCli, type ScratchDatabase } from './database';

/**
 * Gives a test file its own migrated (and optionally seeded) database and points the app's own `lib/`
 * code at it, as the running app would be. Import app modules inside tests or hooks, after this runs.
 */
export function withAppDatabase(label: string, { seed = false } = {}): { current: () => ScratchDatabase } {
  let db: ScratchDatabase | undefined;
  beforeAll(async () => {
    db = await createScratchDatabase(label);
    sequelizeCli(db.url, ['db:migrate']);
    if (seed) sequelizeCli(db.url, ['db:seed:all']);
    process.env.DATABASE_URL = db.url;
    // No test may reach a real inbox by accident: nothing listens on port 9 (discard) here.
    process.env.SMTP_URL ??= 'smtp://127.0.0.1:9';
  });
  afterAll(async () => {
    const { closeDb } = await import('@/lib/db/connection');
    await closeDb();
    await db?.drop();
  });
  return {
    current() {
      if (!db) throw new Error('the database is made in beforeAll');
      return db;
    },
  };
}
