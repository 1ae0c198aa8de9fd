import Link from 'next/link';
import { formatInZone } from '@/lib/drops/phase';
import type { DropSummary } from '@/lib/reports/overview';

function DropList({ drops, empty, zone, when }: { drops: DropSummary[]; empty: string; zone: string; when: (d: DropSummary) => string }) {
  if (drops.length === 0) return <p className="mt-2 rounded-sm border border-paper-edge bg-paper px-4 py-4 text-ink-soft">{empty}</p>;
  return (
    <ul className="mt-2 divide-y divide-paper-edge rounded-sm border border-paper-edge bg-paper">
      {drops.map((drop) => (
        <li key={drop.id} className="grid gap-1 px-4 py-3">
          <p className="font-semibold">
            <Link href={`/workshop/batches/${drop.id}`} className="underline underline-offset-4">
              {drop.designName}: {drop.name}
            </Link>
            {drop.status === 'cancelled' ? <span className="ml-2 text-sm font-normal text-ink-faint">(cancelled)</span> : null}
          </p>
          <p className="text-sm text-ink-soft">
            {when(drop)} <time dateTime={drop.openedAt} className="figures">{formatInZone(new Date(drop.openedAt), zone)}</time> ·{' '}
            <span className="figures">{drop.sold} of {drop.stock}</span> sold ·{' '}
            <Link href={`/workshop/batches/${drop.id}/report`} className="underline underline-offset-4">Drop report</Link>
          </p>
        </li>
      ))}
    </ul>
  );
}

/** The drops still to come (or running) and the latest that opened. */
export function OverviewDrops({ next, last, zone, now }: { next: DropSummary[]; last: DropSummary[]; zone: string; now: number }) {
  return (
    <div className="grid gap-6 md:grid-cols-2">
      <div>
        <h3 className="font-sans text-sm font-semibold">Next drops</h3>
        <DropList drops={next} zone={zone} empty="No drop is scheduled." when={(d) => (new Date(d.openedAt).getTime() <= now ? 'Open since' : 'Opens')} />
      </div>
      <div>
        <h3 className="font-sans text-sm font-semibold">Latest drops</h3>
        <DropList drops={last} zone={zone} empty="No drop has opened yet." when={() => 'Opened'} />
      </div>
    </div>
  );
}
