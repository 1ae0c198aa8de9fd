import { z } from 'zod';
import { AppError } from '@/lib/api/errors';
import { apiHandler } from '@/lib/api/handler';
import { requireRole } from '@/lib/auth/authorize';
import { assertPrintable, listed, loadSlipOrders, maxSlipOrders, recordSlipsPrinted, renderPackingSlips } from '@/lib/documents/packing-slips';
import { orderNumberSchema } from '@/lib/orders/schemas';
import { loadStudioSettings } from '@/lib/settings/studio';

const slipNumbersSchema = z
  .array(z.string().trim().pipe(orderNumberSchema))
  .min(1, 'Name at least one order, as ?number=DM-1001.')
  .max(maxSlipOrders, `Print at most ${maxSlipOrders} orders at a time; split the list and print each part.`);

function parseNumbers(params: URLSearchParams): string[] {
  const parsed = slipNumbersSchema.safeParse(params.getAll('number'));
  if (parsed.success) return [...new Set(parsed.data)];
  const issue = parsed.error.issues[0];
  const at = typeof issue?.path[0] === 'number' ? issue.path[0] : null;
  const message = at === null ? (issue?.message ?? 'Check the order numbers and try again.') : `"${params.getAll('number')[at]}": ${issue!.message}`;
  throw new AppError('invalid_query', message, 400, { fields: { number: parsed.error.issues.map((i) => i.message) } });
}

/** Packing slips, with customs summaries for parcels leaving the customs area, for the named orders as one PDF. */
export const GET = apiHandler(async (request: Request) => {
  const user = await requireRole('staff');
  const numbers = parseNumbers(new URL(request.url).searchParams);
  const settings = await loadStudioSettings();
  if (!settings) throw new AppError('studio_not_set_up', 'The studio is not set up yet: an owner sets it up in Settings first.', 409);
  const orders = await loadSlipOrders(numbers);
  const found = new Set(orders.map((o) => o.number));
  const unknown = numbers.filter((n) => !found.has(n));
  if (unknown.length > 0) {
    throw new AppError(
      'order_not_found',
      `There is no order ${listed(unknown)}. Check the ${unknown.length === 1 ? 'number' : 'numbers'} and print again.`,
      404,
      { numbers: unknown },
    );
  }
  assertPrintable(orders, settings);
  const pdf = await renderPackingSlips(orders, settings);
  await recordSlipsPrinted(orders, settings, user.id);
  return new Response(new Uint8Array(pdf), {
    headers: {
      'Content-Type': 'application/pdf',
      'Content-Disposition': `inline; filename="packing-slips-${numbers[0]}.pdf"`,
      'Content-Length': String(pdf.length),
      'Cache-Control': 'no-store',
    },
  });
});
