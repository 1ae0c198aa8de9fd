#!/usr/bin/env node
// npm test: every check, on a fresh machine too. Sets up what it needs (dependencies, PostgreSQL, the test
// databases, Chromium, the fake inbox), runs lint, typecheck, vitest and Playwright, and exits non-zero on
// any failure. Steps after a failure still run where they can, so one run shows every problem.
//
// `npm test -- --browser-only [playwright arguments]` skips lint, typecheck and vitest and passes the rest on
// to Playwright (e.g. `npm test -- --browser-only tests/e2e/maker.spec.ts --project=desktop`): for working on
// one browser test. Only the full run counts.
import fs from 'node:fs';
import path from 'node:path';
import { ensureDependencies } from './lib/deps.mjs';
import { stopIfStartedHere } from './lib/postgres.mjs';
import { aptInstall, root, runStatus, step } from './lib/run.mjs';
import { ensureAuthSecret } from './lib/secrets.mjs';

const argv = process.argv.slice(2);
const browserOnly = argv[0] === '--browser-only';
const playwrightArgs = browserOnly ? argv.slice(1) : [];
const results = [];
const services = [];
const started = Date.now();

function record(name, status, extra = '') {
  results.push({ name, ok: status === 0, extra });
  return status === 0;
}

function readJson(file) {
  try {
    return JSON.parse(fs.readFileSync(path.join(root, file), 'utf8'));
  } catch {
    return null;
  }
}

function ensureChromium() {
  if (fs.existsSync('/usr/bin/chromium')) return;
  aptInstall(['chromium', 'fonts-dejavu-core'], 'Chromium for the browser tests');
}

let postgres;
let exitCode = 1;
let vitestOk = true;
try {
  ensureDependencies();
  ensureChromium();
  const { ensureDatabase, ensurePostgres, sequelizeCli } = await import('./lib/postgres.mjs');
  const { startFakeMail } = await import('../fake-services/mail/index.mjs');
  const { startFakeStripeService } = await import('../fake-services/stripe/index.mjs');
  const { startFakeUploadthingService } = await import('../fake-services/uploadthing/index.mjs');

  fs.rmSync(path.join(root, 'test-results'), { recursive: true, force: true });
  postgres = await ensurePostgres();
  const testAdminUrl = postgres.urlFor('demold_test');
  await ensureDatabase(testAdminUrl);
  const env = {
    ...process.env,
    NEXT_TELEMETRY_DISABLED: '1',
    TEST_DATABASE_URL: testAdminUrl,
    AUTH_SECRET: ensureAuthSecret(),
  };
  const bin = (file) => path.join(root, 'node_modules', file);

  if (!browserOnly) {
    step('Lint (ESLint with the Next.js rules)');
    record(
      'lint',
      runStatus(process.execPath, [bin('eslint/bin/eslint.js'), '.', '--max-warnings', '0'], { env }),
    );

    step('Typecheck (tsc, strict)');
    runStatus(process.execPath, [bin('next/dist/bin/next'), 'typegen'], { env });
    record('typecheck', runStatus(process.execPath, [bin('typescript/bin/tsc'), '--noEmit'], { env }));

    step('Unit and integration tests (vitest, integration against PostgreSQL)');
    vitestOk = record(
      'vitest',
      runStatus(
        process.execPath,
        [
          bin('vitest/vitest.mjs'),
          'run',
          '--reporter=default',
          '--reporter=json',
          '--outputFile.json=test-results/vitest.json',
        ],
        { env: { ...env, NODE_ENV: 'test' } },
      ),
    );
  }

  step('Preparing the browser tests: a freshly seeded database and a production build');
  const e2eUrl = postgres.urlFor('demold_e2e');
  await ensureDatabase(e2eUrl, { fresh: true });
  fs.rmSync(path.join(root, '.data/media-e2e'), { recursive: true, force: true });
  // Next's data cache lives on disk and outlives builds: from a run against an earlier database it would show
  // that database's designs and drops.
  fs.rmSync(path.join(root, '.next/cache/fetch-cache'), { recursive: true, force: true });
  sequelizeCli(e2eUrl, ['db:migrate']);
  sequelizeCli(e2eUrl, ['db:seed:all']);
  const mail = await startFakeMail({ smtpPort: 1125, webPort: 1180, quiet: true });
  services.push(mail.service);
  // Webhooks retried quickly, so a test that makes the app refuse one sees the retry within seconds.
  const stripe = await startFakeStripeService({
    port: 12211,
    webhookUrl: 'http://127.0.0.1:3100/api/webhooks/stripe',
    retrySchedule: [500, 1000, 2000, 4000],
    quiet: true,
  });
  services.push(stripe.service);
  const uploads = await startFakeUploadthingService({
    port: 12411,
    callbackUrl: 'http://127.0.0.1:3100/api/uploadthing',
    quiet: true,
  });
  services.push(uploads.service);
  const appEnv = {
    ...uploads.env,
    FAKE_UPLOADTHING_URL: uploads.url,
    // The browser tests' uploads go to a folder of their own, emptied each run.
    MEDIA_DIR: path.join(root, '.data/media-e2e'),
    ...env,
    DATABASE_URL: e2eUrl,
    APP_URL: 'http://127.0.0.1:3100',
    NEXTAUTH_URL: 'http://127.0.0.1:3100',
    SMTP_URL: mail.smtpUrl,
    FAKE_INBOX_URL: mail.inboxUrl,
    STRIPE_SECRET_KEY: stripe.secretKey,
    STRIPE_WEBHOOK_SECRET: stripe.webhookSecret,
    STRIPE_API_URL: stripe.url,
    FAKE_STRIPE_URL: stripe.url,
    DEMO_MODE: 'true',
    E2E_PORT: '3100',
    // The browser tests time holds and payments themselves; the minute sweeps (tested in vitest) would race them.
    JOBS_ENABLED: 'false',
  };
  const built = record(
    'build',
    runStatus(process.execPath, [bin('next/dist/bin/next'), 'build'], {
      env: { ...appEnv, NODE_ENV: 'production' },
    }),
  );

  if (built) {
    step('Browser tests (Playwright with Debian’s Chromium)');
    record(
      'playwright',
      runStatus(process.execPath, [bin('@playwright/test/cli.js'), 'test', ...playwrightArgs], {
        env: { ...appEnv, NODE_ENV: 'production' },
      }),
    );
  } else {
    record('playwright', 1, 'not run: the build failed');
  }

  const vitest = readJson('test-results/vitest.json');
  const playwright = readJson('test-results/playwright.json');
  const passed = (vitest?.numPassedTests ?? 0) + (playwright?.stats?.expected ?? 0);
  const failed =
    (vitest?.numFailedTests ?? 0) + (playwright?.stats?.unexpected ?? 0) + (playwright?.stats?.flaky ?? 0);
  const skipped =
    (vitest?.numPendingTests ?? 0) + (vitest?.numTodoTests ?? 0) + (playwright?.stats?.skipped ?? 0);

  console.log('\n\x1b[1mSummary\x1b[0m');
  for (const r of results) console.log(`  ${r.ok ? '✔' : '✘'} ${r.name}${r.extra ? ` (${r.extra})` : ''}`);
  if (!browserOnly && !vitestOk && !vitest) console.log('  vitest wrote no report: see its output above');
  // The failures again, at the end, where a log cut to its last lines still shows them.
  for (const line of failedTests(vitest, playwright)) console.log(`  \x1b[31m✘\x1b[0m ${line}`);
  console.log(`  took ${Math.round((Date.now() - started) / 1000)} s`);
  console.log(`\ntests: ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
  exitCode = results.every((r) => r.ok) && failed === 0 && passed > 0 ? 0 : 1;
} catch (error) {
  console.error(
    `\n\x1b[31mThe tests could not run:\x1b[0m ${error instanceof Error ? error.message : error}`,
  );
  exitCode = 1;
} finally {
  for (const service of services) service.stop();
  stopIfStartedHere(postgres);
}
process.exit(exitCode);

/** One line per failed test from the two JSON reports: file, name and the first line of the message. */
function failedTests(vitest, playwright) {
  const lines = [];
  const firstLine = (text) => String(text ?? '').replace(/\x1b\[[0-9;]*m/g, '').split('\n').find((l) => l.trim()) ?? '';
  for (const file of vitest?.testResults ?? []) {
    const where = path.relative(root, file.name ?? '');
    for (const test of file.assertionResults ?? []) {
      if (test.status === 'failed') lines.push(`${where} › ${test.fullName}: ${firstLine(test.failureMessages?.[0])}`);
    }
    if (file.status === 'failed' && !(file.assertionResults ?? []).some((t) => t.status === 'failed')) {
      lines.push(`${where}: ${firstLine(file.message)}`);
    }
  }
  const walk = (suite, trail) => {
    for (const spec of suite.specs ?? []) {
      for (const test of spec.tests ?? []) {
        if (test.status === 'unexpected' || test.status === 'flaky') {
          const error = test.results?.find((r) => r.error)?.error?.message;
          lines.push(`${spec.file} › [${test.projectName}] ${[...trail, spec.title].join(' › ')}: ${firstLine(error)}`);
        }
      }
    }
    for (const child of suite.suites ?? []) walk(child, [...trail, child.title]);
  };
  for (const suite of playwright?.suites ?? []) walk(suite, []);
  return lines;
}
