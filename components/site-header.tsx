import Link from 'next/link';
import { getCurrentUser } from '@/lib/auth/session';
import { hasRole } from '@/lib/auth/roles';

export async function SiteHeader() {
  const user = await getCurrentUser();
  return (
    <header className="border-b border-paper-edge/70">
      <div className="mx-auto flex max-w-gallery items-center justify-between gap-4 px-5 py-4 sm:px-8">
        <Link href="/" className="font-display text-2xl font-semibold tracking-tight text-ink">
          Demold
        </Link>
        <nav aria-label="Main">
          <ul className="flex items-center gap-5 text-sm text-ink-soft">
            <li>
              <Link href="/#designs" className="underline-offset-4 hover:text-ink hover:underline">
                Designs
              </Link>
            </li>
            {user && hasRole(user.role, 'staff') ? (
              <li>
                <Link href="/workshop" className="underline-offset-4 hover:text-ink hover:underline">
                  Workshop
                </Link>
              </li>
            ) : null}
            <li>
              <Link
                href={user ? '/account' : '/sign-in'}
                className="rounded-full border border-paper-edge px-3 py-1.5 text-ink hover:border-ink"
              >
                {user ? (user.name?.split(' ')[0] ?? 'Account') : 'Sign in'}
              </Link>
            </li>
          </ul>
        </nav>
      </div>
    </header>
  );
}
