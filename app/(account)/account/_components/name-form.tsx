'use client';

import { useActionState, useId } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import { updateAccountNameAction } from '../actions';

export function NameForm({ name }: { name: string | null }) {
  const [state, action, pending] = useActionState(updateAccountNameAction, null);
  const errorId = useId();
  const problem = fieldError(state, 'name');
  return (
    <form action={action} className="grid gap-2">
      <label htmlFor="account-name" className="font-semibold">
        Name
      </label>
      <input
        id="account-name"
        name="name"
        defaultValue={name ?? ''}
        autoComplete="name"
        maxLength={120}
        aria-invalid={problem ? true : undefined}
        aria-describedby={errorId}
        className="rounded-sm border border-paper-edge bg-white px-4 py-3 aria-[invalid]:border-ember"
      />
      <p id={errorId} className="min-h-5 text-sm font-semibold text-ember-deep">
        {problem ?? ''}
      </p>
      <div className="flex items-center gap-4">
        <button type="submit" disabled={pending} className="rounded-full bg-ink px-5 py-2 font-semibold text-paper disabled:opacity-60">
          {pending ? 'Saving…' : 'Save name'}
        </button>
        <FormStatus state={state && !state.ok && state.error.fieldErrors ? null : state} />
      </div>
    </form>
  );
}
