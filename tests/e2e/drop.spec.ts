import { expect, test } from '@playwright/test';
import { createTestBatch, withDb } from './support/db';
import { demoPerson } from './support/auth';

test.describe('a drop opening', () => {
  test('a buyer watches the countdown reach zero, holds, sees the hold timer; another sees the stock fall', async ({ browser, baseURL }, testInfo) => {
    const { batchId } = await createTestBatch({ opensInMs: 8_000, quantity: 3, name: `Opening ${testInfo.project.name}` });
    const contexts = await Promise.all([browser.newContext(), browser.newContext()]);
    const [juno, rafe] = await Promise.all(contexts.map((c) => c.newPage()));
    for (const [page, email] of [[juno!, demoPerson('customer').email], [rafe!, 'rafe@example.net']] as const) {
      const signedIn = await page.request.post(`${baseURL}/api/auth/demo`, { data: { email } });
      expect(signedIn.ok()).toBe(true);
      await page.goto(`/drops/${batchId}`);
    }

    await expect(juno!.getByText('Opens soon')).toBeVisible();
    const countdown = juno!.getByTestId('countdown');
    await expect(countdown).toHaveText(/^0:0\d$/);
    const hold = juno!.getByRole('button', { name: 'Hold Old Bone' });
    await expect(hold).toBeDisabled();
    await juno!.screenshot({ path: `test-results/screenshots/drop-before-${testInfo.project.name}.png`, fullPage: true });

    // The countdown runs out and the phase changes without a reload.
    await expect(juno!.getByText('Open now')).toBeVisible({ timeout: 15_000 });
    await expect(countdown).toHaveCount(0);
    await expect(juno!.getByTestId('stock')).toHaveText('3 of 3 left');
    await hold.click();

    const held = juno!.getByTestId('my-hold');
    await expect(held).toContainText('Held for you: 1 × Old Bone');
    await expect(juno!.getByTestId('hold-countdown')).toHaveText(/^(10:00|9:\d\d)$/);
    await juno!.screenshot({ path: `test-results/screenshots/drop-held-${testInfo.project.name}.png`, fullPage: true });

    // The other buyer's page follows within a poll or two.
    await expect(rafe!.getByTestId('stock')).toHaveText('2 of 3 left', { timeout: 6_000 });

    // Letting go gives it back.
    await juno!.getByRole('button', { name: 'Let it go' }).click();
    await expect(held).toHaveCount(0);
    await expect(rafe!.getByTestId('stock')).toHaveText('3 of 3 left', { timeout: 6_000 });

    const [row] = await withDb(async (db) => (await db.query('SELECT quantity, held, sold, available FROM batch_stock WHERE batch_id = $1', [batchId])).rows);
    expect(row).toEqual({ quantity: 3, held: 0, sold: 0, available: 3 });
    await Promise.all(contexts.map((c) => c.close()));
  });

  test('an unknown drop is a 404 page, and a signed-out visitor is asked to sign in to hold', async ({ page }) => {
    const missing = await page.goto('/drops/00000000-0000-4000-8000-000000000000');
    expect(missing?.status()).toBe(404);
    await expect(page.getByRole('heading', { name: 'There is no such drop' })).toBeVisible();

    const { batchId } = await createTestBatch({ opensInMs: -1_000, quantity: 2, name: 'Signed-out visit' });
    await page.goto(`/drops/${batchId}`);
    await expect(page.getByRole('link', { name: 'Sign in to hold' })).toHaveAttribute('href', `/sign-in?callbackUrl=${encodeURIComponent(`/drops/${batchId}`)}`);
  });
});
