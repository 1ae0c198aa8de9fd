import { renderToStaticMarkup } from 'react-dom/server';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import { withAppDatabase } from './support/app-database';
import { query } from './support/database';

// The settings' save functions against a database migrated and seeded the way the demo is: each save changes
// the studio's rows and writes one audit entry with before and after; a refused save changes nothing at all.
const db = withAppDatabase('settings', { seed: true });

// The page is rendered as the signed-in person.
let currentUser: CurrentUser | null = null;
vi.mock('@/lib/auth/session', () => ({ getCurrentUser: async () => currentUser }));

const save = () => import('@/lib/settings/save');
const schemas = () => import('@/lib/settings/schemas');

type Entry = {
  action: string;
  subject_type: string;
  subject_id: string;
  actor_user_id: string | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
};

const rows = <T extends object>(text: string, params: unknown[] = []) =>
  query<T & Record<string, unknown>>(db.current().url, text, params) as Promise<T[]>;
const auditCount = async () => (await rows<{ n: number }>(`SELECT count(*)::int AS n FROM audit_log`))[0]!.n;
const lastEntry = async () =>
  (
    await rows<Entry>(
      `SELECT action, subject_type, subject_id, actor_user_id, before, after FROM audit_log ORDER BY id DESC LIMIT 1`,
    )
  )[0]!;

type StudioRow = {
  id: string;
  name: string;
  mail_per_minute: number;
  currency: string;
  time_zone: string;
  country: string;
  contact_email: string | null;
  postal_address: string;
  tax_label: string;
  tax_rate_bp: number;
  volumetric_divisor: number;
  working_days: number[];
  working_hours_per_day: string;
  holidays: string[];
  planner_defaults: Record<string, number>;
  customs_area: string[];
  customs_hs_code: string | null;
  customs_description: string;
  customs_origin_country: string | null;
};
const studioRow = async () =>
  (
    await rows<StudioRow>(
      `SELECT id, name, mail_per_minute, currency, time_zone, country, contact_email, postal_address, tax_label, tax_rate_bp, volumetric_divisor, working_days,
            working_hours_per_day::text AS working_hours_per_day, ARRAY(SELECT to_char(h, 'YYYY-MM-DD') FROM unnest(holidays) h ORDER BY h) AS holidays,
            planner_defaults, customs_area, customs_hs_code, customs_description, customs_origin_country
       FROM studios ORDER BY created_at LIMIT 1`,
    )
  )[0]!;

/** Everything the settings can touch, to show a refused save left it all as it was. */
const snapshot = async () =>
  JSON.stringify({
    studio: await studioRow(),
    zones: await rows(`SELECT id, name, countries FROM shipping_zones ORDER BY id`),
    rates: await rows(
      `SELECT id, label, up_to_grams, amount_minor, min_days, max_days FROM shipping_rates ORDER BY id`,
    ),
    carriers: await rows(`SELECT id, name, tracking_url_template FROM carriers ORDER BY id`),
    boxes: await rows(
      `SELECT id, name, length_mm, width_mm, height_mm, empty_weight_g FROM parcel_sizes ORDER BY id`,
    ),
    designs: await rows(`SELECT id, currency FROM designs ORDER BY id`),
    audit: await auditCount(),
  });

async function refusedAndUnchanged(attempt: () => Promise<unknown>, expected: Record<string, unknown>) {
  const before = await snapshot();
  await expect(attempt()).rejects.toMatchObject(expected);
  expect(await snapshot()).toBe(before);
}

/** Runs a save, checks it wrote exactly one audit entry about the studio, and returns that entry. */
async function oneEntry(run: () => Promise<unknown>): Promise<Entry> {
  const count = await auditCount();
  await run();
  expect(await auditCount()).toBe(count + 1);
  const entry = await lastEntry();
  expect(entry).toMatchObject({
    subject_type: 'studio',
    subject_id: (await studioRow()).id,
    actor_user_id: owner.id,
  });
  return entry;
}

let owner: CurrentUser;
beforeAll(async () => {
  const [row] = await rows<{ id: string; email: string }>(
    `SELECT id, email FROM users WHERE role = 'owner' ORDER BY email LIMIT 1`,
  );
  owner = { id: row!.id, email: row!.email, name: 'Owner', role: 'owner' };
});

describe('the studio’s details', () => {
  it('saves a new name and address, logging only what changed', async () => {
    const { updateStudioDetails } = await save();
    const { studioDetailsSchema } = await schemas();
    const was = await studioRow();
    const input = studioDetailsSchema.parse({
      name: 'Marrowgate Mask Studio',
      contactEmail: was.contact_email ?? '',
      mailPerMinute: String(was.mail_per_minute),
      postalAddress: 'Unit 5, Tannery Yard\nMarrowgate\nIreland',
      country: was.country,
      currency: was.currency,
      timeZone: was.time_zone,
    });
    const entry = await oneEntry(() => updateStudioDetails(owner, input));
    const now = await studioRow();
    expect(now).toMatchObject({
      name: 'Marrowgate Mask Studio',
      postal_address: 'Unit 5, Tannery Yard\nMarrowgate\nIreland',
    });
    expect(entry.action).toBe('settings.studio_changed');
    expect(entry.before).toEqual({ name: was.name, postalAddress: was.postal_address });
    expect(entry.after).toEqual({
      name: 'Marrowgate Mask Studio',
      postalAddress: 'Unit 5, Tannery Yard\nMarrowgate\nIreland',
    });
  });

  it('sets the pace of the outbox, and refuses a pace of nothing', async () => {
    const { updateStudioDetails } = await save();
    const { studioDetailsSchema } = await schemas();
    const was = await studioRow();
    const form = {
      name: was.name,
      contactEmail: was.contact_email ?? '',
      postalAddress: was.postal_address,
      country: was.country,
      currency: was.currency,
      timeZone: was.time_zone,
    };
    expect(studioDetailsSchema.safeParse({ ...form, mailPerMinute: '0' }).success).toBe(false);
    expect(studioDetailsSchema.safeParse({ ...form, mailPerMinute: '1.5' }).success).toBe(false);
    const entry = await oneEntry(() =>
      updateStudioDetails(owner, studioDetailsSchema.parse({ ...form, mailPerMinute: '120' })),
    );
    expect((await studioRow()).mail_per_minute).toBe(120);
    expect(entry.before).toEqual({ mailPerMinute: was.mail_per_minute });
    expect(entry.after).toEqual({ mailPerMinute: 120 });
    await updateStudioDetails(
      owner,
      studioDetailsSchema.parse({ ...form, mailPerMinute: String(was.mail_per_minute) }),
    );
  });

  it('writes nothing when nothing changed', async () => {
    const { updateStudioDetails } = await save();
    const was = await studioRow();
    const before = await snapshot();
    const result = await updateStudioDetails(owner, {
      name: was.name,
      contactEmail: was.contact_email,
      mailPerMinute: was.mail_per_minute,
      postalAddress: was.postal_address,
      country: was.country,
      currency: was.currency,
      timeZone: was.time_zone,
    });
    expect(result.changed).toEqual([]);
    expect(await snapshot()).toBe(before);
  });

  it('refuses a new currency once batches exist, saying why, and keeps the other fields as they were', async () => {
    const { updateStudioDetails } = await save();
    const was = await studioRow();
    expect((await rows<{ n: number }>(`SELECT count(*)::int AS n FROM batches`))[0]!.n).toBeGreaterThan(0);
    await refusedAndUnchanged(
      () =>
        updateStudioDetails(owner, {
          name: 'Renamed',
          contactEmail: was.contact_email,
          mailPerMinute: was.mail_per_minute,
          postalAddress: was.postal_address,
          country: was.country,
          currency: 'GBP',
          timeZone: was.time_zone,
        }),
      { code: 'currency_locked', status: 409, message: expect.stringMatching(/batches.*smallest unit/s) },
    );
  });

  it('changes nothing when the database refuses part of the save', async () => {
    const { updateStudioDetails } = await save();
    const was = await studioRow();
    // Past the schema on purpose: the table's own CHECK refuses the address, and the name must not be saved alone.
    await expect(
      updateStudioDetails(owner, {
        name: 'Half saved',
        contactEmail: 'not an address',
        mailPerMinute: was.mail_per_minute,
        postalAddress: was.postal_address,
        country: was.country,
        currency: was.currency,
        timeZone: was.time_zone,
      }),
    ).rejects.toBeTruthy();
    expect((await studioRow()).name).toBe(was.name);
  });
});

describe('the working calendar and money', () => {
  it('saves working days, hours and holidays', async () => {
    const { updateCalendar } = await save();
    const { calendarSchema } = await schemas();
    const was = await studioRow();
    const input = calendarSchema.parse({
      day2: 'on',
      day3: 'on',
      day4: 'on',
      day5: 'on',
      day6: 'on',
      hoursPerDay: '6.5',
      holidays: '2026-12-25, 2026-12-26',
    });
    const entry = await oneEntry(() => updateCalendar(owner, input));
    const now = await studioRow();
    expect(now.working_days.map(Number)).toEqual([2, 3, 4, 5, 6]);
    expect(Number(now.working_hours_per_day)).toBe(6.5);
    expect(now.holidays).toEqual(['2026-12-25', '2026-12-26']);
    expect(entry.action).toBe('settings.calendar_changed');
    expect(entry.before).toMatchObject({ workingDays: was.working_days.map(Number) });
    expect(entry.after).toEqual({
      workingDays: [2, 3, 4, 5, 6],
      hoursPerDay: 6.5,
      holidays: ['2026-12-25', '2026-12-26'],
    });
  });

  it('saves tax and card fee, keeping the planner’s other rules untouched', async () => {
    const { updateMoney } = await save();
    const { moneySchema } = await schemas();
    const was = await studioRow();
    const input = moneySchema.parse({
      currency: was.currency,
      taxLabel: 'VAT',
      taxRate: '13.5',
      cardFeePercent: '1.4',
      cardFeeFixed: '0.25',
      volumetricDivisor: '6000',
    });
    const entry = await oneEntry(() => updateMoney(owner, input));
    const now = await studioRow();
    expect(now).toMatchObject({ tax_rate_bp: 1350, volumetric_divisor: 6000 });
    expect(now.planner_defaults).toMatchObject({ cardFeeBasisPoints: 140, cardFeeFixedMinor: 25 });
    const others = (defaults: Record<string, number>) =>
      Object.fromEntries(
        Object.entries(defaults).filter(
          ([key]) => key !== 'cardFeeBasisPoints' && key !== 'cardFeeFixedMinor',
        ),
      );
    expect(others(now.planner_defaults)).toEqual(others(was.planner_defaults));
    expect(Object.keys(others(now.planner_defaults)).length).toBeGreaterThan(5);
    expect(entry.after).toMatchObject({
      taxRateBasisPoints: 1350,
      cardFeeBasisPoints: 140,
      cardFeeFixedMinor: 25,
      volumetricDivisor: 6000,
    });
    expect(entry.before).toMatchObject({
      taxRateBasisPoints: was.tax_rate_bp,
      volumetricDivisor: was.volumetric_divisor,
    });
  });

  it('refuses money entered for another currency than the studio’s', async () => {
    const { updateMoney } = await save();
    await refusedAndUnchanged(
      () =>
        updateMoney(owner, {
          currency: 'JPY',
          taxLabel: 'VAT',
          taxRate: 0,
          cardFeePercent: 0,
          cardFeeFixedMinor: 30,
          volumetricDivisor: 5000,
        }),
      { code: 'currency_changed', status: 409 },
    );
  });
});

describe('shipping zones and rates', () => {
  it('refuses a country that is already in another zone, naming that zone', async () => {
    const { saveZone } = await save();
    const [ireland] = await rows<{ name: string }>(
      `SELECT name FROM shipping_zones WHERE 'IE' = ANY(countries)`,
    );
    await refusedAndUnchanged(() => saveZone(owner, { name: 'Islands', countries: ['IE', 'IS'].sort() }), {
      code: 'country_in_two_zones',
      status: 409,
      message: expect.stringContaining(`“${ireland!.name}”`),
      details: { fields: { countries: [expect.stringContaining('Ireland (IE)')] } },
    });
  });

  it('adds, edits and deletes a zone and its rates, one audit entry each', async () => {
    const { saveZone, saveRate, deleteRate, deleteZone } = await save();
    const added = await oneEntry(() => saveZone(owner, { name: 'Far North', countries: ['GL'] }));
    expect(added).toMatchObject({
      action: 'settings.zone_added',
      before: null,
      after: { name: 'Far North', countries: ['GL'] },
    });
    const zoneId = added.after!.zoneId as string;
    expect(await rows(`SELECT name, countries FROM shipping_zones WHERE id = $1`, [zoneId])).toEqual([
      { name: 'Far North', countries: ['GL'] },
    ]);

    const edited = await oneEntry(() =>
      saveZone(owner, { zoneId, name: 'Far North', countries: ['FO', 'GL'] }),
    );
    expect(edited).toMatchObject({
      action: 'settings.zone_changed',
      before: { countries: ['GL'] },
      after: { countries: ['FO', 'GL'] },
    });
    expect(edited.before).not.toHaveProperty('name');

    const rate = await oneEntry(() =>
      saveRate(owner, {
        zoneId,
        currency: 'EUR',
        label: 'Tracked post',
        upToGrams: 5000,
        amountMinor: 4500,
        minDays: 5,
        maxDays: 12,
      }),
    );
    expect(rate).toMatchObject({
      action: 'settings.rate_added',
      after: { amountMinor: 4500, currency: 'EUR' },
    });
    const rateId = rate.after!.rateId as string;
    const rateEdit = await oneEntry(() =>
      saveRate(owner, {
        zoneId,
        rateId,
        currency: 'EUR',
        label: 'Tracked post',
        upToGrams: 5000,
        amountMinor: 4900,
        minDays: 5,
        maxDays: 12,
      }),
    );
    expect(rateEdit).toMatchObject({ before: { amountMinor: 4500 }, after: { amountMinor: 4900 } });
    expect(await rows(`SELECT amount_minor FROM shipping_rates WHERE id = $1`, [rateId])).toEqual([
      { amount_minor: 4900 },
    ]);

    // Past the schema: the table refuses fewer most days than fewest, and nothing is written.
    await refusedAndUnchanged(
      () =>
        saveRate(owner, {
          zoneId,
          rateId,
          currency: 'EUR',
          label: 'Tracked post',
          upToGrams: 5000,
          amountMinor: 4900,
          minDays: 9,
          maxDays: 3,
        }),
      {},
    );

    expect(await oneEntry(() => deleteRate(owner, { rateId }))).toMatchObject({
      action: 'settings.rate_deleted',
      after: null,
    });
    expect(await oneEntry(() => deleteZone(owner, { zoneId }))).toMatchObject({
      action: 'settings.zone_deleted',
      before: { name: 'Far North' },
    });
    expect(await rows(`SELECT id FROM shipping_zones WHERE id = $1`, [zoneId])).toEqual([]);
    await refusedAndUnchanged(() => deleteZone(owner, { zoneId }), { code: 'zone_not_found', status: 404 });
  });
});

describe('boxes and carriers', () => {
  it('adds, edits and deletes a box; a second box of the same name is refused', async () => {
    const { saveParcelSize, deleteParcelSize } = await save();
    const added = await oneEntry(() =>
      saveParcelSize(owner, {
        name: 'Flat box',
        lengthMm: 420,
        widthMm: 380,
        heightMm: 90,
        emptyWeightG: 380,
      }),
    );
    const parcelSizeId = added.after!.parcelSizeId as string;
    await refusedAndUnchanged(
      () =>
        saveParcelSize(owner, {
          name: 'Flat box',
          lengthMm: 100,
          widthMm: 100,
          heightMm: 100,
          emptyWeightG: 100,
        }),
      {
        code: 'parcel_size_name_taken',
        status: 409,
      },
    );
    const edited = await oneEntry(() =>
      saveParcelSize(owner, {
        parcelSizeId,
        name: 'Flat box',
        lengthMm: 420,
        widthMm: 380,
        heightMm: 100,
        emptyWeightG: 380,
      }),
    );
    expect(edited).toMatchObject({
      action: 'settings.parcel_size_changed',
      before: { heightMm: 90 },
      after: { heightMm: 100 },
    });
    expect(await rows(`SELECT height_mm FROM parcel_sizes WHERE id = $1`, [parcelSizeId])).toEqual([
      { height_mm: 100 },
    ]);
    await oneEntry(() => deleteParcelSize(owner, { parcelSizeId }));
    expect(await rows(`SELECT id FROM parcel_sizes WHERE id = $1`, [parcelSizeId])).toEqual([]);
  });

  it('adds, edits and deletes a carrier; a template without {tracking} never reaches the table', async () => {
    const { saveCarrier, deleteCarrier } = await save();
    const added = await oneEntry(() =>
      saveCarrier(owner, {
        name: 'Tidewater Parcels',
        trackingUrlTemplate: 'https://tidewater.example/track/{tracking}',
      }),
    );
    expect(added).toMatchObject({ action: 'settings.carrier_added', after: { name: 'Tidewater Parcels' } });
    const carrierId = added.after!.carrierId as string;
    const edited = await oneEntry(() =>
      saveCarrier(owner, {
        carrierId,
        name: 'Tidewater Parcels',
        trackingUrlTemplate: 'https://tidewater.example/t?n={tracking}',
      }),
    );
    expect(edited).toMatchObject({
      before: { trackingUrlTemplate: 'https://tidewater.example/track/{tracking}' },
      after: { trackingUrlTemplate: 'https://tidewater.example/t?n={tracking}' },
    });
    await refusedAndUnchanged(
      () =>
        saveCarrier(owner, {
          carrierId,
          name: 'Tidewater Parcels',
          trackingUrlTemplate: 'https://tidewater.example/track',
        }),
      {},
    );
    await refusedAndUnchanged(
      () =>
        saveCarrier(owner, { name: 'Harbour Post', trackingUrlTemplate: 'https://other.example/{tracking}' }),
      {
        code: 'carrier_name_taken',
      },
    );
    await oneEntry(() => deleteCarrier(owner, { carrierId }));
    expect(await rows(`SELECT id FROM carriers WHERE id = $1`, [carrierId])).toEqual([]);
  });
});

describe('customs', () => {
  it('saves the area, HS code, description and origin', async () => {
    const { updateCustoms } = await save();
    const { customsSchema } = await schemas();
    const was = await studioRow();
    const input = customsSchema.parse({
      area: 'IE, FR, DE',
      hsCode: '3926 90 00',
      description: 'Hand-painted resin masks, boxed',
      originCountry: 'IE',
    });
    const entry = await oneEntry(() => updateCustoms(owner, input));
    const now = await studioRow();
    expect(now.customs_area.map((c) => c.trim())).toEqual(['DE', 'FR', 'IE']);
    expect(now).toMatchObject({
      customs_hs_code: '39269000',
      customs_description: 'Hand-painted resin masks, boxed',
    });
    expect(entry.action).toBe('settings.customs_changed');
    expect(entry.before).toMatchObject({ hsCode: was.customs_hs_code });
    expect(entry.after).toMatchObject({ area: ['DE', 'FR', 'IE'], hsCode: '39269000' });
  });

  it('leaves everything as it was when the HS code is not one the table allows', async () => {
    const { updateCustoms } = await save();
    await refusedAndUnchanged(
      () =>
        updateCustoms(owner, { area: ['IE'], hsCode: '3926900', description: 'Masks', originCountry: 'IE' }),
      {},
    );
  });
});

describe('the settings page', () => {
  it('lets the owner edit every section and says why the currency is fixed', async () => {
    const { default: SettingsPage } = await import('@/app/workshop/settings/page');
    currentUser = owner;
    const html = renderToStaticMarkup(await SettingsPage());
    for (const button of [
      'Save studio details',
      'Save the calendar',
      'Save money settings',
      'Add zone',
      'Add box',
      'Add carrier',
      'Save customs details',
    ]) {
      expect(html, button).toContain(button);
    }
    expect(html).not.toMatch(/<fieldset[^>]* disabled/);
    expect(html).toContain('The currency can no longer change');
    expect(html).toContain('Europe/Dublin');
    expect(html).toContain('Harbour Post');
    // The HS code is the studio's to choose: the page says so and never offers one of its own.
    expect(html).toContain('customs authority');
  });

  it('shows staff everything read-only', async () => {
    const { default: SettingsPage } = await import('@/app/workshop/settings/page');
    const [kit] = await rows<{ id: string; email: string }>(
      `SELECT id, email FROM users WHERE role = 'staff' ORDER BY email LIMIT 1`,
    );
    currentUser = { id: kit!.id, email: kit!.email, name: 'Kit', role: 'staff' };
    const html = renderToStaticMarkup(await SettingsPage());
    expect(html).toContain('Only the maker (owner) can change settings');
    expect(html.match(/<fieldset[^>]* disabled/g)?.length).toBe(4);
    for (const button of [
      'Save studio details',
      'Add zone',
      'Add box',
      'Add carrier',
      'Delete zone',
      'Delete carrier',
    ]) {
      expect(html, button).not.toContain(button);
    }
    expect(html).toContain('Harbour Post');
  });
});

// Last: it empties the batches and orders of this file's scratch database.
describe('the currency before the first batch or order', () => {
  it('may change, and the designs move with it when the decimals agree', async () => {
    await rows(`TRUNCATE orders, batches CASCADE`);
    const { updateStudioDetails } = await save();
    const was = await studioRow();
    const details = {
      name: was.name,
      contactEmail: was.contact_email,
      mailPerMinute: was.mail_per_minute,
      postalAddress: was.postal_address,
      country: was.country,
      timeZone: was.time_zone,
    };
    // ISO 4217: EUR and GBP have two decimals, JPY none, so a stored 18500 would mean ¥18,500 instead of €185.00.
    await refusedAndUnchanged(() => updateStudioDetails(owner, { ...details, currency: 'JPY' }), {
      code: 'currency_decimals_differ',
      status: 409,
    });
    const entry = await oneEntry(() => updateStudioDetails(owner, { ...details, currency: 'GBP' }));
    expect(entry.before).toEqual({ currency: was.currency });
    expect(entry.after).toEqual({ currency: 'GBP' });
    expect((await studioRow()).currency).toBe('GBP');
    expect(await rows(`SELECT DISTINCT currency FROM designs`)).toEqual([{ currency: 'GBP' }]);
  });
});
