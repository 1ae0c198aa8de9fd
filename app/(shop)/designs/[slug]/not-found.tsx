import Link from 'next/link';

export default function DesignNotFound() {
  return (
    <div className="mx-auto max-w-xl py-24 text-center">
      <h1 className="text-4xl font-medium">This design is not in the shop</h1>
      <p className="mt-3 text-ink-soft">It may still be at the bench, or it has been retired.</p>
      <Link href="/" className="mt-8 inline-block rounded-full bg-ink px-6 py-3 font-semibold text-paper">
        See the designs
      </Link>
    </div>
  );
}
