'use server';

import { revalidatePath } from 'next/cache';
import { authorizedAction } from '@/lib/auth/action';
import { moveLines } from '@/lib/production/move';
import { failLineFormSchema, moveLinesFormSchema, recastLineFormSchema } from '@/lib/production/schemas';
import { failureFor } from '@/lib/production/stages';

function refreshBoard() {
  revalidatePath('/workshop/production');
  // An order that starts production shows its new state in the orders list.
  revalidatePath('/workshop/orders');
}

export const moveLinesAction = authorizedAction('staff', moveLinesFormSchema, async (input, user) => {
  try {
    return (await moveLines({ lineIds: input.lineIds, from: input.from, to: input.to, actor: user })).message;
  } finally {
    refreshBoard();
  }
});

export const failLineAction = authorizedAction('owner', failLineFormSchema, async (input, user) => {
  try {
    return (await moveLines({ lineIds: [input.lineId], from: input.from, to: failureFor(input.from)!, actor: user })).message;
  } finally {
    refreshBoard();
  }
});

export const recastLineAction = authorizedAction('owner', recastLineFormSchema, async (input, user) => {
  try {
    const { message } = await moveLines({ lineIds: [input.lineId], from: input.from, to: 'to_cast', actor: user });
    return `${message} Pull a spare from the mold.`;
  } finally {
    refreshBoard();
  }
});
