import Link from 'next/link';

export default function AuditNotFound() {
  return (
    <>
      <h1 className="text-3xl font-medium">No such page of the log</h1>
      <p className="mt-2 text-ink-soft">The link to older entries is not one the log made. Start again from the newest.</p>
      <Link href="/workshop/audit" className="mt-4 inline-block underline underline-offset-4">
        Newest entries
      </Link>
    </>
  );
}
