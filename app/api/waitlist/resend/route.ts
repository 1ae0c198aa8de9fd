import { apiHandler, noStore } from '@/lib/api/handler';
import { clientIp, parseBody } from '@/lib/api/request';
import { resendConfirmation } from '@/lib/waitlist/confirm';
import { tokenBodySchema } from '@/lib/waitlist/schemas';

/** A fresh confirmation link for an entry whose link expired or was replaced; the old link's token is the proof. */
export const POST = apiHandler(async (request: Request) => {
  const { t } = await parseBody(request, tokenBodySchema);
  const result = await resendConfirmation(t, clientIp(request.headers));
  return Response.json(result, { headers: noStore });
});
