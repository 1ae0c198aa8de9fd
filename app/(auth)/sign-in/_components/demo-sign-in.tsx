'use client';

import { useMutation } from '@tanstack/react-query';
import { ApiError, readApiResponse } from '@/lib/api/client';

type Person = { email: string; name: string; label: string; role: string };

/** Demo mode only: one button per seeded demo person. */
export function DemoSignIn({ people, callbackUrl }: { people: Person[]; callbackUrl: string | undefined }) {
  const signIn = useMutation({
    mutationFn: async (person: Person) => {
      const target = callbackUrl ?? (person.role === 'customer' ? '/' : '/workshop');
      const response = await fetch('/api/auth/demo', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify({ email: person.email, callbackUrl: target }),
      });
      return readApiResponse<{ url: string }>(response);
    },
    onSuccess: ({ url }) => window.location.assign(url),
  });

  return (
    <section aria-labelledby="demo-title" className="mt-12 rounded-sm border border-dashed border-paper-edge p-5">
      <h2 id="demo-title" className="font-sans text-base font-semibold">
        Demo: sign in with one click
      </h2>
      <p className="mt-1 text-sm text-ink-soft">These invented people exist only in the demo.</p>
      <ul className="mt-4 grid gap-2">
        {people.map((person) => (
          <li key={person.email}>
            <button
              type="button"
              disabled={signIn.isPending}
              onClick={() => signIn.mutate(person)}
              className="flex w-full items-baseline justify-between gap-3 rounded-sm border border-paper-edge bg-white px-4 py-3 text-left hover:border-ink-faint disabled:opacity-60"
            >
              <span className="font-semibold">{person.name}</span>
              <span className="text-sm text-ink-soft">{person.label}</span>
            </button>
          </li>
        ))}
      </ul>
      <p aria-live="assertive" className="mt-2 text-sm font-semibold text-ember-deep">
        {signIn.error ? (signIn.error instanceof ApiError ? signIn.error.message : 'That did not work. Try again.') : ''}
      </p>
    </section>
  );
}
