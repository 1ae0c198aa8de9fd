import Link from 'next/link';
import { SiteFooter } from '@/components/site-footer';
import { SiteHeader } from '@/components/site-header';

export default function NotFound() {
  return (
    <>
      <SiteHeader />
      <main id="main" className="mx-auto max-w-xl px-5 py-24 text-center">
        <h1 className="text-4xl font-medium">Nothing here</h1>
        <p className="mt-3 text-ink-soft">
          This page does not exist, or the design has been taken out of the shop.
        </p>
        <Link
          href="/"
          className="mt-8 inline-block rounded-full bg-ink px-6 py-3 font-semibold text-paper hover:bg-ink-soft"
        >
          See the designs
        </Link>
      </main>
      <SiteFooter />
    </>
  );
}
