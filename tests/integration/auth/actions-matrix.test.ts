import path from 'node:path';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import type { ActionResult, FormAction } from '@/lib/auth/action';
import { hasRole, roles, type Role } from '@/lib/auth/roles';
import type { CurrentUser } from '@/lib/auth/session';
import { actionRules } from '../../fixtures/access-rules';
import { withAppDatabase } from '../support/app-database';

// Server actions are called here as Next.js calls them, with the session resolved to each kind of person.
let currentUser: CurrentUser | null = null;
vi.mock('@/lib/auth/session', () => ({ getCurrentUser: async () => currentUser }));
vi.mock('next/cache', () => ({
  revalidatePath: () => undefined,
  revalidateTag: () => undefined,
  updateTag: () => undefined,
  unstable_cache: <T>(fn: T) => fn,
}));

withAppDatabase('actions');

const people: Partial<Record<Role, CurrentUser>> = {};
beforeAll(async () => {
  const { getDb } = await import('@/lib/db/connection');
  for (const role of roles) {
    const user = await getDb().models.User.create({ email: `${role}@matrix.example`, name: role, emailVerified: null, role });
    people[role] = { id: user.id, email: user.email, name: user.name, role };
  }
});

async function loadAction(key: string): Promise<FormAction> {
  const [file, name] = key.split('#') as [string, string];
  const exports = (await import(/* @vite-ignore */ path.resolve(__dirname, '../../..', file))) as Record<string, FormAction>;
  return exports[name]!;
}

const callers: (Role | 'anonymous')[] = ['anonymous', ...roles];

describe.each(Object.entries(actionRules))('%s', (key, needed) => {
  it('declares the role its rule names', async () => {
    expect((await loadAction(key)).requiredRole).toBe(needed);
  });

  it.each(callers)('called by %s', async (caller) => {
    currentUser = caller === 'anonymous' ? null : people[caller]!;
    const result: ActionResult = await (await loadAction(key))(null, new FormData());
    expect(result.ok).toBe(false);
    const code = result.ok ? 'ok' : result.error.code;
    if (caller === 'anonymous') expect(code).toBe('unauthorized');
    else if (!hasRole(caller, needed)) expect(code).toBe('forbidden');
    // Allowed through: the empty form is then refused for what it lacks, not for who sent it.
    else expect(code).toBe('invalid_input');
  });
});

describe('a buyer’s own records', () => {
  it('change only for that buyer', async () => {
    const { getDb } = await import('@/lib/db/connection');
    const { User } = getDb().models;
    const other = await User.create({ email: 'other@matrix.example', name: 'Other Buyer', emailVerified: null, role: 'customer' });
    currentUser = people.customer!;
    const action = await loadAction('app/(account)/account/actions.ts#updateAccountNameAction');
    const form = new FormData();
    form.set('name', 'Renamed');
    // A smuggled id is ignored: the action acts on the signed-in person alone.
    form.set('id', other.id);
    expect(await action(null, form)).toMatchObject({ ok: true });
    expect((await User.findByPk(people.customer!.id))?.name).toBe('Renamed');
    expect((await User.findByPk(other.id))?.name).toBe('Other Buyer');
  });
});
