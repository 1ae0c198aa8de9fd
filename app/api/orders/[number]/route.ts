import { AppError } from '@/lib/api/errors';
import { apiHandler, noStore } from '@/lib/api/handler';
import { getCurrentUser } from '@/lib/auth/session';
import { getOrderForBuyer } from '@/lib/orders/queries';
import { orderNumberSchema } from '@/lib/orders/schemas';
import { orderStateLabels } from '@/lib/orders/states';

/** An order's state, for its page to follow while a payment is being confirmed. Its buyer, or the signed link. */
export const GET = apiHandler(async (request: Request, { params }: { params: Promise<{ number: string }> }) => {
  const parsed = orderNumberSchema.safeParse((await params).number);
  if (!parsed.success) throw new AppError('order_not_found', 'There is no such order.', 404);
  const user = await getCurrentUser();
  const token = new URL(request.url).searchParams.get('token');
  const order = await getOrderForBuyer(parsed.data, { userId: user?.id ?? null, token });
  if (!order) throw new AppError('order_not_found', 'There is no such order, or this link is not for it.', 404);
  return Response.json(
    { number: order.number, state: order.state, stateLabel: orderStateLabels[order.state], paidAt: order.paidAt, refundedMinor: order.refundedMinor },
    { headers: noStore },
  );
});
