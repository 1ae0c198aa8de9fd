#!/usr/bin/env node
// Starts the database if needed, then runs studio-owner.ts against it.
import { ensureDependencies } from './lib/deps.mjs';
import { root, run } from './lib/run.mjs';
import { ensureAuthSecret } from './lib/secrets.mjs';

try {
  ensureDependencies();
  const { ensureDatabase, ensurePostgres, sequelizeCli } = await import('./lib/postgres.mjs');
  const pg = await ensurePostgres();
  const url = pg.urlFor(process.env.DEMOLD_DB_NAME ?? 'demold');
  await ensureDatabase(url);
  sequelizeCli(url, ['db:migrate']);
  run(process.execPath, ['--conditions=react-server', '--import', 'tsx', `${root}/scripts/studio-owner.ts`, ...process.argv.slice(2)], {
    env: { ...process.env, DATABASE_URL: url, AUTH_SECRET: ensureAuthSecret() },
  });
} catch (error) {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
}
