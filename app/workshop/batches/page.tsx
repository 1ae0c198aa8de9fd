import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageRole } from '@/lib/auth/authorize';
import { hasRole } from '@/lib/auth/roles';
import { listWorkshopBatches } from '@/lib/drops/batches';
import { formatInZone } from '@/lib/drops/phase';

export const metadata: Metadata = { title: 'Batches' };

const statusWords = { draft: 'Draft (not in the shop)', scheduled: 'Scheduled', cancelled: 'Cancelled' } as const;

export default async function BatchesPage() {
  const user = await requirePageRole('staff', '/workshop/batches');
  const batches = await listWorkshopBatches();
  return (
    <>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-4xl font-medium">Batches</h1>
          <p className="mt-2 text-ink-soft">Every batch with its drop times and how much of it is held and sold.</p>
        </div>
        {hasRole(user.role, 'owner') ? (
          <div className="flex gap-3">
            <Link href="/workshop/plan" className="rounded-full border border-ink px-5 py-2 font-semibold">Plan a batch</Link>
            <Link href="/workshop/batches/new" className="rounded-full bg-ink px-5 py-2 font-semibold text-paper">New batch</Link>
          </div>
        ) : null}
      </div>
      {batches.length === 0 ? (
        <p className="mt-8 rounded-sm border border-paper-edge bg-paper p-6">No batches yet. Plan one from a design&apos;s molds and painting hours, then schedule its drop.</p>
      ) : (
        <div className="mt-8 overflow-x-auto rounded-sm border border-paper-edge bg-paper">
          <table className="w-full text-left text-sm">
            <thead className="border-b border-paper-edge bg-paper-deep/50">
              <tr>
                <th scope="col" className="px-3 py-2">Batch</th>
                <th scope="col" className="px-3 py-2">Status</th>
                <th scope="col" className="px-3 py-2">Opens (studio time)</th>
                <th scope="col" className="px-3 py-2 text-right">Masks</th>
                <th scope="col" className="px-3 py-2 text-right">Held</th>
                <th scope="col" className="px-3 py-2 text-right">Sold</th>
                <th scope="col" className="px-3 py-2">Ships by</th>
              </tr>
            </thead>
            <tbody>
              {batches.map((batch) => (
                <tr key={batch.id} className="border-b border-paper-edge last:border-0">
                  <td className="px-3 py-2">
                    <Link href={`/workshop/batches/${batch.id}`} className="font-semibold underline underline-offset-4">{batch.designName}: {batch.name}</Link>
                  </td>
                  <td className="px-3 py-2">{statusWords[batch.status]}</td>
                  <td className="figures px-3 py-2">{formatInZone(new Date(batch.opensAt), batch.timeZone)}</td>
                  <td className="figures px-3 py-2 text-right">{batch.quantity}</td>
                  <td className="figures px-3 py-2 text-right">{batch.held}</td>
                  <td className="figures px-3 py-2 text-right">{batch.sold}</td>
                  <td className="figures px-3 py-2">{batch.shipBy}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
