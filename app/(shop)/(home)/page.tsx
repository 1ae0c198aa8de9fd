import { connection } from 'next/server';
import { listDesignsForHomeCached as listDesignsForHome } from '@/lib/catalogue/cached';
import { requestTime } from '@/lib/clock';
import { listDrops } from '@/lib/drops/catalogue';
import { DesignCard } from './_components/design-card';
import { DropsStrip } from './_components/drops-strip';

export default async function HomePage() {
  // Rendered per request (the countdowns follow the clock), from cached catalogue reads.
  await connection();
  const [{ studio, designs }, drops] = await Promise.all([listDesignsForHome(), listDrops()]);
  const now = requestTime();
  const open = drops.filter((d) => new Date(d.earlyAccessAt ?? d.opensAt).getTime() <= now && new Date(d.closesAt).getTime() > now);
  const upcoming = drops.filter((d) => new Date(d.earlyAccessAt ?? d.opensAt).getTime() > now);

  return (
    <>
      <section className="py-14 sm:py-20">
        <p className="text-sm font-semibold uppercase tracking-[0.18em] text-ink-faint">
          {studio ? studio.name : 'A studio shop'}
        </p>
        <h1 className="mt-3 max-w-3xl text-4xl font-medium leading-[1.1] sm:text-6xl">
          Masks sculpted, cast and painted by hand, in small numbered batches.
        </h1>
        <p className="mt-5 max-w-2xl text-lg text-ink-soft">
          Each design is sculpted once, molded in silicone and cast a few pulls a day, then painted in the finish
          you choose. Batches are small, so they open at an announced time.
        </p>
      </section>

      <DropsStrip upcoming={upcoming} open={open} now={now} />

      <section id="designs" aria-labelledby="designs-title" className="scroll-mt-8">
        <h2 id="designs-title" className="text-3xl font-medium">
          Designs
        </h2>
        {designs.length === 0 ? (
          <div className="mt-6 rounded-sm border border-dashed border-paper-edge p-10 text-center">
            <p className="text-lg">No designs are on show yet.</p>
            <p className="mt-1 text-ink-soft">The studio is still at the bench. Come back soon.</p>
          </div>
        ) : (
          <ul className="mt-8 grid gap-x-8 gap-y-14 sm:grid-cols-2 lg:grid-cols-3">
            {designs.map((design, index) => (
              <DesignCard key={design.slug} design={design} priority={index < 2} />
            ))}
          </ul>
        )}
      </section>
    </>
  );
}
