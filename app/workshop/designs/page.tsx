import type { Metadata } from 'next';
import Link from 'next/link';
import { connection } from 'next/server';
import { requirePageRole } from '@/lib/auth/authorize';
import { listDesignsForWorkshop } from '@/lib/catalogue/workshop';
import { ReadOnlyNotice } from './_components/read-only';
import { StatusBadge, statusLabels, statusMeaning } from './_components/status';

export const metadata: Metadata = { title: 'Designs' };

export default async function WorkshopDesignsPage() {
  const user = await requirePageRole('staff', '/workshop/designs');
  await connection();
  const designs = await listDesignsForWorkshop();
  const isOwner = user.role === 'owner';
  return (
    <>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-medium">Designs</h1>
          <p className="mt-1 text-ink-soft">
            Every design, drafts and retired ones included. Buyers see only published designs, in their published finishes.
          </p>
        </div>
        {isOwner ? (
          <Link href="/workshop/designs/new" className="rounded-full bg-ink px-5 py-2 font-semibold text-paper">
            New design
          </Link>
        ) : null}
      </div>
      {isOwner ? null : (
        <div className="mt-4">
          <ReadOnlyNotice />
        </div>
      )}

      {designs.length === 0 ? (
        <p className="mt-6 rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">
          No designs yet.{isOwner ? ' Start with “New design”: it stays a draft until you publish it.' : ''}
        </p>
      ) : (
        <div className="mt-6 overflow-x-auto rounded-sm border border-paper-edge bg-paper">
          <table className="w-full text-left text-sm">
            <caption className="sr-only">All designs with their state, finishes and photos</caption>
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
                <tr key={design.slug} className="border-b border-paper-edge/60 align-top last:border-0">
                  <th scope="row" className="px-4 py-3">
                    <Link
                      href={`/workshop/designs/${design.slug}`}
                      className="text-base font-semibold underline underline-offset-4 hover:text-ember-deep"
                    >
                      {design.name}
                      <span className="sr-only">{isOwner ? ', edit' : ', view'}</span>
                    </Link>
                  </th>
                  <td className="px-4 py-3">
                    <StatusBadge status={design.status} />
                    <span className="mt-1 block text-ink-soft">{statusMeaning[design.status]}</span>
                  </td>
                  <td className="px-4 py-3">
                    {design.finishes.length === 0 ? (
                      <span className="text-ink-faint">None yet</span>
                    ) : (
                      <ul className="grid gap-0.5">
                        {design.finishes.map((finish) => (
                          <li key={finish.name}>
                            {finish.name} <span className="text-ink-soft">· {statusLabels[finish.status].toLowerCase()}</span>
                          </li>
                        ))}
                      </ul>
                    )}
                  </td>
                  <td className="figures px-4 py-3 text-right">{design.photoCount}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
