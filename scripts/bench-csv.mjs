#!/usr/bin/env node
// npm run bench:csv: the workshop's CSV export of a large studio, measured. Seeds N paid orders (default
// 100,000) into a database of its own in SQL, starts the production build, and downloads the export twice
// — once with a tenth of the orders in the database, once with all of them — sampling the app's resident
// memory as the file streams. The app runs with V8's old generation capped (--heap-mib, 128 by default):
// without a cap V8 lets garbage pile up before collecting, so resident memory would grow with the file even
// when nothing is kept; with it, a server that held the rows would run out of heap, and one that streams
// keeps about the same peak for ten times the rows.
// The file is parsed back with csv-parse and its Net column summed to the cent against the database.
// A benchmark, not a test: never part of `npm test`. Progress goes to stderr, one JSON line to stdout.
//
//   --orders N (100000)  --heap-mib M (128)  --build (rebuild even when .next/BUILD_ID exists)
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { Readable } from 'node:stream';
import { ensureDependencies } from './lib/deps.mjs';
import { watchLog } from './lib/bench-app.mjs';
import { benchLifecycle, refuseUnknown, rssOfGroup, runAsBenchChild, wholeOption, writeResult } from './lib/bench-common.mjs';
import { root, run, startService, step, waitForHttp } from './lib/run.mjs';
import { ensureAuthSecret } from './lib/secrets.mjs';

const argv = process.argv.slice(2);
const PORT = 3202;
const baseUrl = `http://127.0.0.1:${PORT}`;

/**
 * Adds `count` paid one-mask orders, copies of one of the demo's paid orders with their own numbers and
 * payment ids, spread over the last year so the export's order (newest first) has real work to do.
 */
async function addOrders(db, count, offset) {
  const [template] = (
    await db.query(`SELECT o.id FROM orders o WHERE o.state = 'in_production' AND o.refunded_minor = 0 ORDER BY o.number LIMIT 1`)
  ).rows;
  if (!template) throw new Error('The demo seed has no paid order to copy');
  await db.query(
    `WITH made AS (
       INSERT INTO orders (studio_id, batch_id, state, email, buyer_name, currency, lines_minor, shipping_minor, total_minor,
              tax_label, tax_rate_bp, tax_included_minor, shipping_country, shipping_rate_id, shipping_label, shipping_min_days,
              shipping_max_days, chargeable_weight_g, ship_to, payment_intent_id, paid_minor, refunded_minor, paid_at, created_at, updated_at)
       SELECT o.studio_id, o.batch_id, 'paid', 'bench' || g || '@example.com', 'Bench buyer ' || g, o.currency, o.lines_minor,
              o.shipping_minor, o.total_minor, o.tax_label, o.tax_rate_bp, o.tax_included_minor, o.shipping_country, o.shipping_rate_id,
              o.shipping_label, o.shipping_min_days, o.shipping_max_days, o.chargeable_weight_g, o.ship_to, 'pi_bench_' || g,
              o.total_minor, 0, now() - make_interval(secs => g * 300), now() - make_interval(secs => g * 300 + 60), now()
         FROM orders o, generate_series($2::int + 1, $2::int + $3::int) g WHERE o.id = $1
       RETURNING id)
     INSERT INTO order_lines (order_id, position, batch_stock_id, design_name, finish_name, unit_price_minor, counted_in_stock, stage)
     SELECT made.id, 1, l.batch_stock_id, l.design_name, l.finish_name, l.unit_price_minor, true, 'to_cast'
       FROM made, order_lines l WHERE l.order_id = $1 AND l.position = 1`,
    [template.id, offset, count],
  );
  await db.query('ANALYZE orders; ANALYZE order_lines');
}

async function ownerSession(db) {
  const token = randomBytes(24).toString('hex');
  const { rows } = await db.query(`INSERT INTO users (email, role, name) VALUES ($1, 'owner', 'Bench owner') RETURNING id`, [
    `bench-owner.${randomBytes(4).toString('hex')}@example.com`,
  ]);
  await db.query(`INSERT INTO sessions (session_token, user_id, expires) VALUES ($1, $2, now() + interval '1 hour')`, [token, rows[0].id]);
  return token;
}

/** Downloads the export, parsing it as it arrives, while memory is sampled every 50 ms. */
async function exportOnce({ token, pgrp, parse }) {
  const before = rssOfGroup(pgrp);
  let peak = before;
  const sampler = setInterval(() => {
    peak = Math.max(peak, rssOfGroup(pgrp));
  }, 50);
  const started = performance.now();
  const response = await fetch(`${baseUrl}/api/workshop/orders/export`, { headers: { Cookie: `next-auth.session-token=${token}` } });
  if (response.status !== 200) throw new Error(`The export answered ${response.status}: ${(await response.text()).slice(0, 300)}`);
  let bytes = 0;
  let rows = 0;
  let netMinor = 0;
  let netColumn = -1;
  const parser = parse({ bom: true, relax_column_count: false });
  const counting = new Promise((resolve, reject) => {
    parser.on('readable', () => {
      let record;
      while ((record = parser.read()) !== null) {
        if (netColumn === -1) {
          netColumn = record.indexOf('Net');
          if (netColumn === -1) return reject(new Error('The export has no Net column'));
          continue;
        }
        rows += 1;
        // "12.34" → 1234: the demo studio's currency has two decimals (ISO 4217 minor unit of EUR).
        const [whole, cents = ''] = record[netColumn].split('.');
        netMinor += Number(whole) * 100 + Number(cents.padEnd(2, '0'));
      }
    });
    parser.on('error', reject);
    parser.on('end', resolve);
  });
  for await (const chunk of Readable.fromWeb(response.body)) {
    bytes += chunk.length;
    parser.write(chunk);
  }
  parser.end();
  await counting;
  const seconds = (performance.now() - started) / 1000;
  clearInterval(sampler);
  peak = Math.max(peak, rssOfGroup(pgrp));
  return {
    rows,
    megabytes: Math.round((bytes / 1024 / 1024) * 10) / 10,
    seconds: Math.round(seconds * 100) / 100,
    rowsPerSec: Math.round(rows / seconds),
    rssBeforeMiB: before,
    rssPeakMiB: peak,
    rssGrowthMiB: Math.round((peak - before) * 10) / 10,
    netMinor,
  };
}

async function main() {
  const bench = benchLifecycle();
  try {
    refuseUnknown(argv, /^--(orders|heap-mib)(=.*)?$|^--build$/, 'bench-csv.mjs');
    const total = wholeOption(argv, 'orders', 100_000, 10);
    const first = Math.round(total / 10);
    const heapMib = wholeOption(argv, 'heap-mib', 128, 32);

    ensureDependencies();
    const { default: pg } = await import('pg');
    const { parse } = await import('csv-parse');
    const { ensureDatabase, ensurePostgres, sequelizeCli } = await import('./lib/postgres.mjs');
    const postgres = await ensurePostgres();
    bench.postgres = postgres;
    const url = postgres.urlFor('demold_bench_csv');
    step('A fresh database of its own: demold_bench_csv');
    await ensureDatabase(url, { fresh: true });
    sequelizeCli(url, ['db:migrate']);
    sequelizeCli(url, ['db:seed:all']);
    const db = new pg.Client({ connectionString: url, application_name: 'demold-bench-csv' });
    await db.connect();
    const token = await ownerSession(db);
    const netInDb = async () =>
      Number((await db.query(`SELECT coalesce(sum(paid_minor - refunded_minor), 0)::bigint AS n FROM orders`)).rows[0].n);

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
    const next = path.join(root, 'node_modules/next/dist/bin/next');
    if (argv.includes('--build') || !fs.existsSync(path.join(root, '.next/BUILD_ID'))) {
      step('Building the app for production (about a minute)');
      run(process.execPath, [next, 'build'], { env });
    } else {
      step('Reusing the production build in .next (pass --build to rebuild)');
    }
    step(`Starting the app on ${baseUrl}, its heap's old generation capped at ${heapMib} MiB`);
    const app = startService('app', process.execPath, [next, 'start', '-H', '127.0.0.1', '-p', String(PORT)], {
      env: { ...env, NODE_OPTIONS: `${env.NODE_OPTIONS ?? ''} --max-old-space-size=${heapMib}`.trim() },
      quiet: true,
    });
    bench.services.push(app);
    const log = watchLog(app.child);
    await waitForHttp(`${baseUrl}/api/health`, { timeoutMs: 120_000, process: app.child }).catch((error) => {
      throw new Error(`${error.message}\n${log.tail.join('\n')}`);
    });

    step(`Seeding ${first} orders in SQL`);
    await addOrders(db, first, 0);
    // A warm-up download, so the first measured one does not pay for loading the route.
    await exportOnce({ token, pgrp: app.child.pid, parse });
    step('Exporting them');
    const small = await exportOnce({ token, pgrp: app.child.pid, parse });
    const smallExpected = await netInDb();
    step(`Seeding ${total - first} more orders in SQL`);
    await addOrders(db, total - first, first);
    step(`Exporting all ${total} and more`);
    const large = await exportOnce({ token, pgrp: app.child.pid, parse });
    const largeExpected = await netInDb();
    const ordersInDb = Number((await db.query('SELECT count(*)::int AS n FROM orders')).rows[0].n);
    await db.end();

    const result = {
      orders: ordersInDb,
      heapCapMiB: heapMib,
      small: { ...small, netMatchesDatabase: small.netMinor === smallExpected },
      large: { ...large, netMatchesDatabase: large.netMinor === largeExpected, everyOrderExported: large.rows === ordersInDb },
      // Flat memory: the large file's peak growth is within 1.5× the small one's (plus 20 MiB of noise),
      // although it carries ten times the rows.
      goals: {
        memoryFlat: large.rssGrowthMiB <= small.rssGrowthMiB * 1.5 + 20,
        sumsToTheCent: small.netMinor === smallExpected && large.netMinor === largeExpected,
      },
    };
    step(
      `Done: ${large.rows} rows, ${large.megabytes} MB in ${large.seconds} s (${large.rowsPerSec} rows/s); ` +
        `memory growth ${small.rssGrowthMiB} MiB for ${small.rows} rows, ${large.rssGrowthMiB} MiB for ${large.rows}`,
    );
    writeResult(result);
    await bench.shutdown(0);
  } catch (error) {
    await bench.fail(error);
  }
}

await runAsBenchChild(import.meta.url, argv, main);
