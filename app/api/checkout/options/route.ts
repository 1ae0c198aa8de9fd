import { AppError } from '@/lib/api/errors';
import { apiHandler, noStore } from '@/lib/api/handler';
import { requireUser } from '@/lib/auth/authorize';
import { getCheckoutOptions } from '@/lib/orders/checkout';
import { checkoutOptionsSchema } from '@/lib/orders/schemas';

/** Where a held mask can ship, how, and the total for each choice, priced on the server. */
export const GET = apiHandler(async (request: Request) => {
  const user = await requireUser();
  const params = new URL(request.url).searchParams;
  const parsed = checkoutOptionsSchema.safeParse({ holdId: params.get('holdId') ?? undefined, country: params.get('country') || undefined });
  if (!parsed.success) throw new AppError('invalid_input', parsed.error.issues[0]?.message ?? 'Check the query.', 400);
  return Response.json(await getCheckoutOptions(user, parsed.data), { headers: noStore });
});
