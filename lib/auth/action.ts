import 'server-only';
import type { z } from 'zod';
import { AppError } from '@/lib/api/errors';
import { requireRole } from './authorize';
import type { Role } from './roles';
import type { CurrentUser } from './session';

export type ActionError = { code: string; message: string; fieldErrors?: Record<string, string[]> };
export type ActionResult = { ok: true; message: string } | { ok: false; error: ActionError };
export type FormAction = ((previous: ActionResult | null, formData: FormData) => Promise<ActionResult>) & {
  requiredRole: Role;
};

/**
 * Every server action goes through here: who is asking (401), may they (403), is the input good (422),
 * then the work. Errors come back as data for the form to show, never as a thrown stack.
 */
export function authorizedAction<S extends z.ZodType>(
  role: Role,
  schema: S,
  handler: (input: z.infer<S>, user: CurrentUser) => Promise<string>,
): FormAction {
  const action = async (_previous: ActionResult | null, formData: FormData): Promise<ActionResult> => {
    try {
      const user = await requireRole(role);
      const parsed = schema.safeParse(Object.fromEntries(formData));
      if (!parsed.success) {
        const fieldErrors: Record<string, string[]> = {};
        for (const issue of parsed.error.issues) {
          const key = String(issue.path[0] ?? 'form');
          (fieldErrors[key] ??= []).push(issue.message);
        }
        return { ok: false, error: { code: 'invalid_input', message: 'Please correct the fields below.', fieldErrors } };
      }
      return { ok: true, message: await handler(parsed.data, user) };
    } catch (error) {
      if (error instanceof AppError) {
        // A domain rule about one field (a time that does not exist, a duplicate name) is shown by that field.
        const fields = error.details?.fields as Record<string, string[]> | undefined;
        return { ok: false, error: { code: error.code, message: error.message, ...(fields ? { fieldErrors: fields } : {}) } };
      }
      // Next's own control flow (redirect, notFound) must pass through untouched.
      if (error instanceof Error && 'digest' in error) throw error;
      console.error('A server action failed', error);
      return { ok: false, error: { code: 'internal_error', message: 'Something went wrong on our side. Please try again.' } };
    }
  };
  return Object.assign(action, { requiredRole: role });
}
