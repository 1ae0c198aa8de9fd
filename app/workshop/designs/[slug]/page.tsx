import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { connection } from 'next/server';
import { cache } from 'react';
import { z } from 'zod';
import { requirePageRole } from '@/lib/auth/authorize';
import { hasRole } from '@/lib/auth/roles';
import { getCurrentUser } from '@/lib/auth/session';
import { getDesignForEditing } from '@/lib/catalogue/editing';
import { DesignForm } from '../_components/design-form';
import { DesignStatusControl } from '../_components/design-status-control';
import { FinishesSection } from '../_components/finishes-section';
import { PhotoGroups, type PhotoGroup } from '../_components/photos-section';
import { DesignFacts, MaterialsCaution, ReadOnlyNotice } from '../_components/read-only';
import { StatusBadge, statusLabels } from '../_components/status';
import { UploadPhotos } from '../_components/upload-photos';

type Props = {
  params: Promise<{ slug: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
};

const searchSchema = z.object({ done: z.enum(['created', 'moved']).optional().catch(undefined) });

// Metadata and page share one read per request.
const loadDesign = cache((slug: string) => getDesignForEditing(slug));

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  // Draft names stay in the workshop: only its people get them in the title.
  const user = await getCurrentUser();
  if (!user || !hasRole(user.role, 'staff')) return { title: 'Design' };
  const design = await loadDesign((await params).slug);
  return { title: design ? design.name : 'Design not found' };
}

export default async function WorkshopDesignPage({ params, searchParams }: Props) {
  const { slug } = await params;
  const user = await requirePageRole('staff', `/workshop/designs/${slug}`);
  await connection();
  const design = await loadDesign(slug);
  if (!design) notFound();
  const { done } = searchSchema.parse(await searchParams);
  const isOwner = user.role === 'owner';
  const parcelMissing = [design.measures.parcelLengthMm, design.measures.parcelWidthMm, design.measures.parcelHeightMm, design.measures.parcelWeightG].some(
    (value) => value === null,
  );

  const photoGroups: PhotoGroup[] = [
    { key: 'design', title: `Photos of ${design.name} as a whole`, photos: design.photos },
    ...design.finishes.map((finish) => ({
      key: finish.id,
      title: `Photos of ${finish.name} (${statusLabels[finish.status].toLowerCase()})`,
      photos: finish.photos,
    })),
  ];

  return (
    <div className="grid max-w-4xl gap-8">
      <div>
        <p className="text-sm">
          <Link href="/workshop/designs" className="underline underline-offset-4">
            Designs
          </Link>{' '}
          <span aria-hidden="true">/</span> {design.name}
        </p>
        <h1 className="mt-2 flex flex-wrap items-center gap-3 text-3xl font-medium">
          {design.name} <StatusBadge status={design.status} withMeaning />
        </h1>
        {design.status === 'published' ? (
          <p className="mt-1">
            <Link href={`/designs/${design.slug}`} className="underline underline-offset-4">
              See {design.name} in the shop
            </Link>
          </p>
        ) : null}
        {done === 'created' ? (
          <p role="status" className="mt-4 rounded-sm border border-moss/40 bg-moss-wash px-4 py-3 text-moss">
            {design.name} is created as a draft. Add its finishes and photos below, then publish it.
          </p>
        ) : done === 'moved' ? (
          <p role="status" className="mt-4 rounded-sm border border-moss/40 bg-moss-wash px-4 py-3 text-moss">
            Saved. The design’s address is now /designs/{design.slug}.
          </p>
        ) : null}
        {parcelMissing ? (
          <p className="mt-4 flex gap-2 rounded-sm border border-ember bg-ember-wash px-4 py-3 text-ember-deep">
            <span aria-hidden="true">▲</span>
            <span>
              Buyers cannot pay for {design.name} until its parcel size and packed weight are all set: checkout prices
              shipping from them.
            </span>
          </p>
        ) : null}
      </div>

      {isOwner ? (
        <>
          <DesignStatusControl designId={design.id} name={design.name} status={design.status} problems={design.publishProblems} />
          <section aria-labelledby="design-fields-title" className="grid gap-3">
            <h2 id="design-fields-title" className="text-2xl font-medium">
              The design
            </h2>
            <DesignForm
              mode="edit"
              designId={design.id}
              currency={design.currency}
              published={design.status === 'published'}
              values={{
                name: design.name,
                slug: design.slug,
                summary: design.summary,
                story: design.story,
                basePrice: design.basePrice,
                materials: design.materials,
                care: design.care,
                measures: design.measures,
              }}
            />
          </section>
          <FinishesSection
            design={{
              id: design.id,
              name: design.name,
              status: design.status,
              currency: design.currency,
              basePriceMinor: design.basePriceMinor,
            }}
            finishes={design.finishes}
          />
        </>
      ) : (
        <>
          <ReadOnlyNotice />
          <DesignFacts design={design} />
        </>
      )}

      <section aria-labelledby="photos-title" className="grid gap-4">
        <h2 id="photos-title" className="text-2xl font-medium">
          Photos
        </h2>
        <p className="text-ink-soft">
          The shop shows each published finish’s photos on the design page, in the order below. Every photo needs a
          description for people who cannot see it.
        </p>
        {isOwner ? <UploadPhotos designId={design.id} finishes={design.finishes.map(({ id, name }) => ({ id, name }))} /> : null}
        <PhotoGroups groups={photoGroups} editable={isOwner} />
      </section>

      <MaterialsCaution />
    </div>
  );
}
