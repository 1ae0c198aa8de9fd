#!/usr/bin/env node
// npm run bench:holds: the opening second of a drop, measured. N signed-in buyers each send one hold
// request at the same instant to the production build; then the same hold transaction is sent straight
// to PostgreSQL, to show how much of the database's ceiling the app reaches. A benchmark, not a test:
// never part of `npm test`. Progress goes to stderr, one JSON line with the figures to stdout.
//
//   --buyers N (2000)  --units N (40, over three finishes)  --concurrency C (all)  --workers W (2)
//   --wide-pool P (32, the second raw figure)  --build (rebuild even when .next/BUILD_ID exists)
import fs from 'node:fs';
import path from 'node:path';
import { ensureDependencies } from './lib/deps.mjs';
import { startLoad, stopService, watchLog } from './lib/bench-app.mjs';
import { benchLifecycle, refuseUnknown, runAsBenchChild, wholeOption, writeResult } from './lib/bench-common.mjs';
import { openRaw } from './lib/bench-raw.mjs';
import { checkBatch, createBatch, createBuyers } from './lib/bench-seed.mjs';
import { activitySampler, cpuMeter, summarize } from './lib/bench-stats.mjs';
import { root, run, startService, step, waitForHttp } from './lib/run.mjs';
import { ensureAuthSecret } from './lib/secrets.mjs';

const argv = process.argv.slice(2);
const PORT = 3200;
const baseUrl = `http://127.0.0.1:${PORT}`;

/** The app's own default for a setting, read from lib/env.ts so the comparison follows it if it changes. */
function appDefault(name) {
  if (process.env[name]) return Number(process.env[name]);
  const match = new RegExp(`${name}:[^;]*?\\.default\\(([\\d_]+)\\)`).exec(fs.readFileSync(path.join(root, 'lib/env.ts'), 'utf8'));
  if (!match) throw new Error(`Could not read the default of ${name} from lib/env.ts`);
  return Number(match[1].replaceAll('_', ''));
}

// Buyer i's own network, so each meets only its per-buyer limits (10/8 has room for 16 million buyers).
const ipFor = (i) => `10.${(i >> 16) & 255}.${(i >> 8) & 255}.${i & 255}`;

/** Runs the app's hold path through HTTP: returns the summary, DB checks and where the time went. */
async function benchApp({ pg, db, url, options, env }) {
  const batch = await createBatch(db, { name: 'Bench: the opening second', units: options.units });
  const warmBatch = await createBatch(db, { name: 'Bench: warm-up', units: 3 });
  const buyers = await createBuyers(db, options.buyers + 30, 'bench');
  const warmBuyers = buyers.splice(options.buyers);
  const next = path.join(root, 'node_modules/next/dist/bin/next');
  if (options.build || !fs.existsSync(path.join(root, '.next/BUILD_ID'))) {
    step('Building the app for production (about a minute)');
    run(process.execPath, [next, 'build'], { env });
  } else {
    step('Reusing the production build in .next (pass --build to rebuild)');
  }
  step(`Starting the app on ${baseUrl}`);
  const app = startService('app', process.execPath, [next, 'start', '-H', '127.0.0.1', '-p', String(PORT)], { env, quiet: true });
  bench.services.push(app);
  const log = watchLog(app.child);
  try {
    await waitForHttp(`${baseUrl}/api/health`, { timeoutMs: 120_000, process: app.child });
  } catch (error) {
    throw new Error(`${error.message}\n${log.tail.join('\n')}`);
  }

  const load = await startLoad({
    baseUrl,
    batchId: batch.batchId,
    buyers: buyers.map((b, i) => ({ token: b.token, ip: ipFor(i), finishId: batch.stock[i % 3].finishId })),
    workers: options.workers,
    concurrency: options.concurrency,
  });
  // Warm-up, just before the burst (the app's pool closes connections idle for 10 s): the drop page's
  // polling, then 30 holds at once on a 3-unit batch, which loads the route, fills the pool and
  // takes both the granted and the sold-out branch. Anything else than 3 holds means a broken setup.
  step('Warming up: availability polls and 30 holds on a separate batch');
  for (let i = 0; i < 5; i++) await fetch(`${baseUrl}/api/drops/${batch.batchId}/availability`).then((r) => r.arrayBuffer());
  const warm = await Promise.all(
    warmBuyers.map((b, i) =>
      fetch(`${baseUrl}/api/holds`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', Cookie: `next-auth.session-token=${b.token}`, 'X-Real-IP': ipFor(options.buyers + i) },
        body: JSON.stringify({ batchId: warmBatch.batchId, finishId: warmBatch.stock[i % 3].finishId, quantity: 1 }),
      }).then(async (r) => `${r.status} ${(await r.json().catch(() => null))?.error?.code ?? ''}`.trim()),
    ),
  );
  if (warm.filter((w) => w === '201').length !== 3 || !warm.every((w) => w === '201' || w === '409 sold_out')) {
    throw new Error(`The warm-up holds did not answer as expected: ${[...new Set(warm)].join(', ')}\n${log.tail.join('\n')}`);
  }
  log.errors.clear();

  step(`The opening second: ${options.buyers} buyers, ${options.units} units, ${Math.min(options.concurrency, options.buyers)} in flight, ${load.pids.length} client process(es)`);
  const meter = cpuMeter({ app: (p) => p.pgrp === app.child.pid, postgres: (p) => p.comm === 'postgres', client: (p) => load.pids.includes(p.pid) });
  const sessions = await activitySampler(pg, url, 'demold');
  meter.start();
  const { results, clientCpuMs } = await load.go();
  const cpu = meter.stop();
  const activity = await sessions.stop();
  const summary = { ...summarize(results), ...(await checkBatch(db, batch.batchId, options.units)) };
  const appLogErrors = [...log.errors].sort((a, b) => b[1] - a[1]).slice(0, 5).map(([line, n]) => `${n}× ${line}`);
  report('app', summary, cpu, activity);
  console.log(`  client CPU per process: ${clientCpuMs.join(' / ')} ms; app log lines with an error or warning: ${appLogErrors.length ? '' : 'none'}`);
  for (const line of appLogErrors) console.log(`    ${line}`);

  await stopService(app);
  return { summary: { ...summary, cpu, sessions: activity, appLogErrors }, buyers };
}

/** The same attempts straight at PostgreSQL through a pool of `poolSize`, on a fresh batch. */
async function benchRaw({ pg, db, url, options, buyers, poolSize, statementTimeoutMs }) {
  const batch = await createBatch(db, { name: `Bench: raw, pool ${poolSize}`, units: options.units });
  const warmBatch = await createBatch(db, { name: `Bench: raw warm-up, pool ${poolSize}`, units: 3 });
  const on = (b, list) => list.map((buyer, i) => ({ userId: buyer.userId, finishId: b.stock[i % 3].finishId }));
  step(`Raw PostgreSQL: the same ${buyers.length} hold transactions through a pool of ${poolSize}`);
  const raw = await openRaw(pg, { url, poolSize, statementTimeoutMs });
  // The same warm-up as the app's: 30 attempts on a 3-unit batch, so this code is not timed cold.
  await raw.run(warmBatch, on(warmBatch, buyers.slice(0, 30)), 30);
  const meter = cpuMeter({ postgres: (p) => p.comm === 'postgres', client: (p) => p.pid === process.pid });
  const sessions = await activitySampler(pg, url, `demold-bench-raw-${poolSize}`);
  meter.start();
  const results = await raw.run(batch, on(batch, buyers), options.concurrency);
  const cpu = meter.stop();
  const activity = await sessions.stop();
  await raw.close();
  const summary = { pool: poolSize, ...summarize(results), ...(await checkBatch(db, batch.batchId, options.units)) };
  report(`raw (pool ${poolSize})`, summary, cpu, activity);
  return { ...summary, cpu, sessions: activity };
}

function report(name, s, cpu, activity) {
  const refused = Object.entries(s.refused).map(([k, v]) => `${v} ${k}`).join(', ') || 'none';
  console.log(`  ${name}: ${s.granted} granted, refused ${refused}, ${s.errors} errors, oversell ${s.oversell}, stock rule ${s.stockRuleHolds ? 'holds' : 'BROKEN'}`);
  console.log(`  ${s.throughputPerSec}/s over ${s.wallMs} ms; p50 ${s.p50Ms} ms, p95 ${s.p95Ms} ms, p99 ${s.p99Ms} ms, max ${s.maxMs} ms`);
  console.log(`  CPU: ${Object.entries(cpu).map(([k, v]) => `${k} ${v}%`).join(', ')} (family figures in % of one core)`);
  console.log(`  PostgreSQL sessions on average: ${activity.active} running, ${activity.idleInTx} idle in a transaction, ${activity.idle} idle, ${activity.lockWait} waiting on a lock`);
}

/** What this run started, stopped on Ctrl-C, on failure and at the end (set as main starts). */
let bench;

async function main() {
  bench = benchLifecycle();
  try {
    refuseUnknown(argv, /^--(buyers|units|concurrency|workers|wide-pool)(=.*)?$|^--build$/, 'bench-holds.mjs');
    const option = (name, fallback) => wholeOption(argv, name, fallback);
    const buyers = option('buyers', 2000);
    const options = {
      buyers,
      units: option('units', 40),
      concurrency: option('concurrency', buyers),
      workers: option('workers', 2),
      widePool: option('wide-pool', 32),
      build: argv.includes('--build'),
    };
    const poolMax = appDefault('DATABASE_POOL_MAX');
    const statementTimeoutMs = appDefault('DATABASE_STATEMENT_TIMEOUT_MS');

    ensureDependencies();
    const { default: pg } = await import('pg');
    const { ensureDatabase, ensurePostgres, sequelizeCli } = await import('./lib/postgres.mjs');
    const postgres = await ensurePostgres();
    bench.postgres = postgres;
    const url = postgres.urlFor('demold_bench');
    step('A fresh database of its own: demold_bench');
    await ensureDatabase(url, { fresh: true });
    sequelizeCli(url, ['db:migrate']);
    sequelizeCli(url, ['db:seed:all']);

    const env = {
      ...process.env,
      DATABASE_URL: url,
      APP_URL: baseUrl,
      NEXTAUTH_URL: baseUrl,
      AUTH_SECRET: ensureAuthSecret(),
      SMTP_URL: 'smtp://127.0.0.1:9',
      DEMO_MODE: 'false',
      JOBS_ENABLED: 'false',
      NODE_ENV: 'production',
      NEXT_TELEMETRY_DISABLED: '1',
    };
    delete env.DEMOLD_BENCH_CHILD;
    const db = new pg.Client({ connectionString: url, application_name: 'demold-bench' });
    await db.connect();
    const context = { pg, db, url, options, statementTimeoutMs };
    const { summary: app, buyers: seeded } = await benchApp({ ...context, env });
    const raw = await benchRaw({ ...context, buyers: seeded, poolSize: poolMax });
    const rawWide = await benchRaw({ ...context, buyers: seeded, poolSize: options.widePool });
    await db.end();

    const ratio = raw.throughputPerSec ? Math.round((app.throughputPerSec / raw.throughputPerSec) * 100) / 100 : null;
    const result = {
      buyers: options.buyers,
      units: options.units,
      concurrency: Math.min(options.concurrency, options.buyers),
      workers: options.workers,
      app: { pool: poolMax, ...app },
      raw,
      rawWide,
      ratioAppToRaw: ratio,
      goals: {
        zeroOversell: [app, raw, rawWide].every((s) => s.oversell === 0 && s.stockRuleHolds && s.heldMatchesHolds),
        ratioAtLeast0_5: ratio !== null && ratio >= 0.5,
        p99Under2s: app.p99Ms !== null && app.p99Ms < 2000,
      },
    };
    step(`Done: app ${app.throughputPerSec}/s, raw ${raw.throughputPerSec}/s (pool ${poolMax}), ${rawWide.throughputPerSec}/s (pool ${options.widePool}); ratio ${ratio}`);
    writeResult(result);
    await bench.shutdown(0);
  } catch (error) {
    await bench.fail(error);
  }
}

await runAsBenchChild(import.meta.url, argv, main);
