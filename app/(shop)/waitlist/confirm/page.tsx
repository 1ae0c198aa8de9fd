import type { Metadata } from 'next';
import Link from 'next/link';
import { z } from 'zod';
import { checkConfirmLink } from '@/lib/waitlist/confirm';
import { maskEmail } from '@/lib/waitlist/schemas';
import { ConfirmActions } from './_components/confirm-actions';

export const metadata: Metadata = { title: 'Confirm your waitlist', robots: { index: false } };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };
const searchSchema = z.object({ t: z.string().max(1000).optional().catch(undefined) });

// The link only opens this page; the button confirms. Mail scanners that open every link in a message
// therefore cannot put an address on a list by themselves (common practice, no source).
export default async function ConfirmPage({ searchParams }: Props) {
  const { t } = searchSchema.parse(await searchParams);
  const link = await checkConfirmLink(t);
  return (
    <article className="max-w-2xl py-10">
      <h1 className="text-4xl font-medium">Confirm your waitlist</h1>
      {link.outcome === 'damaged' || link.outcome === 'unknown' ? (
        <div role="alert" className="mt-6 rounded-sm border border-ember/40 bg-ember-wash p-5 text-ember-deep">
          <p className="font-semibold">This link is damaged.</p>
          <p className="mt-1">
            Part of it may be missing: copy the whole link from the e-mail into your browser, or{' '}
            <Link href="/waitlist" className="underline underline-offset-4">join the waitlist again</Link> to get a new one.
          </p>
        </div>
      ) : link.outcome === 'already_confirmed' || link.outcome === 'confirmed' ? (
        <p role="status" className="mt-6 rounded-sm border border-moss/40 bg-moss-wash p-5">
          You are already on the list for <strong>{link.designName}</strong>. We write when its next batch opens.
        </p>
      ) : link.outcome === 'left' ? (
        <div className="mt-6 rounded-sm border border-paper-edge p-5">
          <p>
            You left the <strong>{link.designName}</strong> waitlist, so this old link does not put you back.
          </p>
          <p className="mt-2">
            <Link href={`/waitlist?design=${link.designSlug}`} className="font-semibold underline underline-offset-4">Join again</Link>{' '}
            to get a new confirmation link.
          </p>
        </div>
      ) : (
        <ConfirmActions token={t!} outcome={link.outcome} designName={link.designName ?? ''} email={link.email ? maskEmail(link.email) : 'your address'} />
      )}
    </article>
  );
}
