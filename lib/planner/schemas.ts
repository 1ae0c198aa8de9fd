import { z } from 'zod';
import { isIsoDate } from './calendar';

// The planner's inputs, shared by the server (loading defaults, checking a plan) and the planner form (inline
// errors as the maker types). Numbers may arrive as numbers or as the text of a form field; blank text counts
// as missing. Messages say what to enter, since they are shown beside the field.

function fromText(value: unknown): unknown {
  if (typeof value !== 'string') return value;
  const text = value.trim();
  // A decimal comma is how many of the studio's people write numbers.
  return text === '' ? undefined : Number(text.replace(',', '.'));
}

type Bounds = { min: number; max: number; minMessage?: string; maxMessage?: string };

/** A number within bounds, with messages that name the field. */
function decimal(what: string, { min, max, minMessage, maxMessage }: Bounds) {
  return z.preprocess(
    fromText,
    z
      .number({ error: (issue) => (issue.input === undefined ? `Enter ${what}.` : `Enter ${what} as a number.`) })
      .min(min, minMessage ?? `Enter at least ${min} for ${what}.`)
      .max(max, maxMessage ?? `Enter at most ${max} for ${what}.`),
  );
}

/** A whole number within bounds: "2.5 masks" or "-1 days" are refused, not rounded. */
function whole(what: string, bounds: Bounds) {
  return z.preprocess(
    fromText,
    z
      .number({ error: (issue) => (issue.input === undefined ? `Enter ${what}.` : `Enter ${what} as a number.`) })
      .int(`Enter ${what} as a whole number.`)
      .min(bounds.min, bounds.minMessage ?? `Enter at least ${bounds.min} for ${what}.`)
      .max(bounds.max, bounds.maxMessage ?? `Enter at most ${bounds.max} for ${what}.`),
  );
}

export const isoDateSchema = z.string({ error: 'Enter a date.' }).refine(isIsoDate, 'Enter a real date, written YYYY-MM-DD.');

/** At most this many masks in one batch: far more than a few molds give in a season. */
export const maxBatchQuantity = 2000;

export const planFinishSchema = z.object({
  finishId: z.string().min(1).max(64),
  name: z.string().trim().min(1).max(80),
  quantity: whole('the number of masks', { min: 0, max: 1000, minMessage: 'Enter 0 or more masks.' }),
  paintHoursPerMask: decimal('the paint hours per mask', { min: 0, max: 100 }),
  priceMinor: whole('the price', { min: 0, max: 100_000_000, minMessage: 'A price cannot be negative.' }),
});

// Refinements run even when a field inside failed, so anything that is not a count yet counts as none.
const totalQuantity = (finishes: { quantity: unknown }[]) =>
  finishes.reduce<number>((sum, f) => sum + (typeof f.quantity === 'number' && Number.isFinite(f.quantity) && f.quantity > 0 ? f.quantity : 0), 0);

export const workingCalendarSchema = z.object({
  workingDays: z
    .array(z.number().int().min(1).max(7))
    .min(1, 'Choose at least one working day.')
    .max(7)
    .refine((days) => new Set(days).size === days.length, 'Each working day once.'),
  hoursPerDay: decimal('the working hours a day', {
    min: 0.5,
    max: 24,
    minMessage: 'Enter at least half an hour of work a day: with no hours nothing gets done.',
    maxMessage: 'A day has at most 24 hours.',
  }),
  holidays: z.array(isoDateSchema).max(400),
});

export const moldLifeSchema = z.object({
  id: z.string().min(1).max(64),
  label: z.string().trim().min(1).max(60),
  pullsSoFar: whole('the pulls so far', { min: 0, max: 100_000 }),
  expectedLifePulls: whole('the expected life in pulls', { min: 1, max: 10_000 }),
});

/** How a new mold is made: its counts and cure times (common practice, no source; see defaults.ts). */
export const newMoldSchema = z.object({
  lifePulls: whole('the expected life of a new mold', { min: 1, max: 10_000 }),
  siliconeCoats: whole('the silicone coats', { min: 1, max: 20 }),
  coatCureHours: decimal('the cure hours per coat', { min: 0.25, max: 24 }),
  jacketHalves: whole('the jacket halves', { min: 1, max: 6 }),
  jacketLayersPerHalf: whole('the jacket layers per half', { min: 1, max: 20 }),
  jacketLayerHours: decimal('the hours per jacket layer', { min: 0.25, max: 24 }),
});

export const scheduleInputSchema = z.object({
  finishes: z
    .array(planFinishSchema)
    .min(1, 'The design needs at least one published finish.')
    .max(20)
    .refine((finishes) => new Set(finishes.map((f) => f.finishId)).size === finishes.length, 'Each finish once.')
    .refine((finishes) => totalQuantity(finishes) >= 1, 'Enter at least one mask in some finish.')
    .refine(
      (finishes) => totalQuantity(finishes) <= maxBatchQuantity,
      `A batch can have at most ${maxBatchQuantity} masks.`,
    ),
  calendar: workingCalendarSchema,
  startOn: isoDateSchema,
  pullsPerMoldPerDay: whole('the pulls per mold a day', {
    min: 1,
    max: 50,
    minMessage: 'Each mold must give at least one pull a day.',
  }),
  failedPullsPercent: decimal('the share of failed pulls', {
    min: 0,
    max: 99.99,
    minMessage: 'The share of failed pulls cannot be negative.',
    maxMessage: 'Enter a share of failed pulls below 100%: if every pull fails, no mask is ever made.',
  }).refine((percent) => Math.abs(percent * 100 - Math.round(percent * 100)) < 1e-6, 'Use at most two decimals.'),
  trimMinutesPerPull: whole('the trim minutes per pull', { min: 0, max: 600 }),
  painterHoursPerDay: decimal('the painter hours a day', {
    min: 0.5,
    max: 24,
    minMessage: 'Enter at least half an hour of painting a day: with no hours no mask gets painted.',
    maxMessage: 'A day has at most 24 hours.',
  }),
  packingMinutesPerOrder: whole('the packing minutes per order', { min: 0, max: 600 }),
  handlingDays: whole('the handling days', { min: 0, max: 60 }),
  molds: z.array(moldLifeSchema).max(50),
  newMold: newMoldSchema,
});

export const materialsInputSchema = z.object({
  shellAreaCm2: decimal('the shell area', { min: 10, max: 50_000 }),
  wallThicknessMm: decimal('the wall thickness', { min: 0.2, max: 30 }),
  resinDensityGPerCm3: decimal('the resin density', { min: 0.3, max: 3 }),
  wastePercent: decimal('the waste allowance', { min: 0, max: 300 }),
  resinPricePerKgMinor: whole('the resin price per kg', { min: 0, max: 100_000_000 }),
  paintCostPerMaskMinor: whole('the paint cost per mask', { min: 0, max: 100_000_000 }),
  packagingPerMaskMinor: whole('the packaging cost per mask', { min: 0, max: 100_000_000 }),
  cardFeeBasisPoints: whole('the card fee percentage', { min: 0, max: 2000, maxMessage: 'A card fee above 20% is surely a typing slip.' }),
  cardFeeFixedMinor: whole('the fixed card fee', { min: 0, max: 100_000 }),
  taxRateBasisPoints: whole('the tax rate', { min: 0, max: 10_000 }),
  currency: z.string().regex(/^[A-Z]{3}$/),
});

export const planInputSchema = scheduleInputSchema.extend({ materials: materialsInputSchema });

export type PlanFinishInput = z.infer<typeof planFinishSchema>;
export type MoldLifeInput = z.infer<typeof moldLifeSchema>;
export type NewMoldInput = z.infer<typeof newMoldSchema>;
export type ScheduleInput = z.infer<typeof scheduleInputSchema>;
export type MaterialsInput = z.infer<typeof materialsInputSchema>;
export type PlanInput = z.infer<typeof planInputSchema>;

/** The planner page's query: which design. Anything else is ignored rather than refused. */
export const planPageSearchSchema = z.object({
  design: z
    .string()
    .max(80)
    .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/)
    .optional()
    .catch(undefined),
});

/** Field problems keyed by their path ("finishes.2.quantity", "calendar.hoursPerDay"), first message each. */
export function fieldErrorsOf(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join('.') || 'form';
    out[key] ??= issue.message;
  }
  return out;
}
