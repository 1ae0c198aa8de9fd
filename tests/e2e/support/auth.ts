import { expect, type APIRequestContext } from '@playwright/test';
import demo from '@/seeders/support/demo-people.json';
import type { Role } from '@/lib/auth/roles';

/** The seeded demo person with this role (the first one, where there are two). */
export function demoPerson(role: Role) {
  const person = demo.people.find((p) => p.role === role);
  if (!person) throw new Error(`no demo person with role ${role}`);
  return person;
}

/** Signs a request context in with the demo one-click sign-in; its cookie jar keeps the session. */
export async function signInAs(request: APIRequestContext, role: Role): Promise<void> {
  const response = await request.post('/api/auth/demo', { data: { email: demoPerson(role).email } });
  expect(response.status(), await response.text()).toBe(200);
}

export type InboxMessage = { to: { address: string }[]; subject: string; text: string; date: string };

/** The newest message to `address` (with this subject, if given) in the fake inbox, waiting for it to arrive. */
export async function latestEmailTo(request: APIRequestContext, address: string, subject?: string): Promise<InboxMessage> {
  const inbox = process.env.FAKE_INBOX_URL;
  if (!inbox) throw new Error('FAKE_INBOX_URL is not set: run the browser tests through `npm test`');
  let found: InboxMessage | undefined;
  await expect
    .poll(async () => {
      const messages = (await (await request.get(`${inbox}/api/email`)).json()) as InboxMessage[];
      found = messages.filter((m) => m.to.some((t) => t.address === address) && (!subject || m.subject === subject)).at(-1);
      return Boolean(found);
    }, { timeout: 15_000 })
    .toBe(true);
  return found!;
}
