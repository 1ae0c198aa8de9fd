#!/usr/bin/env node
// npm run worker: runs the job queue (hold expiry, payment sweeps, the outbox, waitlist fan-outs and reminders)
// in a process of its own, beside or instead of the web app's, until SIGTERM or SIGINT.
//
// It runs the app's TypeScript in this very process (so the PID you hold is the worker's, and a signal reaches
// it), without the react-server condition: e-mails are rendered with react-dom/server, which refuses to load
// under that condition. `server-only` is therefore pointed at its own empty module, as the server build does.
import Module, { createRequire } from 'node:module';
import { root } from './lib/run.mjs';

const require = createRequire(import.meta.url);
const emptyServerOnly = `${root}/node_modules/server-only/empty.js`;
const resolveFilename = Module._resolveFilename;
Module._resolveFilename = function (request, ...rest) {
  return request === 'server-only' ? emptyServerOnly : resolveFilename.call(this, request, ...rest);
};

if (!process.env.DATABASE_URL) {
  // Outside a test or a deployment: the local database, started and migrated as the other commands do.
  const { ensureDependencies } = await import('./lib/deps.mjs');
  ensureDependencies();
  const { ensureDatabase, ensurePostgres, sequelizeCli } = await import('./lib/postgres.mjs');
  const { ensureAuthSecret } = await import('./lib/secrets.mjs');
  const pg = await ensurePostgres();
  const url = pg.urlFor(process.env.DEMOLD_DB_NAME ?? 'demold');
  await ensureDatabase(url);
  sequelizeCli(url, ['db:migrate']);
  process.env.DATABASE_URL = url;
  process.env.AUTH_SECRET ??= ensureAuthSecret();
}

const { register } = await import('tsx/cjs/api');
register();
const { main } = require(`${root}/scripts/worker.ts`);
await main().catch((error) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
