import { moldLife } from '@/lib/molds/life';

/** A mold's life used, as a bar with its numbers and state in words beside it. */
export function LifeBar({ pullsSoFar, expectedLifePulls }: { pullsSoFar: number; expectedLifePulls: number }) {
  const life = moldLife({ pullsSoFar, expectedLifePulls });
  const usedPercent = Math.min(100, Math.round(life.usedShare * 100));
  return (
    <div className="grid gap-1">
      <div className="h-2.5 w-full overflow-hidden rounded-full bg-paper-deep" aria-hidden="true">
        <div className={`h-full rounded-full ${life.nearEnd ? 'bg-ember' : 'bg-moss'}`} style={{ width: `${usedPercent}%` }} />
      </div>
      <p className="figures text-sm">
        {pullsSoFar} of {expectedLifePulls} pulls used · {life.left} left
        <span className="sr-only"> ({usedPercent}% of its expected life used)</span>
      </p>
      {life.worn ? (
        <p className="flex items-center gap-1 text-sm font-semibold text-ember-deep">
          <span aria-hidden="true">■</span> Past its expected life
        </p>
      ) : life.nearEnd ? (
        <p className="flex items-center gap-1 text-sm font-semibold text-ember-deep">
          <span aria-hidden="true">▲</span> Near the end of its life
        </p>
      ) : null}
    </div>
  );
}
