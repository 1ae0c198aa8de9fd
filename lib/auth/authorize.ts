import 'server-only';
import { forbidden, redirect } from 'next/navigation';
import { AppError } from '@/lib/api/errors';
import { hasRole, roleLabels, type Role } from './roles';
import { getCurrentUser, type CurrentUser } from './session';

export const unauthorized = () => new AppError('unauthorized', 'Sign in to continue.', 401);
export const notAllowed = (role: Role) =>
  new AppError('forbidden', `This is for the studio's ${roleLabels[role].toLowerCase()} only.`, 403, { needs: role });

/** For route handlers and actions: the signed-in person, or a 401 AppError. */
export async function requireUser(): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) throw unauthorized();
  return user;
}

/** For route handlers and actions: a person with at least `role`, or a 401/403 AppError. */
export async function requireRole(role: Role): Promise<CurrentUser> {
  const user = await requireUser();
  if (!hasRole(user.role, role)) throw notAllowed(role);
  return user;
}

/** For pages: the signed-in person, or a redirect to sign-in that comes back to `returnTo`. */
export async function requirePageUser(returnTo: string): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(returnTo)}`);
  return user;
}

/** For pages: a person with at least `role`; others see the 403 page, anonymous people sign in first. */
export async function requirePageRole(role: Role, returnTo: string): Promise<CurrentUser> {
  const user = await requirePageUser(returnTo);
  if (!hasRole(user.role, role)) forbidden();
  return user;
}
