export default function WaitlistLoading() {
  return (
    <div className="max-w-2xl py-10" aria-busy="true">
      <p className="sr-only" role="status">Loading…</p>
      <div className="h-12 w-2/3 animate-pulse rounded-sm bg-paper-deep" />
      <div className="mt-4 h-5 w-full animate-pulse rounded-sm bg-paper-deep" />
      <div className="mt-8 h-64 animate-pulse rounded-sm bg-paper-deep" />
    </div>
  );
}
