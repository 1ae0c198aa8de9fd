import { includedTaxMinor } from '@/lib/checkout/pricing';
import { fallbackShellAreaCm2 } from './defaults';
import type { MaterialsInput, PlanFinishInput } from './schemas';

// Resin and money for one mask. Lengths are converted explicitly: 1 cm = 10 mm, 1 cm² = 100 mm²,
// 1 kg = 1000 g. Money is integer minor units throughout (see lib/money.ts); each line is rounded half-up to
// the minor unit once, and the margin is what is left of the price after those rounded lines.

const MM_PER_CM = 10;
const MM2_PER_CM2 = MM_PER_CM * MM_PER_CM;
const G_PER_KG = 1000;

/**
 * Surface area of an ellipsoid with semi-axes a, b, c by Knud Thomsen's approximation,
 * 4π((aᵖbᵖ + aᵖcᵖ + bᵖcᵖ)/3)^(1/p) with p ≈ 1.6075 (within about 1% of the exact area; the formula and its
 * error bound as given in Wikipedia's "Ellipsoid" article, section "Surface area"). Exact for a sphere.
 */
export function ellipsoidSurfaceArea(a: number, b: number, c: number): number {
  const p = 1.6075;
  const ap = a ** p;
  const bp = b ** p;
  const cp = c ** p;
  return 4 * Math.PI * ((ap * bp + ap * cp + bp * cp) / 3) ** (1 / p);
}

export type ShellEstimate = { areaCm2: number; ruleOfThumb: 'half-ellipsoid' | 'fallback' };

/**
 * Rule of thumb (common practice, no source): a mask's shell is the front half of an ellipsoid as wide and
 * high as the mask and as deep as its depth; horns, ears and eye openings are left out. Without measures,
 * a fixed face-mask area (defaults.ts).
 */
export function estimateShellAreaCm2(measures: { widthMm: number | null; heightMm: number | null; depthMm: number | null }): ShellEstimate {
  const { widthMm, heightMm, depthMm } = measures;
  if (!widthMm || !heightMm || !depthMm || widthMm <= 0 || heightMm <= 0 || depthMm <= 0) {
    return { areaCm2: fallbackShellAreaCm2, ruleOfThumb: 'fallback' };
  }
  const halfMm2 = ellipsoidSurfaceArea(widthMm / 2, heightMm / 2, depthMm) / 2;
  return { areaCm2: Math.round(halfMm2 / MM2_PER_CM2), ruleOfThumb: 'half-ellipsoid' };
}

export type ResinPerMask = {
  /** Shell volume: area × wall thickness. */
  volumeCm3: number;
  /** Cured shell mass: volume × density. */
  shellMassG: number;
  /** What one pull uses: the shell plus the waste allowance. */
  perPullG: number;
  /** What one kept mask uses once the failed pulls' resin is shared over the kept ones. */
  perKeptMaskG: number;
};

/** Resin for one mask: mass = shell area × wall thickness × density, plus waste, plus the failed pulls' share. */
export function resinPerMask(
  input: Pick<MaterialsInput, 'shellAreaCm2' | 'wallThicknessMm' | 'resinDensityGPerCm3' | 'wastePercent'>,
  pulls: { units: number; pulls: number },
): ResinPerMask {
  const volumeCm3 = input.shellAreaCm2 * (input.wallThicknessMm / MM_PER_CM);
  const shellMassG = volumeCm3 * input.resinDensityGPerCm3;
  const perPullG = shellMassG * (1 + input.wastePercent / 100);
  const perKeptMaskG = pulls.units > 0 ? (perPullG * pulls.pulls) / pulls.units : perPullG;
  return { volumeCm3, shellMassG, perPullG, perKeptMaskG };
}

/** round(value × numerator / denominator), half-up, for whole non-negative minor units. */
function shareHalfUp(value: number, numerator: number, denominator: number): number {
  return Math.floor((2 * value * numerator + denominator) / (2 * denominator));
}

/** A card payment's fee: a percentage of the amount (in basis points, 150 = 1.5%) plus a fixed amount. */
export function cardFeeMinor(amountMinor: number, basisPoints: number, fixedMinor: number): number {
  if (!Number.isSafeInteger(amountMinor) || amountMinor < 0) throw new RangeError(`amountMinor must be a whole number ≥ 0, got ${amountMinor}`);
  return shareHalfUp(amountMinor, basisPoints, 10_000) + fixedMinor;
}

export type FinishMoney = {
  finishId: string;
  name: string;
  priceMinor: number;
  resinMinor: number;
  paintMinor: number;
  packagingMinor: number;
  /** Assuming one mask per card payment, which is what the per-buyer limit of one makes most orders. */
  cardFeeMinor: number;
  /** The tax the price contains (prices shown include tax). */
  taxIncludedMinor: number;
  marginMinor: number;
  /** Margin as a share of the price after tax, in basis points; null for a price of nothing. */
  marginBasisPoints: number | null;
};

export function moneyPerMask(
  finishes: Pick<PlanFinishInput, 'finishId' | 'name' | 'priceMinor'>[],
  input: MaterialsInput,
  resin: ResinPerMask,
): FinishMoney[] {
  const resinMinor = Math.round((resin.perKeptMaskG / G_PER_KG) * input.resinPricePerKgMinor);
  return finishes.map((finish) => {
    const taxIncluded = includedTaxMinor(finish.priceMinor, input.taxRateBasisPoints);
    const fee = cardFeeMinor(finish.priceMinor, input.cardFeeBasisPoints, input.cardFeeFixedMinor);
    const margin = finish.priceMinor - taxIncluded - resinMinor - input.paintCostPerMaskMinor - input.packagingPerMaskMinor - fee;
    const net = finish.priceMinor - taxIncluded;
    return {
      finishId: finish.finishId,
      name: finish.name,
      priceMinor: finish.priceMinor,
      resinMinor,
      paintMinor: input.paintCostPerMaskMinor,
      packagingMinor: input.packagingPerMaskMinor,
      cardFeeMinor: fee,
      taxIncludedMinor: taxIncluded,
      marginMinor: margin,
      marginBasisPoints: net > 0 ? Math.round((margin * 10_000) / net) : null,
    };
  });
}
