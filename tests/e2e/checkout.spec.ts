import { expect, test, type Page } from '@playwright/test';
import { demoPerson, latestEmailTo } from './support/auth';
import { createTestBatch, withDb } from './support/db';

async function signIn(page: Page, email: string) {
  const response = await page.request.post('/api/auth/demo', { data: { email } });
  expect(response.ok(), await response.text()).toBe(true);
}

/** Fills the fake Stripe's payment page as a buyer would. Stripe's published test cards: https://docs.stripe.com/testing */
async function fillPaymentPage(page: Page, card: string) {
  await expect(page.getByRole('button', { name: 'Pay now' })).toBeVisible();
  await page.getByLabel('E-mail').fill(demoPerson('customer').email);
  await page.getByLabel('Full name').fill('Juno Pell');
  await page.getByLabel('Address line 1').fill('12 Quarry Row');
  await page.getByLabel('Postal code').fill('H91 A0B1');
  await page.getByLabel('Town or city').fill('Galway');
  await page.getByLabel('Card number').fill(card);
  await page.getByLabel('Expiry (MM / YY)').fill('12 / 34');
  await page.getByLabel('Security code (CVC)').fill('123');
  await page.getByRole('button', { name: 'Pay now' }).click();
}

test.describe('buying a mask', () => {
  test('hold, pay with 4242…, land on the order page, find the confirmation in the inbox and the order in the account', async ({ page }, testInfo) => {
    const { batchId } = await createTestBatch({ opensInMs: -1_000, quantity: 2, name: `Buy ${testInfo.project.name}` });
    await signIn(page, demoPerson('customer').email);
    await page.goto(`/drops/${batchId}`);
    await page.getByRole('button', { name: 'Hold Old Bone' }).click();
    const held = page.getByTestId('my-hold');
    await expect(held).toContainText('Held for you: 1 × Old Bone');
    await expect(page.getByLabel('Ship to')).toHaveValue('IE');
    await expect(page.getByTestId('checkout-total')).toHaveText(/€\d+\.\d\d/);
    const total = await page.getByTestId('checkout-total').innerText();
    await page.screenshot({ path: `test-results/screenshots/checkout-held-${testInfo.project.name}.png`, fullPage: true });
    await page.getByRole('button', { name: /^Pay €/ }).click();

    await page.waitForURL(/\/pay\/cs_/);
    await expect(page.getByText(total.replace('€', '')).first()).toBeVisible();
    await fillPaymentPage(page, '4242 4242 4242 4242');

    await page.waitForURL(/\/orders\/DM-\d+/);
    await expect(page.getByTestId('order-state')).toContainText('Paid');
    await expect(page.getByText('Thank you: your payment went through.')).toBeVisible();
    await expect(page.getByTestId('order-total')).toHaveText(total);
    await page.screenshot({ path: `test-results/screenshots/order-paid-${testInfo.project.name}.png`, fullPage: true });
    const number = (await page.getByRole('heading', { level: 1 }).innerText()).replace('Order ', '').trim();

    const mail = await latestEmailTo(page.request, demoPerson('customer').email, `Your order ${number} from Marrowgate Studio`);
    expect(mail.text).toContain(total);

    await page.goto('/account');
    await expect(page.getByTestId('my-orders')).toContainText(number);
    const [stock] = await withDb(async (db) => (await db.query('SELECT quantity, held, sold FROM batch_stock WHERE batch_id = $1', [batchId])).rows);
    expect(stock).toEqual({ quantity: 2, held: 0, sold: 1 });
  });

  test('a declined card brings the buyer back with the hold still theirs', async ({ page }, testInfo) => {
    const { batchId } = await createTestBatch({ opensInMs: -1_000, quantity: 2, name: `Declined ${testInfo.project.name}` });
    await signIn(page, 'rafe@example.net');
    await page.goto(`/drops/${batchId}`);
    await page.getByRole('button', { name: 'Hold Old Bone' }).click();
    await page.getByRole('button', { name: /^Pay €/ }).click();
    await page.waitForURL(/\/pay\/cs_/);
    await fillPaymentPage(page, '4000 0000 0000 0002');
    await expect(page.getByRole('alert')).toContainText(/declined/i);
    await page.getByRole('link', { name: 'Cancel and go back to the shop' }).click();
    await page.waitForURL(/\/drops\/.*checkout=cancelled/);
    await expect(page.getByText('The payment was not finished, so nothing was charged.')).toBeVisible();
    await expect(page.getByTestId('my-hold')).toContainText('Held for you: 1 × Old Bone');
    const [stock] = await withDb(async (db) => (await db.query('SELECT held, sold FROM batch_stock WHERE batch_id = $1', [batchId])).rows);
    expect(stock).toEqual({ held: 1, sold: 0 });
  });
});
