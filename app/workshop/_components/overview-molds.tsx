import Link from 'next/link';
import { nearEndShare } from '@/lib/molds/life';
import type { WornMold } from '@/lib/reports/overview';

/** Molds in use with less than the near-end share of their expected life left. */
export function OverviewMolds({ molds }: { molds: WornMold[] }) {
  const share = Math.round(nearEndShare * 100);
  return molds.length === 0 ? (
    <p className="mt-2 rounded-sm border border-paper-edge bg-paper px-4 py-4 text-ink-soft">
      Every mold in use has more than {share}% of its life left. <Link href="/workshop/molds" className="underline underline-offset-4">Molds</Link>
    </p>
  ) : (
    <>
      <ul className="mt-2 divide-y divide-paper-edge rounded-sm border border-paper-edge bg-paper">
        {molds.map((mold) => (
          <li key={mold.id} className="flex flex-wrap items-baseline justify-between gap-2 px-4 py-2">
            <span>
              <span className="font-semibold">{mold.designName}</span>, {mold.label}
            </span>
            <span className={`figures text-sm ${mold.left === 0 ? 'font-semibold text-ember-deep' : 'text-ink-soft'}`}>
              {mold.left === 0 ? (
                <>
                  <span aria-hidden="true">▲ </span>worn out: {mold.pullsSoFar} of {mold.expectedLifePulls} pulls
                </>
              ) : (
                `${mold.left} pull${mold.left === 1 ? '' : 's'} left of ${mold.expectedLifePulls}`
              )}
            </span>
          </li>
        ))}
      </ul>
      <p className="mt-2 text-sm text-ink-soft">
        Under {share}% of their life left: plan new molds before the next batch. <Link href="/workshop/molds" className="underline underline-offset-4">Molds</Link>
      </p>
    </>
  );
}
