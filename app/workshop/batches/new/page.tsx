import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageRole } from '@/lib/auth/authorize';
import { listDesignsForBatches } from '@/lib/drops/batches';
import { BatchForm } from '../_components/batch-form';

export const metadata: Metadata = { title: 'New batch' };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };
const one = (v: string | string[] | undefined) => (typeof v === 'string' ? v : '');
const isDate = (v: string) => /^\d{4}-\d{2}-\d{2}$/.test(v);

export default async function NewBatchPage({ searchParams }: Props) {
  await requirePageRole('owner', '/workshop/batches/new');
  const query = await searchParams;
  const designs = await listDesignsForBatches();
  // The planner links here with the design, the quantities per finish and its ship-by date.
  const design = designs.find((d) => d.slug === one(query.design)) ?? designs.find((d) => d.status === 'published') ?? designs[0];
  const quantities: Record<string, number> = {};
  for (const [key, value] of Object.entries(query)) {
    const n = Number(one(value));
    if (key.startsWith('qty.') && Number.isInteger(n) && n >= 0 && n <= 10_000) quantities[key.slice(4)] = n;
  }
  const planned = isDate(one(query.shipBy)) ? one(query.shipBy) : '';
  return (
    <>
      <p className="text-sm"><Link href="/workshop/batches" className="text-ink-soft underline underline-offset-4">← All batches</Link></p>
      <h1 className="mt-2 text-4xl font-medium">New batch</h1>
      <p className="mt-2 max-w-2xl text-ink-soft">
        Choose how many masks of each finish, when the drop opens and closes, and the ship-by date buyers are promised.
        {planned ? ' The quantities and ship-by date come from the plan.' : ' The planner can work out an honest ship-by date first.'}
      </p>
      {designs.length === 0 ? (
        <p className="mt-8">There are no designs yet: add one first.</p>
      ) : (
        <div className="mt-8">
          <BatchForm
            designs={designs}
            editing={false}
            scheduled={false}
            locked={{ times: false, hasHolds: false }}
            values={{ designId: design?.id ?? '', name: '', announcement: '', perBuyerLimit: 1, holdMinutes: 10, earlyAccessAt: '', opensAt: '', closesAt: '', shipBy: planned, plannedShipBy: planned, quantities }}
          />
        </div>
      )}
    </>
  );
}
