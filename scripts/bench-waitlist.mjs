#!/usr/bin/env node
// npm run bench:waitlist: a batch announcement to N confirmed waitlist entries (default 10,000), measured.
// A database of its own gets N confirmed entries for one design and a scheduled batch with its announcement
// queued; the worker (`npm run worker`, a process of its own) fans it out into the outbox and sends it to the
// fake SMTP server. Then, in the same run, nodemailer sends the very same rendered messages straight to the
// same server with the same number of connections: the raw rate, and the ratio of the two.
// A benchmark, not a test: never part of `npm test`. Progress goes to stderr, one JSON line to stdout.
//
//   --n N (10000)  --concurrency C (16: messages in flight and SMTP connections, both paths)
import { startFakeMail } from '../fake-services/mail/index.mjs';
import { ensureDependencies } from './lib/deps.mjs';
import { stopService } from './lib/bench-app.mjs';
import { benchLifecycle, refuseUnknown, rssOfGroup, runAsBenchChild, wholeOption, writeResult } from './lib/bench-common.mjs';
import { root, startService, step } from './lib/run.mjs';
import { ensureAuthSecret } from './lib/secrets.mjs';

const argv = process.argv.slice(2);
const SMTP_PORT = 1825;
const WEB_PORT = 1880;

const rate = (count, ms) => (ms > 0 ? Math.round((count / ms) * 1000) : null);

/** N confirmed entries on the Ibex list (the seed's own are removed first), a scheduled batch and its queued announcement. */
async function seedAnnouncement(db, n) {
  await db.query(`DELETE FROM waitlist_entries WHERE design_id = (SELECT id FROM designs WHERE slug = 'ibex')`);
  await db.query(
    `INSERT INTO waitlist_entries (design_id, email, state, source, time_zone, confirmed_at)
     SELECT d.id, 'bench' || g || '@example.com', 'confirmed', 'import',
            (ARRAY['Europe/Dublin', 'America/New_York', 'Asia/Tokyo', NULL])[1 + g % 4], now() - interval '1 day'
       FROM designs d, generate_series(1, $1::int) g WHERE d.slug = 'ibex'`,
    [n],
  );
  const { rows: [batch] } = await db.query(
    `INSERT INTO batches (design_id, name, status, per_buyer_limit, hold_minutes, early_access_at, opens_at, closes_at, ship_by, announcement)
     SELECT id, 'Bench: announcement', 'scheduled', 1, 10, now() + interval '2 days', now() + interval '3 days', now() + interval '4 days',
            current_date + 40, 'A benchmark batch.' FROM designs WHERE slug = 'ibex' RETURNING id`,
  );
  await db.query(
    `INSERT INTO batch_stock (batch_id, finish_id, quantity)
     SELECT $1, f.id, 10 FROM finishes f JOIN designs d ON d.id = f.design_id WHERE d.slug = 'ibex' AND f.status = 'published'`,
    [batch.id],
  );
  const { rows: [announcement] } = await db.query(
    `INSERT INTO waitlist_announcements (batch_id, kind) VALUES ($1, 'announced') RETURNING id`,
    [batch.id],
  );
  // A rate no run reaches, so the figures are the machinery's and not the throttle's.
  await db.query(`UPDATE studios SET mail_per_minute = 100000`);
  return announcement.id;
}

async function main() {
  const run = benchLifecycle();
  try {
    refuseUnknown(argv, /^--(n|concurrency)(=.*)?$/, 'bench-waitlist.mjs');
    const n = wholeOption(argv, 'n', 10_000);
    const concurrency = wholeOption(argv, 'concurrency', 16);

    ensureDependencies();
    const { default: pg } = await import('pg');
    const { default: nodemailer } = await import('nodemailer');
    const { ensureDatabase, ensurePostgres, sequelizeCli } = await import('./lib/postgres.mjs');
    const postgres = await ensurePostgres();
    run.postgres = postgres;
    const url = postgres.urlFor('demold_bench_waitlist');
    step('A fresh database of its own: demold_bench_waitlist');
    await ensureDatabase(url, { fresh: true });
    sequelizeCli(url, ['db:migrate']);
    sequelizeCli(url, ['db:seed:all']);
    const db = new pg.Client({ connectionString: url, application_name: 'demold-bench-waitlist' });
    await db.connect();

    step(`Starting the fake mail server on ${SMTP_PORT}/${WEB_PORT}`);
    const mail = await startFakeMail({ smtpPort: SMTP_PORT, webPort: WEB_PORT, quiet: true });
    run.services.push(mail.service);

    step(`Seeding ${n} confirmed waitlist entries and a queued announcement`);
    const announcementId = await seedAnnouncement(db, n);
    const counts = async () =>
      (
        await db.query(
          `SELECT count(*)::int AS queued, count(*) FILTER (WHERE status = 'sent')::int AS sent, count(*) FILTER (WHERE status = 'failed')::int AS failed
             FROM mail_outbox WHERE announcement_id = $1`,
          [announcementId],
        )
      ).rows[0];

    step(`Starting the worker (${concurrency} sends in flight); it picks the announcement up as it starts`);
    const worker = startService('worker', process.execPath, [`${root}/scripts/worker.mjs`], {
      env: {
        ...process.env,
        DATABASE_URL: url,
        SMTP_URL: mail.smtpUrl,
        AUTH_SECRET: ensureAuthSecret(),
        APP_URL: 'https://shop.example',
        MAIL_SEND_CONCURRENCY: String(concurrency),
        MAIL_RETRY_BASE_SECONDS: '1',
        WORKER_LOG_SECONDS: '3600',
        NODE_ENV: 'production',
      },
      quiet: true,
    });
    run.services.push(worker);

    let firstAt = null;
    let queuedAt = null;
    let sentAt = null;
    let peakRss = 0;
    const deadline = Date.now() + 30 * 60_000;
    for (;;) {
      const c = await counts();
      const now = performance.now();
      peakRss = Math.max(peakRss, rssOfGroup(worker.child.pid));
      if (c.queued > 0 && firstAt === null) firstAt = now;
      if (c.queued >= n && queuedAt === null) queuedAt = now;
      if (c.sent + c.failed >= n) {
        sentAt = now;
        if (c.failed > 0) throw new Error(`${c.failed} message(s) failed to send`);
        break;
      }
      if (Date.now() > deadline) throw new Error(`Not done after 30 minutes: ${JSON.stringify(c)}`);
      if (worker.child.exitCode !== null) throw new Error(`The worker exited with ${worker.child.exitCode}`);
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
    const stats = await (await fetch(`${mail.inboxUrl}/api/stats`)).json();
    await stopService(worker);
    const app = {
      queuedPerSec: rate(n, queuedAt - firstAt),
      deliveredPerSec: rate(n, sentAt - firstAt),
      seconds: Math.round((sentAt - firstAt) / 100) / 10,
      workerPeakRssMiB: peakRss,
      inbox: stats,
    };
    step(`Worker: ${app.queuedPerSec} queued/s, ${app.deliveredPerSec} delivered/s, peak ${peakRss} MiB`);

    step('Raw: nodemailer sends the same rendered messages straight to the same server');
    const { rows: messages } = await db.query(
      `SELECT to_address, subject, html, text, headers FROM mail_outbox WHERE announcement_id = $1 ORDER BY created_at`,
      [announcementId],
    );
    await fetch(`${mail.inboxUrl}/api/email/all`, { method: 'DELETE' });
    const transport = nodemailer.createTransport({ host: '127.0.0.1', port: SMTP_PORT, secure: false, pool: true, maxConnections: concurrency, maxMessages: 100 });
    let next = 0;
    const started = performance.now();
    await Promise.all(
      Array.from({ length: concurrency }, async () => {
        while (next < messages.length) {
          const m = messages[next++];
          await transport.sendMail({ from: 'studio@shop.example', to: m.to_address, subject: m.subject, html: m.html, text: m.text, headers: m.headers });
        }
      }),
    );
    const rawMs = performance.now() - started;
    transport.close();
    const raw = { deliveredPerSec: rate(messages.length, rawMs), seconds: Math.round(rawMs / 100) / 10 };
    step(`Raw: ${raw.deliveredPerSec} delivered/s`);
    await db.end();

    const result = {
      n,
      concurrency,
      app,
      raw,
      ratioAppToRaw: raw.deliveredPerSec ? Math.round((app.deliveredPerSec / raw.deliveredPerSec) * 100) / 100 : null,
      exactlyOnce: stats.distinctMessageIds === n && stats.duplicates === 0,
    };
    writeResult(result);
    await run.shutdown(0);
  } catch (error) {
    await run.fail(error);
  }
}

await runAsBenchChild(import.meta.url, argv, main);
