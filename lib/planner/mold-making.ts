import type { MoldLifeInput, NewMoldInput } from './schemas';

// Whether the design's molds have enough life left for a batch, and how long a new one takes to make.

export type MoldNeed = {
  /** Pulls the usable molds still have in them, before the batch. */
  remainingPulls: number;
  /** Pulls the batch needs beyond that (0 when the molds suffice). */
  shortfallPulls: number;
  /** New molds to make first, each good for `newMold.lifePulls`. */
  newMolds: number;
};

export const remainingLife = (mold: Pick<MoldLifeInput, 'pullsSoFar' | 'expectedLifePulls'>) =>
  Math.max(0, mold.expectedLifePulls - mold.pullsSoFar);

export function moldNeed(pulls: number, molds: Pick<MoldLifeInput, 'pullsSoFar' | 'expectedLifePulls'>[], newMold: Pick<NewMoldInput, 'lifePulls'>): MoldNeed {
  const remainingPulls = molds.reduce((sum, mold) => sum + remainingLife(mold), 0);
  const shortfallPulls = Math.max(0, pulls - remainingPulls);
  return { remainingPulls, shortfallPulls, newMolds: Math.ceil(shortfallPulls / newMold.lifePulls) };
}

export type MoldMaking = {
  /** Bench minutes on each working day, by working-day index from the day making starts. */
  minutesByDay: number[];
  /** Working days from the start until the mold can be cast in (it is ready on that day's morning). */
  readyAfterDays: number;
};

/**
 * One new mold, step by step on the studio's working days (common practice, no source; every count is an
 * input): each brush-on silicone coat takes its cure time before the next; then each jacket half is laid up
 * layer by layer and left overnight, so the next half (and finally the demold) waits for the next working
 * day. A step does not start late in a day it cannot finish in; a step longer than a day runs on.
 */
export function makeMold(spec: Omit<NewMoldInput, 'lifePulls'>, minutesPerDay: number): MoldMaking {
  const minutesByDay: number[] = [0];
  let day = 0;
  let used = 0;
  const nextDay = () => {
    day += 1;
    used = 0;
    minutesByDay[day] = 0;
  };
  const step = (minutes: number) => {
    if (used > 0 && used + minutes > minutesPerDay) nextDay();
    let left = minutes;
    for (;;) {
      const take = Math.min(left, minutesPerDay - used);
      minutesByDay[day]! += take;
      used += take;
      left -= take;
      if (left <= 0) return;
      nextDay();
    }
  };
  for (let coat = 0; coat < spec.siliconeCoats; coat += 1) step(Math.round(spec.coatCureHours * 60));
  for (let half = 0; half < spec.jacketHalves; half += 1) {
    for (let layer = 0; layer < spec.jacketLayersPerHalf; layer += 1) step(Math.round(spec.jacketLayerHours * 60));
    nextDay(); // overnight cure
  }
  minutesByDay.pop(); // the morning after the last half: ready, nothing left to do
  return { minutesByDay, readyAfterDays: day };
}
