import { workingDaySequence, type IsoDate } from './calendar';
import { makeMold, moldNeed, remainingLife, type MoldNeed } from './mold-making';
import type { ScheduleInput } from './schemas';

// The forward computation: from quantities, molds and hours to a day-by-day schedule and a ship-by date.
//
// The model, said once so the screen can say it too:
// - Days are the studio's working days from the start date; hours are counted in whole minutes.
// - Casting is limited by the molds: each usable mold gives up to `pullsPerMoldPerDay` pulls a day until its
//   expected life is used up. Failed pulls are set aside at demold; the kept ones go on.
// - A new mold is taken off the one master sculpt, so new molds are made one after another; casting with the
//   molds that are left goes on meanwhile, and a new mold joins on the morning it is ready.
// - Mold making, trimming and packing share the studio's working hours a day, in that order of priority;
//   painting has the painter's own hours a day.
// - A stage takes up a mask the working day after the stage before finished it (resin and paint cure
//   overnight; common practice, no source). A stage with no work at all is skipped, so it adds no day.
// - Every mask is packed as its own order (one mask a box, as the demo's shipping assumes).
// - Handling takes its working days after the last box is packed; the ship-by date is the last of them.

export const stageKeys = ['moldMaking', 'casting', 'trimming', 'painting', 'packing', 'handling'] as const;
export type StageKey = (typeof stageKeys)[number];

export const stageLabels: Record<StageKey, string> = {
  moldMaking: 'Mold making',
  casting: 'Casting',
  trimming: 'Trimming',
  painting: 'Painting',
  packing: 'Packing',
  handling: 'Handling',
};

/** Far past any batch a few molds can give: a plan that needs longer is refused rather than computed. */
export const maxPlanWorkingDays = 1500;

export class PlanTooLongError extends RangeError {
  constructor() {
    super(`This plan needs more than ${maxPlanWorkingDays} working days. Make the batch smaller or add hours.`);
    this.name = 'PlanTooLongError';
  }
}

export type ScheduleDay = {
  index: number;
  date: IsoDate;
  moldMakingMinutes: number;
  pulls: number;
  trimMinutes: number;
  paintMinutes: number;
  packMinutes: number;
  handling: boolean;
  /** Each mold's pulls left at the end of the day; null for a new mold not ready yet. */
  moldLife: Record<string, number | null>;
};

export type StageSummary = {
  /** Working days on which the stage has work. */
  activeDays: number;
  firstDate: IsoDate | null;
  lastDate: IsoDate | null;
  /** The stage's work: minutes (mold making, trimming, painting, packing), pulls (casting) or days (handling). */
  work: number;
  /** Working days its own work needs at its full daily capacity: how the bottleneck is chosen. */
  ownDays: number;
};

export type MoldUse = {
  id: string;
  label: string;
  isNew: boolean;
  readyOn: IsoDate;
  expectedLifePulls: number;
  remainingBefore: number;
  pullsInBatch: number;
  remainingAfter: number;
};

export type Schedule = {
  units: number;
  pulls: number;
  moldNeed: MoldNeed;
  /** Working days one new mold takes, from its first coat to the morning it can be cast in. */
  newMoldLeadDays: number;
  molds: MoldUse[];
  days: ScheduleDay[];
  stages: Record<StageKey, StageSummary>;
  bottleneck: StageKey;
  startOn: IsoDate;
  shipBy: IsoDate;
  /** Working days from the start up to and including the ship-by date. */
  totalWorkingDays: number;
};

/** Pulls to cast for `units` kept masks when a share of pulls fails: units / (1 − share), rounded up. */
export function pullsNeeded(units: number, failedBasisPoints: number): number {
  if (!Number.isSafeInteger(units) || units < 0) throw new RangeError(`units must be a whole number ≥ 0, got ${units}`);
  if (!Number.isInteger(failedBasisPoints) || failedBasisPoints < 0 || failedBasisPoints >= 10_000) {
    throw new RangeError(`The failed share must be at least 0 and below 100%, got ${failedBasisPoints / 100}%`);
  }
  // Exact in integers: ceil(units × 10000 / (10000 − bp)).
  const kept = 10_000 - failedBasisPoints;
  return Math.floor((units * 10_000 + kept - 1) / kept);
}

/** A stage that works through masks one after another, each taking its minutes, and hands them on. */
type FlowStage = {
  key: 'trimming' | 'painting' | 'packing';
  minutesFor: (item: number) => number;
  skipped: boolean;
  item: number;
  progress: number;
  doneByDay: number[];
  minutesByDay: number[];
};

function flowStage(key: FlowStage['key'], minutes: number[]): FlowStage {
  return {
    key,
    minutesFor: (item) => minutes[item]!,
    skipped: minutes.every((m) => m === 0),
    item: 0,
    progress: 0,
    doneByDay: [],
    minutesByDay: [],
  };
}

/** One day of a stage: work through what the stage before had finished by yesterday, within `capacity`. */
function workDay(stage: FlowStage, day: number, available: number, capacity: number, upstreamToday: number): number {
  if (stage.skipped) {
    stage.doneByDay[day] = upstreamToday;
    stage.minutesByDay[day] = 0;
    return 0;
  }
  let left = capacity;
  while (left > 0 && stage.item < available) {
    const need = stage.minutesFor(stage.item) - stage.progress;
    if (need <= left) {
      left -= need;
      stage.progress = 0;
      stage.item += 1;
    } else {
      stage.progress += left;
      left = 0;
    }
  }
  stage.doneByDay[day] = stage.item;
  stage.minutesByDay[day] = capacity - left;
  return capacity - left;
}

type MoldState = { id: string; label: string; isNew: boolean; readyDay: number; life: number; before: number; left: number };

export function planSchedule(input: ScheduleInput): Schedule {
  const dayAt = workingDaySequence(input.startOn, input.calendar);
  const units = input.finishes.reduce((sum, f) => sum + f.quantity, 0);
  const failedBp = Math.round(input.failedPullsPercent * 100);
  const pulls = pullsNeeded(units, failedBp);
  const need = moldNeed(pulls, input.molds, input.newMold);
  const benchMinutes = Math.round(input.calendar.hoursPerDay * 60);
  const painterMinutes = Math.round(input.painterHoursPerDay * 60);

  const molds: MoldState[] = input.molds.map((m) => ({
    id: m.id,
    label: m.label,
    isNew: false,
    readyDay: 0,
    life: m.expectedLifePulls,
    before: remainingLife(m),
    left: remainingLife(m),
  }));
  const moldMakingByDay: number[] = [];
  let newMoldLeadDays = 0;
  if (need.newMolds > 0) {
    const making = makeMold(input.newMold, benchMinutes);
    newMoldLeadDays = making.readyAfterDays;
    for (let k = 0; k < need.newMolds; k += 1) {
      const offset = k * making.readyAfterDays;
      making.minutesByDay.forEach((minutes, day) => {
        moldMakingByDay[offset + day] = (moldMakingByDay[offset + day] ?? 0) + minutes;
      });
      molds.push({
        id: `new-${k + 1}`,
        label: need.newMolds === 1 ? 'New mold' : `New mold ${k + 1}`,
        isNew: true,
        readyDay: offset + making.readyAfterDays,
        life: input.newMold.lifePulls,
        before: input.newMold.lifePulls,
        left: input.newMold.lifePulls,
      });
    }
  }

  const paintMinutes = input.finishes.flatMap((f) => Array<number>(f.quantity).fill(Math.round(f.paintHoursPerMask * 60)));
  const trimming = flowStage('trimming', Array<number>(units).fill(input.trimMinutesPerPull));
  const painting = flowStage('painting', paintMinutes);
  const packing = flowStage('packing', Array<number>(units).fill(input.packingMinutesPerOrder));

  const days: ScheduleDay[] = [];
  const keptByDay: number[] = [];
  let cast = 0;
  for (let day = 0; day === 0 || packing.doneByDay[day - 1] !== units; day += 1) {
    if (day >= maxPlanWorkingDays) throw new PlanTooLongError();
    const moldMakingMinutes = Math.min(moldMakingByDay[day] ?? 0, benchMinutes);

    let pullsToday = 0;
    const ready = molds.filter((m) => m.readyDay <= day && m.left > 0).sort((a, b) => b.left - a.left);
    for (const mold of ready) {
      const take = Math.min(input.pullsPerMoldPerDay, mold.left, pulls - cast);
      mold.left -= take;
      cast += take;
      pullsToday += take;
    }
    keptByDay[day] = cast === pulls ? units : Math.min(units, Math.floor((cast * (10_000 - failedBp)) / 10_000));

    const yesterday = (done: number[]) => (day === 0 ? 0 : done[day - 1]!);
    let bench = benchMinutes - moldMakingMinutes;
    bench -= workDay(trimming, day, yesterday(keptByDay), bench, keptByDay[day]!);
    workDay(painting, day, yesterday(trimming.doneByDay), painterMinutes, trimming.doneByDay[day]!);
    workDay(packing, day, yesterday(painting.doneByDay), bench, painting.doneByDay[day]!);

    days.push({
      index: day,
      date: dayAt(day),
      moldMakingMinutes,
      pulls: pullsToday,
      trimMinutes: trimming.minutesByDay[day]!,
      paintMinutes: painting.minutesByDay[day]!,
      packMinutes: packing.minutesByDay[day]!,
      handling: false,
      moldLife: Object.fromEntries(molds.map((m) => [m.id, m.readyDay <= day ? m.left : null])),
    });
  }

  const lastWorkDay = days.length - 1;
  for (let h = 1; h <= input.handlingDays; h += 1) {
    const day = lastWorkDay + h;
    if (day >= maxPlanWorkingDays) throw new PlanTooLongError();
    const previous = days[day - 1]!;
    days.push({
      index: day,
      date: dayAt(day),
      moldMakingMinutes: 0,
      pulls: 0,
      trimMinutes: 0,
      paintMinutes: 0,
      packMinutes: 0,
      handling: true,
      moldLife: previous.moldLife,
    });
  }

  const summary = (amount: (d: ScheduleDay) => number, ownDays: number): StageSummary => {
    const active = days.filter((d) => amount(d) > 0);
    return {
      activeDays: active.length,
      firstDate: active[0]?.date ?? null,
      lastDate: active[active.length - 1]?.date ?? null,
      work: days.reduce((sum, d) => sum + amount(d), 0),
      ownDays,
    };
  };
  const sum = (values: number[]) => values.reduce((a, b) => a + b, 0);
  const castingDays = days.filter((d) => d.pulls > 0).length;
  const stages: Record<StageKey, StageSummary> = {
    moldMaking: summary((d) => d.moldMakingMinutes, need.newMolds * newMoldLeadDays),
    casting: summary((d) => d.pulls, castingDays),
    trimming: summary((d) => d.trimMinutes, Math.ceil((units * input.trimMinutesPerPull) / benchMinutes)),
    painting: summary((d) => d.paintMinutes, Math.ceil(sum(paintMinutes) / painterMinutes)),
    packing: summary((d) => d.packMinutes, Math.ceil((units * input.packingMinutesPerOrder) / benchMinutes)),
    handling: summary((d) => (d.handling ? 1 : 0), input.handlingDays),
  };
  // The stage whose own work needs the most working days; on a tie, the earlier stage, which holds up the rest.
  const bottleneck = stageKeys.reduce((best, key) => (stages[key].ownDays > stages[best].ownDays ? key : best), stageKeys[0]);

  return {
    units,
    pulls,
    moldNeed: need,
    newMoldLeadDays,
    molds: molds.map((m) => ({
      id: m.id,
      label: m.label,
      isNew: m.isNew,
      readyOn: dayAt(m.readyDay),
      expectedLifePulls: m.life,
      remainingBefore: m.before,
      pullsInBatch: m.before - m.left,
      remainingAfter: m.left,
    })),
    days,
    stages,
    bottleneck,
    startOn: dayAt(0),
    shipBy: days[days.length - 1]!.date,
    totalWorkingDays: days.length,
  };
}
