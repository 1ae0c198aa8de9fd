import { apiHandler, noStore } from '@/lib/api/handler';
import { parseBody } from '@/lib/api/request';
import { damagedUnsubscribeLink, leaveByToken, readUnsubscribeToken } from '@/lib/waitlist/leave';
import { oneClickUnsubscribeSchema } from '@/lib/waitlist/schemas';

/**
 * RFC 8058 one-click unsubscribe: a POST to the List-Unsubscribe URI with the body
 * `List-Unsubscribe=One-Click`. No cookie or sign-in: the signed token in `t` is the proof. The unsubscribe
 * page's buttons post here too (with `scope=all` to leave every waitlist of the address).
 */
export const POST = apiHandler(async (request: Request) => {
  const token = new URL(request.url).searchParams.get('t');
  if (!readUnsubscribeToken(token)) throw damagedUnsubscribeLink();
  const { scope } = await parseBody(request, oneClickUnsubscribeSchema);
  const { message } = await leaveByToken(token, scope);
  return Response.json({ left: true, message }, { headers: noStore });
});
