import { stringify } from 'csv-stringify/sync';
import { apiHandler } from '@/lib/api/handler';
import { requireRole } from '@/lib/auth/authorize';
import { parseWaitlistExportQuery, streamWaitlistEntries, waitlistCsvColumns } from '@/lib/waitlist/workshop-view';

// As the orders export: a cell a spreadsheet would read as a formula (= + - @) gets a leading apostrophe (common
// practice against CSV injection), and the byte-order mark lets spreadsheet programs read the file as UTF-8.
const csvOptions = { escape_formulas: true, record_delimiter: 'windows' } as const;

/** The waitlist (optionally one design, one state) as CSV, written page by page as the client reads it. */
export const GET = apiHandler(async (request: Request) => {
  await requireRole('staff');
  const query = parseWaitlistExportQuery(new URL(request.url).searchParams);
  const pages = streamWaitlistEntries(query);
  const encoder = new TextEncoder();
  const toCsv = (rows: string[][], bom = false) => encoder.encode(stringify(rows, { ...csvOptions, bom }));
  // The first page is read before answering, so a failing database is still a plain error answer, not a broken file.
  let next = await pages.next();

  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(toCsv([waitlistCsvColumns.map(([name]) => name)], true));
    },
    async pull(controller) {
      try {
        if (next.done) return controller.close();
        controller.enqueue(toCsv(next.value.map((row) => waitlistCsvColumns.map(([, cell]) => cell(row)))));
        next = await pages.next();
      } catch (error) {
        // Headers are sent by now: a broken download is the honest signal, never a short file that looks whole.
        console.error('The waitlist export failed part-way', error);
        controller.error(error);
      }
    },
    async cancel() {
      await pages.return(undefined);
    },
  });

  const day = new Date().toISOString().slice(0, 10);
  return new Response(body, {
    headers: {
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="demold-waitlist-${day}.csv"`,
      'Cache-Control': 'no-store',
    },
  });
});
