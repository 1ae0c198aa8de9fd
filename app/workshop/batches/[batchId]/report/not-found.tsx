import Link from 'next/link';

export default function DropReportNotFound() {
  return (
    <>
      <h1 className="text-3xl font-medium">No such batch</h1>
      <p className="mt-2 text-ink-soft">There is no batch at this address, so it has no drop report. It may have been a mistyped link.</p>
      <Link href="/workshop/batches" className="mt-4 inline-block underline underline-offset-4">
        All batches
      </Link>
    </>
  );
}
