'use client';

import { useEffect } from 'react';

export default function WaitlistError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);

  return (
    <div role="alert" className="max-w-xl">
      <h1 className="text-3xl font-medium">The waitlist could not be read</h1>
      <p className="mt-2 text-ink-soft">
        The workshop had trouble reading the waitlist. Nothing was changed and sending goes on; try again in a few seconds.
      </p>
      <button type="button" onClick={reset} className="mt-4 rounded-full border border-ink px-4 py-1 text-sm font-semibold">
        Try again
      </button>
      {error.digest ? <p className="mt-4 text-xs text-ink-faint">Reference: {error.digest}</p> : null}
    </div>
  );
}
