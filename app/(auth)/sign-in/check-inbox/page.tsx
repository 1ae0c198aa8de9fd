import type { Metadata } from 'next';
import Link from 'next/link';

export const metadata: Metadata = { title: 'Check your inbox' };

export default function CheckInboxPage() {
  return (
    <div role="status">
      <h1 className="text-4xl font-medium">Check your inbox</h1>
      <p className="mt-3 text-ink-soft">
        We sent you a sign-in link. Open it on this device; it works once, within the next few minutes. Nothing there?
        Look in your spam folder, or ask for a new link.
      </p>
      <Link href="/sign-in" className="mt-6 inline-block font-semibold underline underline-offset-4">
        Ask for a new link
      </Link>
    </div>
  );
}
