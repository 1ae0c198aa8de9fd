import { z } from 'zod';

/**
 * The planner's rules of thumb. Each is an input the maker can change; these are only where the form starts.
 * The migration that adds `studios.planner_defaults` stores the same values as the column's default
 * (tests/unit/planner-defaults.test.ts checks that they agree).
 */
export const plannerRulesOfThumb = {
  // Common practice, no source: a slush-cast shell demolds in a few hours, so a mold gives a few pulls a day.
  pullsPerMoldPerDay: 3,
  // Common practice, no source: an allowance for pulls with voids, thin spots or tears.
  failedPullsPercent: 10,
  // Common practice, no source: minutes to cut the flashing, open the eyes and sand the edge of one pull.
  trimMinutesPerPull: 20,
  // Common practice, no source: painting hours a day that leave time for drying, cleaning and the rest.
  painterHoursPerDay: 6,
  // Common practice, no source: wrapping, boxing and labelling one order of one mask.
  packingMinutesPerOrder: 20,
  // Common practice, no source: working days between the last box packed and the parcels going out.
  handlingDays: 2,
  // Common practice, no source: a brush-on silicone mold is good for some tens of pulls.
  newMoldLifePulls: 40,
  // Common practice, no source: a print coat and a few thickened coats of brush-on silicone, each left about an
  // hour to cure before the next.
  siliconeCoats: 5,
  coatCureHours: 1,
  // Common practice, no source: a two-part fibreglass-and-resin jacket ("mother mold"), each half laid up in a
  // few layers of one to two hours each and left overnight before the next half.
  jacketHalves: 2,
  jacketLayersPerHalf: 3,
  jacketLayerHours: 1.5,
  // Common practice, no source: a slush-cast mask shell is a few millimetres thick (the demo's materials text
  // says "about 3 mm").
  wallThicknessMm: 3,
  // Recalled from memory, not checked against a datasheet: unfilled polyurethane casting resins are typically
  // about 1.0–1.2 g/cm³ once cured. Use the density on your resin's own datasheet.
  resinDensityGPerCm3: 1.1,
  // Common practice, no source: resin left in cups and poured out of the mold after each slush coat.
  wastePercent: 15,
} as const;

export type PlannerRulesOfThumb = { -readonly [K in keyof typeof plannerRulesOfThumb]: number };

/**
 * Common practice, no source: when a design has no measures, a face mask's shell is taken to be about
 * 1,200 cm² (the front half of an ellipsoid 18 cm wide, 26 cm high and 12 cm deep is roughly that).
 */
export const fallbackShellAreaCm2 = 1200;

/** The studio's own money settings for the planner; none is a rule of thumb, so each starts at nothing. */
export const plannerMoneyDefaults = {
  resinPricePerKgMinor: 0,
  paintCostPerMaskMinor: 0,
  packagingPerMaskMinor: 0,
  cardFeeBasisPoints: 0,
  cardFeeFixedMinor: 0,
} as const;

export type PlannerDefaults = PlannerRulesOfThumb & { -readonly [K in keyof typeof plannerMoneyDefaults]: number };

const ruleKeys = Object.keys(plannerRulesOfThumb) as (keyof typeof plannerRulesOfThumb)[];
const moneyKeys = Object.keys(plannerMoneyDefaults) as (keyof typeof plannerMoneyDefaults)[];

/**
 * Reads `studios.planner_defaults` (jsonb): any key that is missing or not a sensible number falls back to
 * its rule of thumb (or to zero for money), so a half-filled or older settings object never breaks the page.
 */
export function readPlannerDefaults(stored: unknown): PlannerDefaults {
  const source = stored && typeof stored === 'object' ? (stored as Record<string, unknown>) : {};
  const number = z.number().min(0).max(1_000_000_000);
  const out = {} as PlannerDefaults;
  for (const key of ruleKeys) out[key] = number.catch(plannerRulesOfThumb[key]).parse(source[key]);
  for (const key of moneyKeys) out[key] = number.int().catch(plannerMoneyDefaults[key]).parse(source[key]);
  return out;
}
