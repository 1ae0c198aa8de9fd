import type { Metadata } from 'next';
import Link from 'next/link';
import { z } from 'zod';
import { getUnsubscribeView } from '@/lib/waitlist/queries';
import { LeaveButtons } from './_components/leave-buttons';

export const metadata: Metadata = { title: 'Leave a waitlist', robots: { index: false } };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };
const searchSchema = z.object({ t: z.string().max(1000).optional().catch(undefined) });

// Opening the page leaves nothing (a mail scanner may open it); the buttons post to the one-click endpoint.
export default async function UnsubscribePage({ searchParams }: Props) {
  const { t } = searchSchema.parse(await searchParams);
  const view = await getUnsubscribeView({ token: t });
  return (
    <article className="max-w-2xl py-10">
      <h1 className="text-4xl font-medium">Leave a waitlist</h1>
      {!view ? (
        <div role="alert" className="mt-6 rounded-sm border border-ember/40 bg-ember-wash p-5 text-ember-deep">
          <p className="font-semibold">This link is damaged.</p>
          <p className="mt-1">
            Copy the whole link from the e-mail into your browser, or sign in and leave from{' '}
            <Link href="/account" className="underline underline-offset-4">your account</Link>.
          </p>
        </div>
      ) : (
        <>
          <p className="mt-4 text-lg">
            {view.designName ? (
              <>
                You are about to leave the <strong>{view.designName}</strong> waitlist{view.maskedEmail ? ` for ${view.maskedEmail}` : ''}.
              </>
            ) : (
              'You are about to leave this waitlist.'
            )}{' '}
            You will get no more e-mails about it.
          </p>
          {view.alreadyLeft ? <p className="mt-2 text-ink-soft">This address has already left it; leaving again changes nothing.</p> : null}
          <LeaveButtons token={t!} otherEntries={view.otherEntries} />
        </>
      )}
    </article>
  );
}
