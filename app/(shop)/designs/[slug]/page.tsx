import type { Metadata } from 'next';
import Image from 'next/image';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { connection } from 'next/server';
import { cache } from 'react';
import { Price } from '@/components/ui/price';
import { getPublishedDesignBySlugCached as getPublishedDesignBySlug } from '@/lib/catalogue/cached';
import { requestTime } from '@/lib/clock';
import { listDrops } from '@/lib/drops/catalogue';
import { designPageParamsSchema, designPageSearchSchema } from '@/lib/catalogue/schemas';
import { JoinForm } from '@/components/waitlist/join-form';
import { getCurrentUser } from '@/lib/auth/session';
import { listWaitlistDesigns } from '@/lib/waitlist/queries';
import { BatchList } from './_components/batch-list';
import { FitTable } from './_components/fit-table';

type Props = {
  params: Promise<{ slug: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
};

// Metadata and page share one database read per request.
const loadDesign = cache(async (rawSlug: string) => {
  const parsed = designPageParamsSchema.safeParse({ slug: rawSlug });
  return parsed.success ? getPublishedDesignBySlug(parsed.data.slug) : null;
});

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const design = await loadDesign((await params).slug);
  if (!design) return { title: 'Design not found' };
  return { title: `${design.name} mask`, description: design.summary };
}

export default async function DesignPage({ params, searchParams }: Props) {
  await connection();
  const design = await loadDesign((await params).slug);
  if (!design) notFound();

  const { finish: wanted } = designPageSearchSchema.parse(await searchParams);
  const selected = design.finishes.find((finish) => finish.slug === wanted) ?? design.finishes[0];
  if (!selected) notFound();

  return (
    <article className="grid gap-10 py-10 lg:grid-cols-[3fr_2fr] lg:gap-16">
      {/* On a phone the photos are a strip to swipe, so the name and price are on the first screen. */}
      <div
        role="region"
        aria-label={`Photos of ${design.name} in ${selected.name}`}
        tabIndex={0}
        className="-mx-5 flex snap-x snap-mandatory scroll-px-5 gap-3 self-start overflow-x-auto px-5 focus-visible:outline focus-visible:outline-2 sm:mx-0 sm:grid sm:grid-cols-2 sm:gap-4 sm:overflow-visible sm:px-0 sm:scroll-px-0 lg:sticky lg:top-6 lg:grid-cols-1 xl:grid-cols-2"
      >
        {selected.photos.map((photo, index) => (
          <div
            key={photo.src}
            className="relative aspect-[4/5] w-[72%] shrink-0 snap-start overflow-hidden rounded-sm bg-paper-deep sm:w-auto"
          >
            <Image
              src={photo.src}
              alt={photo.alt}
              fill
              priority={index === 0}
              sizes="(min-width: 1280px) 22rem, (min-width: 1024px) 36rem, (min-width: 640px) 45vw, 72vw"
              className="object-cover"
            />
          </div>
        ))}
      </div>

      <div>
        <p className="text-sm font-semibold uppercase tracking-[0.18em] text-ink-faint">{design.studio.name}</p>
        <h1 className="mt-2 text-5xl font-medium">{design.name}</h1>
        <p className="mt-3 text-lg text-ink-soft">{design.summary}</p>

        <p className="mt-6 text-3xl">
          <Price value={selected.price} />
          <span className="ml-2 align-middle text-base text-ink-soft">in {selected.name}</span>
        </p>

        <h2 className="mt-8 font-sans text-sm font-semibold uppercase tracking-wider text-ink-soft">Finish</h2>
        <ul className="mt-3 grid gap-2">
          {design.finishes.map((finish) => {
            const isSelected = finish.slug === selected.slug;
            return (
              <li key={finish.slug}>
                <Link
                  href={`/designs/${design.slug}?finish=${finish.slug}`}
                  scroll={false}
                  aria-current={isSelected ? 'true' : undefined}
                  className={`flex items-baseline justify-between gap-4 rounded-sm border px-4 py-3 ${
                    isSelected ? 'border-ink bg-paper-deep' : 'border-paper-edge hover:border-ink-faint'
                  }`}
                >
                  <span>
                    <span className="font-semibold">{finish.name}</span>
                    {isSelected ? <span className="sr-only"> (shown)</span> : null}
                    <span className="block text-sm text-ink-soft">{finish.description}</span>
                  </span>
                  <Price value={finish.price} className="shrink-0" />
                </Link>
              </li>
            );
          })}
        </ul>
        <p className="mt-3 text-sm text-ink-faint">
          About {selected.paintHours} hours of hand painting go into each {selected.name} mask.
        </p>

        <section className="mt-10" aria-labelledby="story-title">
          <h2 id="story-title" className="text-2xl font-medium">
            The sculpt
          </h2>
          <p className="mt-2 text-ink-soft">{design.story}</p>
        </section>

        <BatchList batches={(await listDrops()).filter((d) => d.designSlug === design.slug)} now={requestTime()} />

        <WaitlistBox slug={design.slug} name={design.name} />

        <FitTable fit={design.fit} />

        <section className="mt-10" aria-labelledby="materials-title">
          <h2 id="materials-title" className="text-2xl font-medium">
            Materials and care
          </h2>
          <p className="mt-2 text-ink-soft">{design.materials}</p>
          <p className="mt-2 text-ink-soft">{design.care}</p>
        </section>

      </div>
    </article>
  );
}

async function WaitlistBox({ slug, name }: { slug: string; name: string }) {
  const [[entry], user] = await Promise.all([listWaitlistDesigns({ slug }), getCurrentUser()]);
  if (!entry) return null;
  return (
    <div className="mt-10">
      <JoinForm compact designs={[entry]} fixedEmail={user?.email ?? null} source="design_page" heading={`Hear when the next ${name} batch opens`} />
    </div>
  );
}
