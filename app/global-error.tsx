'use client';

// The last resort when even the root layout fails: plain HTML, no shared components.
export default function GlobalError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <html lang="en">
      <body style={{ fontFamily: 'system-ui, sans-serif', background: '#f7f3ec', color: '#1f1c1a', padding: '4rem 1.5rem', textAlign: 'center' }}>
        <h1>Demold is having trouble</h1>
        <p>Something went wrong on our side. Please try again in a few seconds.</p>
        <button type="button" onClick={reset} style={{ padding: '0.75rem 1.5rem', borderRadius: '999px' }}>
          Try again
        </button>
      </body>
    </html>
  );
}
