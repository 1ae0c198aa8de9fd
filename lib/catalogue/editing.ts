import 'server-only';
import type { Transaction } from 'sequelize';
import { z } from 'zod';
import { AppError } from '@/lib/api/errors';
import { writeAudit, type AuditActor } from '@/lib/audit/log';
import { slugify } from '@/lib/catalogue/slug';
import { inTransaction, sql } from '@/lib/db/sql';
import { formatMoney, minorUnitDigits } from '@/lib/money';
import type { DesignStatus } from '@/models';

// The workshop's editing of designs, finishes and their photos. Forms arrive through Object.fromEntries,
// so every field is a string (or missing); the schemas below turn them into typed input with one message
// per field, and the functions change the database, each change in one transaction.

// ---------------------------------------------------------------------------------------------------
// Parsing what a person types

/** The largest price (and price difference) the workshop takes, in the currency's major units. */
export const maxPriceMajor = 1_000_000;
/** Paint hours are NUMERIC(5, 2) in the database; no single mask takes more than this. */
export const maxPaintHours = 200;

const slugPattern = /^[a-z0-9]+(-[a-z0-9]+)*$/;

const example = (digits: number) => (digits === 0 ? '240' : `240.${'5'.padEnd(digits, '0')}`);

export type ParsedMoney = { ok: true; amountMinor: number } | { ok: false; message: string };

/**
 * A price typed as a decimal in the studio's currency ("240", "240.50"; a decimal comma is read too) to
 * integer minor units, with the currency's digits from ISO 4217 (through Intl, see lib/money.ts). More
 * decimals than the currency has, a negative, and more than 1,000,000 are refused; so is 0 unless allowed.
 */
export function parseMoney(
  text: string,
  currency: string,
  { allowZero = false, what = 'The price' }: { allowZero?: boolean; what?: string } = {},
): ParsedMoney {
  const value = text.trim();
  const digits = minorUnitDigits(currency);
  if (value === '') return { ok: false, message: `Enter ${what.toLowerCase()} in ${currency}, such as ${example(digits)}.` };
  const match = /^([+-]?)(\d+)(?:[.,](\d*))?$/.exec(value);
  if (!match) {
    return {
      ok: false,
      message: `Enter ${what.toLowerCase()} as a number without thousands separators, such as ${example(digits)}.`,
    };
  }
  const [, sign, whole = '', fraction = ''] = match;
  if (value.includes(',') && fraction.length === 3) {
    // "1,000" is a thousand to most people here, not one with three decimals: ask rather than guess.
    return { ok: false, message: `Enter ${what.toLowerCase()} without thousands separators, such as 1000 or ${example(digits)}.` };
  }
  if (fraction.length > digits) {
    return {
      ok: false,
      message:
        digits === 0
          ? `${currency} has no decimals: enter a whole amount, such as ${example(digits)}.`
          : `${currency} has ${digits} decimal${digits === 1 ? '' : 's'} at most, such as ${example(digits)}.`,
    };
  }
  const max = maxPriceMajor * 10 ** digits;
  const wholeDigits = whole.replace(/^0+(?=\d)/, '');
  // Past 7 whole digits it is beyond the maximum whatever the decimals; shorter ones are exact in a double.
  const amountMinor =
    wholeDigits.length > 7 ? Number.POSITIVE_INFINITY : Number(wholeDigits) * 10 ** digits + Number(fraction.padEnd(digits, '0') || '0');
  if (sign === '-' && amountMinor > 0) {
    return {
      ok: false,
      message: allowZero ? `${what} cannot be negative: enter 0 or more.` : `${what} must be more than zero.`,
    };
  }
  if (amountMinor > max) {
    return { ok: false, message: `${what} can be at most ${formatMoney({ amountMinor: max, currency })}.` };
  }
  if (amountMinor === 0 && !allowZero) return { ok: false, message: `${what} must be more than zero.` };
  return { ok: true, amountMinor };
}

/** Minor units back to the decimal a form shows: 24000 EUR → "240.00". */
export function minorToDecimal(amountMinor: number, currency: string): string {
  const digits = minorUnitDigits(currency);
  if (digits === 0) return String(amountMinor);
  const scale = 10 ** digits;
  const whole = Math.trunc(amountMinor / scale);
  const fraction = String(Math.abs(amountMinor % scale)).padStart(digits, '0');
  return `${whole}.${fraction}`;
}

/** Paint hours as typed ("3", "3.5", "3,25") to the NUMERIC text the database keeps ("3.50"). */
export function parsePaintHours(text: string): { ok: true; hours: string } | { ok: false; message: string } {
  const value = text.trim();
  if (value === '') return { ok: false, message: 'Enter the paint hours for one mask, such as 3.5 (0 if it needs none).' };
  if (/^-\s*\d/.test(value)) return { ok: false, message: 'Paint hours cannot be negative: enter 0 or more.' };
  const match = /^(\d+)(?:[.,](\d*))?$/.exec(value);
  if (!match) return { ok: false, message: 'Enter the paint hours as a number, such as 3.5.' };
  const [, whole = '', fraction = ''] = match;
  if (fraction.length > 2) return { ok: false, message: 'Enter the paint hours with two decimals at most, such as 3.25.' };
  const hundredths = whole.length > 4 ? Number.POSITIVE_INFINITY : Number(whole) * 100 + Number(fraction.padEnd(2, '0') || '0');
  if (hundredths > maxPaintHours * 100) return { ok: false, message: `Paint hours can be at most ${maxPaintHours} for one mask.` };
  return { ok: true, hours: `${Math.floor(hundredths / 100)}.${String(hundredths % 100).padStart(2, '0')}` };
}

// ---------------------------------------------------------------------------------------------------
// Schemas

const text = (max: number, label: string) =>
  z
    .string({ error: `${label} must be text.` })
    .trim()
    .max(max, `Keep ${label.toLowerCase()} under ${max.toLocaleString('en-IE')} characters.`)
    .default('');

const requiredName = (what: string, example: string) =>
  z
    .string({ error: `Give the ${what} a name, such as “${example}”.` })
    .trim()
    .min(1, `Give the ${what} a name, such as “${example}”.`)
    .max(80, 'Keep the name under 80 characters.');

// Empty means "make it from the name"; the object-level check below makes sure that gives a slug.
const slugField = z
  .string({ error: 'The slug must be text.' })
  .trim()
  .toLowerCase()
  .max(80, 'Keep the slug under 80 characters.')
  .refine((value) => value === '' || slugPattern.test(value), 'Use lower-case letters, digits and single hyphens, such as old-bone.')
  .default('');

/** An optional whole number in a unit, within bounds; an empty field is "not measured" (null). */
const measure = (label: string, unit: 'mm' | 'g', min: number, max: number) =>
  z
    .string({ error: `${label} must be a number.` })
    .trim()
    .default('')
    .transform((value, ctx) => {
      if (value === '') return null;
      if (!/^\d+$/.test(value)) {
        ctx.addIssue({
          code: 'custom',
          message: /^-/.test(value)
            ? `${label} cannot be negative.`
            : `Enter ${label.toLowerCase()} in whole ${unit === 'mm' ? 'millimetres' : 'grams'}, such as ${Math.max(min, 120)}.`,
        });
        return z.NEVER;
      }
      const n = Number(value);
      if (n < min || n > max) {
        ctx.addIssue({ code: 'custom', message: `${label} must be between ${min} and ${max.toLocaleString('en-IE')} ${unit}.` });
        return z.NEVER;
      }
      return n;
    });

const currencyField = z
  .string({ error: 'The form lost its currency. Reload the page and try again.' })
  .regex(/^[A-Z]{3}$/, 'The form lost its currency. Reload the page and try again.');

const moneyText = (label: string) => z.string({ error: `Enter ${label}.` });

// Bounds for the mask itself are our own sanity limits (a worn mask, not a statue); the parcel's are the
// database's own (migrations/20261203090000-add-checkout-settings.cjs).
const designShape = {
  currency: currencyField,
  name: requiredName('design', 'Ibex'),
  slug: slugField,
  summary: text(300, 'The summary'),
  story: text(5000, 'The story'),
  basePrice: moneyText('the base price'),
  widthMm: measure('Width', 'mm', 1, 1000),
  heightMm: measure('Height', 'mm', 1, 1000),
  depthMm: measure('Depth', 'mm', 1, 1000),
  weightG: measure('Weight', 'g', 1, 10_000),
  eyeOpeningWidthMm: measure('Eye opening width', 'mm', 1, 200),
  eyeSpacingMm: measure('Eye spacing', 'mm', 1, 300),
  parcelLengthMm: measure('Parcel length', 'mm', 10, 3000),
  parcelWidthMm: measure('Parcel width', 'mm', 10, 3000),
  parcelHeightMm: measure('Parcel height', 'mm', 10, 3000),
  parcelWeightG: measure('Packed weight', 'g', 1, 70_000),
  materials: text(2000, 'The materials'),
  care: text(2000, 'The care notes'),
};

type Raw = Record<string, unknown>;
const rawText = (raw: Raw, key: string) => (typeof raw[key] === 'string' ? (raw[key] as string) : '');

/**
 * Checks that need two fields (a price needs its currency, an empty slug needs the name). They run even
 * when other fields failed (`when`), so the person sees every problem at once.
 */
function crossFieldChecks(priceField: string, money: { allowZero: boolean; what: string }) {
  return [
    (raw: Raw, ctx: z.RefinementCtx) => {
      const currency = rawText(raw, 'currency');
      if (!/^[A-Z]{3}$/.test(currency) || typeof raw[priceField] !== 'string') return;
      const parsed = parseMoney(rawText(raw, priceField), currency, money);
      if (!parsed.ok) ctx.addIssue({ code: 'custom', path: [priceField], message: parsed.message });
      const slug = rawText(raw, 'slug').trim();
      const name = rawText(raw, 'name').trim();
      if (slug === '' && name !== '' && slugify(name) === '') {
        ctx.addIssue({ code: 'custom', path: ['slug'], message: 'The name has no letters or digits to make a slug from: enter one, such as ibex.' });
      }
    },
    { when: () => true },
  ] as const;
}

function toMinor(textValue: string, currency: string, allowZero: boolean): number {
  const parsed = parseMoney(textValue, currency, { allowZero });
  if (!parsed.ok) throw new Error('checked by the schema');
  return parsed.amountMinor;
}

const designObject = z.object(designShape);
const designOutput = ({ basePrice, ...form }: z.output<typeof designObject>) => ({
  ...form,
  slug: form.slug || slugify(form.name),
  basePriceMinor: toMinor(basePrice, form.currency, false),
});

/** The new-design form. */
export const designFormSchema = designObject
  .superRefine(...crossFieldChecks('basePrice', { allowZero: false, what: 'The base price' }))
  .transform(designOutput);
export type DesignInput = z.output<typeof designFormSchema>;

const designIdField = z.uuid({ error: 'That design could not be found. Go back to the designs list.' });
const finishIdField = z.uuid({ error: 'That finish could not be found. Reload the page.' });
const photoIdField = z.uuid({ error: 'That photo could not be found. Reload the page.' });

/** The edit-design form: the same fields, for one design. */
export const designUpdateSchema = designObject
  .extend({ designId: designIdField })
  .superRefine(...crossFieldChecks('basePrice', { allowZero: false, what: 'The base price' }))
  .transform(({ designId, ...form }) => ({ designId, ...designOutput(form) }));
export type DesignUpdateInput = z.output<typeof designUpdateSchema>;

const finishObject = z.object({
  currency: currencyField,
  name: requiredName('finish', 'Old Bone'),
  slug: slugField,
  description: text(1000, 'The description'),
  priceDifference: moneyText('the price difference (0 if the finish costs the same)'),
  paintHours: z
    .string({ error: 'Enter the paint hours for one mask.' })
    .transform((value, ctx) => {
      const parsed = parsePaintHours(value);
      if (!parsed.ok) {
        ctx.addIssue({ code: 'custom', message: parsed.message });
        return z.NEVER;
      }
      return parsed.hours;
    }),
});
const finishOutput = ({ priceDifference, ...form }: z.output<typeof finishObject>) => ({
  ...form,
  slug: form.slug || slugify(form.name),
  priceDifferenceMinor: toMinor(priceDifference, form.currency, true),
});
const finishMoney = { allowZero: true, what: 'The price difference' };

/** The add-a-finish form of a design. */
export const finishFormSchema = finishObject
  .extend({ designId: designIdField })
  .superRefine(...crossFieldChecks('priceDifference', finishMoney))
  .transform(({ designId, ...form }) => ({ designId, ...finishOutput(form) }));
export type FinishInput = z.output<typeof finishFormSchema>;

/** The edit form of one finish. */
export const finishUpdateSchema = finishObject
  .extend({ finishId: finishIdField })
  .superRefine(...crossFieldChecks('priceDifference', finishMoney))
  .transform(({ finishId, ...form }) => ({ finishId, ...finishOutput(form) }));
export type FinishUpdateInput = z.output<typeof finishUpdateSchema>;

const statusField = z.enum(['draft', 'published', 'retired'], { error: 'Choose draft, published or retired.' });

export const designStatusSchema = z.object({ designId: designIdField, status: statusField });
export const finishStatusSchema = z.object({ finishId: finishIdField, status: statusField });

export const photoAltSchema = z.object({
  photoId: photoIdField,
  alt: z
    .string({ error: 'Describe the photo for people who cannot see it.' })
    .trim()
    .min(1, 'Describe the photo for people who cannot see it, such as “Ibex mask in Old Bone, from the front”.')
    .max(300, 'Keep the description under 300 characters.'),
});
export const photoMoveSchema = z.object({
  photoId: photoIdField,
  direction: z.enum(['up', 'down'], { error: 'Choose to move the photo up or down.' }),
});
export const photoIdSchema = z.object({ photoId: photoIdField });

// ---------------------------------------------------------------------------------------------------
// What the workshop reads

export type PhotoEditView = { id: string; src: string; alt: string; width: number; height: number };

export type FinishEditView = {
  id: string;
  slug: string;
  name: string;
  description: string;
  priceDifferenceMinor: number;
  /** For the form: "15.00". */
  priceDifference: string;
  paintHours: string;
  status: DesignStatus;
  photos: PhotoEditView[];
};

export type DesignEditView = {
  id: string;
  slug: string;
  name: string;
  summary: string;
  story: string;
  basePriceMinor: number;
  /** For the form: "240.00". */
  basePrice: string;
  currency: string;
  status: DesignStatus;
  publishedAt: string | null;
  measures: Record<MeasureField, number | null>;
  materials: string;
  care: string;
  finishes: FinishEditView[];
  /** Photos of the design as a whole, not of one finish. */
  photos: PhotoEditView[];
  /** What stands between the design and the shop; empty when it may be published. */
  publishProblems: PublishProblem[];
};

export const measureFields = [
  'widthMm',
  'heightMm',
  'depthMm',
  'weightG',
  'eyeOpeningWidthMm',
  'eyeSpacingMm',
  'parcelLengthMm',
  'parcelWidthMm',
  'parcelHeightMm',
  'parcelWeightG',
] as const;
export type MeasureField = (typeof measureFields)[number];

const measureColumns: Record<MeasureField, string> = {
  widthMm: 'width_mm',
  heightMm: 'height_mm',
  depthMm: 'depth_mm',
  weightG: 'weight_g',
  eyeOpeningWidthMm: 'eye_opening_width_mm',
  eyeSpacingMm: 'eye_spacing_mm',
  parcelLengthMm: 'parcel_length_mm',
  parcelWidthMm: 'parcel_width_mm',
  parcelHeightMm: 'parcel_height_mm',
  parcelWeightG: 'parcel_weight_g',
};

export type PublishProblem = 'no_published_finish' | 'no_photo';

export const publishProblemWords: Record<PublishProblem, string> = {
  no_published_finish: 'publish at least one of its finishes',
  no_photo: 'add at least one photo of the design or of a published finish',
};

type DesignRow = {
  id: string;
  studio_id: string;
  slug: string;
  name: string;
  summary: string;
  story: string;
  base_price_minor: number;
  currency: string;
  status: DesignStatus;
  published_at: Date | null;
  materials: string;
  care: string;
} & Record<(typeof measureColumns)[MeasureField], number | null>;

type StudioRow = { id: string; currency: string };

/** The shop's studio: the app serves one, the first made. */
async function shopStudio(transaction?: Transaction): Promise<StudioRow> {
  const [studio] = await sql<StudioRow>(`SELECT id, currency FROM studios ORDER BY created_at LIMIT 1`, [], transaction);
  if (!studio) throw new AppError('no_studio', 'The shop has no studio yet. Run the setup first.', 409);
  return studio;
}

/** The studio new designs belong to, with the currency their prices are entered in; null before setup. */
export async function getEditingStudio(): Promise<{ currency: string } | null> {
  const [studio] = await sql<StudioRow>(`SELECT id, currency FROM studios ORDER BY created_at LIMIT 1`);
  return studio ? { currency: studio.currency } : null;
}

/** One design of the shop's studio with its finishes and photos, drafts and retired ones included. */
export async function getDesignForEditing(slug: string): Promise<DesignEditView | null> {
  if (!slugPattern.test(slug)) return null;
  const studio = await shopStudio();
  const [design] = await sql<DesignRow>(`SELECT * FROM designs WHERE studio_id = $1 AND slug = $2`, [studio.id, slug]);
  if (!design) return null;
  const [finishes, photos, problems] = await Promise.all([
    sql<{ id: string; slug: string; name: string; description: string; price_difference_minor: number; paint_hours: string; status: DesignStatus }>(
      `SELECT id, slug, name, description, price_difference_minor, paint_hours::text AS paint_hours, status
         FROM finishes WHERE design_id = $1 ORDER BY position, created_at, id`,
      [design.id],
    ),
    sql<PhotoEditView & { finish_id: string | null }>(
      `SELECT id, finish_id, src, alt, width, height FROM photos WHERE design_id = $1 AND batch_id IS NULL ORDER BY position, created_at, id`,
      [design.id],
    ),
    findPublishProblems(design.id),
  ]);
  const photoView = ({ id, src, alt, width, height }: PhotoEditView): PhotoEditView => ({ id, src, alt, width, height });
  return {
    id: design.id,
    slug: design.slug,
    name: design.name,
    summary: design.summary,
    story: design.story,
    basePriceMinor: design.base_price_minor,
    basePrice: minorToDecimal(design.base_price_minor, design.currency),
    currency: design.currency,
    status: design.status,
    publishedAt: design.published_at ? new Date(design.published_at).toISOString() : null,
    measures: Object.fromEntries(measureFields.map((field) => [field, design[measureColumns[field]]])) as Record<MeasureField, number | null>,
    materials: design.materials,
    care: design.care,
    finishes: finishes.map((finish) => ({
      id: finish.id,
      slug: finish.slug,
      name: finish.name,
      description: finish.description,
      priceDifferenceMinor: finish.price_difference_minor,
      priceDifference: minorToDecimal(finish.price_difference_minor, design.currency),
      paintHours: finish.paint_hours,
      status: finish.status,
      photos: photos.filter((photo) => photo.finish_id === finish.id).map(photoView),
    })),
    photos: photos.filter((photo) => photo.finish_id === null).map(photoView),
    publishProblems: problems,
  };
}

/**
 * What a design lacks to be in the shop: a published finish (the shop lists a design only with one) and a
 * photo the shop can show (of the design as a whole, or of a published finish).
 */
async function findPublishProblems(designId: string, transaction?: Transaction): Promise<PublishProblem[]> {
  const [counts] = await sql<{ finishes: number; photos: number }>(
    `SELECT (SELECT count(*) FROM finishes WHERE design_id = $1 AND status = 'published')::int AS finishes,
            (SELECT count(*) FROM photos p LEFT JOIN finishes f ON f.id = p.finish_id
              WHERE p.design_id = $1 AND p.batch_id IS NULL AND (p.finish_id IS NULL OR f.status = 'published'))::int AS photos`,
    [designId],
    transaction,
  );
  const problems: PublishProblem[] = [];
  if (!counts || counts.finishes === 0) problems.push('no_published_finish');
  if (!counts || counts.photos === 0) problems.push('no_photo');
  return problems;
}

// ---------------------------------------------------------------------------------------------------
// Changes

/** What changed, for the caller to refresh: every slug the shop may have cached a page under. */
export type CatalogueChange = { designId: string; designName: string; slugs: string[] };

const designNotFound = () => new AppError('design_not_found', 'That design no longer exists. Go back to the designs list.', 404);
const finishNotFound = () => new AppError('finish_not_found', 'That finish no longer exists. Reload the page.', 404);
const photoNotFound = () => new AppError('photo_not_found', 'That photo no longer exists. Reload the page.', 404);

const fieldError = (code: string, field: string, message: string, status = 422) =>
  new AppError(code, message, status, { fields: { [field]: [message] } });

const designSlugTaken = (slug: string) =>
  fieldError('slug_taken', 'slug', `Another design already uses the slug “${slug}”. Choose a different one.`, 409);
const finishSlugTaken = (slug: string) =>
  fieldError('slug_taken', 'slug', `Another finish of this design already uses the slug “${slug}”. Choose a different one.`, 409);

const currencyChanged = (field: string) =>
  fieldError('currency_changed', field, 'The design’s currency is not the one this form was made for. Reload the page and enter the price again.', 409);

function isUniqueViolation(error: unknown, constraint: string): boolean {
  const original = (error as { original?: { code?: string; constraint?: string } }).original;
  return original?.code === '23505' && original.constraint === constraint;
}

/** The design row, locked for this transaction, so every check and change on it is made in turn. */
async function lockDesign(designId: string, transaction: Transaction): Promise<DesignRow> {
  const studio = await shopStudio(transaction);
  const [design] = await sql<DesignRow>(`SELECT * FROM designs WHERE id = $1 AND studio_id = $2 FOR UPDATE`, [designId, studio.id], transaction);
  if (!design) throw designNotFound();
  return design;
}

/** The design a finish belongs to (locked), with the finish. */
async function lockFinish(finishId: string, transaction: Transaction) {
  const [owner] = await sql<{ design_id: string }>(`SELECT design_id FROM finishes WHERE id = $1`, [finishId], transaction);
  if (!owner) throw finishNotFound();
  const design = await lockDesign(owner.design_id, transaction);
  const [finish] = await sql<{ id: string; slug: string; name: string; status: DesignStatus; price_difference_minor: number }>(
    `SELECT id, slug, name, status, price_difference_minor FROM finishes WHERE id = $1 AND design_id = $2 FOR UPDATE`,
    [finishId, design.id],
    transaction,
  );
  if (!finish) throw finishNotFound();
  return { design, finish };
}

/** The design a photo belongs to (locked), with the photo. */
async function lockPhoto(photoId: string, transaction: Transaction) {
  const [owner] = await sql<{ design_id: string }>(`SELECT design_id FROM photos WHERE id = $1`, [photoId], transaction);
  if (!owner) throw photoNotFound();
  const design = await lockDesign(owner.design_id, transaction);
  const [photo] = await sql<{ id: string; finish_id: string | null; batch_id: string | null; position: number }>(
    `SELECT id, finish_id, batch_id, position FROM photos WHERE id = $1 AND design_id = $2 FOR UPDATE`,
    [photoId, design.id],
    transaction,
  );
  if (!photo) throw photoNotFound();
  return { design, photo };
}

/**
 * A design in the shop must stay showable: checked after a change inside its transaction, so a change that
 * would leave it without a published finish or a photo is refused and undone.
 */
async function keepShowable(design: DesignRow, change: string, transaction: Transaction): Promise<void> {
  if (design.status !== 'published') return;
  const problems = await findPublishProblems(design.id, transaction);
  if (problems.includes('no_published_finish')) {
    throw new AppError(
      'design_needs_finish',
      `${design.name} is in the shop, and ${change} would leave it with no published finish. Publish another finish first, or retire ${design.name}.`,
      409,
    );
  }
  if (problems.includes('no_photo')) {
    throw new AppError(
      'design_needs_photo',
      `${design.name} is in the shop, and ${change} would leave it with no photo the shop can show. Add another photo first, or retire ${design.name}.`,
      409,
    );
  }
}

const designValues = (input: DesignInput) => [
  input.slug,
  input.name,
  input.summary,
  input.story,
  input.basePriceMinor,
  ...measureFields.map((field) => input[field]),
  input.materials,
  input.care,
];
const designColumns = ['slug', 'name', 'summary', 'story', 'base_price_minor', ...measureFields.map((f) => measureColumns[f]), 'materials', 'care'];

/** A new design, as a draft at the end of the studio's list, priced in the studio's currency. */
export async function createDesign(input: DesignInput): Promise<CatalogueChange & { slug: string }> {
  return inTransaction(async (transaction) => {
    const studio = await shopStudio(transaction);
    if (input.currency !== studio.currency) throw currencyChanged('basePrice');
    const [taken] = await sql(`SELECT 1 FROM designs WHERE studio_id = $1 AND slug = $2`, [studio.id, input.slug], transaction);
    if (taken) throw designSlugTaken(input.slug);
    const values = designValues(input);
    const placeholders = values.map((_, index) => `$${index + 3}`);
    try {
      const [row] = await sql<{ id: string }>(
        `INSERT INTO designs (studio_id, currency, ${designColumns.join(', ')}, status, position)
         VALUES ($1, $2, ${placeholders.join(', ')}, 'draft',
                 (SELECT coalesce(max(position), 0) + 1 FROM designs WHERE studio_id = $1))
         RETURNING id`,
        [studio.id, studio.currency, ...values],
        transaction,
      );
      return { designId: row!.id, designName: input.name, slug: input.slug, slugs: [input.slug] };
    } catch (error) {
      // Two makers saving the same slug at once: the unique key decides, and says so by the field.
      if (isUniqueViolation(error, 'designs_studio_slug_unique')) throw designSlugTaken(input.slug);
      throw error;
    }
  });
}

/** Who changes the catalogue: the signed-in owner. Price and status changes go to the audit log. */
type Actor = Exclude<AuditActor, 'system'>;

const money = (amountMinor: number, currency: string) => formatMoney({ amountMinor, currency });
const signedMoney = (amountMinor: number, currency: string) => `${amountMinor < 0 ? '−' : '+'}${money(Math.abs(amountMinor), currency)}`;

/** Saves the design's fields. A new slug moves its shop page, so both slugs are returned for refreshing. */
export async function updateDesign(actor: Actor, input: DesignUpdateInput): Promise<CatalogueChange & { slug: string; previousSlug: string }> {
  return inTransaction(async (transaction) => {
    const design = await lockDesign(input.designId, transaction);
    if (input.currency !== design.currency) throw currencyChanged('basePrice');
    const [taken] = await sql(
      `SELECT 1 FROM designs WHERE studio_id = $1 AND slug = $2 AND id <> $3`,
      [design.studio_id, input.slug, design.id],
      transaction,
    );
    if (taken) throw designSlugTaken(input.slug);
    const values = designValues(input);
    try {
      await sql(
        `UPDATE designs SET ${designColumns.map((column, index) => `${column} = $${index + 2}`).join(', ')}, updated_at = now()
          WHERE id = $1 RETURNING id`,
        [design.id, ...values],
        transaction,
      );
    } catch (error) {
      if (isUniqueViolation(error, 'designs_studio_slug_unique')) throw designSlugTaken(input.slug);
      throw error;
    }
    if (input.basePriceMinor !== design.base_price_minor) {
      await writeAudit(
        {
          actor,
          action: 'design.price_changed',
          subject: { type: 'design', id: design.id },
          summary: `Changed the price of ${input.name} from ${money(design.base_price_minor, design.currency)} to ${money(input.basePriceMinor, design.currency)}`,
          before: { currency: design.currency, basePriceMinor: design.base_price_minor },
          after: { currency: design.currency, basePriceMinor: input.basePriceMinor },
        },
        transaction,
      );
    }
    return { designId: design.id, designName: input.name, slug: input.slug, previousSlug: design.slug, slugs: [design.slug, input.slug] };
  });
}

export const statusWords: Record<DesignStatus, string> = {
  draft: 'a draft',
  published: 'published',
  retired: 'retired',
};

const statusSummary = (status: DesignStatus, name: string) =>
  status === 'draft' ? `Put ${name} back to draft` : `${status === 'published' ? 'Published' : 'Retired'} ${name}`;

/** Draft → published → retired → draft: the only ways a design or finish moves. */
const nextStatuses: Record<DesignStatus, DesignStatus[]> = {
  draft: ['published'],
  published: ['retired'],
  retired: ['draft'],
};

export function allowedStatuses(from: DesignStatus): DesignStatus[] {
  return nextStatuses[from];
}

function refuseMove(name: string, from: DesignStatus, to: DesignStatus): AppError {
  if (from === to) return new AppError('status_unchanged', `${name} is already ${statusWords[to]}.`, 409);
  const how: Record<DesignStatus, string> = {
    draft: `${name} is a draft: publish it first; only what is published can be retired.`,
    published: `${name} is published: retire it first; from retired it can go back to draft.`,
    retired: `${name} is retired: put it back to draft first, and publish it from there.`,
  };
  return new AppError('status_not_allowed', how[from], 409);
}

/**
 * Moves a design along draft → published → retired → draft. Publishing needs a published finish and a
 * photo the shop can show, and stamps `published_at`.
 */
export async function setDesignStatus(actor: Actor, input: z.output<typeof designStatusSchema>): Promise<CatalogueChange & { status: DesignStatus }> {
  return inTransaction(async (transaction) => {
    const design = await lockDesign(input.designId, transaction);
    if (!nextStatuses[design.status].includes(input.status)) throw refuseMove(design.name, design.status, input.status);
    if (input.status === 'published') {
      const problems = await findPublishProblems(design.id, transaction);
      if (problems.length > 0) {
        throw new AppError(
          problems.includes('no_published_finish') ? 'design_needs_finish' : 'design_needs_photo',
          `${design.name} cannot be published yet: ${problems.map((p) => publishProblemWords[p]).join(', and ')} first.`,
          409,
          { problems },
        );
      }
    }
    if (design.status === 'published') {
      // A design out of the shop takes its drop pages with it: not while a batch is on sale or coming.
      const [batch] = await sql<{ name: string }>(
        `SELECT name FROM batches WHERE design_id = $1 AND status = 'scheduled' AND closes_at > now() ORDER BY opens_at LIMIT 1`,
        [design.id],
        transaction,
      );
      if (batch) {
        throw new AppError(
          'design_has_open_batch',
          `${design.name} has a batch that is coming up or on sale (“${batch.name}”). Let it close, or cancel it, before taking ${design.name} out of the shop.`,
          409,
        );
      }
    }
    await sql(
      `UPDATE designs SET status = $2, published_at = CASE WHEN $2 = 'published' THEN now() ELSE published_at END, updated_at = now()
        WHERE id = $1 RETURNING id`,
      [design.id, input.status],
      transaction,
    );
    await writeAudit(
      {
        actor,
        action: 'design.status_changed',
        subject: { type: 'design', id: design.id },
        summary: statusSummary(input.status, design.name),
        before: { status: design.status },
        after: { status: input.status },
      },
      transaction,
    );
    return { designId: design.id, designName: design.name, slugs: [design.slug], status: input.status };
  });
}

const finishColumns = ['slug', 'name', 'description', 'price_difference_minor', 'paint_hours'];
const finishValues = (input: FinishInput | FinishUpdateInput) => [input.slug, input.name, input.description, input.priceDifferenceMinor, input.paintHours];

/** A new finish of a design, as a draft at the end of its list. */
export async function addFinish(input: FinishInput): Promise<CatalogueChange & { finishId: string; finishName: string }> {
  return inTransaction(async (transaction) => {
    const design = await lockDesign(input.designId, transaction);
    if (input.currency !== design.currency) throw currencyChanged('priceDifference');
    const [taken] = await sql(`SELECT 1 FROM finishes WHERE design_id = $1 AND slug = $2`, [design.id, input.slug], transaction);
    if (taken) throw finishSlugTaken(input.slug);
    const [row] = await sql<{ id: string }>(
      `INSERT INTO finishes (design_id, ${finishColumns.join(', ')}, status, position)
       VALUES ($1, $2, $3, $4, $5, $6::numeric, 'draft', (SELECT coalesce(max(position), -1) + 1 FROM finishes WHERE design_id = $1))
       RETURNING id`,
      [design.id, ...finishValues(input)],
      transaction,
    );
    await touchDesign(design.id, transaction);
    return { designId: design.id, designName: design.name, slugs: [design.slug], finishId: row!.id, finishName: input.name };
  });
}

/** Saves one finish's fields. */
export async function updateFinish(actor: Actor, input: FinishUpdateInput): Promise<CatalogueChange & { finishName: string }> {
  return inTransaction(async (transaction) => {
    const { design, finish } = await lockFinish(input.finishId, transaction);
    if (input.currency !== design.currency) throw currencyChanged('priceDifference');
    const [taken] = await sql(
      `SELECT 1 FROM finishes WHERE design_id = $1 AND slug = $2 AND id <> $3`,
      [design.id, input.slug, finish.id],
      transaction,
    );
    if (taken) throw finishSlugTaken(input.slug);
    await sql(
      `UPDATE finishes SET slug = $2, name = $3, description = $4, price_difference_minor = $5, paint_hours = $6::numeric, updated_at = now()
        WHERE id = $1 RETURNING id`,
      [finish.id, ...finishValues(input)],
      transaction,
    );
    if (input.priceDifferenceMinor !== finish.price_difference_minor) {
      await writeAudit(
        {
          actor,
          action: 'finish.price_changed',
          subject: { type: 'finish', id: finish.id },
          summary: `Changed the price difference of ${design.name} — ${input.name} from ${signedMoney(finish.price_difference_minor, design.currency)} to ${signedMoney(input.priceDifferenceMinor, design.currency)}`,
          before: { currency: design.currency, priceDifferenceMinor: finish.price_difference_minor },
          after: { currency: design.currency, priceDifferenceMinor: input.priceDifferenceMinor },
        },
        transaction,
      );
    }
    await touchDesign(design.id, transaction);
    return { designId: design.id, designName: design.name, slugs: [design.slug], finishName: input.name };
  });
}

/**
 * Moves a finish along draft → published → retired → draft. A finish shows in the shop only while its
 * design is published too; a published design keeps at least one published finish.
 */
export async function setFinishStatus(
  actor: Actor,
  input: z.output<typeof finishStatusSchema>,
): Promise<CatalogueChange & { finishName: string; status: DesignStatus; designStatus: DesignStatus }> {
  return inTransaction(async (transaction) => {
    const { design, finish } = await lockFinish(input.finishId, transaction);
    if (!nextStatuses[finish.status].includes(input.status)) throw refuseMove(finish.name, finish.status, input.status);
    await sql(`UPDATE finishes SET status = $2, updated_at = now() WHERE id = $1 RETURNING id`, [finish.id, input.status], transaction);
    await keepShowable(design, `${input.status === 'retired' ? 'retiring' : 'changing'} ${finish.name}`, transaction);
    await writeAudit(
      {
        actor,
        action: 'finish.status_changed',
        subject: { type: 'finish', id: finish.id },
        summary: statusSummary(input.status, `${design.name} — ${finish.name}`),
        before: { status: finish.status },
        after: { status: input.status },
      },
      transaction,
    );
    await touchDesign(design.id, transaction);
    return {
      designId: design.id,
      designName: design.name,
      slugs: [design.slug],
      finishName: finish.name,
      status: input.status,
      designStatus: design.status,
    };
  });
}

/** Changes one photo's alt text. */
export async function updatePhotoAlt(input: z.output<typeof photoAltSchema>): Promise<CatalogueChange> {
  return inTransaction(async (transaction) => {
    const { design, photo } = await lockPhoto(input.photoId, transaction);
    await sql(`UPDATE photos SET alt = $2, updated_at = now() WHERE id = $1 RETURNING id`, [photo.id, input.alt], transaction);
    return { designId: design.id, designName: design.name, slugs: [design.slug] };
  });
}

/**
 * Moves a photo one place up or down among the photos of its group (the design's own, or one finish's).
 * The group's positions are shuffled among themselves, so the other groups' order is not touched.
 */
export async function movePhoto(input: z.output<typeof photoMoveSchema>): Promise<CatalogueChange & { moved: boolean }> {
  return inTransaction(async (transaction) => {
    const { design, photo } = await lockPhoto(input.photoId, transaction);
    const group = await sql<{ id: string; position: number }>(
      `SELECT id, position FROM photos WHERE design_id = $1 AND finish_id IS NOT DISTINCT FROM $2
          AND batch_id IS NOT DISTINCT FROM $3
        ORDER BY position, created_at, id FOR UPDATE`,
      [design.id, photo.finish_id, photo.batch_id],
      transaction,
    );
    const from = group.findIndex((row) => row.id === photo.id);
    const to = input.direction === 'up' ? from - 1 : from + 1;
    const change = { designId: design.id, designName: design.name, slugs: [design.slug] };
    if (from < 0 || to < 0 || to >= group.length) return { ...change, moved: false };
    // Keep the group's own positions, made distinct, and hand them out in the new order.
    const positions: number[] = [];
    for (const row of group) positions.push(positions.length === 0 ? row.position : Math.max(row.position, positions.at(-1)! + 1));
    const order = group.map((row) => row.id);
    [order[from], order[to]] = [order[to]!, order[from]!];
    await sql(
      `UPDATE photos SET position = v.position, updated_at = now()
         FROM unnest($1::uuid[], $2::int[]) AS v(id, position) WHERE photos.id = v.id RETURNING photos.id`,
      [order, positions],
      transaction,
    );
    return { ...change, moved: true };
  });
}

/**
 * Checks that a photo may go (a design in the shop keeps a photo it can show) and removes its row, in one
 * transaction. `removeFiles`, when given, runs inside it, so a failure there leaves the row in place.
 */
export async function deletePhotoRecord(
  photoId: string,
  removeFiles?: (photo: { id: string }) => Promise<void>,
): Promise<CatalogueChange> {
  return inTransaction(async (transaction) => {
    const { design, photo } = await lockPhoto(photoId, transaction);
    await sql(`DELETE FROM photos WHERE id = $1 RETURNING id`, [photo.id], transaction);
    await keepShowable(design, 'deleting this photo', transaction);
    await touchDesign(design.id, transaction);
    // Last, so nothing after it can fail and keep a row whose files are gone.
    if (removeFiles) await removeFiles({ id: photo.id });
    return { designId: design.id, designName: design.name, slugs: [design.slug] };
  });
}

async function touchDesign(designId: string, transaction: Transaction): Promise<void> {
  await sql(`UPDATE designs SET updated_at = now() WHERE id = $1 RETURNING id`, [designId], transaction);
}
