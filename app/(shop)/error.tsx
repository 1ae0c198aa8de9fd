'use client';

import { useEffect } from 'react';

export default function ShopError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);

  return (
    <div role="alert" className="mx-auto max-w-xl py-24 text-center">
      <h1 className="text-3xl font-medium">This page could not be loaded</h1>
      <p className="mt-3 text-ink-soft">
        The shop had trouble reaching its records. Nothing you did caused this; try again in a few seconds.
      </p>
      <button
        type="button"
        onClick={reset}
        className="mt-8 rounded-full bg-ink px-6 py-3 font-semibold text-paper hover:bg-ink-soft"
      >
        Try again
      </button>
      {error.digest ? <p className="mt-6 text-xs text-ink-faint">Reference: {error.digest}</p> : null}
    </div>
  );
}
