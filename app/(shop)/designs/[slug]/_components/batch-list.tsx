import Link from 'next/link';
import type { DropSummary } from '@/lib/drops/catalogue';

const dateFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });

/** Coming and past batches of one design, newest first. */
export function BatchList({ batches, now }: { batches: DropSummary[]; now: number }) {
  const coming = batches.filter((b) => new Date(b.closesAt).getTime() > now);
  const past = batches.filter((b) => new Date(b.closesAt).getTime() <= now).reverse();
  return (
    <section className="mt-10" aria-labelledby="batches-title">
      <h2 id="batches-title" className="text-2xl font-medium">
        Batches
      </h2>
      {batches.length === 0 ? <p className="mt-2 text-ink-soft">No batch has been announced yet.</p> : null}
      <ul className="mt-3 grid gap-2">
        {coming.map((b) => (
          <li key={b.id}>
            <Link href={`/drops/${b.id}`} className="flex justify-between gap-3 rounded-sm border border-ink px-4 py-3 hover:bg-paper-deep">
              <span className="font-semibold">{b.name}</span>
              <span className="text-sm text-ink-soft">
                {new Date(b.opensAt).getTime() > now ? 'coming' : 'open now'} · {b.units} masks
              </span>
            </Link>
          </li>
        ))}
        {past.map((b) => (
          <li key={b.id} className="flex justify-between gap-3 rounded-sm border border-paper-edge px-4 py-3 text-ink-soft">
            <span>{b.name}</span>
            <span className="text-sm">
              {b.units} masks · shipped by {dateFormat.format(new Date(`${b.shipBy}T12:00:00Z`))}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
