import { apiHandler, noStore } from '@/lib/api/handler';
import { requireRole } from '@/lib/auth/authorize';
import { listWorkshopOrderPage, parseWorkshopOrdersQuery } from '@/lib/orders/workshop-list';

/** One page of the workshop's orders, filtered and sorted on the server. Studio hands and the maker. */
export const GET = apiHandler(async (request: Request) => {
  await requireRole('staff');
  const query = parseWorkshopOrdersQuery(new URL(request.url).searchParams);
  return Response.json(await listWorkshopOrderPage(query), { headers: noStore });
});
