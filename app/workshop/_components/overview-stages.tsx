import Link from 'next/link';
import { boardStages, failedStages, isFailed, stageLabels, type LineStage } from '@/lib/production/stages';

/** Masks of open orders at each production stage, in the order they move. */
export function OverviewStages({ stages }: { stages: Record<LineStage, number> }) {
  const shown = [...boardStages, ...failedStages.filter((stage) => stages[stage] > 0)];
  const total = shown.reduce((n, stage) => n + stages[stage], 0);
  if (total === 0) return <p className="mt-2 rounded-sm border border-paper-edge bg-paper px-4 py-4 text-ink-soft">No open orders: nothing waits to be made.</p>;
  return (
    <>
      <dl className="mt-2 grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-6">
        {shown.map((stage) => (
          <div key={stage} className={`rounded-sm border bg-paper p-3 ${isFailed(stage) ? 'border-ember' : 'border-paper-edge'}`}>
            <dt className="text-sm text-ink-soft">{stageLabels[stage]}</dt>
            <dd className="figures text-2xl font-semibold">{stages[stage]}</dd>
          </div>
        ))}
      </dl>
      <p className="mt-2 text-sm text-ink-soft">
        {total} mask{total === 1 ? '' : 's'} in open orders.{' '}
        <Link href="/workshop/production" className="underline underline-offset-4">Production board</Link>
      </p>
    </>
  );
}
