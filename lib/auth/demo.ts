import 'server-only';
import { randomBytes } from 'node:crypto';
import demoPeople from '@/seeders/support/demo-people.json';
import { AppError } from '@/lib/api/errors';
import { getEnv } from '@/lib/env';
import { demoldAdapter } from './adapter';
import { SESSION_MAX_AGE_SECONDS } from './options';
import type { Role } from './roles';

export type DemoPerson = { email: string; name: string; role: Role; label: string };

export const demoPersonList = demoPeople.people as DemoPerson[];

/** Demo mode only: a database session for one of the seeded demo people, as an e-mail link would give. */
export async function startDemoSession(email: string): Promise<{ sessionToken: string; expires: Date }> {
  if (!getEnv().DEMO_MODE) throw new AppError('not_found', 'There is no such page.', 404);
  const person = demoPersonList.find((p) => p.email === email);
  if (!person) throw new AppError('not_a_demo_person', 'Pick one of the demo people shown on the sign-in page.', 422);
  const adapter = demoldAdapter();
  const user = await adapter.getUserByEmail!(person.email);
  if (!user) {
    throw new AppError('demo_not_seeded', 'The demo people are not in the database: run `npm run db:seed`.', 409);
  }
  const sessionToken = randomBytes(32).toString('hex');
  const expires = new Date(Date.now() + SESSION_MAX_AGE_SECONDS * 1000);
  await adapter.createSession!({ sessionToken, userId: user.id, expires });
  return { sessionToken, expires };
}
