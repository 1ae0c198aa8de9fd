import 'server-only';
import { cookies } from 'next/headers';
import { cache } from 'react';
import { getDb } from '@/lib/db/connection';
import type { Role } from './roles';
import { demoldAdapter } from './adapter';
import { sessionCookieName } from './options';

export type CurrentUser = { id: string; email: string; name: string | null; role: Role };

/**
 * The signed-in person for this request, or null. Read from the database every time (once per request),
 * so a sign-out or a changed role counts at once; a forged or stale cookie simply finds nothing.
 */
export const getCurrentUser = cache(async (): Promise<CurrentUser | null> => {
  const token = (await cookies()).get(sessionCookieName())?.value;
  if (!token || token.length > 200) return null;
  getDb();
  const found = await demoldAdapter().getSessionAndUser!(token);
  if (!found) return null;
  const user = found.user as CurrentUser & { emailVerified: Date | null };
  return { id: user.id, email: user.email, name: user.name ?? null, role: user.role };
});
