'use server';

import { revalidatePath } from 'next/cache';
import { authorizedAction } from '@/lib/auth/action';
import {
  changeRoleSchema,
  changeStudioRole,
  invitePerson,
  invitePersonSchema,
  removeFromStudio,
  removePersonSchema,
} from '@/lib/auth/people';
import { roleLabels } from '@/lib/auth/roles';

export const invitePersonAction = authorizedAction('owner', invitePersonSchema, async (input, user) => {
  const { person, emailed } = await invitePerson(user, input);
  revalidatePath('/workshop/people');
  return emailed
    ? `${person.email} is now ${roleLabels[person.role].toLowerCase()}; we e-mailed them how to sign in.`
    : `${person.email} is now ${roleLabels[person.role].toLowerCase()}, but the e-mail could not be sent: tell them to sign in with that address.`;
});

export const changeRoleAction = authorizedAction('owner', changeRoleSchema, async (input, user) => {
  const person = await changeStudioRole(user, input);
  revalidatePath('/workshop/people');
  return `${person.name ?? person.email} is now ${roleLabels[person.role].toLowerCase()}.`;
});

export const removePersonAction = authorizedAction('owner', removePersonSchema, async (input, user) => {
  const person = await removeFromStudio(user, input);
  revalidatePath('/workshop/people');
  return `${person.name ?? person.email} no longer has access to the workshop.`;
});
