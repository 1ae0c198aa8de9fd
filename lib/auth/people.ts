import 'server-only';
import { createElement } from 'react';
import { Op, Transaction } from 'sequelize';
import { z } from 'zod';
import { StaffInvitationEmail } from '@/emails/staff-invitation';
import { AppError } from '@/lib/api/errors';
import { writeAudit } from '@/lib/audit/log';
import { getDb } from '@/lib/db/connection';
import { getEnv } from '@/lib/env';
import { sendEmail } from '@/lib/mail/send';
import { emailAddressSchema } from './email-address';
import { roleLabels, type Role } from './roles';
import type { CurrentUser } from './session';

export const studioRoles = ['staff', 'owner'] as const satisfies readonly Role[];

export const invitePersonSchema = z.object({
  email: emailAddressSchema,
  name: z.string().trim().max(120, 'Keep the name under 120 characters.').optional().transform((v) => v || undefined),
  role: z.enum(studioRoles, { error: 'Choose studio hand or maker.' }),
});
export const changeRoleSchema = z.object({
  userId: z.uuid({ error: 'That person could not be found.' }),
  role: z.enum(studioRoles, { error: 'Choose studio hand or maker.' }),
});
export const removePersonSchema = z.object({ userId: z.uuid({ error: 'That person could not be found.' }) });

export type StudioPerson = { id: string; name: string | null; email: string; role: Role; since: Date };

/** Everyone with a studio role, makers first. */
export async function listStudioPeople(): Promise<StudioPerson[]> {
  const people = await getDb().models.User.findAll({
    where: { role: { [Op.in]: studioRoles } },
    order: [['role', 'ASC'], ['name', 'ASC'], ['email', 'ASC']],
  });
  return people.map((p) => ({ id: p.id, name: p.name, email: p.email, role: p.role, since: p.updatedAt }));
}

const lastOwner = () =>
  new AppError('last_owner', 'The studio must keep at least one maker (owner): make someone else an owner first.', 409);

/**
 * Changes a person's studio role (or takes it away, `customer`) in one transaction that locks every owner,
 * so two owners demoting each other at the same moment cannot leave the studio without one.
 */
const roleWords = (role: Role) => roleLabels[role].toLowerCase();
const personLabel = (person: { name: string | null; email: string }) => person.name?.trim() || person.email;

async function setRole(actor: CurrentUser, userId: string, role: Role): Promise<StudioPerson> {
  const { sequelize, models } = getDb();
  return sequelize.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED }, async (transaction) => {
    const owners = await models.User.findAll({
      where: { role: 'owner' },
      lock: transaction.LOCK.UPDATE,
      transaction,
      attributes: ['id'],
    });
    if (!owners.some((owner) => owner.id === actor.id)) {
      throw new AppError('forbidden', 'You are no longer an owner of this studio.', 403);
    }
    const target = await models.User.findOne({ where: { id: userId }, lock: transaction.LOCK.UPDATE, transaction });
    if (!target || target.role === 'customer') throw new AppError('not_found', 'That person is not in the studio.', 404);
    if (target.role === 'owner' && role !== 'owner' && owners.length <= 1) throw lastOwner();
    const previous = target.role;
    target.role = role;
    await target.save({ transaction });
    if (previous !== role) {
      await writeAudit(
        {
          actor,
          action: role === 'customer' ? 'person.removed' : 'person.role_changed',
          subject: { type: 'user', id: target.id },
          summary:
            role === 'customer'
              ? `Removed ${personLabel(target)} (${roleWords(previous)}) from the studio`
              : `Changed ${personLabel(target)} from ${roleWords(previous)} to ${roleWords(role)}`,
          before: { role: previous },
          after: { role },
        },
        transaction,
      );
    }
    if (role === 'customer') {
      // Losing the studio role ends their signed-in sessions too.
      await models.AuthSession.destroy({ where: { userId: target.id }, transaction });
    }
    return { id: target.id, name: target.name, email: target.email, role: target.role, since: target.updatedAt };
  });
}

export function changeStudioRole(actor: CurrentUser, input: z.infer<typeof changeRoleSchema>) {
  return setRole(actor, input.userId, input.role);
}

export function removeFromStudio(actor: CurrentUser, input: z.infer<typeof removePersonSchema>) {
  return setRole(actor, input.userId, 'customer');
}

/** Gives a person a studio role (making their account if needed) and tells them by e-mail. */
export async function invitePerson(
  actor: CurrentUser,
  input: z.infer<typeof invitePersonSchema>,
): Promise<{ person: StudioPerson; emailed: boolean }> {
  const { models, sequelize } = getDb();
  const user = await sequelize.transaction(async (transaction) => {
    const [found] = await models.User.findOrCreate({
      where: { email: input.email },
      defaults: { email: input.email, name: input.name ?? null, emailVerified: null, role: 'customer' },
      transaction,
    });
    // Locked, so two owners inviting the same address at once give one studio role, logged once.
    const person = await found.reload({ lock: transaction.LOCK.UPDATE, transaction });
    if (person.role !== 'customer') {
      throw new AppError('already_in_studio', `${input.email} is already in the studio as ${roleWords(person.role)}.`, 409);
    }
    person.role = input.role;
    if (!person.name && input.name) person.name = input.name;
    await person.save({ transaction });
    await writeAudit(
      {
        actor,
        action: 'person.invited',
        subject: { type: 'user', id: person.id },
        summary: `Invited ${personLabel(person)}${person.name ? ` (${person.email})` : ''} as ${roleWords(input.role)}`,
        before: { role: 'customer' },
        after: { role: input.role },
      },
      transaction,
    );
    return person;
  });

  const studio = await models.Studio.findOne({ order: [['createdAt', 'ASC']] });
  let emailed = true;
  try {
    await sendEmail({
      to: user.email,
      subject: `You are in the workshop of ${studio?.name ?? 'the studio'}`,
      body: createElement(StaffInvitationEmail, {
        studioName: studio?.name ?? 'the studio',
        inviterName: actor.name ?? actor.email,
        roleLabel: roleLabels[input.role],
        signInUrl: `${getEnv().APP_URL}/sign-in?callbackUrl=${encodeURIComponent('/workshop')}`,
      }),
    });
  } catch {
    emailed = false;
  }
  return { person: { id: user.id, name: user.name, email: user.email, role: user.role, since: user.updatedAt }, emailed };
}

/** For the `studio:owner` command: makes (or promotes) the given address an owner. */
export async function makeOwner(email: string): Promise<{ created: boolean }> {
  const { models, sequelize } = getDb();
  return sequelize.transaction(async (transaction) => {
    const [user, created] = await models.User.findOrCreate({
      where: { email },
      defaults: { email, name: null, emailVerified: null, role: 'owner' },
      transaction,
    });
    const previous: Role = created ? 'customer' : user.role;
    if (previous === 'owner') return { created };
    user.role = 'owner';
    await user.save({ transaction });
    await writeAudit(
      {
        actor: 'system',
        action: 'person.role_changed',
        subject: { type: 'user', id: user.id },
        summary: `Made ${personLabel(user)} ${roleWords('owner')} from the command line`,
        before: { role: previous },
        after: { role: 'owner' },
      },
      transaction,
    );
    return { created };
  });
}
