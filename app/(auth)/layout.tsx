import Link from 'next/link';
import type { ReactNode } from 'react';

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col">
      <header className="px-5 py-5 sm:px-8">
        <Link href="/" className="font-display text-2xl font-semibold tracking-tight">
          Demold
        </Link>
      </header>
      <main id="main" className="mx-auto w-full max-w-md flex-1 px-5 pb-16 pt-6 sm:pt-12">
        {children}
      </main>
    </div>
  );
}
