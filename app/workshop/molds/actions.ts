'use server';

import { revalidatePath } from 'next/cache';
import { authorizedAction } from '@/lib/auth/action';
import { addMold, recordPulls, retireMold } from '@/lib/molds/molds';
import { addMoldSchema, recordPullsSchema, retireMoldSchema } from '@/lib/molds/schemas';

// Molds change what the planner can promise, so both pages are refreshed after each change.
function refresh() {
  revalidatePath('/workshop/molds');
  revalidatePath('/workshop/plan');
}

export const addMoldAction = authorizedAction('owner', addMoldSchema, async (input, user) => {
  const mold = await addMold(user, input);
  refresh();
  return `${mold.label} is added, with ${mold.expectedLifePulls - mold.pullsSoFar} pulls of life ahead of it.`;
});

export const recordPullsAction = authorizedAction('owner', recordPullsSchema, async (input, user) => {
  const mold = await recordPulls(user, input);
  refresh();
  return `${input.pulls === 1 ? '1 pull' : `${input.pulls} pulls`} added to ${mold.label}: ${mold.pullsSoFar} of ${mold.expectedLifePulls} so far.`;
});

export const retireMoldAction = authorizedAction('owner', retireMoldSchema, async (input, user) => {
  const mold = await retireMold(user, input);
  refresh();
  return `${mold.label} is retired after ${mold.pullsSoFar} pulls.`;
});
