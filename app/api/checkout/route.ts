import { apiHandler, noStore } from '@/lib/api/handler';
import { parseBody } from '@/lib/api/request';
import { requireUser } from '@/lib/auth/authorize';
import { startCheckout } from '@/lib/orders/checkout';
import { checkoutSchema } from '@/lib/orders/schemas';

/** Opens the payment page for one of the buyer's running holds: 200 with the page's URL. */
export const POST = apiHandler(async (request: Request) => {
  const user = await requireUser();
  const input = await parseBody(request, checkoutSchema);
  const checkout = await startCheckout(user, input);
  return Response.json(checkout, { headers: noStore });
});
