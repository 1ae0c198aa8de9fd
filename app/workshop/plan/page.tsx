import type { Metadata } from 'next';
import Link from 'next/link';
import { requirePageRole } from '@/lib/auth/authorize';
import { hasRole } from '@/lib/auth/roles';
import { loadPlanner } from '@/lib/planner/load';
import { planPageSearchSchema } from '@/lib/planner/schemas';
import { MaterialsCaution } from './_components/materials-caution';
import { Planner } from './_components/planner';

export const metadata: Metadata = { title: 'Plan a batch' };

export default async function PlanPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const query = await searchParams;
  const { design: slug } = planPageSearchSchema.parse({ design: typeof query.design === 'string' ? query.design : undefined });
  const user = await requirePageRole('staff', slug ? `/workshop/plan?design=${slug}` : '/workshop/plan');
  const { studio, designs, design } = await loadPlanner(slug);
  const canOpenBatch = hasRole(user.role, 'owner');

  return (
    <>
      <h1 className="text-3xl font-medium">Plan a batch{design ? ` of ${design.name}` : ''}</h1>
      <p className="mt-1 max-w-3xl text-ink-soft">
        Size a batch to what the molds and the painting hours allow, and see the ship-by date it can honestly promise. Nothing is saved
        here: the plan is worked out as you type.
      </p>

      <div className="mt-4">
        <MaterialsCaution />
      </div>

      {!studio ? (
        <p className="mt-6 text-ink-soft">The shop has no studio yet.</p>
      ) : (
        <>
          <form method="get" action="/workshop/plan" className="mt-6 flex flex-wrap items-end gap-3">
            <div className="grid gap-1">
              <label htmlFor="plan-design" className="text-sm font-semibold">Design</label>
              <select
                id="plan-design"
                name="design"
                defaultValue={design?.slug ?? ''}
                className="min-w-48 rounded-sm border border-paper-edge bg-white px-3 py-2"
              >
                <option value="" disabled>
                  Choose a design
                </option>
                {designs.map((d) => (
                  <option key={d.slug} value={d.slug}>
                    {d.name}
                  </option>
                ))}
              </select>
            </div>
            <button type="submit" className="rounded-full bg-ink px-5 py-2 font-semibold text-paper hover:bg-ink-soft">
              Plan this design
            </button>
          </form>

          {slug && !design ? (
            <p role="alert" className="mt-4 rounded-sm border border-ember bg-ember-wash px-4 py-3 text-ember-deep">
              <span aria-hidden="true">▲ </span>
              There is no published design called &ldquo;{slug}&rdquo;. Choose one from the list; drafts are planned once published.
            </p>
          ) : null}

          {designs.length === 0 ? (
            <p className="mt-6 text-ink-soft">No published design with a published finish yet: publish one to plan its batches.</p>
          ) : null}

          {design ? (
            design.finishes.length > 0 ? (
              // Keyed by design, so choosing another one starts from its own figures.
              <Planner key={design.slug} studio={studio} design={design} canOpenBatch={canOpenBatch} />
            ) : null
          ) : designs.length > 0 && !slug ? (
            <ul className="mt-6 flex flex-wrap gap-2">
              {designs.map((d) => (
                <li key={d.slug}>
                  <Link href={`/workshop/plan?design=${d.slug}`} className="inline-block rounded-full border border-paper-edge bg-paper px-4 py-1.5 hover:border-ink">
                    {d.name}
                  </Link>
                </li>
              ))}
            </ul>
          ) : null}

          {design && design.molds.length === 0 ? (
            <p className="mt-4 text-sm text-ink-soft">
              {design.name} has no mold in use, so the plan starts by making one. Add molds on the{' '}
              <Link href="/workshop/molds" className="underline underline-offset-4">molds page</Link>.
            </p>
          ) : null}
        </>
      )}
    </>
  );
}
