import fs from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createScratchDatabase, query, sequelizeCli, type ScratchDatabase } from './support/database';

// The home page's own query functions, read against a database built the way the demo builds it.
let db: ScratchDatabase;
let catalogue: typeof import('@/lib/catalogue/designs');
let connection: typeof import('@/lib/db/connection');

beforeAll(async () => {
  db = await createScratchDatabase('catalogue');
  sequelizeCli(db.url, ['db:migrate']);
  sequelizeCli(db.url, ['db:seed:all']);
  process.env.DATABASE_URL = db.url;
  catalogue = await import('@/lib/catalogue/designs');
  connection = await import('@/lib/db/connection');
});

afterAll(async () => {
  await connection?.closeDb();
  await db?.drop();
});

describe('the home page catalogue', () => {
  it('lists the studio and only its published designs, in the studio’s order', async () => {
    const { studio, designs } = await catalogue.listDesignsForHome();
    expect(studio?.name).toBe('Marrowgate Studio');

    const expected = await query<{ name: string }>(
      db.url,
      `SELECT name FROM designs WHERE status = 'published' ORDER BY position, name`,
    );
    expect(expected.length).toBeGreaterThan(0);
    expect(designs.map((d) => d.name)).toEqual(expected.map((row) => row.name));

    const drafts = await query<{ name: string }>(db.url, `SELECT name FROM designs WHERE status <> 'published'`);
    expect(drafts.length).toBeGreaterThan(0);
    for (const draft of drafts) expect(designs.map((d) => d.name)).not.toContain(draft.name);
  });

  it('prices each card from its cheapest published finish, computed by the server in minor units', async () => {
    const { designs } = await catalogue.listDesignsForHome();
    const rows = await query<{ slug: string; from_minor: number; currency: string }>(
      db.url,
      `SELECT d.slug, min(d.base_price_minor + f.price_difference_minor)::int AS from_minor, d.currency
         FROM designs d JOIN finishes f ON f.design_id = d.id AND f.status = 'published'
        WHERE d.status = 'published' GROUP BY d.slug, d.currency`,
    );
    for (const row of rows) {
      const card = designs.find((d) => d.slug === row.slug);
      expect(card?.fromPrice).toEqual({ amountMinor: row.from_minor, currency: row.currency });
      expect(Number.isInteger(card?.fromPrice.amountMinor)).toBe(true);
    }
  });

  it('never shows a draft finish, on the card or on the design page', async () => {
    const [draft] = await query<{ design: string; finish: string; name: string }>(
      db.url,
      `SELECT d.slug AS design, f.slug AS finish, f.name FROM finishes f JOIN designs d ON d.id = f.design_id
        WHERE f.status = 'draft' AND d.status = 'published' LIMIT 1`,
    );
    expect(draft, 'the demo has a draft finish on a published design').toBeDefined();
    const { designs } = await catalogue.listDesignsForHome();
    expect(designs.find((d) => d.slug === draft!.design)?.finishNames).not.toContain(draft!.name);

    const detail = await catalogue.getPublishedDesignBySlug(draft!.design);
    expect(detail?.finishes.map((f) => f.slug)).not.toContain(draft!.finish);
  });

  it('answers null for a draft design and for one that does not exist', async () => {
    const [draft] = await query<{ slug: string }>(db.url, `SELECT slug FROM designs WHERE status = 'draft' LIMIT 1`);
    expect(await catalogue.getPublishedDesignBySlug(draft!.slug)).toBeNull();
    expect(await catalogue.getPublishedDesignBySlug('no-such-design')).toBeNull();
  });

  it('points every photo at a real WebP file of the recorded size, with alt text', async () => {
    const photos = await query<{ src: string; alt: string; width: number; height: number }>(
      db.url,
      'SELECT src, alt, width, height FROM photos',
    );
    expect(photos.length).toBeGreaterThan(0);
    for (const photo of photos) {
      const file = path.join(process.cwd(), 'public', photo.src);
      expect(fs.existsSync(file), file).toBe(true);
      // The file's own header, read by sharp, not the database's claim.
      const meta = await sharp(file).metadata();
      expect(meta.format).toBe('webp');
      expect([meta.width, meta.height]).toEqual([photo.width, photo.height]);
      expect(photo.alt.trim().length).toBeGreaterThan(10);
    }
  });
});
