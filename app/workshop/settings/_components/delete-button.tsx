'use client';

import { useActionState } from 'react';
import { FormStatus } from '@/components/ui/form-status';
import type { FormAction } from '@/lib/auth/action';
import { dangerButton } from './parts';

/** A delete button for one row, asking first; its outcome is said beside it. */
export function DeleteButton({
  action,
  field,
  value,
  label,
  what,
  question,
}: {
  action: FormAction;
  field: string;
  value: string;
  label: string;
  what: string;
  question: string;
}) {
  const [state, dispatch, pending] = useActionState(action, null);
  return (
    <form
      action={dispatch}
      onSubmit={(event) => {
        if (!window.confirm(question)) event.preventDefault();
      }}
      className="flex flex-wrap items-center gap-2"
    >
      <input type="hidden" name={field} value={value} />
      <button type="submit" disabled={pending} className={dangerButton}>
        {pending ? 'Deleting…' : label}
        <span className="sr-only"> {what}</span>
      </button>
      {state && !state.ok ? <FormStatus state={state} /> : null}
    </form>
  );
}
