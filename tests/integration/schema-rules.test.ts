import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createScratchDatabase, sequelizeCli, type ScratchDatabase } from './support/database';

// The rules the data keeps are in the schema too, so no code path (or hand-typed SQL) can break them.
let db: ScratchDatabase;
let client: pg.Client;
let studioId: string;

beforeAll(async () => {
  db = await createScratchDatabase('rules');
  sequelizeCli(db.url, ['db:migrate']);
  client = new pg.Client({ connectionString: db.url });
  await client.connect();
  const { rows } = await client.query(
    `INSERT INTO studios (slug, name, time_zone, currency, country)
     VALUES ('test-studio', 'Test Studio', 'UTC', 'EUR', 'IE') RETURNING id`,
  );
  studioId = rows[0].id;
});

afterAll(async () => {
  await client?.end();
  await db?.drop();
});

async function violation(sql: string, params: unknown[]): Promise<string | undefined> {
  try {
    await client.query('SAVEPOINT attempt');
    await client.query(sql, params);
    await client.query('RELEASE SAVEPOINT attempt');
    return undefined;
  } catch (error) {
    await client.query('ROLLBACK TO SAVEPOINT attempt');
    return (error as { constraint?: string }).constraint;
  }
}

const insertDesign = `INSERT INTO designs (studio_id, slug, name, base_price_minor, currency, status, published_at)
                      VALUES ($1, $2, 'A design', $3, $4, $5, $6)`;

describe('designs', () => {
  beforeAll(() => client.query('BEGIN'));
  afterAll(() => client.query('ROLLBACK'));

  it('refuses a negative price', async () => {
    expect(await violation(insertDesign, [studioId, 'neg', -1, 'EUR', 'draft', null])).toBe(
      'designs_price_not_negative',
    );
  });

  it('refuses a currency that is not three capital letters (ISO 4217 alphabetic form)', async () => {
    expect(await violation(insertDesign, [studioId, 'cur', 100, 'eur', 'draft', null])).toBe(
      'designs_currency_format',
    );
  });

  it('refuses an unknown status and a published design without a publication time', async () => {
    expect(await violation(insertDesign, [studioId, 'st', 100, 'EUR', 'on-sale', null])).toBe(
      'designs_status_known',
    );
    expect(await violation(insertDesign, [studioId, 'pub', 100, 'EUR', 'published', null])).toBe(
      'designs_published_has_date',
    );
  });

  it('refuses a slug that would not make a clean URL, and a duplicate within the studio', async () => {
    expect(await violation(insertDesign, [studioId, 'Has Spaces', 100, 'EUR', 'draft', null])).toBe(
      'designs_slug_format',
    );
    expect(await violation(insertDesign, [studioId, 'twin', 100, 'EUR', 'draft', null])).toBeUndefined();
    expect(await violation(insertDesign, [studioId, 'twin', 100, 'EUR', 'draft', null])).toBe(
      'designs_studio_slug_unique',
    );
  });
});

describe('photos', () => {
  beforeAll(() => client.query('BEGIN'));
  afterAll(() => client.query('ROLLBACK'));

  it('refuses a photo without alt text or pointing outside the site', async () => {
    const { rows } = await client.query(
      `INSERT INTO designs (studio_id, slug, name, base_price_minor, currency) VALUES ($1, 'p', 'P', 1, 'EUR') RETURNING id`,
      [studioId],
    );
    const insertPhoto = `INSERT INTO photos (design_id, src, alt, width, height) VALUES ($1, $2, $3, 10, 10)`;
    expect(await violation(insertPhoto, [rows[0].id, '/media/a.webp', '   '])).toBe('photos_alt_present');
    expect(await violation(insertPhoto, [rows[0].id, 'https://elsewhere.test/a.webp', 'A mask'])).toBe(
      'photos_src_local',
    );
  });
});
