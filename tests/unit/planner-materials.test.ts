import { describe, expect, it } from 'vitest';
import { includedTaxMinor } from '@/lib/checkout/pricing';
import { fallbackShellAreaCm2 } from '@/lib/planner/defaults';
import { cardFeeMinor, ellipsoidSurfaceArea, estimateShellAreaCm2, moneyPerMask, resinPerMask } from '@/lib/planner/materials';
import { planBatch } from '@/lib/planner/plan';
import { materialsInputSchema, planInputSchema } from '@/lib/planner/schemas';

const materials = materialsInputSchema.parse({
  shellAreaCm2: 1000,
  wallThicknessMm: 3,
  resinDensityGPerCm3: 1.1,
  wastePercent: 15,
  resinPricePerKgMinor: 2600, // €26.00 a kg: invented for the test
  paintCostPerMaskMinor: 600,
  packagingPerMaskMinor: 450,
  cardFeeBasisPoints: 160, // 1.6%: invented
  cardFeeFixedMinor: 22,
  taxRateBasisPoints: 2300,
  currency: 'EUR',
});

describe('resin: mass = volume × density, units converted explicitly', () => {
  it('works a shell through by hand', () => {
    // 1000 cm² × 3 mm; 3 mm = 0.3 cm → 300 cm³. × 1.1 g/cm³ → 330 g. + 15% waste → 379.5 g a pull.
    // 30 kept masks from 34 pulls: 379.5 × 34 / 30 = 430.1 g of resin for each kept mask.
    const resin = resinPerMask(materials, { units: 30, pulls: 34 });
    expect(resin.volumeCm3).toBeCloseTo(300, 9);
    expect(resin.shellMassG).toBeCloseTo(330, 9);
    expect(resin.perPullG).toBeCloseTo(379.5, 9);
    expect(resin.perKeptMaskG).toBeCloseTo(430.1, 9);
  });

  it('keeps millimetres and centimetres apart: a 10 cm square plate 2 mm thick', () => {
    // 10 cm × 10 cm = 100 cm² (= 10,000 mm²); 2 mm = 0.2 cm → 20 cm³; × 1.1 g/cm³ = 22 g. Reading the
    // 2 mm as 2 cm would give 220 g, and 20,000 mm³ taken for cm³ 22 kg: neither passes.
    const plate = resinPerMask({ shellAreaCm2: 100, wallThicknessMm: 2, resinDensityGPerCm3: 1.1, wastePercent: 0 }, { units: 1, pulls: 1 });
    expect(plate.volumeCm3).toBeCloseTo(20, 9);
    expect(plate.shellMassG).toBeCloseTo(22, 9);
  });

  it('scales linearly with each factor', () => {
    const base = resinPerMask(materials, { units: 1, pulls: 1 }).shellMassG;
    expect(resinPerMask({ ...materials, wallThicknessMm: 6 }, { units: 1, pulls: 1 }).shellMassG).toBeCloseTo(2 * base, 9);
    expect(resinPerMask({ ...materials, resinDensityGPerCm3: 2.2 }, { units: 1, pulls: 1 }).shellMassG).toBeCloseTo(2 * base, 9);
    expect(resinPerMask({ ...materials, shellAreaCm2: 500 }, { units: 1, pulls: 1 }).shellMassG).toBeCloseTo(base / 2, 9);
  });
});

describe('shell area, a rule of thumb', () => {
  it("Thomsen's ellipsoid formula is exact for a sphere: 4πr²", () => {
    // A sphere is the one case the approximation must get exactly (Wikipedia, "Ellipsoid", surface area).
    for (const r of [1, 7.5, 100]) expect(ellipsoidSurfaceArea(r, r, r)).toBeCloseTo(4 * Math.PI * r * r, 6);
  });

  it('takes a mask as the front half of an ellipsoid of its width, height and depth', () => {
    // 200 mm wide and high, 100 mm deep: a half sphere of r = 100 mm → 2π × 100² = 62,832 mm² = 628 cm².
    expect(estimateShellAreaCm2({ widthMm: 200, heightMm: 200, depthMm: 100 })).toEqual({ areaCm2: 628, ruleOfThumb: 'half-ellipsoid' });
    // A bigger mask has a bigger shell.
    const ibex = estimateShellAreaCm2({ widthMm: 180, heightMm: 340, depthMm: 150 }).areaCm2;
    const moth = estimateShellAreaCm2({ widthMm: 260, heightMm: 280, depthMm: 100 }).areaCm2;
    expect(ibex).toBeGreaterThan(628);
    expect(ibex).toBeGreaterThan(moth);
  });

  it('falls back to a fixed area, and says so, when the design has no measures', () => {
    expect(estimateShellAreaCm2({ widthMm: null, heightMm: 300, depthMm: 120 })).toEqual({ areaCm2: fallbackShellAreaCm2, ruleOfThumb: 'fallback' });
  });
});

describe('money per mask, in whole minor units', () => {
  it('takes the card fee as a percentage plus a fixed amount, rounded half-up', () => {
    // 1.6% of €240.00 = €3.84, + €0.22 = €4.06.
    expect(cardFeeMinor(24000, 160, 22)).toBe(406);
    // 1.5% of €1.00 = 1.5 cents → 2 (half-up); 1.5% of €0.99 = 1.485 → 1.
    expect(cardFeeMinor(100, 150, 0)).toBe(2);
    expect(cardFeeMinor(99, 150, 0)).toBe(1);
    expect(() => cardFeeMinor(10.5, 150, 0)).toThrow(RangeError);
  });

  it('works the margin through by hand at the chosen price', () => {
    const resin = resinPerMask(materials, { units: 30, pulls: 34 });
    const [row] = moneyPerMask([{ finishId: 'old-bone', name: 'Old Bone', priceMinor: 24000 }], materials, resin);
    // Resin: 430.1 g = 0.4301 kg × €26.00 = €11.1826 → 1118 cents.
    // Tax in the price at 23%: 24000 × 23 / 123 = 4487.8 → 4488 (the same rule as checkout's includedTaxMinor).
    // Card fee 406 (above). Margin: 24000 − 4488 − 1118 − 600 − 450 − 406 = 16938.
    expect(row).toMatchObject({ resinMinor: 1118, paintMinor: 600, packagingMinor: 450, cardFeeMinor: 406, taxIncludedMinor: 4488, marginMinor: 16938 });
    expect(row!.taxIncludedMinor).toBe(includedTaxMinor(24000, 2300));
    // As a share of the price after tax: 16938 / 19512 = 86.81% → 8681 basis points.
    expect(row!.marginBasisPoints).toBe(8681);
    for (const value of Object.values(row!)) if (typeof value === 'number') expect(Number.isInteger(value)).toBe(true);
  });

  it('shows a loss as a negative margin rather than hiding it', () => {
    const resin = resinPerMask(materials, { units: 1, pulls: 1 });
    const [row] = moneyPerMask([{ finishId: 'x', name: 'Cheap', priceMinor: 1000 }], materials, resin);
    expect(row!.marginMinor).toBeLessThan(0);
  });
});

describe('the whole plan', () => {
  it('shares the failed pulls’ resin over the kept masks of the batch', () => {
    const plan = planBatch(
      planInputSchema.parse({
        finishes: [{ finishId: 'old-bone', name: 'Old Bone', quantity: 9, paintHoursPerMask: 3, priceMinor: 24000 }],
        calendar: { workingDays: [1, 2, 3, 4, 5], hoursPerDay: 7, holidays: [] },
        startOn: '2027-03-01',
        pullsPerMoldPerDay: 3,
        failedPullsPercent: 10,
        trimMinutesPerPull: 20,
        painterHoursPerDay: 6,
        packingMinutesPerOrder: 20,
        handlingDays: 2,
        molds: [{ id: 'a', label: 'A', pullsSoFar: 0, expectedLifePulls: 40 }],
        newMold: { lifePulls: 40, siliconeCoats: 5, coatCureHours: 1, jacketHalves: 2, jacketLayersPerHalf: 3, jacketLayerHours: 1.5 },
        materials,
      }),
    );
    // 9 / 0.9 = 10 pulls; 379.5 g a pull × 10 / 9 = 421.67 g a kept mask.
    expect(plan.schedule.pulls).toBe(10);
    expect(plan.resin.perKeptMaskG).toBeCloseTo((379.5 * 10) / 9, 9);
  });
});
