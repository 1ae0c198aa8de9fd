import { toDayNumber, type IsoDate } from './calendar';
import { moneyPerMask, resinPerMask, type FinishMoney, type ResinPerMask } from './materials';
import { planSchedule, PlanTooLongError, type Schedule } from './schedule';
import { maxBatchQuantity, type PlanInput, type ScheduleInput } from './schemas';

export type Plan = { schedule: Schedule; resin: ResinPerMask; money: FinishMoney[] };

/** Everything the planner shows for one set of inputs (already parsed with `planInputSchema`). */
export function planBatch(input: PlanInput): Plan {
  const schedule = planSchedule(input);
  const resin = resinPerMask(input.materials, { units: schedule.units, pulls: schedule.pulls });
  return { schedule, resin, money: moneyPerMask(input.finishes, input.materials, resin) };
}

/**
 * `total` masks shared over finishes in proportion to `weights` by the highest-averages (D'Hondt) method: one
 * mask at a time to the finish with the largest weight / (masks so far + 1), ties to the earlier finish.
 * Adding a mask never takes one from another finish (unlike rounding shares), so a larger batch is never
 * quicker to paint than a smaller one, which the search below relies on.
 */
export function shareByWeight(total: number, weights: number[]): number[] {
  if (!Number.isSafeInteger(total) || total < 0) throw new RangeError(`total must be a whole number ≥ 0, got ${total}`);
  const positive = weights.some((w) => w > 0);
  const w = weights.map((weight) => (positive ? Math.max(0, weight) : 1));
  const counts = w.map(() => 0);
  for (let n = 0; n < total; n += 1) {
    let best = 0;
    for (let i = 1; i < w.length; i += 1) if (w[i]! * (counts[best]! + 1) > w[best]! * (counts[i]! + 1)) best = i;
    counts[best]! += 1;
  }
  return counts;
}

export type LargestBatch = {
  /** The most masks that ship on or before the date, in the plan's mix of finishes; 0 when not even one does. */
  quantity: number;
  perFinish: { finishId: string; name: string; quantity: number }[];
  /** That batch's own ship-by date (on or before the target), or null for none. */
  shipBy: IsoDate | null;
  /** True when even the largest batch the planner allows ships in time. */
  atLimit: boolean;
};

/**
 * The other way round: the largest batch, in the same mix of finishes as `input`, whose forward schedule ships
 * by `target`. The ship-by date only moves later as the batch grows (more pulls, more mold life used, more
 * painting), so a doubling search finds a batch that is too late and a bisection finds the boundary.
 */
export function largestBatchBy(input: ScheduleInput, target: IsoDate): LargestBatch {
  const targetDay = toDayNumber(target);
  const weights = input.finishes.map((f) => f.quantity);
  const shaped = (total: number): ScheduleInput => {
    const counts = shareByWeight(total, weights);
    return { ...input, finishes: input.finishes.map((f, i) => ({ ...f, quantity: counts[i]! })) };
  };
  const shipByFor = (total: number): IsoDate | null => {
    try {
      return planSchedule(shaped(total)).shipBy;
    } catch (error) {
      if (error instanceof PlanTooLongError) return null;
      throw error;
    }
  };
  const fits = (total: number) => {
    const shipBy = shipByFor(total);
    return shipBy !== null && toDayNumber(shipBy) <= targetDay;
  };

  const answer = (total: number, atLimit: boolean): LargestBatch => {
    const counts = shareByWeight(total, weights);
    return {
      quantity: total,
      perFinish: input.finishes.map((f, i) => ({ finishId: f.finishId, name: f.name, quantity: counts[i]! })),
      shipBy: total > 0 ? shipByFor(total) : null,
      atLimit,
    };
  };

  if (!fits(1)) return answer(0, false);
  let low = 1; // fits
  let high = 2;
  while (high <= maxBatchQuantity && fits(high)) {
    low = high;
    high *= 2;
  }
  if (high > maxBatchQuantity) {
    if (fits(maxBatchQuantity)) return answer(maxBatchQuantity, true);
    high = maxBatchQuantity;
  }
  // low fits, high does not.
  while (high - low > 1) {
    const mid = Math.floor((low + high) / 2);
    if (fits(mid)) low = mid;
    else high = mid;
  }
  return answer(low, false);
}
