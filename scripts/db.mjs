#!/usr/bin/env node
// npm run db -- <start|stop|migrate|seed|reset|status>: the database by hand, for contributors.
import { ensureDependencies } from './lib/deps.mjs';
import { ensureDatabase, ensurePostgres, sequelizeCli, stopPostgres } from './lib/postgres.mjs';

const command = process.argv[2] ?? 'status';
const database = process.env.DEMOLD_DB_NAME ?? 'demold';

try {
  if (command === 'stop') {
    if (process.env.DATABASE_URL) console.log('DATABASE_URL is set: that server is not ours to stop.');
    else stopPostgres();
  } else if (['start', 'migrate', 'seed', 'reset', 'status'].includes(command)) {
    ensureDependencies();
    const pg = await ensurePostgres();
    const url = pg.urlFor(database);
    await ensureDatabase(url, { fresh: command === 'reset' });
    if (command === 'migrate' || command === 'seed' || command === 'reset') sequelizeCli(url, ['db:migrate']);
    if (command === 'seed' || command === 'reset') sequelizeCli(url, ['db:seed:all']);
    if (command === 'status') sequelizeCli(url, ['db:migrate:status']);
    console.log(`\nDATABASE_URL=${url}`);
  } else {
    console.error(`Unknown command "${command}". Use one of: start, stop, migrate, seed, reset, status.`);
    process.exit(2);
  }
} catch (error) {
  console.error(`\n${error instanceof Error ? error.message : error}`);
  process.exit(1);
}
