import { csvDownload } from '@/lib/api/csv-download';
import { apiHandler } from '@/lib/api/handler';
import { requireRole } from '@/lib/auth/authorize';
import { csvColumns, parseWorkshopOrdersQuery, streamWorkshopOrders } from '@/lib/orders/workshop-list';

/** The whole filtered view as CSV (paging ignored), written batch by batch as the client reads it. */
export const GET = apiHandler(async (request: Request) => {
  await requireRole('staff');
  const query = parseWorkshopOrdersQuery(new URL(request.url).searchParams);
  return csvDownload({ pages: streamWorkshopOrders(query), columns: csvColumns, filename: 'demold-orders', what: 'orders' });
});
