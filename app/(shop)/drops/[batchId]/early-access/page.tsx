import type { Metadata } from 'next';
import Link from 'next/link';
import { redirect } from 'next/navigation';
import type { ReactNode } from 'react';
import { z } from 'zod';
import { LocalTime } from '@/components/local-time';
import { getCurrentUser } from '@/lib/auth/session';
import { redeemEarlyAccess } from '@/lib/waitlist/early-access';

export const metadata: Metadata = { title: 'Early access', robots: { index: false } };

type Props = { params: Promise<{ batchId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> };
const searchSchema = z.object({ t: z.string().max(1000).optional().catch(undefined) });

function Notice({ tone = 'plain', children }: { tone?: 'plain' | 'alert'; children: ReactNode }) {
  return tone === 'alert' ? (
    <div role="alert" className="mt-6 rounded-sm border border-ember/40 bg-ember-wash p-5 text-ember-deep">{children}</div>
  ) : (
    <div role="status" className="mt-6 rounded-sm border border-paper-edge p-5">{children}</div>
  );
}

// Redeeming writes only an idempotent grant for the address's own account, so it is safe on opening the link.
export default async function EarlyAccessPage({ params, searchParams }: Props) {
  const { batchId } = await params;
  const { t } = searchSchema.parse(await searchParams);
  const user = await getCurrentUser();
  const result = await redeemEarlyAccess(t, user, { batchId });
  const here = `/drops/${batchId}/early-access${t ? `?t=${encodeURIComponent(t)}` : ''}`;
  if (result.outcome === 'granted') redirect(`/drops/${result.batchId}?early=granted`);

  let body: ReactNode;
  if (result.outcome === 'damaged' || result.outcome === 'unknown_batch') {
    body = (
      <Notice tone="alert">
        <p className="font-semibold">This early-access link is damaged.</p>
        <p className="mt-1">Copy the whole link from the e-mail into your browser. Changing any part of it stops it working.</p>
      </Notice>
    );
  } else if (result.outcome === 'sign_in') {
    const signIn = `/sign-in?callbackUrl=${encodeURIComponent(here)}&email=${encodeURIComponent(result.email)}`;
    body = (
      <Notice>
        <p>
          This is early access to <strong>{result.designName}: {result.batchName}</strong> for {result.maskedEmail}. Sign in with that address to
          use it.
        </p>
        <Link href={signIn} className="mt-4 inline-block rounded-full bg-ink px-6 py-3 font-semibold text-paper hover:bg-ink-soft">
          Sign in
        </Link>
      </Notice>
    );
  } else if (result.outcome === 'wrong_account') {
    body = (
      <Notice tone="alert">
        <p className="font-semibold">This early access belongs to {result.maskedEmail}.</p>
        <p className="mt-1">
          You are signed in with another address, so it was not given to this account. Sign out and sign in with {result.maskedEmail} to use it.
        </p>
      </Notice>
    );
  } else {
    const words = {
      cancelled: 'This batch was cancelled, so there is no early access to it.',
      closed: 'This drop has closed.',
      already_public: 'This drop is already open to everyone: early access is not needed any more.',
      no_early_access: 'This drop has no early access: it opens to everyone at the same time.',
    }[result.outcome];
    body = (
      <Notice>
        <p>{words}</p>
        {result.outcome === 'no_early_access' ? (
          <p className="mt-1">
            It opens <LocalTime at={result.opensAt} />.
          </p>
        ) : null}
        <Link href={`/drops/${result.batchId}`} className="mt-3 inline-block font-semibold underline underline-offset-4">
          Go to the drop
        </Link>
      </Notice>
    );
  }
  return (
    <article className="max-w-2xl py-10">
      <h1 className="text-4xl font-medium">Early access</h1>
      {body}
    </article>
  );
}
