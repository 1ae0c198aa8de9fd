// A mold's life, for the workshop's bars and warnings. Plain data, safe to import anywhere.

/** Under this share of its expected life left, a mold is "near the end of its life". */
export const nearEndShare = 0.15;

export type MoldLife = {
  /** Pulls left before the expected life is used up; 0 once past it. */
  left: number;
  /** Share of the expected life used, 0–1 (above 1 for a mold cast past its expected life). */
  usedShare: number;
  nearEnd: boolean;
  worn: boolean;
};

export function moldLife({ pullsSoFar, expectedLifePulls }: { pullsSoFar: number; expectedLifePulls: number }): MoldLife {
  const left = Math.max(0, expectedLifePulls - pullsSoFar);
  return {
    left,
    usedShare: pullsSoFar / expectedLifePulls,
    nearEnd: left < nearEndShare * expectedLifePulls,
    worn: left === 0,
  };
}
