export default function DropReportLoading() {
  return (
    <div role="status" aria-live="polite">
      <span className="sr-only">Loading the drop report…</span>
      <div aria-hidden="true" className="h-4 w-32 animate-pulse rounded bg-paper-deep" />
      <div aria-hidden="true" className="mt-3 h-9 w-2/3 animate-pulse rounded bg-paper-deep" />
      <div aria-hidden="true" className="mt-6 grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
        {Array.from({ length: 8 }, (_, i) => (
          <div key={i} className="h-24 animate-pulse rounded-sm bg-paper-deep" />
        ))}
      </div>
      <div aria-hidden="true" className="mt-8 h-64 animate-pulse rounded-sm bg-paper-deep" />
    </div>
  );
}
