import { spawn } from 'node:child_process';
import { expect, test, type APIRequestContext } from '@playwright/test';
import { demoPerson, signInAs, type InboxMessage } from './support/auth';
import { withDb } from './support/db';

// The waitlist's whole promise, in the browser: a buyer who missed a drop joins a design's waitlist, confirms
// from the inbox, hears when the maker schedules the next batch, and holds a mask in the early-access window
// through the link in that e-mail — while a buyer who is not on the list is told the drop opens to everyone
// later. Each screen size uses its own design, so the two runs never meet.

const juno = demoPerson('customer');
const rafe = { email: 'rafe@example.net' };

/** A moment `days` from now as the studio's wall clock shows it, for a datetime-local field. */
function wallClock(days: number, hour: number, timeZone: string): string {
  const at = new Date(Date.now() + days * 86_400_000);
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' })
      .formatToParts(at)
      .map((p) => [p.type, p.value]),
  );
  return `${parts.year}-${parts.month}-${parts.day}T${String(hour).padStart(2, '0')}:00`;
}

/** The newest message to `address` whose text has a link matching `link`, waiting for it; returns the link. */
async function linkInInbox(
  request: APIRequestContext,
  address: string,
  link: RegExp,
  since: number,
  timeout = 30_000,
): Promise<{ url: string; mail: InboxMessage & { headers: Record<string, string> } }> {
  const inbox = process.env.FAKE_INBOX_URL;
  if (!inbox) throw new Error('FAKE_INBOX_URL is not set: run the browser tests through `npm test`');
  let found: { url: string; mail: InboxMessage & { headers: Record<string, string> } } | undefined;
  await expect
    .poll(
      async () => {
        const messages = (await (
          await request.get(`${inbox}/api/email?to=${encodeURIComponent(address)}`)
        ).json()) as (InboxMessage & { headers: Record<string, string> })[];
        for (const mail of messages.filter((m) => Date.parse(m.date) >= since - 1000).reverse()) {
          const match = link.exec(mail.text);
          if (match) {
            found = { url: match[0], mail };
            return true;
          }
        }
        return false;
      },
      { timeout },
    )
    .toBe(true);
  return found!;
}

test('a waitlisted buyer confirms, hears of the next batch and holds in early access; others wait', async ({
  page,
  browser,
}, testInfo) => {
  test.setTimeout(120_000);
  const slug = testInfo.project.name === 'phone' ? 'moth' : 'boar';
  const started = Date.now();
  const shots = (name: string) => `test-results/screenshots/waitlist-${name}-${testInfo.project.name}.png`;

  // 1. Juno joins the design's waitlist from its page.
  await signInAs(page.request, 'customer');
  await page.goto(`/designs/${slug}`);
  await page.getByRole('button', { name: 'Join the waitlist' }).click();
  await expect(page.getByTestId('waitlist-result')).toContainText('Check your inbox');
  const pending = await withDb(
    async (db) =>
      (
        await db.query(
          `SELECT w.state FROM waitlist_entries w JOIN designs d ON d.id = w.design_id WHERE d.slug = $1 AND w.email = $2`,
          [slug, juno.email],
        )
      ).rows,
  );
  expect(pending).toEqual([{ state: 'pending' }]);

  // 2. … and confirms from the fake inbox.
  const confirm = await linkInInbox(
    page.request,
    juno.email,
    /https?:\/\/[^\s<>"]+\/waitlist\/confirm\?t=[\w.-]+/,
    started,
  );
  await page.goto(confirm.url);
  await page.getByRole('button', { name: 'Yes, put me on the list' }).click();
  await expect(page.getByTestId('confirm-result')).toBeVisible();
  const confirmed = await withDb(
    async (db) =>
      (
        await db.query(
          `SELECT w.state FROM waitlist_entries w JOIN designs d ON d.id = w.design_id WHERE d.slug = $1 AND w.email = $2`,
          [slug, juno.email],
        )
      ).rows,
  );
  expect(confirmed).toEqual([{ state: 'confirmed' }]);
  await page.screenshot({ path: shots('confirmed'), fullPage: true });

  // 3. The maker schedules the next batch, with early access for the waitlist a day before it opens. The browser
  // tests run the app with its job queue off (its minute sweeps would race the timed tests), so, as a deployment
  // with `npm run worker` does, a worker process of its own fans the announcement out and sends it.
  const worker = spawn(process.execPath, ['scripts/worker.mjs'], {
    env: { ...process.env, WORKER_LOG_SECONDS: '3600' },
    stdio: 'ignore',
  });
  let batchId: string;
  let announced: Awaited<ReturnType<typeof linkInInbox>>;
  try {
    await signInAs(page.request, 'owner');
    const timeZone = await withDb(
      async (db) => (await db.query(`SELECT time_zone FROM studios LIMIT 1`)).rows[0].time_zone as string,
    );
    await page.goto(`/workshop/batches/new?design=${slug}`);
    await page.getByLabel('Batch name').fill(`Waitlist ${testInfo.project.name}`);
    await page.getByLabel('Announcement').fill('A second pour from the new mold.');
    await page.getByLabel('Old Bone').fill('3');
    await page.getByLabel('Early access for the waitlist (optional)').fill(wallClock(2, 10, timeZone));
    await page.getByLabel('Opens to everyone').fill(wallClock(3, 10, timeZone));
    await page.getByLabel('Closes').fill(wallClock(4, 10, timeZone));
    await page.getByLabel('Ships by').fill(wallClock(40, 10, timeZone).slice(0, 10));
    await page.getByRole('button', { name: 'Schedule the batch' }).click();
    await expect(page).toHaveURL(/\/workshop\/batches\/[0-9a-f-]{36}\?saved=scheduled/);
    batchId = /batches\/([0-9a-f-]{36})/.exec(page.url())![1]!;

    // 4. Juno's announcement carries her own early-access link and the one-click unsubscribe headers (RFC 8058 §3.1).
    announced = await linkInInbox(
      page.request,
      juno.email,
      new RegExp(`https?://[^\\s<>"]+/drops/${batchId}/early-access\\?t=[\\w.-]+`),
      started,
      60_000,
    );
    expect(announced.mail.headers['list-unsubscribe']).toMatch(
      /^<https?:\/\/[^>]+\/api\/waitlist\/unsubscribe\?t=[\w.-]+>$/,
    );
    expect(announced.mail.headers['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click');
  } finally {
    worker.kill('SIGTERM');
  }

  // Two days pass: the early-access hour is brought forward in the database, the public opening stays ahead.
  await withDb((db) =>
    db.query(`UPDATE batches SET early_access_at = now() - interval '1 second' WHERE id = $1`, [batchId]),
  );

  // 5. Juno opens the link, signed in with her address, and holds a mask before the public.
  await signInAs(page.request, 'customer');
  await page.goto(announced.url);
  await expect(page).toHaveURL(new RegExp(`/drops/${batchId}`));
  await page.getByRole('button', { name: 'Hold Old Bone' }).click();
  await expect(page.getByTestId('my-hold')).toContainText('Held for you: 1 × Old Bone');
  await page.screenshot({ path: shots('early-hold'), fullPage: true });

  // 6. Rafe, not on the list, is told the drop opens to everyone later, and the database agrees.
  const other = await browser.newContext();
  const rafePage = await other.newPage();
  const signIn = await rafePage.request.post('/api/auth/demo', { data: { email: rafe.email } });
  expect(signIn.ok()).toBe(true);
  await rafePage.goto(`/drops/${batchId}`);
  await expect(rafePage.getByTestId('early-access-only')).toContainText('The drop opens to everyone on');
  await expect(rafePage.getByRole('button', { name: 'Hold Old Bone' })).toBeDisabled();
  const refused = await rafePage.request.post('/api/holds', {
    data: { batchId, finishId: await finishId(batchId), quantity: 1 },
  });
  expect(refused.status()).toBe(403);
  expect((await refused.json()).error.code).toBe('early_access_only');
  await rafePage.screenshot({ path: shots('not-yet'), fullPage: true });
  await other.close();

  const holds = await withDb(
    async (db) =>
      (
        await db.query(
          `SELECT u.email FROM holds h JOIN users u ON u.id = h.user_id WHERE h.batch_id = $1 AND h.state = 'active'`,
          [batchId],
        )
      ).rows,
  );
  expect(holds).toEqual([{ email: juno.email }]);
});

async function finishId(batchId: string): Promise<string> {
  return withDb(
    async (db) =>
      (await db.query(`SELECT finish_id FROM batch_stock WHERE batch_id = $1 LIMIT 1`, [batchId])).rows[0]
        .finish_id as string,
  );
}
