import { expect, test, type Page } from '@playwright/test';
import { demoPerson, latestEmailTo } from './support/auth';
import { createTestBatch, withDb } from './support/db';

// The maker works at a desk: this runs on the desktop project only (see playwright.config.ts).
const fakeStripe = () => {
  const url = process.env.FAKE_STRIPE_URL;
  if (!url) throw new Error('FAKE_STRIPE_URL is not set: run the browser tests through `npm test`');
  return url;
};

async function signIn(page: Page, email: string) {
  const response = await page.request.post('/api/auth/demo', { data: { email } });
  expect(response.ok(), await response.text()).toBe(true);
}

test.describe('the oversold queue', () => {
  test('a late payment that found the stock gone is refunded in one step and the buyer hears about it', async ({ browser, baseURL }) => {
    const { batchId, finishId } = await createTestBatch({ opensInMs: -1_000, quantity: 1, name: 'Oversold in the browser' });
    const buyerContext = await browser.newContext({ baseURL });
    const buyer = await buyerContext.newPage();
    const lateEmail = 'rafe@example.net';
    await signIn(buyer, lateEmail);
    const hold = await (await buyer.request.post('/api/holds', { data: { batchId, finishId, quantity: 1 } })).json();
    const options = await (await buyer.request.get(`/api/checkout/options?holdId=${hold.hold.id}&country=IE`)).json();
    const checkout = await (await buyer.request.post('/api/checkout', { data: { holdId: hold.hold.id, country: 'IE', shippingRateId: options.options[0].rateId } })).json();
    // The hold runs out and the last mask goes to someone else, then the first buyer's payment completes.
    await withDb(async (db) => {
      await db.query(`UPDATE holds SET expires_at = now() - interval '1 second' WHERE id = $1`, [hold.hold.id]);
      await db.query(`SELECT expire_holds(NULL, NULL, NULL, 100)`);
      await db.query(`UPDATE batch_stock SET sold = sold + 1 WHERE batch_id = $1`, [batchId]);
    });
    const sessionId = checkout.url.split('/').pop();
    const paid = await buyer.request.post(`${fakeStripe()}/_control/sessions/${sessionId}/pay`, {
      data: { card: '4242424242424242', email: lateEmail, shipping: { name: 'Rafe Quill', line1: '3 Mill Lane', city: 'Sligo', postal_code: 'F91 C2D3', country: 'IE' } },
    });
    expect(paid.status()).toBe(200);
    await buyerContext.close();

    const makerContext = await browser.newContext({ baseURL });
    const maker = await makerContext.newPage();
    await signIn(maker, demoPerson('owner').email);
    await expect
      .poll(async () => {
        await maker.goto('/workshop/oversold');
        return maker.getByText(checkout.orderNumber).count();
      }, { timeout: 15_000 })
      .toBeGreaterThan(0);
    await maker.screenshot({ path: 'test-results/screenshots/oversold-queue.png', fullPage: true });
    const row = maker.getByRole('row').filter({ hasText: checkout.orderNumber }).or(maker.getByRole('listitem').filter({ hasText: checkout.orderNumber }));
    await row.getByRole('button', { name: 'Refund this mask' }).click();
    await expect(maker.getByText(/Refunded/).first()).toBeVisible({ timeout: 15_000 });

    const mail = await latestEmailTo(maker.request, lateEmail, `Sorry: we refunded your order ${checkout.orderNumber}`);
    expect(mail.text).toContain(checkout.orderNumber);
    const [order] = await withDb(async (db) => (await db.query('SELECT state, refunded_minor = paid_minor AS full FROM orders WHERE number = $1', [checkout.orderNumber])).rows);
    expect(order).toEqual({ state: 'refunded', full: true });
    await makerContext.close();
  });
});
