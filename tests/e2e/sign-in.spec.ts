import { expect, test } from '@playwright/test';
import { latestEmailTo } from './support/auth';

test.describe('signing in with an e-mail link', () => {
  test('ask for a link, open it from the inbox, land signed in; the same link then fails', async ({ page, request }, testInfo) => {
    const address = `new.buyer.${testInfo.project.name}@example.com`;
    await page.goto('/sign-in');
    await page.getByLabel('E-mail address').fill(`  New.Buyer.${testInfo.project.name}@Example.com `);
    await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
    await expect(page.getByRole('status')).toContainText('Check your inbox');
    await expect(page.getByRole('status')).toContainText(address);

    const email = await latestEmailTo(request, address);
    expect(email.subject).toBe('Your sign-in link');
    const link = email.text.match(/https?:\/\/\S+\/api\/auth\/callback\/email\S+/)?.[0];
    expect(link, 'the plain-text part carries the link').toBeTruthy();

    await page.goto(link!);
    await expect(page).toHaveURL(/127\.0\.0\.1:\d+\/$/);
    await page.goto('/account');
    await expect(page.getByText(address)).toBeVisible();
    await page.screenshot({ path: `test-results/screenshots/account-${testInfo.project.name}.png`, fullPage: true });

    // Signed out, the link that was used cannot sign anyone in again.
    await page.getByRole('button', { name: 'Sign out' }).click();
    await expect(page.getByRole('link', { name: 'Sign in' })).toBeVisible();
    await page.goto(link!);
    await expect(page).toHaveURL(/\/sign-in\?error=link_used/);
    await expect(page.getByRole('alert').filter({ hasText: 'already been used' })).toBeVisible();
    await page.goto('/account');
    await expect(page).toHaveURL(/\/sign-in/);
  });

  test('a malformed address is refused with a message next to the field, and nothing is sent', async ({ page, request }) => {
    await page.goto('/sign-in');
    await page.getByLabel('E-mail address').fill('juno@example');
    await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
    const field = page.getByLabel('E-mail address');
    await expect(field).toHaveAttribute('aria-invalid', 'true');
    await expect(page.getByText('needs a full domain')).toBeVisible();

    const response = await request.post('/api/auth/signin/email', { form: { email: 'a@b@c.example', csrfToken: 'x' } });
    expect(response.status()).toBe(400);
    expect((await response.json()).error.code).toBe('invalid_input');
  });

  test('a tampered link says it is not valid', async ({ page }) => {
    await page.goto('/api/auth/callback/email?token=forged0123456789abcdef&email=juno%40example.com');
    await expect(page).toHaveURL(/error=link_invalid/);
    await expect(page.getByRole('alert').filter({ hasText: 'is not valid' })).toBeVisible();
  });

  test('the demo people sign in with one click: a maker lands in the workshop', async ({ page }, testInfo) => {
    await page.goto('/sign-in');
    await page.getByRole('button', { name: /Ines Marrow/ }).click();
    await expect(page).toHaveURL(/\/workshop$/);
    await expect(page.getByRole('heading', { name: 'Overview' })).toBeVisible();
    if (testInfo.project.name === 'phone') {
      // On a phone the sections fold behind one button that names where you are.
      const people = page.getByRole('link', { name: 'People' });
      await expect(people).toBeHidden();
      await page.getByRole('button', { name: /^Overview.*show the workshop sections/ }).click();
    }
    await page.getByRole('link', { name: 'People' }).click();
    await expect(page.getByRole('heading', { name: 'People' })).toBeVisible();
    await expect(page.getByText('kit@marrowgate.example')).toBeVisible();
    await page.screenshot({ path: `test-results/screenshots/workshop-people-${testInfo.project.name}.png`, fullPage: true });
  });

  test('a forged session cookie counts as signed out', async ({ browser }) => {
    const context = await browser.newContext();
    await context.addCookies([{ name: 'next-auth.session-token', value: 'forged-session-token', url: test.info().project.use.baseURL! }]);
    const page = await context.newPage();
    const response = await page.request.get('/account', { maxRedirects: 0 });
    expect(response.status()).toBe(307);
    expect(response.headers().location).toMatch(/\/sign-in\?callbackUrl=%2Faccount/);
    await context.close();
  });
});
