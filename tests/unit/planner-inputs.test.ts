import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { plannerRulesOfThumb, readPlannerDefaults } from '@/lib/planner/defaults';
import { minorToMoneyText, moneyTextToMinor, percentTextToBasisPoints } from '@/lib/planner/form';
import { openBatchHref } from '@/lib/planner/link';
import { fieldErrorsOf, planInputSchema, planPageSearchSchema } from '@/lib/planner/schemas';

const require = createRequire(import.meta.url);

// A plan as the form sends it: every number still the text of its field.
const formInput = {
  finishes: [
    { finishId: 'f1', name: 'Old Bone', quantity: '10', paintHoursPerMask: '3', priceMinor: '24000' },
    { finishId: 'f2', name: 'Bog Oak', quantity: '0', paintHoursPerMask: '3.5', priceMinor: '25500' },
  ],
  calendar: { workingDays: [1, 2, 3, 4, 5], hoursPerDay: '7', holidays: ['2027-03-17'] },
  startOn: '2027-03-01',
  pullsPerMoldPerDay: '3',
  failedPullsPercent: '10',
  trimMinutesPerPull: '20',
  painterHoursPerDay: '6',
  packingMinutesPerOrder: '20',
  handlingDays: '2',
  molds: [{ id: 'm1', label: 'Ibex A', pullsSoFar: 12, expectedLifePulls: 40 }],
  newMold: { lifePulls: '40', siliconeCoats: '5', coatCureHours: '1', jacketHalves: '2', jacketLayersPerHalf: '3', jacketLayerHours: '1,5' },
  materials: {
    shellAreaCm2: '1160', wallThicknessMm: '3', resinDensityGPerCm3: '1.1', wastePercent: '15', resinPricePerKgMinor: '2600',
    paintCostPerMaskMinor: '600', packagingPerMaskMinor: '450', cardFeeBasisPoints: '160', cardFeeFixedMinor: '22',
    taxRateBasisPoints: '2300', currency: 'EUR',
  },
};

type Patch = (draft: typeof formInput) => void;
function errorsFor(patch: Patch): Record<string, string> {
  const draft = structuredClone(formInput);
  patch(draft);
  const result = planInputSchema.safeParse(draft);
  return result.success ? {} : fieldErrorsOf(result.error);
}

describe('planner inputs', () => {
  it('accepts the form as typed, text and a decimal comma included, and gives numbers back', () => {
    const parsed = planInputSchema.parse(formInput);
    expect(parsed.finishes[0]!.quantity).toBe(10);
    expect(parsed.newMold.jacketLayerHours).toBe(1.5);
    expect(parsed.calendar.hoursPerDay).toBe(7);
  });

  const refusals: [string, Patch, string, RegExp][] = [
    ['a negative quantity', (d) => void (d.finishes[0]!.quantity = '-1'), 'finishes.0.quantity', /0 or more/],
    ['a fractional quantity', (d) => void (d.finishes[0]!.quantity = '2.5'), 'finishes.0.quantity', /whole number/],
    ['a quantity that is not a number', (d) => void (d.finishes[0]!.quantity = 'ten'), 'finishes.0.quantity', /as a number/],
    ['no masks at all', (d) => void (d.finishes[0]!.quantity = '0'), 'finishes', /at least one mask/],
    ['a failed share of 100%', (d) => void (d.failedPullsPercent = '100'), 'failedPullsPercent', /below 100%/],
    ['a failed share above 100%', (d) => void (d.failedPullsPercent = '150'), 'failedPullsPercent', /below 100%/],
    ['a negative failed share', (d) => void (d.failedPullsPercent = '-5'), 'failedPullsPercent', /cannot be negative/],
    ['zero working hours a day', (d) => void (d.calendar.hoursPerDay = '0'), 'calendar.hoursPerDay', /no hours/],
    ['zero painter hours a day', (d) => void (d.painterHoursPerDay = '0'), 'painterHoursPerDay', /no hours/],
    ['zero pulls per mold a day', (d) => void (d.pullsPerMoldPerDay = '0'), 'pullsPerMoldPerDay', /at least one pull/],
    ['half a pull a day', (d) => void (d.pullsPerMoldPerDay = '1.5'), 'pullsPerMoldPerDay', /whole number/],
    ['negative handling days', (d) => void (d.handlingDays = '-1'), 'handlingDays', /at least 0/],
    ['an empty field', (d) => void (d.trimMinutesPerPull = ''), 'trimMinutesPerPull', /^Enter the trim minutes per pull\.$/],
    ['a day that does not exist', (d) => void (d.startOn = '2027-02-29'), 'startOn', /real date/],
    ['no working days', (d) => void (d.calendar.workingDays = []), 'calendar.workingDays', /at least one working day/],
    ['a negative price', (d) => void (d.finishes[0]!.priceMinor = '-100'), 'finishes.0.priceMinor', /negative/],
    ['a zero-life new mold', (d) => void (d.newMold.lifePulls = '0'), 'newMold.lifePulls', /at least 1/],
    ['a wall of no thickness', (d) => void (d.materials.wallThicknessMm = '0'), 'materials.wallThicknessMm', /at least/],
  ];
  for (const [name, patch, path, message] of refusals) {
    it(`refuses ${name}, with a message beside the field`, () => {
      const errors = errorsFor(patch);
      expect(Object.keys(errors)).toContain(path);
      expect(errors[path]).toMatch(message);
    });
  }

  it('reads the design from the query and ignores anything that is not a design name', () => {
    expect(planPageSearchSchema.parse({ design: 'ibex' })).toEqual({ design: 'ibex' });
    expect(planPageSearchSchema.parse({ design: '../etc' })).toEqual({ design: undefined });
    expect(planPageSearchSchema.parse({})).toEqual({ design: undefined });
  });
});

describe('planner defaults', () => {
  it('are the same in the migration that stores them as the column default', () => {
    const migration = require('../../migrations/20261203130000-create-molds-and-calendar.cjs') as { plannerDefaults: unknown };
    expect(migration.plannerDefaults).toEqual(plannerRulesOfThumb);
  });

  it("take the studio's own values and fall back per key on anything missing or not a number", () => {
    const read = readPlannerDefaults({ pullsPerMoldPerDay: 4, failedPullsPercent: 'lots', cardFeeBasisPoints: 160, cardFeeFixedMinor: 2.5 });
    expect(read.pullsPerMoldPerDay).toBe(4);
    expect(read.failedPullsPercent).toBe(plannerRulesOfThumb.failedPullsPercent);
    expect(read.painterHoursPerDay).toBe(plannerRulesOfThumb.painterHoursPerDay);
    expect(read.cardFeeBasisPoints).toBe(160);
    expect(read.cardFeeFixedMinor).toBe(0);
    expect(readPlannerDefaults(null)).toMatchObject(plannerRulesOfThumb);
  });
});

describe('the link that opens a batch with the plan', () => {
  it('carries the design, the ship-by date and each finish with masks', () => {
    const href = openBatchHref({
      designSlug: 'ibex',
      shipBy: '2027-03-19',
      quantities: [
        { finishId: '0b6c…-1', quantity: 10 },
        { finishId: 'f2', quantity: 0 },
        { finishId: 'f3', quantity: 4 },
      ],
    });
    const url = new URL(href, 'http://studio.invalid');
    expect(url.pathname).toBe('/workshop/batches/new');
    expect(url.searchParams.get('design')).toBe('ibex');
    expect(url.searchParams.get('shipBy')).toBe('2027-03-19');
    expect(url.searchParams.get('qty.0b6c…-1')).toBe('10');
    expect(url.searchParams.get('qty.f3')).toBe('4');
    expect(url.searchParams.has('qty.f2')).toBe(false);
  });
});

describe('money and percentages as typed', () => {
  it('turns major units into exact minor units, for the currency’s own number of decimals', () => {
    // EUR has 2 minor digits, JPY none (ISO 4217, through Intl, as lib/money.ts reads it).
    expect(moneyTextToMinor('28.50', 'EUR')).toEqual({ ok: true, value: 2850 });
    expect(moneyTextToMinor('28,5', 'EUR')).toEqual({ ok: true, value: 2850 });
    expect(moneyTextToMinor('0.29', 'EUR')).toEqual({ ok: true, value: 29 }); // not 28.999… as 0.29 × 100 is in floats
    expect(moneyTextToMinor('1200', 'JPY')).toEqual({ ok: true, value: 1200 });
    expect(moneyTextToMinor('', 'EUR')).toEqual({ ok: true, value: undefined });
    expect(moneyTextToMinor('12.345', 'EUR')).toMatchObject({ ok: false, message: expect.stringMatching(/at most 2 decimals/) });
    expect(moneyTextToMinor('12.5', 'JPY')).toMatchObject({ ok: false, message: expect.stringMatching(/without decimals/) });
    expect(moneyTextToMinor('€12', 'EUR')).toMatchObject({ ok: false });
    expect(minorToMoneyText(2850, 'EUR')).toBe('28.50');
  });

  it('turns a percentage into basis points', () => {
    expect(percentTextToBasisPoints('1.6')).toEqual({ ok: true, value: 160 });
    expect(percentTextToBasisPoints('23')).toEqual({ ok: true, value: 2300 });
    expect(percentTextToBasisPoints('1.625')).toMatchObject({ ok: false });
  });
});
