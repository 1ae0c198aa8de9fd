import { expect, test, type Page } from '@playwright/test';
import { demoPerson, latestEmailTo, signInAs } from './support/auth';
import { withDb } from './support/db';

// From painted to the buyer's door: a studio hand moves three orders to packed from the orders table, the
// owner prints their packing slips, ships one with a tracking number, and the buyer sees it on the order
// page and in the inbox. The three orders are made in the database for each run (copies of a demo order,
// with their own numbers, masks painted), so the two screen sizes never meet.

const buyer = demoPerson('customer');

async function makePaintedOrders(tag: string): Promise<string[]> {
  return withDb(async (db) => {
    const { rows } = await db.query(
      `WITH made AS (
         INSERT INTO orders (studio_id, batch_id, user_id, state, email, buyer_name, currency, lines_minor, shipping_minor, total_minor,
                tax_label, tax_rate_bp, tax_included_minor, shipping_country, shipping_rate_id, shipping_label, shipping_min_days,
                shipping_max_days, chargeable_weight_g, ship_to, payment_intent_id, paid_minor, paid_at)
         SELECT o.studio_id, o.batch_id, u.id, 'in_production', u.email, $2 || ' ' || g, o.currency, o.lines_minor, o.shipping_minor,
                o.total_minor, o.tax_label, o.tax_rate_bp, o.tax_included_minor, 'IE', o.shipping_rate_id, o.shipping_label,
                o.shipping_min_days, o.shipping_max_days, o.chargeable_weight_g,
                jsonb_build_object('name', $2 || ' ' || g, 'address',
                  jsonb_build_object('line1', '12 Quarry Row', 'city', 'Galway', 'postal_code', 'H91 A0B1', 'country', 'IE')),
                'pi_story_' || $2 || '_' || g, o.total_minor, now() - interval '3 days'
           FROM orders o, users u, generate_series(1, 3) g
          WHERE o.number = 'DM-1001' AND u.email = $1
         RETURNING id, number)
       , lines AS (
         INSERT INTO order_lines (order_id, position, batch_stock_id, design_name, finish_name, unit_price_minor, counted_in_stock, stage)
         SELECT made.id, 1, l.batch_stock_id, l.design_name, l.finish_name, l.unit_price_minor, true, 'painted'
           FROM made, orders o JOIN order_lines l ON l.order_id = o.id AND l.position = 1 WHERE o.number = 'DM-1001'
         RETURNING order_id)
       SELECT made.number FROM made JOIN lines ON lines.order_id = made.id ORDER BY made.number`,
      [buyer.email, tag],
    );
    expect(rows).toHaveLength(3);
    return rows.map((r) => r.number as string);
  });
}

async function selectOrders(page: Page, tag: string, numbers: string[]) {
  await page.goto(`/workshop/orders?q=${encodeURIComponent(tag)}`);
  for (const number of numbers) await expect(page.getByRole('link', { name: number })).toBeVisible();
  for (const number of numbers) await page.getByLabel(`Select order ${number}`).check();
}

test('three orders packed, their slips printed, one shipped, and the buyer told', async ({ page, context }, testInfo) => {
  test.setTimeout(90_000);
  const tag = `Story ${testInfo.project.name}`;
  const numbers = await makePaintedOrders(tag);
  const shots = (name: string) => `test-results/screenshots/shipping-${name}-${testInfo.project.name}.png`;

  // 1. A studio hand moves all three from painted to packed in one go.
  await signInAs(page.request, 'staff');
  await selectOrders(page, tag, numbers);
  await page.getByRole('button', { name: 'Advance stage' }).click();
  await expect(page.getByText(/Moved 3 masks of DM-\d+, DM-\d+, DM-\d+ one stage on\./)).toBeVisible();
  const stages = await withDb(async (db) =>
    (await db.query(`SELECT o.number, l.stage FROM orders o JOIN order_lines l ON l.order_id = o.id WHERE o.number = ANY($1) ORDER BY 1`, [numbers])).rows,
  );
  expect(stages).toEqual(numbers.map((number) => ({ number, stage: 'packed' })));
  await page.screenshot({ path: shots('packed'), fullPage: true });

  // 2. The owner prints their packing slips: one PDF for the three, opened in a new tab.
  await signInAs(page.request, 'owner');
  await selectOrders(page, tag, numbers);
  const [popup] = await Promise.all([context.waitForEvent('page'), page.getByRole('link', { name: /Print packing slips/ }).click()]);
  const slipsUrl = new URL(popup.url());
  expect(slipsUrl.pathname).toBe('/api/workshop/orders/packing-slips');
  expect(slipsUrl.searchParams.getAll('number').sort()).toEqual([...numbers].sort());
  await popup.close();
  const pdf = await page.request.get(slipsUrl.toString());
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()['content-type']).toBe('application/pdf');
  // Every PDF file begins with the %PDF- header (ISO 32000-1, 7.5.2).
  expect((await pdf.body()).subarray(0, 5).toString('latin1')).toBe('%PDF-');

  // 3. … and ships the first with Harbour Post.
  const [shipped] = numbers;
  await page.goto(`/workshop/orders/${shipped}`);
  await page.getByLabel('Carrier').selectOption({ label: 'Harbour Post' });
  await page.getByLabel('Tracking number').fill('hp 2041 7730 ie');
  await page.getByRole('button', { name: 'Mark shipped' }).click();
  await expect(page.getByText('HP 2041 7730 IE').first()).toBeVisible();
  await page.screenshot({ path: shots('workshop-order'), fullPage: true });

  // 4. The buyer's order page and inbox show the parcel, with the carrier's tracking link.
  await signInAs(page.request, 'customer');
  await page.goto(`/orders/${shipped}`);
  await expect(page.getByTestId('order-state')).toContainText('Shipped');
  const tracking = page.getByRole('link', { name: /HP 2041 7730 IE|Track/ }).first();
  await expect(tracking).toBeVisible();
  const href = new URL((await tracking.getAttribute('href'))!);
  expect(href.origin).toBe('https://track.harbourpost.example');
  expect(href.searchParams.get('code')).toBe('HP 2041 7730 IE');
  await page.screenshot({ path: shots('buyer-order'), fullPage: true });

  const mail = await latestEmailTo(page.request, buyer.email, `Order ${shipped} from Marrowgate Studio has shipped`);
  expect(mail.text).toContain('HP 2041 7730 IE');
  expect(mail.text).toContain(href.toString());

  // The other two stay packed, waiting for their own parcels.
  const rest = await withDb(async (db) =>
    (await db.query(`SELECT o.number, o.state FROM orders o WHERE o.number = ANY($1) ORDER BY 1`, [numbers])).rows,
  );
  expect(rest).toEqual([
    { number: shipped, state: 'shipped' },
    ...numbers.slice(1).map((number) => ({ number, state: 'in_production' })),
  ]);
});
