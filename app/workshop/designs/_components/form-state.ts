import type { ActionResult } from '@/lib/auth/action';

/**
 * What the form's status line says. Errors about fields the form shows are shown by those fields; errors
 * about hidden ones (a stale or altered page) are said here, so none is lost.
 */
export function statusFor(state: ActionResult | null, shownFields: readonly string[]): ActionResult | null {
  if (!state || state.ok || !state.error.fieldErrors) return state;
  const hidden = Object.entries(state.error.fieldErrors)
    .filter(([field]) => !shownFields.includes(field))
    .flatMap(([, messages]) => messages);
  const shown = Object.keys(state.error.fieldErrors).some((field) => shownFields.includes(field));
  const message = [shown ? 'Please correct the marked fields.' : '', ...hidden].filter(Boolean).join(' ');
  return { ok: false, error: { code: state.error.code, message } };
}

/** Moves focus to the first field the server refused, so a keyboard or screen-reader user lands on it. */
export function focusFirstInvalid(form: HTMLFormElement | null) {
  form?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
}
