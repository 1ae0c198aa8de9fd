import 'server-only';
import { cookies } from 'next/headers';
import { cache } from 'react';
import { getDb } from '@/lib/db/connection';
import type { Role } from './roles';
import { QueryTypes } from 'sequelize';
import { sessionCookieName } from './options';

export type CurrentUser = { id: string; email: string; name: string | null; role: Role };

/**
 * The signed-in person for this request, or null. Read from the database every time (once per request),
 * so a sign-out or a changed role counts at once; a forged or stale cookie simply finds nothing.
 */
export const getCurrentUser = cache(async (): Promise<CurrentUser | null> => {
  const token = (await cookies()).get(sessionCookieName())?.value;
  if (!token || token.length > 200) return null;
  // Plain SQL on purpose: this runs on every signed-in request, the hold route's included.
  const [user] = await getDb().sequelize.query<CurrentUser>(
    `SELECT u.id, u.email, u.name, u.role FROM sessions s JOIN users u ON u.id = s.user_id
      WHERE s.session_token = $1 AND s.expires > now()`,
    { bind: [token], type: QueryTypes.SELECT },
  );
  return user ?? null;
});
