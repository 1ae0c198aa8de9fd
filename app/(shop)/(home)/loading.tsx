import { DesignCardSkeleton } from './_components/design-card';

export default function Loading() {
  return (
    <div role="status" aria-live="polite" className="py-14 sm:py-20">
      <span className="sr-only">Loading the designs…</span>
      <div aria-hidden="true" className="h-4 w-40 animate-pulse rounded bg-paper-deep" />
      <div aria-hidden="true" className="mt-4 h-14 w-3/4 animate-pulse rounded bg-paper-deep" />
      <ul className="mt-16 grid gap-x-8 gap-y-14 sm:grid-cols-2 lg:grid-cols-3">
        {Array.from({ length: 3 }, (_, index) => (
          <DesignCardSkeleton key={index} />
        ))}
      </ul>
    </div>
  );
}
