import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getCurrentUser } from '@/lib/auth/session';
import { hasEarlyAccess } from '@/lib/waitlist/early-access';
import { getDrop } from '@/lib/drops/catalogue';
import { batchIdSchema } from '@/lib/drops/schemas';
import { JoinForm } from '@/components/waitlist/join-form';
import { listWaitlistDesigns } from '@/lib/waitlist/queries';
import { BatchPhotos } from './_components/batch-photos';
import { DropLive } from './_components/drop-live';

type Props = { params: Promise<{ batchId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> };

async function load(raw: string) {
  const id = batchIdSchema.safeParse(raw);
  return id.success ? getDrop(id.data) : null;
}

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const drop = await load((await params).batchId);
  return drop ? { title: `${drop.design.name}: ${drop.name}`, description: drop.design.summary } : { title: 'Drop not found' };
}

export default async function DropPage({ params, searchParams }: Props) {
  const drop = await load((await params).batchId);
  if (!drop) notFound();
  const user = await getCurrentUser();
  const [waitlistDesign] = await listWaitlistDesigns({ slug: drop.design.slug });
  const earlyAccess = Boolean(user && drop.earlyAccessAt && (await hasEarlyAccess(drop.id, user.id)));
  const finishCount = drop.finishes.length;
  return (
    <article className="py-10">
      <p className="text-sm font-semibold uppercase tracking-[0.18em] text-ink-faint">{drop.studio.name} · drop</p>
      <h1 className="mt-2 text-4xl font-medium sm:text-5xl">
        {drop.design.name}: {drop.name}
      </h1>
      <p className="mt-3 max-w-2xl text-lg text-ink-soft">{drop.design.summary}</p>
      {drop.announcement ? <p className="mt-3 max-w-2xl whitespace-pre-line">{drop.announcement}</p> : null}
      <ul className="mt-4 flex flex-wrap gap-x-6 gap-y-1 text-sm text-ink-soft">
        <li>
          {finishCount} {finishCount === 1 ? 'finish' : 'finishes'}
        </li>
        <li>
          Up to {drop.perBuyerLimit} per buyer
        </li>
        <li>Held for {drop.holdMinutes} minutes while you pay</li>
        <li>
          Ships by <time dateTime={drop.shipBy}>{new Date(`${drop.shipBy}T12:00:00Z`).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })}</time>
        </li>
        <li>
          <Link href={`/designs/${drop.design.slug}`} className="underline underline-offset-4">
            About the design
          </Link>
        </li>
      </ul>
      <BatchPhotos photos={drop.photos} />
      <div className="mt-8">
        {(await searchParams).early === 'granted' ? (
          <p role="status" className="mb-4 rounded-sm border border-moss/40 bg-moss-wash p-3">
            Early access is yours: you may hold a mask from the moment early access starts, before the drop opens to everyone.
          </p>
        ) : null}
        <DropLive
          drop={drop}
          signedIn={Boolean(user)}
          earlyAccess={earlyAccess}
          returnedFromCheckout={(await searchParams).checkout === 'cancelled'}
          waitlistForm={
            waitlistDesign ? (
              <JoinForm compact designs={[waitlistDesign]} fixedEmail={user?.email ?? null} source="drop_page" heading={`Missed it? Wait for the next ${drop.design.name} batch`} />
            ) : null
          }
        />
      </div>
    </article>
  );
}
