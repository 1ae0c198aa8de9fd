import { expect, test } from '@playwright/test';
import { HomePage } from './pages/home-page';
import { withDb } from './support/db';

test.describe('the shop’s home page', () => {
  test('shows the studio’s published designs with prices and photos', async ({ page }, testInfo) => {
    const requests: string[] = [];
    page.on('request', (request) => requests.push(request.url()));
    const home = new HomePage(page);
    await home.open();

    await expect(page.getByText('Marrowgate Studio')).toBeVisible();
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();

    // The demo publishes four designs; the Ram is still a draft and must not be offered.
    for (const name of ['Ibex', 'Hare', 'Moth', 'Boar']) {
      const card = home.design(name);
      await expect(card).toBeVisible();
      await expect(card).toContainText(/from €\d+\.\d\d/);
    }
    await expect(home.design('Ram')).toHaveCount(0);
    // Every published design, and only those (the maker's browser test may have published one more by now).
    const published = await withDb(async (db) => (await db.query(`SELECT count(*)::int AS n FROM designs WHERE status = 'published'`)).rows[0].n as number);
    expect(published).toBeGreaterThanOrEqual(4);
    await expect(home.designs).toHaveCount(published);

    // Every cover photo has really loaded (a broken image has no natural width).
    const covers = page.getByRole('region', { name: 'Designs' }).getByRole('img');
    await expect(covers).toHaveCount(published);
    for (const cover of await covers.all()) {
      await cover.scrollIntoViewIfNeeded();
      await expect.poll(() => cover.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBeGreaterThan(0);
      await expect(cover).toHaveAttribute('alt', /mask in the .+ finish/);
    }

    // The shipped fonts are loaded from the app itself, and nothing at all is fetched from elsewhere.
    await page.evaluate(() => document.fonts.ready);
    const loadedFaces = await page.evaluate(() =>
      [...document.fonts].filter((face) => face.status === 'loaded').map((face) => face.family),
    );
    expect(loadedFaces.length).toBeGreaterThanOrEqual(2);
    expect(requests.filter((url) => url.endsWith('.woff2')).length).toBeGreaterThanOrEqual(2);
    const origin = new URL(page.url()).origin;
    expect(requests.filter((url) => !url.startsWith(origin) && !url.startsWith('data:'))).toEqual([]);

    await expect(page.getByRole('complementary', { name: 'Wearing a mask safely' })).toBeVisible();

    await page.screenshot({ path: testInfo.outputPath('home.png'), fullPage: true });
    await page.screenshot({ path: `test-results/screenshots/home-${testInfo.project.name}.png`, fullPage: true });
  });

  test('opens a design and switches its finish', async ({ page }) => {
    const home = new HomePage(page);
    await home.open();
    await home.design('Hare').getByRole('link').click();

    await expect(page).toHaveURL(/\/designs\/hare$/);
    await expect(page.getByRole('heading', { level: 1, name: 'Hare' })).toBeVisible();
    await page.getByRole('link', { name: /Verdigris/ }).click();
    await expect(page).toHaveURL(/finish=verdigris/);
    await expect(page.getByRole('link', { name: /Verdigris/ })).toHaveAttribute('aria-current', 'true');
    await expect(page.getByRole('img').first()).toHaveAttribute('alt', /Verdigris finish/);
  });

  test('answers a missing design with the not-found page and a 404', async ({ page }) => {
    const response = await page.goto('/designs/ram');
    expect(response?.status()).toBe(404);
    await expect(page.getByRole('heading', { name: 'This design is not in the shop' })).toBeVisible();

    const malformed = await page.goto('/designs/%20DROP%20TABLE');
    expect(malformed?.status()).toBe(404);
  });

  test('reports the database as up on the health endpoint', async ({ request }) => {
    const response = await request.get('/api/health');
    expect(response.status()).toBe(200);
    expect(response.headers()['cache-control']).toBe('no-store');
    const body = await response.json();
    expect(body).toMatchObject({ status: 'ok', checks: { database: { status: 'up' } } });
  });
  test('serves robots.txt keeping crawlers out of the workshop, and a sitemap of the published designs', async ({ request }) => {
    const robots = await request.get('/robots.txt');
    expect(robots.status()).toBe(200);
    const robotsText = await robots.text();
    // RFC 9309: a group starts with User-agent; Disallow lines name path prefixes.
    expect(robotsText).toMatch(/^User-Agent: \*$/im);
    expect(robotsText).toMatch(/^Disallow: \/workshop$/m);
    expect(robotsText).toMatch(/^Disallow: \/account$/m);
    expect(robotsText).toMatch(/^Sitemap: http:\/\/127\.0\.0\.1:3100\/sitemap\.xml$/m);

    const sitemap = await request.get('/sitemap.xml');
    expect(sitemap.status()).toBe(200);
    const xml = await sitemap.text();
    // The sitemaps.org 0.9 protocol's namespace, one <loc> per page.
    expect(xml).toContain('xmlns="http://www.sitemaps.org/schemas/sitemap/0.9"');
    const locs = [...xml.matchAll(/<loc>([^<]+)<\/loc>/g)].map((m) => m[1] ?? '');
    expect(locs).toContain('http://127.0.0.1:3100/');
    expect(locs.some((loc) => /\/designs\/hare/.test(loc))).toBe(true);
    expect(locs.some((loc) => loc.includes('/workshop') || loc.includes('/account'))).toBe(false);
  });
  test('answers with headers that forbid framing and sniffing, and keep the referrer to the origin', async ({ request }) => {
    for (const path of ['/', '/designs/hare', '/api/health']) {
      const headers = (await request.get(path)).headers();
      // Clickjacking: CSP Level 2's frame-ancestors, with X-Frame-Options for older browsers.
      expect(headers['content-security-policy'], path).toContain("frame-ancestors 'none'");
      expect(headers['x-frame-options'], path).toBe('DENY');
      expect(headers['x-content-type-options'], path).toBe('nosniff');
      expect(headers['referrer-policy'], path).toBe('strict-origin-when-cross-origin');
      // The browser tests run the production build, which sends HSTS (RFC 6797).
      expect(headers['strict-transport-security'], path).toMatch(/^max-age=\d{7,}/);
      expect(headers['x-powered-by'], path).toBeUndefined();
    }
  });
});
