import { AppError } from '@/lib/api/errors';
import { apiHandler } from '@/lib/api/handler';
import { requireUser } from '@/lib/auth/authorize';
import { releaseHold } from '@/lib/drops/holds';
import { holdIdSchema } from '@/lib/drops/schemas';

type Context = { params: Promise<{ id: string }> };

/** Lets the buyer's own hold go; its units return to the batch at once. */
export const DELETE = apiHandler(async (_request: Request, context: Context) => {
  const user = await requireUser();
  const id = holdIdSchema.safeParse((await context.params).id);
  // A malformed id cannot be anyone's hold: the same 404 as someone else's.
  if (!id.success) throw new AppError('hold_not_found', 'That hold is not yours, or it has already ended.', 404);
  await releaseHold(user, id.data);
  return new Response(null, { status: 204 });
});
