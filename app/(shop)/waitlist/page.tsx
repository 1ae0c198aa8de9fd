import type { Metadata } from 'next';
import { z } from 'zod';
import { JoinForm } from '@/components/waitlist/join-form';
import { getCurrentUser } from '@/lib/auth/session';
import { slugSchema } from '@/lib/catalogue/schemas';
import { listWaitlistDesigns } from '@/lib/waitlist/queries';

export const metadata: Metadata = { title: 'Join a waitlist' };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };
const searchSchema = z.object({ design: slugSchema.optional().catch(undefined) });

export default async function WaitlistPage({ searchParams }: Props) {
  const { design } = searchSchema.parse(await searchParams);
  const [user, designs] = await Promise.all([getCurrentUser(), listWaitlistDesigns()]);
  const preselected = designs.filter((d) => d.slug === design).map((d) => d.id);
  return (
    <article className="max-w-2xl py-10">
      <h1 className="text-4xl font-medium sm:text-5xl">Join a waitlist</h1>
      <p className="mt-3 text-lg text-ink-soft">
        Missed a drop? Tell us which designs you would like, and we write when their next batch opens. First we send one e-mail to
        confirm the address; nothing else comes until you use its link.
      </p>
      <div className="mt-8">
        {designs.length === 0 ? (
          <p className="rounded-sm border border-paper-edge p-4 text-ink-soft">There are no designs to wait for just now. Come back soon.</p>
        ) : (
          <JoinForm
            designs={designs.map(({ id, name, finishes }) => ({ id, name, finishes }))}
            fixedEmail={user?.email ?? null}
            source="waitlist_page"
            preselected={preselected}
            heading="Your waitlists"
          />
        )}
      </div>
    </article>
  );
}
