import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { requirePageRole } from '@/lib/auth/authorize';
import { requestTime } from '@/lib/clock';
import { hasRole } from '@/lib/auth/roles';
import { listDesignsForBatches, listWorkshopBatches } from '@/lib/drops/batches';
import { utcToLocalInput } from '@/lib/drops/local-time';
import { formatInZone } from '@/lib/drops/phase';
import { batchIdSchema } from '@/lib/drops/schemas';
import { listBatchPhotos } from '@/lib/photos/batch-photos';
import { BatchForm } from '../_components/batch-form';
import { CancelBatch } from '../_components/cancel-batch';
import { BatchPhotosSection } from './_components/batch-photos-section';

export const metadata: Metadata = { title: 'Batch' };

type Props = { params: Promise<{ batchId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> };

export default async function BatchPage({ params, searchParams }: Props) {
  const { batchId } = await params;
  const user = await requirePageRole('staff', `/workshop/batches/${batchId}`);
  const id = batchIdSchema.safeParse(batchId);
  if (!id.success) notFound();
  const [batch] = await listWorkshopBatches(id.data);
  if (!batch) notFound();
  const query = await searchParams;
  const [designs, photos] = await Promise.all([listDesignsForBatches(), listBatchPhotos(batch.id)]);
  const zone = batch.timeZone;
  const started = batch.status === 'scheduled' && new Date(batch.earlyAccessAt ?? batch.opensAt).getTime() <= requestTime();
  const owner = hasRole(user.role, 'owner');
  return (
    <>
      <p className="flex flex-wrap gap-x-4 text-sm"><Link href="/workshop/batches" className="text-ink-soft underline underline-offset-4">← All batches</Link><Link href={`/workshop/batches/${batch.id}/report`} className="underline underline-offset-4">Drop report</Link></p>
      <h1 className="mt-2 text-4xl font-medium">{batch.designName}: {batch.name}</h1>
      <p className="mt-2 text-ink-soft">
        {batch.status === 'draft' ? 'Draft: the shop does not show it.' : batch.status === 'cancelled' ? 'Cancelled.' : `Scheduled: opens ${formatInZone(new Date(batch.opensAt), zone)}.`}{' '}
        {batch.status !== 'draft' ? <Link href={`/drops/${batch.id}`} className="underline underline-offset-4">See the drop page</Link> : null}
      </p>
      {query.saved ? (
        <p role="status" className="mt-4 rounded-sm border-2 border-moss bg-paper p-3">
          {query.saved === 'scheduled' ? 'Scheduled: the batch shows in the shop now.' : 'Saved as a draft.'}
          {query.warning === 'ship-by' ? ' Its ship-by date is earlier than the plan says is reachable.' : ''}
        </p>
      ) : null}
      {owner && batch.status !== 'cancelled' ? (
        <div className="mt-8 grid gap-8">
          <BatchForm
            designs={designs}
            editing
            scheduled={batch.status === 'scheduled'}
            locked={{ times: started, hasHolds: batch.hasHolds }}
            values={{
              batchId: batch.id,
              designId: batch.designId,
              name: batch.name,
              announcement: batch.announcement,
              perBuyerLimit: batch.perBuyerLimit,
              holdMinutes: batch.holdMinutes,
              earlyAccessAt: batch.earlyAccessAt ? utcToLocalInput(new Date(batch.earlyAccessAt), zone) : '',
              opensAt: utcToLocalInput(new Date(batch.opensAt), zone),
              closesAt: utcToLocalInput(new Date(batch.closesAt), zone),
              shipBy: batch.shipBy,
              plannedShipBy: batch.plannedShipBy ?? '',
              quantities: Object.fromEntries(batch.stock.map((s) => [s.finishId, s.quantity])),
            }}
          />
          <CancelBatch batchId={batch.id} name={batch.name} />
        </div>
      ) : (
        <dl className="mt-8 grid max-w-xl grid-cols-[auto_1fr] gap-x-6 gap-y-2">
          <dt className="font-semibold">Masks</dt><dd className="figures">{batch.quantity} ({batch.held} held, {batch.sold} sold)</dd>
          <dt className="font-semibold">Per buyer</dt><dd>{batch.perBuyerLimit}</dd>
          <dt className="font-semibold">Ships by</dt><dd className="figures">{batch.shipBy}</dd>
          {!owner ? <dd className="col-span-2 text-ink-soft">Only the maker can change a batch.</dd> : null}
        </dl>
      )}
      <BatchPhotosSection batch={batch} photos={photos} owner={owner} />
    </>
  );
}
