'use client';

import { startTransition, useActionState, useCallback, useEffect, useRef, type FormEvent } from 'react';
import { fieldError } from '@/components/ui/form-status';
import type { ActionResult, FormAction } from '@/lib/auth/action';

/**
 * One settings form: sends by hand so a refused save keeps what was typed, moves focus to the first field the
 * server refused, and says in the status line what no field shows (a stale page, a rule about the whole form).
 */
export function useSettingsForm(
  action: FormAction,
  shownFields: readonly string[],
  { resetOnSuccess = false } = {},
) {
  const [state, dispatch, pending] = useActionState(action, null);
  const formRef = useRef<HTMLFormElement>(null);
  const onSubmit = useCallback(
    (event: FormEvent<HTMLFormElement>) => {
      event.preventDefault();
      const data = new FormData(event.currentTarget);
      startTransition(() => dispatch(data));
    },
    [dispatch],
  );
  useEffect(() => {
    if (!state) return;
    if (state.ok) {
      if (resetOnSuccess) formRef.current?.reset();
    } else {
      formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
    }
  }, [state, resetOnSuccess]);
  return {
    formRef,
    onSubmit,
    pending,
    state,
    error: (field: string) => fieldError(state, field),
    status: statusLine(state, shownFields),
  };
}

function statusLine(state: ActionResult | null, shownFields: readonly string[]): ActionResult | null {
  if (!state || state.ok || !state.error.fieldErrors) return state;
  const entries = Object.entries(state.error.fieldErrors);
  const hidden = entries
    .filter(([field]) => !shownFields.includes(field))
    .flatMap(([, messages]) => messages);
  const shown = entries.some(([field]) => shownFields.includes(field));
  const message = [shown ? 'Please correct the marked fields.' : '', ...hidden].filter(Boolean).join(' ');
  return { ok: false, error: { code: state.error.code, message } };
}
