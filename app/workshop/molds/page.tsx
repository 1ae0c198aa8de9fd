import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageRole } from '@/lib/auth/authorize';
import { hasRole } from '@/lib/auth/roles';
import { nearEndShare } from '@/lib/molds/life';
import { listMoldsByDesign, studioToday } from '@/lib/molds/molds';
import { formatDay } from '@/lib/planner/format';
import { MaterialsCaution } from '../plan/_components/materials-caution';
import { AddMoldForm } from './_components/add-mold-form';
import { LifeBar } from './_components/life-bar';
import { MoldActions } from './_components/mold-actions';

export const metadata: Metadata = { title: 'Molds' };

export default async function MoldsPage() {
  const user = await requirePageRole('staff', '/workshop/molds');
  const [designs, today] = await Promise.all([listMoldsByDesign(), studioToday()]);
  const isOwner = hasRole(user.role, 'owner');
  const retired = designs.flatMap((d) => d.molds.filter((m) => m.retiredAt).map((m) => ({ ...m, designName: d.name })));
  return (
    <>
      <h1 className="text-3xl font-medium">Molds</h1>
      <p className="mt-1 max-w-3xl text-ink-soft">
        Each design&rsquo;s molds and their life in pulls. A mold with less than {Math.round(nearEndShare * 100)}% of its
        expected life left is near the end of its life: plan a new one before the next batch.
        {isOwner ? '' : ' Only the maker (owner) can add molds, record pulls or retire them.'}
      </p>

      {isOwner && designs.length > 0 ? (
        <section aria-labelledby="add-mold-title" className="mt-6">
          <h2 id="add-mold-title" className="mb-2 font-sans text-base font-semibold">Add a mold</h2>
          <AddMoldForm designs={designs.map((d) => ({ id: d.designId, name: d.name, status: d.status }))} today={today} />
        </section>
      ) : null}

      {designs.length === 0 ? <p className="mt-6 text-ink-soft">No designs yet: add a design first, then its molds.</p> : null}

      {designs.map((design) => {
        const active = design.molds.filter((m) => !m.retiredAt);
        const headingId = `design-${design.slug}`;
        return (
          <section key={design.designId} aria-labelledby={headingId} className="mt-8">
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <h2 id={headingId} className="text-2xl font-medium">
                {design.name}
                {design.status !== 'published' ? <span className="ml-2 font-sans text-sm font-normal text-ink-faint">({design.status})</span> : null}
              </h2>
              {design.status === 'published' ? (
                <Link href={`/workshop/plan?design=${design.slug}`} className="text-sm underline underline-offset-4 hover:text-ember-deep">
                  Plan a batch of {design.name}
                </Link>
              ) : null}
            </div>
            {active.length === 0 ? (
              <p className="mt-2 rounded-sm border border-paper-edge bg-paper px-4 py-4 text-ink-soft">
                No mold in use. A batch of {design.name} needs a new mold made first.
              </p>
            ) : (
              <ul className="mt-2 divide-y divide-paper-edge rounded-sm border border-paper-edge bg-paper">
                {active.map((mold) => (
                  <li key={mold.id} className="grid gap-3 px-4 py-3 md:grid-cols-[12rem_1fr_auto] md:items-start">
                    <div>
                      <p className="font-semibold">{mold.label}</p>
                      <p className="text-sm text-ink-soft">Made {formatDay(mold.madeOn)}</p>
                      {mold.notes ? <p className="mt-1 text-sm text-ink-soft">{mold.notes}</p> : null}
                    </div>
                    <LifeBar pullsSoFar={mold.pullsSoFar} expectedLifePulls={mold.expectedLifePulls} />
                    {isOwner ? <MoldActions moldId={mold.id} label={mold.label} /> : null}
                  </li>
                ))}
              </ul>
            )}
          </section>
        );
      })}

      {retired.length > 0 ? (
        <section aria-labelledby="retired-title" className="mt-10">
          <h2 id="retired-title" className="text-2xl font-medium">Retired molds</h2>
          <p className="mt-1 text-sm text-ink-soft">Kept for the record; they take no more pulls and the planner leaves them out.</p>
          <div className="mt-2 overflow-x-auto rounded-sm border border-paper-edge bg-paper">
            <table className="w-full text-left text-sm">
              <caption className="sr-only">Retired molds</caption>
              <thead className="border-b border-paper-edge text-ink-soft">
                <tr>
                  <th scope="col" className="px-3 py-2 font-semibold">Mold</th>
                  <th scope="col" className="px-3 py-2 font-semibold">Design</th>
                  <th scope="col" className="px-3 py-2 font-semibold">Made</th>
                  <th scope="col" className="px-3 py-2 font-semibold">Retired</th>
                  <th scope="col" className="px-3 py-2 text-right font-semibold">Pulls</th>
                </tr>
              </thead>
              <tbody>
                {retired.map((mold) => (
                  <tr key={mold.id} className="border-b border-paper-edge/60 last:border-0">
                    <th scope="row" className="px-3 py-2 font-semibold">{mold.label}</th>
                    <td className="px-3 py-2">{mold.designName}</td>
                    <td className="figures px-3 py-2">{formatDay(mold.madeOn)}</td>
                    <td className="figures px-3 py-2">{mold.retiredOn ? formatDay(mold.retiredOn) : '—'}</td>
                    <td className="figures px-3 py-2 text-right">
                      {mold.pullsSoFar} of {mold.expectedLifePulls}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </section>
      ) : null}

      <div className="mt-10">
        <MaterialsCaution />
      </div>
    </>
  );
}
