import { describe, expect, it } from 'vitest';
import { addWorkingDays, toDayNumber } from '@/lib/planner/calendar';
import { makeMold, moldNeed } from '@/lib/planner/mold-making';
import { largestBatchBy, shareByWeight } from '@/lib/planner/plan';
import { planSchedule, pullsNeeded } from '@/lib/planner/schedule';
import { scheduleInputSchema, type ScheduleInput } from '@/lib/planner/schemas';

// Worked examples are computed by hand in the comments beside them; the code under test must reach the
// same numbers. 2027-03-01 is a Monday (so are 2027-01-04 and 2027-02-01, four weeks apart each).

const newMold = { lifePulls: 40, siliconeCoats: 5, coatCureHours: 1, jacketHalves: 2, jacketLayersPerHalf: 3, jacketLayerHours: 1.5 };

function input(overrides: Partial<Record<keyof ScheduleInput, unknown>> = {}): ScheduleInput {
  return scheduleInputSchema.parse({
    finishes: [
      { finishId: 'old-bone', name: 'Old Bone', quantity: 4, paintHoursPerMask: 3, priceMinor: 24000 },
      { finishId: 'verdigris', name: 'Verdigris', quantity: 2, paintHoursPerMask: 5, priceMinor: 27500 },
    ],
    calendar: { workingDays: [1, 2, 3, 4, 5], hoursPerDay: 7, holidays: [] },
    startOn: '2027-03-01',
    pullsPerMoldPerDay: 3,
    failedPullsPercent: 0,
    trimMinutesPerPull: 30,
    painterHoursPerDay: 6,
    packingMinutesPerOrder: 20,
    handlingDays: 1,
    molds: [{ id: 'a', label: 'Ibex A', pullsSoFar: 0, expectedLifePulls: 40 }],
    newMold,
    ...overrides,
  });
}

describe('pulls needed', () => {
  it('is units / (1 − failed share), rounded up', () => {
    // 30 masks over three finishes (10 + 10 + 10), 10% of pulls fail: 30 / 0.9 = 33.3… → 34 pulls.
    expect(pullsNeeded(30, 1000)).toBe(34);
    // 27 / 0.9 = 30 exactly: no pull more than needed (a float division would give 30.000000000000004 → 31).
    expect(pullsNeeded(27, 1000)).toBe(30);
    // No failures: one pull per mask. 12.5% of 7: 7 / 0.875 = 8 exactly.
    expect(pullsNeeded(12, 0)).toBe(12);
    expect(pullsNeeded(7, 1250)).toBe(8);
    expect(() => pullsNeeded(5, 10_000)).toThrow(RangeError);
  });

  it('30 masks, 10% failed, 2 molds × 3 pulls a day: 34 pulls in 6 working days of casting', () => {
    const schedule = planSchedule(
      input({
        finishes: [
          { finishId: 'old-bone', name: 'Old Bone', quantity: 10, paintHoursPerMask: 3, priceMinor: 24000 },
          { finishId: 'bog-oak', name: 'Bog Oak', quantity: 10, paintHoursPerMask: 3.5, priceMinor: 25500 },
          { finishId: 'verdigris', name: 'Verdigris', quantity: 10, paintHoursPerMask: 5, priceMinor: 27500 },
        ],
        failedPullsPercent: 10,
        molds: [
          { id: 'a', label: 'A', pullsSoFar: 5, expectedLifePulls: 40 },
          { id: 'b', label: 'B', pullsSoFar: 10, expectedLifePulls: 40 },
        ],
      }),
    );
    expect(schedule.units).toBe(30);
    expect(schedule.pulls).toBe(34);
    // 2 molds × 3 pulls = 6 pulls a day; 34 / 6 = 5.67 → 6 working days: 6+6+6+6+6 = 30, then 4 on day 6.
    expect(schedule.stages.casting.activeDays).toBe(6);
    expect(schedule.days.slice(0, 6).map((d) => d.pulls)).toEqual([6, 6, 6, 6, 6, 4]);
    expect(schedule.moldNeed.newMolds).toBe(0);
    // Life left: A had 35, B 30, 65 in all; 34 pulls used → 31 left. The fuller mold takes the odd pulls:
    // 5 days × 3 each, then A (35 − 15 = 20 left, more than B's 15) gives 3 and B 1 on day 6.
    expect(schedule.molds.map((m) => [m.id, m.pullsInBatch, m.remainingAfter])).toEqual([
      ['a', 18, 17],
      ['b', 16, 14],
    ]);
    // Painting: 10 × 3 h + 10 × 3.5 h + 10 × 5 h = 115 h at 6 h a day → 19.17 → 20 working days of its own.
    expect(schedule.stages.painting.ownDays).toBe(20);
    expect(schedule.bottleneck).toBe('painting');
  });
});

describe('the day-by-day schedule, worked by hand', () => {
  it('6 masks, one mold, no failures: ships Wednesday 10 March', () => {
    const schedule = planSchedule(input());
    // Casting: 6 pulls, one mold × 3 a day → Mon 1 (3), Tue 2 (3).
    // Trimming, 30 min a pull within 7 h: Tue 2 trims Monday's 3 (90 min), Wed 3 Tuesday's 3 (90 min).
    // Painting, 6 h = 360 min a day; Old Bone 180 min, Verdigris 300 min, in that order:
    //   Wed 3: the 3 trimmed by Tuesday → OB1, OB2 (360).   Thu 4: OB3, OB4 (360).
    //   Fri 5: V1 (300) and 60 min of V2.                    Mon 8: the rest of V2 (240).
    // Packing, 20 min an order, the day after painting: Thu 4: 2 (40). Fri 5: 2 (40). Mon 8: 1 (20). Tue 9: 1 (20).
    // Handling: 1 working day → Wed 10 March is the ship-by date.
    expect(schedule.days.map((d) => [d.date, d.pulls, d.trimMinutes, d.paintMinutes, d.packMinutes, d.handling])).toEqual([
      ['2027-03-01', 3, 0, 0, 0, false],
      ['2027-03-02', 3, 90, 0, 0, false],
      ['2027-03-03', 0, 90, 360, 0, false],
      ['2027-03-04', 0, 0, 360, 40, false],
      ['2027-03-05', 0, 0, 360, 40, false],
      ['2027-03-08', 0, 0, 240, 20, false],
      ['2027-03-09', 0, 0, 0, 20, false],
      ['2027-03-10', 0, 0, 0, 0, true],
    ]);
    expect(schedule.shipBy).toBe('2027-03-10');
    expect(schedule.totalWorkingDays).toBe(8);
    // Own days: casting 2; trimming 180/420 → 1; painting (4×180 + 2×300)/360 = 3.67 → 4; packing 120/420 → 1;
    // handling 1. Painting needs the most working days of its own work.
    expect(Object.fromEntries(Object.entries(schedule.stages).map(([k, s]) => [k, s.ownDays]))).toEqual({
      moldMaking: 0, casting: 2, trimming: 1, painting: 4, packing: 1, handling: 1,
    });
    expect(schedule.bottleneck).toBe('painting');
    expect(schedule.stages.painting).toMatchObject({ activeDays: 4, firstDate: '2027-03-03', lastDate: '2027-03-08', work: 1320 });
  });

  it('a studio holiday on Friday 5 March moves everything after it by one working day', () => {
    const schedule = planSchedule(input({ calendar: { workingDays: [1, 2, 3, 4, 5], hoursPerDay: 7, holidays: ['2027-03-05'] } }));
    expect(schedule.days.map((d) => d.date)).not.toContain('2027-03-05');
    // Same eight working days, Fri 5 skipped: Mon 1 … Thu 4, Mon 8, Tue 9, Wed 10, Thu 11.
    expect(schedule.shipBy).toBe('2027-03-11');
    expect(schedule.days[4]).toMatchObject({ date: '2027-03-08', paintMinutes: 360 });
  });

  it('a start on a Saturday begins on the Monday', () => {
    const schedule = planSchedule(input({ startOn: '2027-02-27' }));
    expect(schedule.startOn).toBe('2027-03-01');
    expect(schedule.shipBy).toBe('2027-03-10');
  });

  it('a stage with no work adds no day: without trimming, painting starts the day after casting', () => {
    const schedule = planSchedule(input({ trimMinutesPerPull: 0 }));
    // Mon 1 casts 3; Tue 2 paints OB1, OB2 from them (360). One day earlier than with trimming.
    expect(schedule.days[1]).toMatchObject({ date: '2027-03-02', trimMinutes: 0, paintMinutes: 360 });
    expect(schedule.shipBy).toBe('2027-03-09');
  });

  it('handling days run after the last box and end on the ship-by date', () => {
    const base = planSchedule(input({ handlingDays: 0 }));
    const lastPacked = base.stages.packing.lastDate!;
    expect(base.shipBy).toBe(lastPacked);
    for (const handlingDays of [1, 2, 5]) {
      const schedule = planSchedule(input({ handlingDays }));
      expect(schedule.shipBy).toBe(addWorkingDays(lastPacked, handlingDays, { workingDays: [1, 2, 3, 4, 5], holidays: [] }));
      expect(schedule.days.filter((d) => d.handling)).toHaveLength(handlingDays);
    }
  });
});

describe('molds: life left and the new-mold decision', () => {
  it('needs no new mold while the molds have the pulls in them', () => {
    expect(moldNeed(34, [{ pullsSoFar: 5, expectedLifePulls: 40 }, { pullsSoFar: 10, expectedLifePulls: 40 }], newMold)).toEqual({
      remainingPulls: 65, shortfallPulls: 0, newMolds: 0,
    });
    // Exactly enough is enough: 40 left, 40 needed.
    expect(moldNeed(40, [{ pullsSoFar: 0, expectedLifePulls: 40 }], newMold).newMolds).toBe(0);
  });

  it('needs as many new molds as the shortfall takes, and a worn-out mold counts for nothing', () => {
    // 2 left; 5 needed → 3 short → one new mold of 40.
    expect(moldNeed(5, [{ pullsSoFar: 38, expectedLifePulls: 40 }], newMold)).toEqual({ remainingPulls: 2, shortfallPulls: 3, newMolds: 1 });
    // Past its expected life: 0 left, not −4. 90 needed → 90 short → ⌈90 / 40⌉ = 3 new molds.
    expect(moldNeed(90, [{ pullsSoFar: 44, expectedLifePulls: 40 }], newMold)).toEqual({ remainingPulls: 0, shortfallPulls: 90, newMolds: 3 });
  });

  it('takes a new mold step by step: coats, then each jacket half and its night', () => {
    const making = makeMold(newMold, 7 * 60);
    // Day 1: 5 coats × 60 min = 300, then jacket layer 1 (90) → 390; layer 2 would end at 480 > 420.
    // Day 2: layers 2 and 3 → 180; first half cures overnight.
    // Day 3: second half, 3 × 90 = 270; cures overnight. Day 4 morning: demold, ready to cast.
    expect(making.minutesByDay).toEqual([390, 180, 270]);
    expect(making.readyAfterDays).toBe(3);
    // One jacket half only: day 1 (390), day 2 (180), night → ready on day 3, index 2.
    expect(makeMold({ ...newMold, jacketHalves: 1 }, 7 * 60)).toEqual({ minutesByDay: [390, 180], readyAfterDays: 2 });
  });

  it('casts with the old mold while the new one is made, and counts both lives after the batch', () => {
    const schedule = planSchedule(
      input({
        finishes: [{ finishId: 'old-bone', name: 'Old Bone', quantity: 5, paintHoursPerMask: 3, priceMinor: 24000 }],
        trimMinutesPerPull: 20,
        molds: [{ id: 'a', label: 'Ibex A', pullsSoFar: 38, expectedLifePulls: 40 }],
      }),
    );
    expect(schedule.moldNeed).toEqual({ remainingPulls: 2, shortfallPulls: 3, newMolds: 1 });
    expect(schedule.newMoldLeadDays).toBe(3);
    // Mon 1: Ibex A gives its last 2 pulls while mold making starts (390 min). Tue 2, Wed 3: no mold left.
    // Thu 4: the new mold is ready and gives 3 pulls. 2 + 3 = 5.
    expect(schedule.days.slice(0, 4).map((d) => [d.date, d.moldMakingMinutes, d.pulls])).toEqual([
      ['2027-03-01', 390, 2],
      ['2027-03-02', 180, 0],
      ['2027-03-03', 270, 0],
      ['2027-03-04', 0, 3],
    ]);
    // Trimming shares the bench with mold making: Tue 2 trims the 2 pulls (40 min) in the 240 min left.
    expect(schedule.days[1]!.trimMinutes).toBe(40);
    expect(schedule.molds).toEqual([
      { id: 'a', label: 'Ibex A', isNew: false, readyOn: '2027-03-01', expectedLifePulls: 40, remainingBefore: 2, pullsInBatch: 2, remainingAfter: 0 },
      { id: 'new-1', label: 'New mold', isNew: true, readyOn: '2027-03-04', expectedLifePulls: 40, remainingBefore: 40, pullsInBatch: 3, remainingAfter: 37 },
    ]);
    expect(schedule.days[1]!.moldLife).toEqual({ a: 0, 'new-1': null });
    expect(schedule.days[3]!.moldLife).toEqual({ a: 0, 'new-1': 37 });
  });

  it('makes two new molds one after the other from the one master', () => {
    const schedule = planSchedule(
      input({
        finishes: [{ finishId: 'old-bone', name: 'Old Bone', quantity: 50, paintHoursPerMask: 0, priceMinor: 24000 }],
        molds: [],
      }),
    );
    expect(schedule.moldNeed.newMolds).toBe(2);
    expect(schedule.molds.map((m) => m.readyOn)).toEqual(['2027-03-04', '2027-03-09']); // day 3 and day 6
    expect(schedule.stages.moldMaking.ownDays).toBe(6);
  });
});

describe('the largest batch by a date', () => {
  const configurations: [string, ScheduleInput][] = [
    ['the hand-worked two-finish plan', input()],
    [
      'three finishes, two molds, 10% failed, a holiday',
      input({
        finishes: [
          { finishId: 'old-bone', name: 'Old Bone', quantity: 10, paintHoursPerMask: 3, priceMinor: 24000 },
          { finishId: 'bog-oak', name: 'Bog Oak', quantity: 6, paintHoursPerMask: 3.5, priceMinor: 25500 },
          { finishId: 'verdigris', name: 'Verdigris', quantity: 4, paintHoursPerMask: 5, priceMinor: 27500 },
        ],
        failedPullsPercent: 10,
        calendar: { workingDays: [1, 2, 3, 4, 5], hoursPerDay: 7, holidays: ['2027-03-17'] },
        molds: [
          { id: 'a', label: 'A', pullsSoFar: 30, expectedLifePulls: 40 },
          { id: 'b', label: 'B', pullsSoFar: 12, expectedLifePulls: 40 },
        ],
        handlingDays: 2,
      }),
    ],
    ['a worn mold, so bigger batches need new molds', input({ molds: [{ id: 'a', label: 'A', pullsSoFar: 36, expectedLifePulls: 40 }] })],
  ];

  for (const [name, config] of configurations) {
    it(`${name}: the ship-by date never comes earlier as the batch grows`, () => {
      const weights = config.finishes.map((f) => f.quantity);
      let previous = -Infinity;
      for (let total = 1; total <= 120; total += 1) {
        const counts = shareByWeight(total, weights);
        const day = toDayNumber(planSchedule({ ...config, finishes: config.finishes.map((f, i) => ({ ...f, quantity: counts[i]! })) }).shipBy);
        expect(day, `${total} masks`).toBeGreaterThanOrEqual(previous);
        previous = day;
      }
    });

    it(`${name}: agrees with the forward computation at the boundary`, () => {
      const weights = config.finishes.map((f) => f.quantity);
      const shaped = (total: number) => {
        const counts = shareByWeight(total, weights);
        return { ...config, finishes: config.finishes.map((f, i) => ({ ...f, quantity: counts[i]! })) };
      };
      for (const target of ['2027-03-12', '2027-03-26', '2027-04-30', '2027-06-30']) {
        const best = largestBatchBy(config, target);
        expect(best.quantity).toBeGreaterThan(0);
        const atBest = planSchedule(shaped(best.quantity));
        const oneMore = planSchedule(shaped(best.quantity + 1));
        expect(atBest.shipBy <= target, `${best.quantity} masks ship ${atBest.shipBy}, by ${target}`).toBe(true);
        expect(oneMore.shipBy > target, `${best.quantity + 1} masks ship ${oneMore.shipBy}, after ${target}`).toBe(true);
        expect(best.shipBy).toBe(atBest.shipBy);
        expect(best.perFinish.reduce((s, f) => s + f.quantity, 0)).toBe(best.quantity);
      }
    });
  }

  it("finds at least the batch a forward plan ships by that plan's own date", () => {
    const forward = planSchedule(input());
    expect(largestBatchBy(input(), forward.shipBy).quantity).toBeGreaterThanOrEqual(forward.units);
  });

  it('answers none when not even one mask ships by the date', () => {
    // One mask: cast Mon 1, trimmed Tue 2, painted Wed 3, packed Thu 4, handled Fri 5.
    expect(largestBatchBy(input(), '2027-03-04')).toMatchObject({ quantity: 0, shipBy: null });
    expect(largestBatchBy(input(), '2027-03-05').quantity).toBeGreaterThanOrEqual(1);
  });

  it('shares masks over finishes in the plan’s proportions, never taking one away as the batch grows', () => {
    // 4 : 2 is 2 : 1, so 10 masks are 6.67 : 3.33 → 7 : 3 (ties go to the earlier finish).
    expect(shareByWeight(10, [4, 2])).toEqual([7, 3]);
    expect(shareByWeight(6, [4, 2])).toEqual([4, 2]);
    expect(shareByWeight(5, [1, 0, 1])).toEqual([3, 0, 2]);
    expect(shareByWeight(3, [0, 0])).toEqual([2, 1]);
    for (let total = 1; total < 60; total += 1) {
      const before = shareByWeight(total - 1, [10, 6, 4]);
      const after = shareByWeight(total, [10, 6, 4]);
      after.forEach((count, i) => expect(count).toBeGreaterThanOrEqual(before[i]!));
    }
  });
});
