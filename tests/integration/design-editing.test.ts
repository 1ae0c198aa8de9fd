import currencyCodes from 'currency-codes';
import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import type { ActionResult, FormAction } from '@/lib/auth/action';
import type { Role } from '@/lib/auth/roles';
import type { CurrentUser } from '@/lib/auth/session';
import { withAppDatabase } from './support/app-database';
import { query } from './support/database';

// The workshop's design editing, against the seeded demo studio: the functions in lib/catalogue/editing.ts,
// and the server actions as Next.js calls them, with the session resolved to each kind of person.
let currentUser: CurrentUser | null = null;
vi.mock('@/lib/auth/session', () => ({ getCurrentUser: async () => currentUser }));
const cache = vi.hoisted(() => ({ tags: [] as string[] }));
vi.mock('next/cache', async (importOriginal) => ({
  ...(await importOriginal<typeof import('next/cache')>()),
  // Calls made only inside a running Next.js server; here they record what the shop would drop.
  revalidatePath: () => undefined,
  revalidateTag: (tag: string) => void cache.tags.push(tag),
  updateTag: (tag: string) => void cache.tags.push(tag),
}));

const database = withAppDatabase('design_editing', { seed: true });

let editing: typeof import('@/lib/catalogue/editing');
let actions: typeof import('@/app/workshop/designs/actions');
let shop: typeof import('@/lib/catalogue/designs');
const people = {} as Record<Role, CurrentUser>;

beforeAll(async () => {
  editing = await import('@/lib/catalogue/editing');
  actions = await import('@/app/workshop/designs/actions');
  shop = await import('@/lib/catalogue/designs');
  const { getDb } = await import('@/lib/db/connection');
  for (const role of ['customer', 'staff', 'owner'] as const) {
    const user = await getDb().models.User.create({ email: `${role}@editing.example`, name: role, emailVerified: null, role });
    people[role] = { id: user.id, email: user.email, name: user.name, role };
  }
});

beforeEach(() => {
  currentUser = people.owner;
  cache.tags.length = 0;
});

const rows = <T extends Record<string, unknown>>(text: string, params: unknown[] = []) => query<T>(database.current().url, text, params);

function form(fields: Record<string, string>): FormData {
  const data = new FormData();
  for (const [key, value] of Object.entries(fields)) data.set(key, value);
  return data;
}

const newDesign = (overrides: Record<string, string> = {}) =>
  form({
    currency: 'EUR',
    name: 'Stag',
    slug: '',
    summary: 'Branching antlers over a long, narrow face.',
    basePrice: '240.50',
    widthMm: '190',
    heightMm: '420',
    parcelLengthMm: '450',
    parcelWidthMm: '300',
    parcelHeightMm: '250',
    parcelWeightG: '1400',
    ...overrides,
  });

/** Runs an action that ends in a redirect (as creating a design does) and returns where it sends the maker. */
async function redirectOf(action: FormAction, data: FormData): Promise<string> {
  try {
    const result = await action(null, data);
    throw new Error(`expected a redirect, got ${JSON.stringify(result)}`);
  } catch (error) {
    const digest = (error as { digest?: string }).digest;
    if (!digest?.startsWith('NEXT_REDIRECT')) throw error;
    // Next.js encodes a redirect as "NEXT_REDIRECT;<type>;<url>;<status>;".
    return digest.split(';')[2]!;
  }
}

function refusal(result: ActionResult) {
  expect(result.ok).toBe(false);
  return result.ok ? { code: 'ok', message: '', fieldErrors: undefined } : result.error;
}

async function designCount(): Promise<number> {
  const [row] = await rows<{ n: number }>(`SELECT count(*)::int AS n FROM designs`);
  return row!.n;
}

async function designBySlug(slug: string) {
  const [row] = await rows<{ id: string; name: string; status: string; base_price_minor: number; currency: string; published_at: Date | null; slug: string }>(
    `SELECT id, name, status, base_price_minor, currency, published_at, slug FROM designs WHERE slug = $1`,
    [slug],
  );
  return row;
}

/** A draft design of its own for one test, made through the same function the action calls. */
async function draftDesign(name: string) {
  const parsed = editing.designFormSchema.parse(Object.fromEntries(newDesign({ name })));
  const created = await editing.createDesign(parsed);
  return { id: created.designId, slug: created.slug };
}

async function addPublishedFinish(designId: string, name = 'Old Bone') {
  const finish = await editing.addFinish(
    editing.finishFormSchema.parse({ designId, currency: 'EUR', name, priceDifference: '0', paintHours: '3' }),
  );
  await editing.setFinishStatus(people.owner, { finishId: finish.finishId, status: 'published' });
  return finish.finishId;
}

async function addPhoto(designId: string, finishId: string | null, position = 0): Promise<string> {
  const [row] = await rows<{ id: string }>(
    `INSERT INTO photos (design_id, finish_id, src, alt, width, height, position)
     VALUES ($1, $2, '/media/demo/test.webp', 'A test photo of the mask, from the front.', 800, 1000, $3) RETURNING id`,
    [designId, finishId, position],
  );
  return row!.id;
}

describe('creating a design', () => {
  it('stores the price in integer minor units of the studio’s currency, as a draft', async () => {
    const before = await designCount();
    const to = await redirectOf(actions.createDesignAction, newDesign());
    expect(to).toBe('/workshop/designs/stag?done=created');

    const stag = await designBySlug('stag');
    expect(stag).toMatchObject({ name: 'Stag', base_price_minor: 24050, currency: 'EUR', status: 'draft', published_at: null });
    expect(await designCount()).toBe(before + 1);
    // The shop is told, so a change shows there without waiting for the cache to run out.
    expect(cache.tags).toEqual(expect.arrayContaining(['catalogue', 'design:stag']));
  });

  it('writes the tags the shop’s cache is filed under', async () => {
    const { catalogueTag } = await import('@/lib/catalogue/cached');
    const design = await draftDesign('Heron');
    const finishId = await addPublishedFinish(design.id);
    cache.tags.length = 0;
    const result = await actions.setFinishStatusAction(null, form({ finishId, status: 'retired' }));
    expect(result.ok).toBe(true);
    expect(cache.tags).toEqual(expect.arrayContaining([catalogueTag, `design:${design.slug}`]));
  });

  it('uses the ISO 4217 minor unit of the currency when reading a price', () => {
    // Outside reference: the `currency-codes` package's ISO 4217 table (its `digits` is the minor unit).
    for (const code of ['EUR', 'JPY', 'BHD']) {
      const digits = currencyCodes.code(code)!.digits;
      const typed = digits === 0 ? '240' : `240.${'1'.repeat(digits)}`;
      expect(editing.parseMoney(typed, code)).toEqual({ ok: true, amountMinor: Number(typed.replace('.', '')) });
      expect(editing.parseMoney(`240.${'1'.repeat(digits + 1)}`, code).ok).toBe(false);
    }
  });

  it('refuses a slug another design has, by the slug field, and writes nothing', async () => {
    const before = await designCount();
    const error = refusal(await actions.createDesignAction(null, newDesign({ name: 'Second Ibex', slug: 'ibex' })));
    expect(error.code).toBe('slug_taken');
    expect(error.fieldErrors?.slug?.[0]).toMatch(/already uses the slug “ibex”/);
    expect(await designCount()).toBe(before);
    expect(await rows(`SELECT 1 FROM designs WHERE name = 'Second Ibex'`)).toHaveLength(0);
    expect(cache.tags).toEqual([]);
  });

  it('refuses one slug saved twice at the same moment once, by the unique key', async () => {
    const input = editing.designFormSchema.parse(Object.fromEntries(newDesign({ name: 'Wren', slug: 'wren' })));
    const outcomes = await Promise.allSettled([editing.createDesign(input), editing.createDesign(input)]);
    expect(outcomes.filter((o) => o.status === 'fulfilled')).toHaveLength(1);
    const refused = outcomes.find((o) => o.status === 'rejected') as PromiseRejectedResult;
    expect(refused.reason.code).toBe('slug_taken');
    expect(refused.reason.details.fields.slug).toHaveLength(1);
    expect(await rows(`SELECT 1 FROM designs WHERE slug = 'wren'`)).toHaveLength(1);
  });

  it.each([
    ['0', /more than zero/],
    ['-5', /more than zero/],
    // EUR has two decimals (ISO 4217): a fraction of a cent cannot be charged.
    ['12.345', /EUR has 2 decimals at most/],
    ['99999999999', /at most €1,000,000\.00/],
    ['1000000.01', /at most €1,000,000\.00/],
    ['', /Enter the base price/],
    ['twelve', /as a number/],
  ])('refuses a base price of “%s” by its field and writes nothing', async (price, message) => {
    const before = await designCount();
    const error = refusal(await actions.createDesignAction(null, newDesign({ name: `Priced ${price}`, basePrice: price })));
    expect(error.code).toBe('invalid_input');
    expect(error.fieldErrors?.basePrice?.[0]).toMatch(message);
    expect(Object.keys(error.fieldErrors ?? {})).toEqual(['basePrice']);
    expect(await designCount()).toBe(before);
  });

  it('takes the largest price it allows, 1,000,000.00', async () => {
    const design = editing.designFormSchema.parse(Object.fromEntries(newDesign({ basePrice: '1000000.00' })));
    expect(design.basePriceMinor).toBe(100_000_000);
  });

  it('shows every field problem at once, the price’s among them', async () => {
    const error = refusal(await actions.createDesignAction(null, newDesign({ name: '', basePrice: '12.345', widthMm: '18.5', parcelWeightG: '0' })));
    expect(Object.keys(error.fieldErrors ?? {}).sort()).toEqual(['basePrice', 'name', 'parcelWeightG', 'widthMm']);
  });

  it('refuses a form made for another currency instead of reading its price in the wrong one', async () => {
    const before = await designCount();
    const error = refusal(await actions.createDesignAction(null, newDesign({ name: 'Yen priced', currency: 'JPY', basePrice: '24000' })));
    expect(error.code).toBe('currency_changed');
    expect(error.fieldErrors?.basePrice).toHaveLength(1);
    expect(await designCount()).toBe(before);
  });
});

describe('editing a design', () => {
  it('saves its fields in one go, and a refused save changes none of them', async () => {
    const hare = (await designBySlug('hare'))!;
    const refused = refusal(
      await actions.updateDesignAction(null, newDesign({ designId: hare.id, name: 'Hare', slug: 'hare', summary: 'Changed', basePrice: '12.345' })),
    );
    expect(refused.code).toBe('invalid_input');
    const [unchanged] = await rows<{ summary: string; base_price_minor: number }>(`SELECT summary, base_price_minor FROM designs WHERE id = $1`, [hare.id]);
    expect(unchanged!.summary).not.toBe('Changed');
    expect(unchanged!.base_price_minor).toBe(hare.base_price_minor);

    const saved = await actions.updateDesignAction(null, newDesign({ designId: hare.id, name: 'Hare', slug: 'hare', summary: 'Changed', basePrice: '190' }));
    expect(saved).toEqual({ ok: true, message: 'Hare is saved.' });
    const [after] = await rows<{ summary: string; base_price_minor: number }>(`SELECT summary, base_price_minor FROM designs WHERE id = $1`, [hare.id]);
    expect(after).toEqual({ summary: 'Changed', base_price_minor: 19000 });
    // The shop's cached card and design page now show the new price.
    const [cheapest] = await rows<{ minor: number }>(
      `SELECT min(price_difference_minor)::int AS minor FROM finishes WHERE design_id = $1 AND status = 'published'`,
      [hare.id],
    );
    const card = (await shop.listDesignsForHome()).designs.find((d) => d.slug === 'hare');
    expect(card?.fromPrice.amountMinor).toBe(19000 + cheapest!.minor);
    expect(cache.tags).toEqual(expect.arrayContaining(['catalogue', 'design:hare']));
  });

  it('refuses another design’s slug, and moves the shop page when the slug is new', async () => {
    const design = await draftDesign('Otter');
    const taken = refusal(await actions.updateDesignAction(null, newDesign({ designId: design.id, name: 'Otter', slug: 'ibex' })));
    expect(taken.fieldErrors?.slug?.[0]).toMatch(/already uses/);
    expect((await rows<{ slug: string }>(`SELECT slug FROM designs WHERE id = $1`, [design.id]))[0]!.slug).toBe('otter');

    const to = await redirectOf(actions.updateDesignAction, newDesign({ designId: design.id, name: 'Otter', slug: 'river-otter' }));
    expect(to).toBe('/workshop/designs/river-otter?done=moved');
    // Both addresses are dropped from the shop's cache: the old one must stop showing the design.
    expect(cache.tags).toEqual(expect.arrayContaining(['design:otter', 'design:river-otter']));
  });
});

describe('publishing', () => {
  it('needs a published finish and a photo the shop can show, and says so', async () => {
    const design = await draftDesign('Lynx');
    const publish = () => actions.setDesignStatusAction(null, form({ designId: design.id, status: 'published' }));

    const bare = refusal(await publish());
    expect(bare.code).toBe('design_needs_finish');
    expect(bare.message).toMatch(/publish at least one of its finishes/);
    expect(bare.message).toMatch(/add at least one photo/);

    const finishId = await addPublishedFinish(design.id);
    const noPhoto = refusal(await publish());
    expect(noPhoto.code).toBe('design_needs_photo');
    expect(noPhoto.message).not.toMatch(/finishes/);

    // A photo of a draft finish is not shown by the shop, so it does not count.
    const draftFinish = await editing.addFinish(
      editing.finishFormSchema.parse({ designId: design.id, currency: 'EUR', name: 'Bog Oak', priceDifference: '15', paintHours: '3.5' }),
    );
    await addPhoto(design.id, draftFinish.finishId);
    expect(refusal(await publish()).code).toBe('design_needs_photo');
    expect((await designBySlug(design.slug))).toMatchObject({ status: 'draft', published_at: null });

    await addPhoto(design.id, finishId);
    const started = Date.now();
    expect(await publish()).toMatchObject({ ok: true });
    const published = (await designBySlug(design.slug))!;
    expect(published.status).toBe('published');
    expect(new Date(published.published_at!).getTime()).toBeGreaterThanOrEqual(started - 5_000);
  });

  it('keeps a draft out of the shop until it is published', async () => {
    const design = await draftDesign('Badger');
    const finishId = await addPublishedFinish(design.id);
    await editing.addFinish(
      editing.finishFormSchema.parse({ designId: design.id, currency: 'EUR', name: 'Verdigris', priceDifference: '35', paintHours: '5' }),
    );
    await addPhoto(design.id, finishId);

    expect((await shop.listDesignsForHome()).designs.map((d) => d.slug)).not.toContain(design.slug);
    expect(await shop.getPublishedDesignBySlug(design.slug)).toBeNull();

    await editing.setDesignStatus(people.owner, { designId: design.id, status: 'published' });
    const card = (await shop.listDesignsForHome()).designs.find((d) => d.slug === design.slug);
    // 240.50 in the cheapest published finish (Old Bone, +0); the draft Verdigris is not offered.
    expect(card?.fromPrice).toEqual({ amountMinor: 24050, currency: 'EUR' });
    expect(card?.finishNames).toEqual(['Old Bone']);
    expect((await shop.getPublishedDesignBySlug(design.slug))?.finishes.map((f) => f.name)).toEqual(['Old Bone']);

    await editing.setDesignStatus(people.owner, { designId: design.id, status: 'retired' });
    expect(await shop.getPublishedDesignBySlug(design.slug)).toBeNull();
  });

  it('moves only draft → published → retired → draft', async () => {
    const design = await draftDesign('Newt');
    const retireDraft = refusal(await actions.setDesignStatusAction(null, form({ designId: design.id, status: 'retired' })));
    expect(retireDraft.code).toBe('status_not_allowed');
    expect((await designBySlug(design.slug))!.status).toBe('draft');
  });

  it('does not take a design out of the shop while one of its batches is on sale', async () => {
    // The demo's Ibex has its Winter batch open for three more days.
    const ibex = (await designBySlug('ibex'))!;
    const error = refusal(await actions.setDesignStatusAction(null, form({ designId: ibex.id, status: 'retired' })));
    expect(error.code).toBe('design_has_open_batch');
    expect(error.message).toMatch(/Winter batch/);
    expect((await designBySlug('ibex'))!.status).toBe('published');
  });

  it('keeps a published design with a published finish and a photo', async () => {
    const design = await draftDesign('Crane');
    const finishId = await addPublishedFinish(design.id);
    const photoId = await addPhoto(design.id, finishId);
    await editing.setDesignStatus(people.owner, { designId: design.id, status: 'published' });

    const retireFinish = refusal(await actions.setFinishStatusAction(null, form({ finishId, status: 'retired' })));
    expect(retireFinish.code).toBe('design_needs_finish');
    expect(retireFinish.message).toMatch(/Crane is in the shop/);
    expect((await rows<{ status: string }>(`SELECT status FROM finishes WHERE id = $1`, [finishId]))[0]!.status).toBe('published');

    const deletePhoto = refusal(await actions.deletePhotoAction(null, form({ photoId })));
    expect(deletePhoto.code).toBe('design_needs_photo');
    expect(await rows(`SELECT 1 FROM photos WHERE id = $1`, [photoId])).toHaveLength(1);
  });
});

describe('finishes', () => {
  let serial = 0;
  it('are added as drafts with their price difference in minor units and exact paint hours', async () => {
    const design = await draftDesign('Fox');
    const result = await actions.addFinishAction(
      null,
      form({ designId: design.id, currency: 'EUR', name: 'Soot & Gilt', slug: '', priceDifference: '55.5', paintHours: '6.25' }),
    );
    expect(result.ok).toBe(true);
    const [finish] = await rows<{ slug: string; status: string; price_difference_minor: number; paint_hours: string }>(
      `SELECT slug, status, price_difference_minor, paint_hours::text FROM finishes WHERE design_id = $1`,
      [design.id],
    );
    expect(finish).toEqual({ slug: 'soot-and-gilt', status: 'draft', price_difference_minor: 5550, paint_hours: '6.25' });
  });

  it.each([
    ['priceDifference', '-1', /cannot be negative/],
    ['priceDifference', '0.001', /EUR has 2 decimals/],
    ['paintHours', '-2', /cannot be negative/],
    ['paintHours', '200.5', /at most 200/],
    ['paintHours', '', /Enter the paint hours/],
  ])('refuses %s “%s” and writes nothing', async (field, value, message) => {
    const design = await draftDesign(`Mole ${(serial += 1)}`);
    const fields = { designId: design.id, currency: 'EUR', name: 'Old Bone', priceDifference: '0', paintHours: '3', [field]: value };
    const error = refusal(await actions.addFinishAction(null, form(fields)));
    expect(error.fieldErrors?.[field]?.[0]).toMatch(message);
    expect(await rows(`SELECT 1 FROM finishes WHERE design_id = $1`, [design.id])).toHaveLength(0);
  });

  it('refuses a slug the design’s other finish has, by the slug field', async () => {
    const design = await draftDesign('Weasel');
    await addPublishedFinish(design.id, 'Old Bone');
    const error = refusal(
      await actions.addFinishAction(null, form({ designId: design.id, currency: 'EUR', name: 'Old Bone', priceDifference: '0', paintHours: '3' })),
    );
    expect(error.code).toBe('slug_taken');
    expect(error.fieldErrors?.slug).toHaveLength(1);
    expect(await rows(`SELECT 1 FROM finishes WHERE design_id = $1`, [design.id])).toHaveLength(1);
  });
});

describe('photos', () => {
  it('need a description of at most 300 characters', async () => {
    const design = await draftDesign('Pike');
    const photoId = await addPhoto(design.id, null);
    for (const alt of ['', '   ', 'x'.repeat(301)]) {
      const error = refusal(await actions.updatePhotoAltAction(null, form({ photoId, alt })));
      expect(error.fieldErrors?.alt).toHaveLength(1);
    }
    expect(await actions.updatePhotoAltAction(null, form({ photoId, alt: 'Pike mask, from the side.' }))).toMatchObject({ ok: true });
    expect((await rows<{ alt: string }>(`SELECT alt FROM photos WHERE id = $1`, [photoId]))[0]!.alt).toBe('Pike mask, from the side.');
  });

  it('move up and down among their own group only', async () => {
    const design = await draftDesign('Eel');
    const finishId = await addPublishedFinish(design.id);
    const own = await addPhoto(design.id, null, 0);
    const a = await addPhoto(design.id, finishId, 1);
    const b = await addPhoto(design.id, finishId, 2);
    const order = async () =>
      (await rows<{ id: string }>(`SELECT id FROM photos WHERE design_id = $1 ORDER BY position, created_at, id`, [design.id])).map((r) => r.id);

    expect(await actions.movePhotoAction(null, form({ photoId: b, direction: 'up' }))).toMatchObject({ ok: true, message: 'The photo moved up.' });
    expect(await order()).toEqual([own, b, a]);
    // The finish's first photo does not jump over the design's own.
    expect(await actions.movePhotoAction(null, form({ photoId: b, direction: 'up' }))).toMatchObject({ ok: true, message: 'The photo is already first.' });
    expect(await order()).toEqual([own, b, a]);
  });

  it('of one batch stay on that batch: not on the design page, not counted for publishing', async () => {
    const design = await draftDesign('Marten');
    const finishId = await addPublishedFinish(design.id);
    const [batch] = await rows<{ id: string }>(
      `INSERT INTO batches (design_id, name, status, per_buyer_limit, hold_minutes, opens_at, closes_at, ship_by)
       VALUES ($1, 'Spring batch', 'draft', 1, 10, now() + interval '2 days', now() + interval '3 days', current_date + 40)
       RETURNING id`,
      [design.id],
    );
    const batchPhoto = await addPhoto(design.id, finishId);
    await rows(`UPDATE photos SET batch_id = $2 WHERE id = $1`, [batchPhoto, batch!.id]);

    const view = (await editing.getDesignForEditing(design.slug))!;
    expect(JSON.stringify(view)).not.toContain(batchPhoto);
    const refused = refusal(await actions.setDesignStatusAction(null, form({ designId: design.id, status: 'published' })));
    expect(refused.code).toBe('design_needs_photo');

    // Moving a design photo reorders the design's own group; the batch's photo keeps its place.
    const first = await addPhoto(design.id, finishId, 1);
    const second = await addPhoto(design.id, finishId, 2);
    expect(await actions.movePhotoAction(null, form({ photoId: second, direction: 'up' }))).toMatchObject({ ok: true, message: 'The photo moved up.' });
    expect(await actions.movePhotoAction(null, form({ photoId: second, direction: 'up' }))).toMatchObject({ message: 'The photo is already first.' });
    const positions = await rows<{ id: string; position: number }>(`SELECT id, position FROM photos WHERE design_id = $1`, [design.id]);
    expect(positions.find((p) => p.id === batchPhoto)!.position).toBe(0);
    expect(positions.find((p) => p.id === second)!.position).toBeLessThan(positions.find((p) => p.id === first)!.position);
  });

  it('are deleted with their row when the design can spare them', async () => {
    const design = await draftDesign('Vole');
    const photoId = await addPhoto(design.id, null);
    expect(await actions.deletePhotoAction(null, form({ photoId }))).toMatchObject({ ok: true });
    expect(await rows(`SELECT 1 FROM photos WHERE id = $1`, [photoId])).toHaveLength(0);
  });
});

describe('who may change designs', () => {
  const editingActions = [
    'createDesignAction',
    'updateDesignAction',
    'setDesignStatusAction',
    'addFinishAction',
    'updateFinishAction',
    'setFinishStatusAction',
    'updatePhotoAltAction',
    'movePhotoAction',
    'deletePhotoAction',
  ] as const;

  it.each(editingActions)('%s is for owners, and an empty form is refused for what it lacks', async (name) => {
    const action = actions[name];
    expect(action.requiredRole).toBe('owner');
    currentUser = people.owner;
    expect(refusal(await action(null, new FormData())).code).toBe('invalid_input');
  });

  it('refuses studio hands, buyers and strangers a well-formed change, and writes nothing', async () => {
    const ibex = (await designBySlug('ibex'))!;
    const before = await designCount();
    const cases: [CurrentUser | null, string][] = [
      [people.staff, 'forbidden'],
      [people.customer, 'forbidden'],
      [null, 'unauthorized'],
    ];
    for (const [user, code] of cases) {
      currentUser = user;
      expect(refusal(await actions.createDesignAction(null, newDesign({ name: 'Intruder' }))).code).toBe(code);
      expect(refusal(await actions.updateDesignAction(null, newDesign({ designId: ibex.id, name: 'Renamed', slug: 'ibex' }))).code).toBe(code);
      expect(refusal(await actions.setDesignStatusAction(null, form({ designId: ibex.id, status: 'retired' }))).code).toBe(code);
    }
    expect(await designCount()).toBe(before);
    expect(await designBySlug('ibex')).toMatchObject({ name: 'Ibex', status: 'published', base_price_minor: ibex.base_price_minor });
    expect(cache.tags).toEqual([]);
  });
});
