import { csvDownload } from '@/lib/api/csv-download';
import { apiHandler } from '@/lib/api/handler';
import { requireRole } from '@/lib/auth/authorize';
import { parseWaitlistExportQuery, streamWaitlistEntries, waitlistCsvColumns } from '@/lib/waitlist/workshop-view';

/** The waitlist (optionally one design, one state) as CSV, written page by page as the client reads it. */
export const GET = apiHandler(async (request: Request) => {
  await requireRole('staff');
  const query = parseWaitlistExportQuery(new URL(request.url).searchParams);
  return csvDownload({ pages: streamWaitlistEntries(query), columns: waitlistCsvColumns, filename: 'demold-waitlist', what: 'waitlist' });
});
