import type { Metadata } from 'next';
import Link from 'next/link';
import type { ReactNode } from 'react';
import { SignOutButton } from '@/components/auth/sign-out-button';
import { getCurrentUser } from '@/lib/auth/session';
import { roleLabels } from '@/lib/auth/roles';
import { WorkshopNav } from './_components/workshop-nav';

export const metadata: Metadata = { title: { default: 'Workshop', template: '%s · Workshop · Demold' }, robots: { index: false } };

// Chrome only: every workshop page checks the person's role itself.
export default async function WorkshopLayout({ children }: { children: ReactNode }) {
  const user = await getCurrentUser();
  return (
    <div className="min-h-dvh bg-paper-deep/40">
      <header className="border-b border-paper-edge bg-paper">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-5 py-3">
          <div className="flex items-center gap-6">
            <Link href="/workshop" className="font-display text-xl font-semibold">
              Demold <span className="font-sans text-sm font-normal text-ink-soft">workshop</span>
            </Link>
            <WorkshopNav />
          </div>
          {user ? (
            <div className="flex items-center gap-3 text-sm">
              <span className="text-ink-soft">
                {user.name ?? user.email} · {roleLabels[user.role]}
              </span>
              <Link href="/" className="underline underline-offset-4">
                Shop
              </Link>
              <SignOutButton className="rounded-full border border-paper-edge px-3 py-1 hover:border-ink" />
            </div>
          ) : null}
        </div>
      </header>
      <main id="main" className="mx-auto max-w-6xl px-5 py-8">
        {children}
      </main>
    </div>
  );
}
