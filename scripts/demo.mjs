#!/usr/bin/env node
// npm run demo: everything the product needs on this machine, then the app in production mode.
// Ctrl-C stops what this command started (a PostgreSQL it found running is left running).
import fs from 'node:fs';
import path from 'node:path';
import { ensureDependencies } from './lib/deps.mjs';
import { stopIfStartedHere } from './lib/postgres.mjs';
import { root, run, startService, step, waitForHttp } from './lib/run.mjs';
import { ensureAuthSecret } from './lib/secrets.mjs';

const args = new Set(process.argv.slice(2));
const devMode = args.has('--dev');
const skipBuild = args.has('--no-build') && fs.existsSync(path.join(root, '.next/BUILD_ID'));
const port = Number(process.env.PORT ?? 3000);
const smtpPort = Number(process.env.FAKE_SMTP_PORT ?? 1025);
const inboxPort = Number(process.env.FAKE_INBOX_PORT ?? 1080);
const stripePort = Number(process.env.FAKE_STRIPE_PORT ?? 12111);
const uploadsPort = Number(process.env.FAKE_UPLOADTHING_PORT ?? 12311);

const services = [];
let postgres;
let stopping = false;

async function shutdown(code) {
  if (stopping) return;
  stopping = true;
  console.log('\nStopping the demo…');
  for (const service of services.reverse()) service.stop();
  stopIfStartedHere(postgres);
  process.exit(code);
}
process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));

try {
  ensureDependencies();
  // Only now may modules that need the dependencies be loaded.
  const { ensureDatabase, ensurePostgres, sequelizeCli } = await import('./lib/postgres.mjs');
  const { startFakeMail } = await import('../fake-services/mail/index.mjs');
  const { startFakeStripeService } = await import('../fake-services/stripe/index.mjs');
  const { startFakeUploadthingService } = await import('../fake-services/uploadthing/index.mjs');

  postgres = await ensurePostgres();
  const databaseUrl = postgres.urlFor(process.env.DEMOLD_DB_NAME ?? 'demold');
  await ensureDatabase(databaseUrl);
  step('Migrating the database');
  sequelizeCli(databaseUrl, ['db:migrate']);
  step('Seeding the demo studio (first run only)');
  sequelizeCli(databaseUrl, ['db:seed:all']);
  // The photos are files, not rows: make sure they exist even when the rows were seeded earlier.
  run(process.execPath, ['seeders/support/render-demo-art.cjs']);
  run(process.execPath, ['seeders/support/retime-demo-drops.cjs'], { env: { ...process.env, DATABASE_URL: databaseUrl } });
  // Next's data cache lives on disk and outlives restarts; the drops were just moved, so start it afresh.
  fs.rmSync(path.join(root, '.next/cache/fetch-cache'), { recursive: true, force: true });
  // Cached drop pages from an earlier run would still show the old opening time.
  fs.rmSync(path.join(root, '.next/cache/fetch-cache'), { recursive: true, force: true });

  step('Starting the fake mail inbox');
  const mail = await startFakeMail({ smtpPort, webPort: inboxPort });
  services.push(mail.service);

  const appUrl = `http://127.0.0.1:${port}`;
  step('Starting the fake Stripe');
  const stripe = await startFakeStripeService({ port: stripePort, webhookUrl: `${appUrl}/api/webhooks/stripe` });
  services.push(stripe.service);
  step('Starting the fake uploadthing (photo uploads)');
  const uploads = await startFakeUploadthingService({ port: uploadsPort, callbackUrl: `${appUrl}/api/uploadthing` });
  services.push(uploads.service);
  const env = {
    ...uploads.env,
    ...process.env,
    DATABASE_URL: databaseUrl,
    APP_URL: appUrl,
    NEXTAUTH_URL: appUrl,
    AUTH_SECRET: ensureAuthSecret(),
    SMTP_URL: mail.smtpUrl,
    STRIPE_SECRET_KEY: stripe.secretKey,
    STRIPE_WEBHOOK_SECRET: stripe.webhookSecret,
    STRIPE_API_URL: stripe.url,
    DEMO_MODE: 'true',
    NEXT_TELEMETRY_DISABLED: '1',
  };
  const next = path.join(root, 'node_modules/next/dist/bin/next');
  if (!devMode && !skipBuild) {
    step('Building the app for production (about a minute)');
    run(process.execPath, [next, 'build'], { env: { ...env, NODE_ENV: 'production' } });
  }
  step(devMode ? 'Starting the app in development mode' : 'Starting the app');
  const app = startService(
    'app',
    process.execPath,
    [next, devMode ? 'dev' : 'start', '-H', '127.0.0.1', '-p', String(port)],
    { env: { ...env, NODE_ENV: devMode ? 'development' : 'production' } },
  );
  services.push(app);
  app.child.on('exit', (code) => {
    if (!stopping) {
      console.error(`The app stopped (exit ${code}).`);
      shutdown(code ?? 1);
    }
  });
  await waitForHttp(`${appUrl}/api/health`, { timeoutMs: 120_000, process: app.child });

  console.log(`
\x1b[1mDemold is running.\x1b[0m

  Shop        ${appUrl}/
  Sign in     ${appUrl}/sign-in
  Workshop    ${appUrl}/workshop   (makers and studio hands)
  Fake inbox  ${mail.inboxUrl}/   (every e-mail the app sends lands here)
  Fake uploads ${uploads.url}/_control/state   (photos the workshop uploads go through it)
  Fake Stripe ${stripe.url}/_control/state   (test payments: card 4242 4242 4242 4242, any future date, any CVC)
  Health      ${appUrl}/api/health
  Database    ${databaseUrl}

How to sign in: open the sign-in page and click one of the demo people (demo mode only):
  Ines Marrow or Tam Greaves   makers (owners): the whole workshop
  Kit Sorrel                   studio hand (staff)
  Juno Pell or Rafe Quill      buyers
Or type any address to get a sign-in link by e-mail: it arrives in the fake inbox above.

The demo studio is "Marrowgate Studio" with its designs Ibex, Hare, Moth and Boar (the Ram is a draft).

Press Ctrl-C to stop.`);
} catch (error) {
  console.error(`\n\x1b[31mThe demo could not start:\x1b[0m ${error instanceof Error ? error.message : error}`);
  await shutdown(1);
}
