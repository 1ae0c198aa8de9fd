import { apiHandler, noStore } from '@/lib/api/handler';
import { clientIp, parseBody } from '@/lib/api/request';
import { requireUser } from '@/lib/auth/authorize';
import { createHold } from '@/lib/drops/holds';
import { consumeHoldAllowance } from '@/lib/drops/limits';
import { createHoldSchema } from '@/lib/drops/schemas';

/** Holds a mask for the signed-in buyer: 201 with the hold and its expiry, or a typed refusal. */
export const POST = apiHandler(async (request: Request) => {
  const user = await requireUser();
  await consumeHoldAllowance({ userId: user.id, ip: clientIp(request.headers) });
  const input = await parseBody(request, createHoldSchema);
  const hold = await createHold(user, input);
  return Response.json({ hold }, { status: 201, headers: noStore });
});
