import Link from 'next/link';

export default function Forbidden() {
  return (
    <main id="main" className="mx-auto max-w-xl px-5 py-24 text-center">
      <h1 className="text-4xl font-medium">Not for this account</h1>
      <p className="mt-3 text-ink-soft">
        This part of Demold belongs to the studio. If you work there, ask a maker to add you from the workshop&apos;s
        People page, then sign in again.
      </p>
      <div className="mt-8 flex justify-center gap-4">
        <Link href="/" className="rounded-full bg-ink px-6 py-3 font-semibold text-paper">Back to the shop</Link>
        <Link href="/account" className="rounded-full border border-ink px-6 py-3 font-semibold">Your account</Link>
      </div>
    </main>
  );
}
