import type { ActionResult } from '@/lib/auth/action';

/** The outcome of a form's last submission, announced to screen readers. */
export function FormStatus({ state, id }: { state: ActionResult | null; id?: string }) {
  return (
    <p id={id} aria-live="polite" className={`min-h-6 text-sm font-semibold ${state?.ok ? 'text-moss' : 'text-ember-deep'}`}>
      {state ? (state.ok ? state.message : state.error.message) : ''}
    </p>
  );
}

export function fieldError(state: ActionResult | null, field: string): string | undefined {
  return state && !state.ok ? state.error.fieldErrors?.[field]?.[0] : undefined;
}
