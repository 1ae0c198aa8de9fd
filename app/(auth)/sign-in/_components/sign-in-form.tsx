'use client';

import { useMutation } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { ApiError, postAuthForm } from '@/lib/api/client';

export function SignInForm({ callbackUrl, initialEmail }: { callbackUrl: string; initialEmail?: string }) {
  const [email, setEmail] = useState(initialEmail ?? '');
  const errorId = useId();
  const send = useMutation({
    mutationFn: (address: string) => postAuthForm('/api/auth/signin/email', { email: address, callbackUrl }),
  });

  if (send.isSuccess) {
    return (
      <div role="status" className="rounded-sm border border-moss/40 bg-moss-wash p-6">
        <h2 className="text-2xl font-medium">Check your inbox</h2>
        <p className="mt-2 text-ink-soft">
          We sent a sign-in link to <strong className="text-ink">{send.variables.trim().toLowerCase()}</strong>. It works once, within the
          next few minutes. Nothing there? Look in your spam folder.
        </p>
        <button type="button" onClick={() => send.reset()} className="mt-4 font-semibold underline underline-offset-4">
          Use a different address
        </button>
      </div>
    );
  }

  const problem = send.error instanceof ApiError ? send.error : send.error ? new ApiError('network', 'We could not reach Demold. Check your connection and try again.', 0) : null;
  return (
    <form
      noValidate
      onSubmit={(event) => {
        event.preventDefault();
        send.mutate(email);
      }}
    >
      <label htmlFor="sign-in-email" className="block font-semibold">
        E-mail address
      </label>
      <input
        id="sign-in-email"
        name="email"
        type="email"
        inputMode="email"
        autoComplete="email"
        required
        value={email}
        onChange={(event) => setEmail(event.target.value)}
        aria-invalid={problem ? true : undefined}
        aria-describedby={problem ? errorId : undefined}
        className="mt-2 block w-full rounded-sm border border-paper-edge bg-white px-4 py-3 text-lg aria-[invalid]:border-ember"
        placeholder="you@example.com"
      />
      <p id={errorId} aria-live="assertive" className="mt-2 min-h-6 text-sm font-semibold text-ember-deep">
        {problem ? problem.message : ''}
      </p>
      <button
        type="submit"
        disabled={send.isPending}
        className="mt-2 w-full rounded-full bg-ink px-6 py-3 text-lg font-semibold text-paper hover:bg-ink-soft disabled:opacity-60"
      >
        {send.isPending ? 'Sending…' : 'Send me a sign-in link'}
      </button>
    </form>
  );
}
