'use server';

import { revalidatePath } from 'next/cache';
import { authorizedAction } from '@/lib/auth/action';
import { updateAccountName } from '@/lib/auth/account';
import { updateNameSchema } from '@/lib/auth/schemas';
import { leaveAllOfUser, leaveEntryOfUser } from '@/lib/waitlist/leave';
import { leaveAllFormSchema, leaveEntryFormSchema } from '@/lib/waitlist/schemas';

export const updateAccountNameAction = authorizedAction('customer', updateNameSchema, async (input, user) => {
  await updateAccountName(user, input);
  revalidatePath('/account');
  return 'Your name is saved.';
});

export const leaveWaitlistEntryAction = authorizedAction('customer', leaveEntryFormSchema, async (input, user) => {
  const { message } = await leaveEntryOfUser(user, input.entryId);
  revalidatePath('/account');
  return message;
});

export const leaveAllWaitlistsAction = authorizedAction('customer', leaveAllFormSchema, async (_input, user) => {
  const { message } = await leaveAllOfUser(user);
  revalidatePath('/account');
  return message;
});
