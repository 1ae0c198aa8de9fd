import { stringify } from 'csv-stringify/sync';
import { apiHandler } from '@/lib/api/handler';
import { requireRole } from '@/lib/auth/authorize';
import { csvColumns, parseWorkshopOrdersQuery, streamWorkshopOrders } from '@/lib/orders/workshop-list';

// A cell a spreadsheet would read as a formula (= + - @) gets a leading apostrophe: common practice
// against CSV injection. The byte-order mark lets spreadsheet programs read the file as UTF-8.
const csvOptions = { escape_formulas: true, record_delimiter: 'windows' } as const;

/** The whole filtered view as CSV (paging ignored), written batch by batch as the client reads it. */
export const GET = apiHandler(async (request: Request) => {
  await requireRole('staff');
  const query = parseWorkshopOrdersQuery(new URL(request.url).searchParams);
  const batches = streamWorkshopOrders(query);
  const encoder = new TextEncoder();
  const toCsv = (rows: (string | number)[][], bom = false) => encoder.encode(stringify(rows, { ...csvOptions, bom }));
  // The first batch is read before answering, so a failing database is still a plain 500, not a broken file.
  let next = await batches.next();

  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(toCsv([csvColumns.map(([name]) => name)], true));
    },
    async pull(controller) {
      try {
        if (next.done) return controller.close();
        controller.enqueue(toCsv(next.value.map((row) => csvColumns.map(([, cell]) => cell(row)))));
        next = await batches.next();
      } catch (error) {
        // Headers are sent by now: the only honest signal left is a broken download, never a short file that looks whole.
        console.error('The orders export failed part-way', error);
        controller.error(error);
      }
    },
    async cancel() {
      await batches.return(undefined);
    },
  });

  const day = new Date().toISOString().slice(0, 10);
  return new Response(body, {
    headers: {
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="demold-orders-${day}.csv"`,
      'Cache-Control': 'no-store',
    },
  });
});
