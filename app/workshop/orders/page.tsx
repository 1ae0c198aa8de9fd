import type { Metadata } from 'next';
import { Suspense } from 'react';
import { requirePageRole } from '@/lib/auth/authorize';
import { listDesignsForHomeCached } from '@/lib/catalogue/cached';
import { listDesignsForBatches, listWorkshopBatches } from '@/lib/drops/batches';
import { OrdersTable } from './_components/orders-table';

export const metadata: Metadata = { title: 'Orders' };

// The check runs here, on the server; the table itself is a client component that reads its view from the URL.
export default async function WorkshopOrdersPage() {
  await requirePageRole('staff', '/workshop/orders');
  const [{ studio }, batches, designs] = await Promise.all([listDesignsForHomeCached(), listWorkshopBatches(), listDesignsForBatches()]);
  const zone = studio?.timeZone ?? 'UTC';
  const batchOptions = batches.map((b) => ({ id: b.id, label: `${b.designName}: ${b.name}` }));
  const finishOptions = designs.flatMap((d) => d.finishes.map((f) => ({ id: f.id, label: `${d.name}: ${f.name}` })));
  return (
    <>
      <h1 className="text-3xl font-medium">Orders</h1>
      <p className="mt-1 text-ink-soft">
        Paid orders unless you choose otherwise, newest first. Times are the studio&rsquo;s ({zone}); the CSV gives them in UTC.
      </p>
      <Suspense fallback={<p className="mt-6 text-ink-soft">Loading orders…</p>}>
        <OrdersTable zone={zone} batches={batchOptions} finishes={finishOptions} />
      </Suspense>
    </>
  );
}
