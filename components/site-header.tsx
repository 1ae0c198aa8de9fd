import Link from 'next/link';

export function SiteHeader() {
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
          </ul>
        </nav>
      </div>
    </header>
  );
}
