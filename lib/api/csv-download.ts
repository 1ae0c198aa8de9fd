import 'server-only';
import { stringify } from 'csv-stringify/sync';

// A cell a spreadsheet would read as a formula (= + - @) gets a leading apostrophe: common practice
// against CSV injection. The byte-order mark lets spreadsheet programs read the file as UTF-8.
const csvOptions = { escape_formulas: true, record_delimiter: 'windows' } as const;

export type CsvColumn<Row> = [header: string, cell: (row: Row) => string | number];

/**
 * A CSV download streamed page by page as the client reads it: a header row, then each page the generator
 * yields. The first page is read before answering, so a failing database is still a plain error answer, not a
 * broken file; a failure later breaks the download, never a short file that looks whole.
 */
export async function csvDownload<Row>(options: {
  pages: AsyncGenerator<Row[], unknown, unknown>;
  columns: CsvColumn<Row>[];
  /** The file name without the date and extension, e.g. "demold-orders". */
  filename: string;
  /** For the log line when it fails part-way, e.g. "orders". */
  what: string;
}): Promise<Response> {
  const { pages, columns, filename, what } = options;
  const encoder = new TextEncoder();
  const toCsv = (rows: (string | number)[][], bom = false) => encoder.encode(stringify(rows, { ...csvOptions, bom }));
  let next = await pages.next();

  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(toCsv([columns.map(([name]) => name)], true));
    },
    async pull(controller) {
      try {
        if (next.done) return controller.close();
        controller.enqueue(toCsv(next.value.map((row) => columns.map(([, cell]) => cell(row)))));
        next = await pages.next();
      } catch (error) {
        // Headers are sent by now: the only honest signal left is a broken download.
        console.error(`The ${what} export failed part-way`, error);
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
      'Content-Disposition': `attachment; filename="${filename}-${day}.csv"`,
      'Cache-Control': 'no-store',
    },
  });
}
