import { addDays } from '@/lib/planner/calendar';
import { basisPointsToPercentText, minorToMoneyText, moneyTextToMinor, percentTextToBasisPoints } from '@/lib/planner/form';
import type { PlannerDesign, PlannerStudio } from '@/lib/planner/load';
import { fieldErrorsOf, isoDateSchema, planInputSchema, type PlanInput } from '@/lib/planner/schemas';

// The planner form's state (the text of each field, as typed) and how it becomes the planner's input. The
// schema in lib/planner/schemas.ts does the checking, so the messages beside the fields are the server's.

export type FieldKey =
  | 'startOn'
  | 'hoursPerDay'
  | 'painterHoursPerDay'
  | 'pullsPerMoldPerDay'
  | 'failedPullsPercent'
  | 'trimMinutesPerPull'
  | 'packingMinutesPerOrder'
  | 'handlingDays'
  | 'lifePulls'
  | 'siliconeCoats'
  | 'coatCureHours'
  | 'jacketHalves'
  | 'jacketLayersPerHalf'
  | 'jacketLayerHours'
  | 'shellAreaCm2'
  | 'wallThicknessMm'
  | 'resinDensityGPerCm3'
  | 'wastePercent'
  | 'resinPricePerKg'
  | 'paintCostPerMask'
  | 'packagingPerMask'
  | 'cardFeePercent'
  | 'cardFeeFixed'
  | 'shipByTarget';

export type FinishFields = { quantity: string; price: string; paintHours: string };
export type FormState = { fields: Record<FieldKey, string>; finishes: Record<string, FinishFields> };

/** Where each field's value lands in the planner's input, so the schema's messages find their field. */
export const fieldPaths: Record<FieldKey, string> = {
  startOn: 'startOn',
  hoursPerDay: 'calendar.hoursPerDay',
  painterHoursPerDay: 'painterHoursPerDay',
  pullsPerMoldPerDay: 'pullsPerMoldPerDay',
  failedPullsPercent: 'failedPullsPercent',
  trimMinutesPerPull: 'trimMinutesPerPull',
  packingMinutesPerOrder: 'packingMinutesPerOrder',
  handlingDays: 'handlingDays',
  lifePulls: 'newMold.lifePulls',
  siliconeCoats: 'newMold.siliconeCoats',
  coatCureHours: 'newMold.coatCureHours',
  jacketHalves: 'newMold.jacketHalves',
  jacketLayersPerHalf: 'newMold.jacketLayersPerHalf',
  jacketLayerHours: 'newMold.jacketLayerHours',
  shellAreaCm2: 'materials.shellAreaCm2',
  wallThicknessMm: 'materials.wallThicknessMm',
  resinDensityGPerCm3: 'materials.resinDensityGPerCm3',
  wastePercent: 'materials.wastePercent',
  resinPricePerKg: 'materials.resinPricePerKgMinor',
  paintCostPerMask: 'materials.paintCostPerMaskMinor',
  packagingPerMask: 'materials.packagingPerMaskMinor',
  cardFeePercent: 'materials.cardFeeBasisPoints',
  cardFeeFixed: 'materials.cardFeeFixedMinor',
  shipByTarget: 'shipByTarget',
};

export const finishPath = (index: number, field: 'quantity' | 'priceMinor' | 'paintHoursPerMask') => `finishes.${index}.${field}`;

/** The form as the studio's defaults and the design's own figures fill it. */
export function initialFormState(studio: PlannerStudio, design: PlannerDesign): FormState {
  const d = studio.defaults;
  const money = (minor: number) => minorToMoneyText(minor, design.currency);
  return {
    fields: {
      startOn: studio.today,
      hoursPerDay: String(studio.calendar.hoursPerDay),
      painterHoursPerDay: String(d.painterHoursPerDay),
      pullsPerMoldPerDay: String(d.pullsPerMoldPerDay),
      failedPullsPercent: String(d.failedPullsPercent),
      trimMinutesPerPull: String(d.trimMinutesPerPull),
      packingMinutesPerOrder: String(d.packingMinutesPerOrder),
      handlingDays: String(d.handlingDays),
      lifePulls: String(d.newMoldLifePulls),
      siliconeCoats: String(d.siliconeCoats),
      coatCureHours: String(d.coatCureHours),
      jacketHalves: String(d.jacketHalves),
      jacketLayersPerHalf: String(d.jacketLayersPerHalf),
      jacketLayerHours: String(d.jacketLayerHours),
      shellAreaCm2: String(design.shell.areaCm2),
      wallThicknessMm: String(d.wallThicknessMm),
      resinDensityGPerCm3: String(d.resinDensityGPerCm3),
      wastePercent: String(d.wastePercent),
      resinPricePerKg: money(d.resinPricePerKgMinor),
      paintCostPerMask: money(d.paintCostPerMaskMinor),
      packagingPerMask: money(d.packagingPerMaskMinor),
      cardFeePercent: basisPointsToPercentText(d.cardFeeBasisPoints),
      cardFeeFixed: money(d.cardFeeFixedMinor),
      // Six weeks out: a common horizon for announcing a drop (the maker changes it).
      shipByTarget: addDays(studio.today, 42),
    },
    finishes: Object.fromEntries(
      design.finishes.map((f) => [f.finishId, { quantity: '0', price: money(f.priceMinor), paintHours: String(f.paintHoursPerMask) }]),
    ),
  };
}

export type BuiltInput =
  | { ok: true; input: PlanInput; errors: Record<string, string>; target: string | null }
  | { ok: false; errors: Record<string, string>; target: string | null };

/** The planner's input from the form, or the messages to show beside the fields. */
export function buildInput(state: FormState, studio: PlannerStudio, design: PlannerDesign): BuiltInput {
  const f = state.fields;
  const local: Record<string, string> = {};
  // Money and percentages are turned into whole minor units and basis points here; text that cannot be
  // becomes NaN, which the schema refuses, and the more precise message from here is the one shown.
  const minor = (text: string, path: string, what: string) => {
    const parsed = moneyTextToMinor(text, design.currency, what);
    if (!parsed.ok) {
      local[path] = parsed.message;
      return Number.NaN;
    }
    return parsed.value;
  };
  const basisPoints = (text: string, path: string, what: string) => {
    const parsed = percentTextToBasisPoints(text, what);
    if (!parsed.ok) {
      local[path] = parsed.message;
      return Number.NaN;
    }
    return parsed.value;
  };

  const raw = {
    finishes: design.finishes.map((finish, index) => {
      const fields = state.finishes[finish.finishId]!;
      return {
        finishId: finish.finishId,
        name: finish.name,
        quantity: fields.quantity,
        paintHoursPerMask: fields.paintHours,
        priceMinor: minor(fields.price, finishPath(index, 'priceMinor'), 'the price'),
      };
    }),
    calendar: { workingDays: studio.calendar.workingDays, hoursPerDay: f.hoursPerDay, holidays: studio.calendar.holidays },
    startOn: f.startOn,
    pullsPerMoldPerDay: f.pullsPerMoldPerDay,
    failedPullsPercent: f.failedPullsPercent,
    trimMinutesPerPull: f.trimMinutesPerPull,
    painterHoursPerDay: f.painterHoursPerDay,
    packingMinutesPerOrder: f.packingMinutesPerOrder,
    handlingDays: f.handlingDays,
    molds: design.molds,
    newMold: {
      lifePulls: f.lifePulls,
      siliconeCoats: f.siliconeCoats,
      coatCureHours: f.coatCureHours,
      jacketHalves: f.jacketHalves,
      jacketLayersPerHalf: f.jacketLayersPerHalf,
      jacketLayerHours: f.jacketLayerHours,
    },
    materials: {
      shellAreaCm2: f.shellAreaCm2,
      wallThicknessMm: f.wallThicknessMm,
      resinDensityGPerCm3: f.resinDensityGPerCm3,
      wastePercent: f.wastePercent,
      resinPricePerKgMinor: minor(f.resinPricePerKg, fieldPaths.resinPricePerKg, 'the resin price'),
      paintCostPerMaskMinor: minor(f.paintCostPerMask, fieldPaths.paintCostPerMask, 'the paint cost'),
      packagingPerMaskMinor: minor(f.packagingPerMask, fieldPaths.packagingPerMask, 'the packaging cost'),
      cardFeeBasisPoints: basisPoints(f.cardFeePercent, fieldPaths.cardFeePercent, 'the card fee percentage'),
      cardFeeFixedMinor: minor(f.cardFeeFixed, fieldPaths.cardFeeFixed, 'the fixed card fee'),
      taxRateBasisPoints: studio.taxRateBasisPoints,
      currency: design.currency,
    },
  };

  const targetParsed = isoDateSchema.safeParse(f.shipByTarget);
  const target = targetParsed.success ? targetParsed.data : null;
  if (!targetParsed.success) local[fieldPaths.shipByTarget] = targetParsed.error.issues[0]?.message ?? 'Enter a date.';

  const parsed = planInputSchema.safeParse(raw);
  if (!parsed.success) return { ok: false, errors: { ...fieldErrorsOf(parsed.error), ...local }, target };
  return { ok: true, input: parsed.data, errors: local, target };
}
