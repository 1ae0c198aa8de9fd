import { AppError } from '@/lib/api/errors';
import { apiHandler, noStore } from '@/lib/api/handler';
import { getAvailability } from '@/lib/drops/availability';
import { batchIdSchema } from '@/lib/drops/schemas';

type Context = { params: Promise<{ batchId: string }> };

/** Live stock and phase of one drop, polled every couple of seconds by the drop page. */
export const GET = apiHandler(async (_request: Request, context: Context) => {
  const id = batchIdSchema.safeParse((await context.params).batchId);
  if (!id.success) throw new AppError('batch_not_found', 'There is no such batch in the shop.', 404);
  const availability = await getAvailability(id.data);
  if (!availability) throw new AppError('batch_not_found', 'There is no such batch in the shop.', 404);
  return Response.json(availability, { headers: noStore });
});
