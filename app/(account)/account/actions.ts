'use server';

import { revalidatePath } from 'next/cache';
import { authorizedAction } from '@/lib/auth/action';
import { updateAccountName } from '@/lib/auth/account';
import { updateNameSchema } from '@/lib/auth/schemas';

export const updateAccountNameAction = authorizedAction('customer', updateNameSchema, async (input, user) => {
  await updateAccountName(user, input);
  revalidatePath('/account');
  return 'Your name is saved.';
});
