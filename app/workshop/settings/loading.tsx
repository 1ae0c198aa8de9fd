export default function SettingsLoading() {
  return (
    <div role="status" aria-live="polite">
      <span className="sr-only">Loading the settings…</span>
      <div aria-hidden="true" className="h-9 w-48 animate-pulse rounded bg-paper-deep" />
      <div aria-hidden="true" className="mt-3 h-4 w-2/3 animate-pulse rounded bg-paper-deep" />
      {Array.from({ length: 3 }, (_, i) => (
        <div key={i} aria-hidden="true" className="mt-10 grid gap-3">
          <div className="h-7 w-40 animate-pulse rounded bg-paper-deep" />
          <div className="h-48 animate-pulse rounded-sm bg-paper-deep" />
        </div>
      ))}
    </div>
  );
}
