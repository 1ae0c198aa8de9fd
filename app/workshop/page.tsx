import type { Metadata } from 'next';
import Link from 'next/link';
import { connection } from 'next/server';
import { requirePageRole } from '@/lib/auth/authorize';
import { listDesignsForWorkshop } from '@/lib/catalogue/workshop';
import { requestTime } from '@/lib/clock';
import { formatMoney } from '@/lib/money';
import { listOversoldLines } from '@/lib/orders/queries';
import { formatMonthKey } from '@/lib/reports/months';
import { loadStudioOverview } from '@/lib/reports/overview';
import { OverviewDesigns } from './_components/overview-designs';
import { OverviewDrops } from './_components/overview-drops';
import { OverviewLate } from './_components/overview-late';
import { OverviewMolds } from './_components/overview-molds';
import { OverviewRevenueChart } from './_components/overview-revenue-chart';
import { OverviewRevenueTable } from './_components/overview-revenue-table';
import { OverviewStages } from './_components/overview-stages';

export const metadata: Metadata = { title: 'Overview' };

export default async function WorkshopOverviewPage() {
  await requirePageRole('staff', '/workshop');
  await connection();
  const now = requestTime();
  const [overview, designs, oversold] = await Promise.all([loadStudioOverview({ now }), listDesignsForWorkshop(), listOversoldLines()]);
  const { revenue, currency } = overview;
  const yearNet = revenue.reduce((n, r) => n + r.netMinor, 0);
  const money = (minor: number) => formatMoney({ amountMinor: minor, currency });
  const summary = `Net revenue over the last twelve months, ${formatMonthKey(revenue[0]!.month)} to ${formatMonthKey(revenue.at(-1)!.month)}: ${money(yearNet)}.`;
  return (
    <>
      <h1 className="text-3xl font-medium">Overview</h1>
      <p className="mt-1 text-ink-soft">The studio at a glance: money, the work in hand, what is late, and the drops either side of today.</p>
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

      <section aria-labelledby="overview-drops" className="mt-8">
        <h2 id="overview-drops" className="text-2xl font-medium">Drops</h2>
        <div className="mt-2">
          <OverviewDrops next={overview.nextDrops} last={overview.lastDrops} zone={overview.timeZone} now={now} />
        </div>
      </section>

      <section aria-labelledby="overview-late" className="mt-8">
        <h2 id="overview-late" className="text-2xl font-medium">Late orders</h2>
        <OverviewLate late={overview.late} today={overview.today} timeZone={overview.timeZone} />
      </section>

      <section aria-labelledby="overview-stages" className="mt-8">
        <h2 id="overview-stages" className="text-2xl font-medium">Open orders by stage</h2>
        <OverviewStages stages={overview.stages} />
      </section>

      <section aria-labelledby="overview-molds" className="mt-8">
        <h2 id="overview-molds" className="text-2xl font-medium">Molds near the end of their life</h2>
        <OverviewMolds molds={overview.wornMolds} />
      </section>

      <section aria-labelledby="overview-revenue" className="mt-8">
        <h2 id="overview-revenue" className="text-2xl font-medium">Revenue</h2>
        <p className="mt-1 text-sm text-ink-soft">
          {summary} Months are the studio&rsquo;s own ({overview.timeZone}); a refund counts against the month its order was paid in. Card fees
          are not taken off here: each drop report shows them.
        </p>
        <div className="mt-2 rounded-sm border border-paper-edge bg-paper p-3">
          <OverviewRevenueChart revenue={revenue} currency={currency} summary={summary} />
        </div>
        <details className="mt-2">
          <summary className="cursor-pointer text-sm font-semibold underline underline-offset-4">Month by month</summary>
          <div className="mt-2">
            <OverviewRevenueTable revenue={revenue} currency={currency} />
          </div>
        </details>
      </section>

      <section aria-labelledby="overview-designs" className="mt-8">
        <h2 id="overview-designs" className="text-2xl font-medium">Designs</h2>
        <p className="mt-1 text-sm text-ink-soft">Designs and finishes as the shop sees them. Drafts are not shown to buyers.</p>
        <OverviewDesigns designs={designs} />
      </section>
    </>
  );
}
