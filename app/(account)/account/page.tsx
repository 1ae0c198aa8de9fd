import type { Metadata } from 'next';
import Link from 'next/link';
import { SignOutButton } from '@/components/auth/sign-out-button';
import { requirePageUser } from '@/lib/auth/authorize';
import { hasRole, roleLabels } from '@/lib/auth/roles';
import { NameForm } from './_components/name-form';

export const metadata: Metadata = { title: 'Your account' };

export default async function AccountPage() {
  const user = await requirePageUser('/account');
  return (
    <>
      <h1 className="text-4xl font-medium">Your account</h1>
      <dl className="mt-8 grid gap-1">
        <dt className="text-sm text-ink-faint">Signed in as</dt>
        <dd className="text-lg">{user.email}</dd>
        {user.role !== 'customer' ? <dd className="text-sm text-ink-soft">{roleLabels[user.role]}</dd> : null}
      </dl>
      <div className="mt-8">
        <NameForm name={user.name} />
      </div>
      <section className="mt-10" aria-labelledby="orders-title">
        <h2 id="orders-title" className="text-2xl font-medium">
          Orders and waitlists
        </h2>
        <p className="mt-2 text-ink-soft">Nothing yet. Masks you buy and waitlists you join will be listed here.</p>
      </section>
      <div className="mt-10 flex flex-wrap items-center gap-4">
        {hasRole(user.role, 'staff') ? (
          <Link href="/workshop" className="rounded-full border border-ink px-5 py-2 font-semibold">
            Open the workshop
          </Link>
        ) : null}
        <SignOutButton className="rounded-full border border-paper-edge px-5 py-2 font-semibold hover:border-ink" />
      </div>
    </>
  );
}
