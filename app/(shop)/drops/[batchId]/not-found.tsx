import Link from 'next/link';

export default function DropNotFound() {
  return (
    <div className="mx-auto max-w-xl py-24 text-center">
      <h1 className="text-4xl font-medium">There is no such drop</h1>
      <p className="mt-3 text-ink-soft">The link may be mistyped, or the batch has not been announced yet.</p>
      <Link href="/" className="mt-8 inline-block rounded-full bg-ink px-6 py-3 font-semibold text-paper">
        See the drops
      </Link>
    </div>
  );
}
