import { expect, test } from '@playwright/test';
import sharp from 'sharp';
import { signInAs } from './support/auth';
import { withDb } from './support/db';

// The maker's story, from a fresh sculpt to a drop on the calendar: a new design with two finishes, a photo
// through the upload service (the fake, with uploadthing's real packages on both ends), a plan of 30 masks,
// a scheduled batch, and the shop showing it. Only workshop pages are used; the database is only read.

/** A moment `days` from now as the studio's clock on the wall shows it, for a datetime-local field. */
function wallClock(days: number, hour: number, timeZone: string): string {
  const at = new Date(Date.now() + days * 86_400_000);
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' })
      .formatToParts(at)
      .map((part) => [part.type, part.value]),
  );
  return `${parts.year}-${parts.month}-${parts.day}T${String(hour).padStart(2, '0')}:00`;
}

test('the maker goes from a new design to a scheduled batch the shop shows', async ({ page }, testInfo) => {
  test.setTimeout(120_000);
  await signInAs(page.request, 'owner');
  // Each project makes its own design, so the two runs do not meet.
  const name = testInfo.project.name === 'phone' ? 'Heron' : 'Stag';
  const slug = name.toLowerCase();

  // 1. The design, as a draft.
  await page.goto('/workshop/designs/new');
  await page.getByLabel('Name', { exact: true }).fill(name);
  await expect(page.getByLabel('Slug', { exact: true })).toHaveValue(slug);
  await page.getByLabel('Summary').fill(`A ${slug} mask with swept-back antlers, cast in resin and painted by hand.`);
  await page.getByLabel(/^Base price in/).fill('210');
  await page.getByLabel('Parcel length (mm)').fill('400');
  await page.getByLabel('Parcel width (mm)').fill('300');
  await page.getByLabel('Parcel height (mm)').fill('200');
  await page.getByLabel('Packed weight (g)').fill('1200');
  await page.getByRole('button', { name: 'Create the design' }).click();
  await expect(page).toHaveURL(new RegExp(`/workshop/designs/${slug}\\?done=created`));
  await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();

  // 2. Two finishes, each published (they show in the shop once the design is).
  const addFinish = page.locator('section[aria-labelledby="add-finish-title"]');
  for (const finish of [
    { name: 'Chalk', difference: '0', hours: '3' },
    { name: 'Burnt Umber', difference: '25', hours: '4.5' },
  ]) {
    await addFinish.getByLabel('Name', { exact: true }).fill(finish.name);
    await addFinish.getByLabel(/^Price difference in/).fill(finish.difference);
    await addFinish.getByLabel('Paint hours for one mask').fill(finish.hours);
    await addFinish.getByRole('button', { name: 'Add the finish' }).click();
    await page.getByRole('button', { name: `Publish ${finish.name}` }).click();
    await expect(page.getByRole('button', { name: `Retire ${finish.name}` })).toBeVisible();
  }

  // 3. A photo of the first finish, through the upload service and the image pipeline.
  const photo = await sharp({ create: { width: 900, height: 1200, channels: 3, background: { r: 196, g: 180, b: 150 } } })
    .jpeg()
    .toBuffer();
  await page.getByLabel('Photos of', { exact: true }).selectOption({ label: 'Chalk' });
  await page.locator('input[type="file"]').setInputFiles({ name: 'chalk-front.jpg', mimeType: 'image/jpeg', buffer: photo });
  await expect(page.getByText('chalk-front.jpg: Added.')).toBeVisible({ timeout: 30_000 });
  await expect(page.getByLabel(/Description of photo 1 of 1/)).toHaveValue(`${name} mask in the Chalk finish, studio photo.`);
  const stored = await withDb(async (db) =>
    (await db.query(`SELECT p.width, p.height, p.renditions FROM photos p JOIN designs d ON d.id = p.design_id WHERE d.slug = $1`, [slug])).rows,
  );
  expect(stored).toHaveLength(1);
  expect([stored[0].width, stored[0].height]).toEqual([900, 1200]);

  // 4. Published: now in the shop.
  await page.getByRole('button', { name: `Publish ${name}` }).click();
  await expect(page.getByRole('button', { name: `Retire ${name}` })).toBeVisible();

  // 5. A plan of 30 masks: 20 in the first finish, 10 in the second.
  await page.goto(`/workshop/plan?design=${slug}`);
  await page.locator('#plan-qty-chalk').fill('20');
  await page.locator('#plan-qty-burnt-umber').fill('10');
  const planLine = page.getByRole('status').filter({ hasText: 'masks ship by' });
  await expect(planLine).toContainText('30 masks ship by');
  await page.getByRole('link', { name: 'Open a batch with this plan' }).click();

  // 6. The batch, scheduled, with the plan's quantities and ship-by date carried over.
  await expect(page).toHaveURL(/\/workshop\/batches\/new\?/);
  const plannedShipBy = new URL(page.url()).searchParams.get('shipBy');
  expect(plannedShipBy).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  await expect(page.getByLabel('Ships by')).toHaveValue(plannedShipBy!);
  await expect(page.getByLabel('Chalk')).toHaveValue('20');
  await expect(page.getByLabel('Burnt Umber')).toHaveValue('10');
  const timeZone = await withDb(async (db) => (await db.query(`SELECT time_zone FROM studios LIMIT 1`)).rows[0].time_zone as string);
  await page.getByLabel('Batch name').fill('First pour');
  await page.getByLabel('Announcement').fill(`The first ${slug} masks off the new mold.`);
  await page.getByLabel('Opens to everyone').fill(wallClock(2, 18, timeZone));
  await page.getByLabel('Closes').fill(wallClock(3, 18, timeZone));
  await page.getByRole('button', { name: 'Schedule the batch' }).click();
  await expect(page).toHaveURL(/\/workshop\/batches\/[0-9a-f-]{36}\?saved=scheduled/);

  const batch = await withDb(async (db) =>
    (
      await db.query(
        `SELECT b.status, b.ship_by::text AS ship_by, b.planned_ship_by::text AS planned_ship_by,
                (SELECT sum(quantity)::int FROM batch_stock s WHERE s.batch_id = b.id) AS units
           FROM batches b JOIN designs d ON d.id = b.design_id WHERE d.slug = $1`,
        [slug],
      )
    ).rows,
  );
  expect(batch).toEqual([{ status: 'scheduled', ship_by: plannedShipBy, planned_ship_by: plannedShipBy, units: 30 }]);

  // 7. The shop shows it: the design on the home page with its photo, and the batch among the drops.
  await page.goto('/');
  await expect(page.getByRole('link', { name: new RegExp(`${name}: First pour`) })).toBeVisible();
  await expect(page.getByRole('heading', { name, exact: true })).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath('home-with-new-batch.png'), fullPage: true });
  await page.goto(`/designs/${slug}`);
  await expect(page.getByText('First pour')).toBeVisible();
  await page.screenshot({ path: `test-results/screenshots/maker-${testInfo.project.name}-design.png`, fullPage: true });
});
