import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageRole } from '@/lib/auth/authorize';
import { listDesignsForWorkshop } from '@/lib/catalogue/workshop';
import { listOversoldLines } from '@/lib/orders/queries';

export const metadata: Metadata = { title: 'Overview' };

const statusStyle = {
  published: 'bg-moss-wash text-moss',
  draft: 'bg-paper-deep text-ink-soft',
  retired: 'bg-paper-deep text-ink-faint line-through',
} as const;

export default async function WorkshopOverviewPage() {
  await requirePageRole('staff', '/workshop');
  const [designs, oversold] = await Promise.all([listDesignsForWorkshop(), listOversoldLines()]);
  return (
    <>
      <h1 className="text-3xl font-medium">Overview</h1>
      <p className="mt-1 text-ink-soft">Designs and finishes as the shop sees them. Drafts are not shown to buyers.</p>
      {oversold.length > 0 ? (
        <p className="mt-6 flex gap-2 rounded-sm border border-ember bg-ember-wash px-4 py-3 text-ember-deep">
          <span aria-hidden="true">▲</span>
          <span>
            <strong>
              {oversold.length === 1 ? '1 mask was' : `${oversold.length} masks were`} paid after the stock had gone
            </strong>{' '}
            — decide in the{' '}
            <Link href="/workshop/oversold" className="font-semibold underline underline-offset-4">
              oversold queue
            </Link>
            .
          </span>
        </p>
      ) : null}
      <div className="mt-6 overflow-x-auto rounded-sm border border-paper-edge bg-paper">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Designs</caption>
          <thead className="border-b border-paper-edge text-ink-soft">
            <tr>
              <th scope="col" className="px-4 py-3 font-semibold">Design</th>
              <th scope="col" className="px-4 py-3 font-semibold">State</th>
              <th scope="col" className="px-4 py-3 font-semibold">Finishes</th>
              <th scope="col" className="px-4 py-3 text-right font-semibold">Photos</th>
            </tr>
          </thead>
          <tbody>
            {designs.map((design) => (
              <tr key={design.slug} className="border-b border-paper-edge/60 last:border-0">
                <th scope="row" className="px-4 py-3 text-base font-semibold">{design.name}</th>
                <td className="px-4 py-3">
                  <span className={`rounded-full px-2 py-0.5 text-xs font-semibold ${statusStyle[design.status]}`}>{design.status}</span>
                </td>
                <td className="px-4 py-3">
                  {design.finishes.map((f) => (f.status === 'published' ? f.name : `${f.name} (${f.status})`)).join(', ') || '—'}
                </td>
                <td className="figures px-4 py-3 text-right">{design.photoCount}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {designs.length === 0 ? <p className="mt-4 text-ink-soft">No designs yet.</p> : null}
    </>
  );
}
