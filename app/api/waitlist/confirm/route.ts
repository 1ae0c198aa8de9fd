import { AppError } from '@/lib/api/errors';
import { apiHandler, noStore } from '@/lib/api/handler';
import { parseBody } from '@/lib/api/request';
import { confirmWaitlist, type ConfirmOutcome } from '@/lib/waitlist/confirm';
import { tokenBodySchema } from '@/lib/waitlist/schemas';

const words: Record<Exclude<ConfirmOutcome, 'damaged' | 'unknown' | 'ready'>, string> = {
  confirmed: 'You are on the list. We will write when the next batch opens, and only then.',
  already_confirmed: 'You are already on the list.',
  expired: 'This link has expired. Ask for a fresh one below.',
  superseded: 'A newer link was sent since this one. Use the newest e-mail, or ask for a fresh link below.',
  left: 'You left this waitlist, so this old link does not put you back. Join again to get a new link.',
};

/** Uses a confirmation link (the confirm page's button): the state it ends in, in words; a bad link is a 400. */
export const POST = apiHandler(async (request: Request) => {
  const { t } = await parseBody(request, tokenBodySchema);
  const result = await confirmWaitlist(t);
  if (result.outcome === 'damaged' || result.outcome === 'unknown' || result.outcome === 'ready') {
    throw new AppError('damaged_link', 'This confirmation link is damaged. Copy the whole link from the e-mail, or join the waitlist again.', 400);
  }
  return Response.json({ outcome: result.outcome, designName: result.designName, message: words[result.outcome] }, { headers: noStore });
});
