import { apiHandler, noStore } from '@/lib/api/handler';
import { clientIp, parseBody } from '@/lib/api/request';
import { getCurrentUser } from '@/lib/auth/session';
import { joinWaitlist } from '@/lib/waitlist/join';
import { joinWaitlistRequestSchema } from '@/lib/waitlist/schemas';

/**
 * Joins the waitlists of 1–10 designs: 200 with one result per design, each saying what happens next.
 * Anyone may call it; a signed-in buyer joins with their own address and sees their real state.
 */
export const POST = apiHandler(async (request: Request) => {
  const input = await parseBody(request, joinWaitlistRequestSchema);
  const user = await getCurrentUser();
  const result = await joinWaitlist({ ...input, user, ip: clientIp(request.headers) });
  return Response.json(result, { headers: noStore });
});
