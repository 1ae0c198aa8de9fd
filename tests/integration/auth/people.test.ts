import { describe, expect, it } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import { withAppDatabase } from '../support/app-database';

withAppDatabase('people');

async function person(email: string, role: CurrentUser['role']): Promise<CurrentUser> {
  const { getDb } = await import('@/lib/db/connection');
  const user = await getDb().models.User.create({ email, name: email.split('@')[0]!, emailVerified: null, role });
  return { id: user.id, email: user.email, name: user.name, role };
}

async function owners(): Promise<number> {
  const { getDb } = await import('@/lib/db/connection');
  return getDb().models.User.count({ where: { role: 'owner' } });
}

describe('studio people', () => {
  it('never lose their last owner, even when two owners demote each other at the same moment', async () => {
    const { getDb } = await import('@/lib/db/connection');
    const { changeStudioRole } = await import('@/lib/auth/people');
    const { sequelize, models } = getDb();
    // Open several pooled connections first, so the two transactions below really run side by side.
    await Promise.all(Array.from({ length: 4 }, () => sequelize.query('SELECT pg_sleep(0.05)')));
    for (let round = 0; round < 5; round += 1) {
      await models.User.update({ role: 'customer' }, { where: { role: 'owner' } });
      const a = await person(`owner-a${round}@example.com`, 'owner');
      const b = await person(`owner-b${round}@example.com`, 'owner');
      const outcomes = await Promise.allSettled([
        changeStudioRole(a, { userId: b.id, role: 'staff' }),
        changeStudioRole(b, { userId: a.id, role: 'staff' }),
      ]);
      expect(outcomes.filter((o) => o.status === 'fulfilled')).toHaveLength(1);
      const refused = outcomes.find((o) => o.status === 'rejected') as PromiseRejectedResult;
      expect(['last_owner', 'forbidden']).toContain(refused.reason.code);
      expect(await owners()).toBe(1);
    }
  });

  it('refuse to remove the only owner, who may hand over first', async () => {
    const { getDb } = await import('@/lib/db/connection');
    const { invitePerson, removeFromStudio } = await import('@/lib/auth/people');
    const [only] = await getDb().models.User.findAll({ where: { role: 'owner' } });
    const me: CurrentUser = { id: only!.id, email: only!.email, name: only!.name, role: 'owner' };
    await expect(removeFromStudio(me, { userId: me.id })).rejects.toMatchObject({ code: 'last_owner', status: 409 });

    const { person: heir } = await invitePerson(me, { email: 'heir@example.com', name: 'Heir', role: 'owner' });
    await removeFromStudio(me, { userId: me.id });
    expect(await owners()).toBe(1);
    const { User } = getDb().models;
    expect((await User.findByPk(heir.id))?.role).toBe('owner');
    expect((await User.findByPk(me.id))?.role).toBe('customer');
  });

  it('end the sessions of someone removed from the studio', async () => {
    const { getDb } = await import('@/lib/db/connection');
    const { removeFromStudio } = await import('@/lib/auth/people');
    const owner = await person('boss@example.com', 'owner');
    const hand = await person('hand@example.com', 'staff');
    await getDb().models.AuthSession.create({ sessionToken: 'hand-session', userId: hand.id, expires: new Date(Date.now() + 60_000) });
    await removeFromStudio(owner, { userId: hand.id });
    expect(await getDb().models.AuthSession.count({ where: { userId: hand.id } })).toBe(0);
  });

  it('invite by address: a buyer becomes a studio hand, and someone already in the studio is told so', async () => {
    const { invitePerson } = await import('@/lib/auth/people');
    const owner = await person('inviter@example.com', 'owner');
    await person('buyer-to-be@example.com', 'customer');
    const { person: invited, emailed } = await invitePerson(owner, { email: 'buyer-to-be@example.com', name: undefined, role: 'staff' });
    expect(invited.role).toBe('staff');
    // SMTP_URL points at a closed port in tests: the role is given, and the failure to e-mail is reported.
    expect(emailed).toBe(false);
    await expect(invitePerson(owner, { email: 'buyer-to-be@example.com', name: undefined, role: 'owner' })).rejects.toMatchObject({
      code: 'already_in_studio',
      status: 409,
    });
  });
});
