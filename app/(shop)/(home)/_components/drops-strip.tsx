import Image from 'next/image';
import Link from 'next/link';
import { Countdown } from '@/components/countdown';
import { LocalTime } from '@/components/local-time';
import type { DropSummary } from '@/lib/drops/catalogue';

/** How many of the later drops (after the next one) the home page lists. */
const LATER_SHOWN = 4;

/** The drops open now, the next drop with its countdown, and the ones announced after it with their opening time. */
export function DropsStrip({ upcoming, open, now }: { upcoming: DropSummary[]; open: DropSummary[]; now: number }) {
  const [next, ...later] = upcoming;
  if (!next && open.length === 0) return null;
  return (
    <section aria-labelledby="drops-title" className="mb-16">
      <h2 id="drops-title" className="text-3xl font-medium">
        Drops
      </h2>
      <ul className="mt-6 grid gap-6 md:grid-cols-2">
        {next ? (
          <DropCard drop={next} badge={next.earlyAccessAt ? 'Next drop · early access first' : 'Next drop'}>
            <p className="mt-1 text-ink-soft">
              {next.earlyAccessAt ? 'Early access in ' : 'Opens in '}
              <Countdown at={next.earlyAccessAt ?? next.opensAt} className="font-display text-2xl text-ember-deep" />
            </p>
          </DropCard>
        ) : null}
        {open.map((drop) => (
          <DropCard key={drop.id} drop={drop} badge={new Date(drop.opensAt).getTime() > now ? 'Early access now' : 'Open now'}>
            <p className="mt-1 text-ink-soft">
              Closes in <Countdown at={drop.closesAt} />
            </p>
          </DropCard>
        ))}
        {later.slice(0, LATER_SHOWN).map((drop) => (
          <DropCard key={drop.id} drop={drop} badge="Coming up">
            <p className="mt-1 text-ink-soft">
              {drop.earlyAccessAt ? 'Early access from ' : 'Opens '}
              <LocalTime at={drop.earlyAccessAt ?? drop.opensAt} />
            </p>
          </DropCard>
        ))}
      </ul>
    </section>
  );
}

function DropCard({ drop, badge, children }: { drop: DropSummary; badge: string; children: React.ReactNode }) {
  return (
    <li>
      <Link href={`/drops/${drop.id}`} className="group flex gap-4 rounded-sm border border-paper-edge bg-paper-deep/50 p-4 hover:border-ink-faint">
        <div className="relative h-32 w-24 shrink-0 overflow-hidden rounded-sm bg-paper-deep">
          {drop.cover ? <Image src={drop.cover.src} alt="" fill sizes="6rem" className="object-cover" /> : null}
        </div>
        <div>
          <p className="text-xs font-semibold uppercase tracking-wider text-ember-deep">{badge}</p>
          <h3 className="mt-1 text-2xl font-medium group-hover:underline group-hover:underline-offset-4">
            {drop.designName}: {drop.name}
          </h3>
          {children}
          <p className="mt-1 text-sm text-ink-faint">{drop.units} masks in this batch</p>
        </div>
      </Link>
    </li>
  );
}
