import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { connection } from 'next/server';
import { requirePageRole } from '@/lib/auth/authorize';
import { formatInZone } from '@/lib/drops/phase';
import { formatMoney } from '@/lib/money';
import { batchIdSchema } from '@/lib/drops/schemas';
import { getDropReport, type DropReport } from '@/lib/reports/drop-report';
import { formatElapsed } from '@/lib/reports/sell-through';
import { FinishTable } from './_components/finish-table';
import { ReportMoneyTable } from './_components/report-money-table';
import { SellThroughChart } from './_components/sell-through-chart';
import { SellThroughTable } from './_components/sell-through-table';
import { StatCard } from './_components/stat-card';

export const metadata: Metadata = { title: 'Drop report' };

type Props = { params: Promise<{ batchId: string }> };

export default async function DropReportPage({ params }: Props) {
  const { batchId } = await params;
  await requirePageRole('staff', `/workshop/batches/${batchId}/report`);
  await connection();
  const id = batchIdSchema.safeParse(batchId);
  if (!id.success) notFound();
  const report = await getDropReport({ batchId: id.data });
  if (!report) notFound();
  const { batch } = report;
  const zone = batch.timeZone;
  const nothing = report.holds.total === 0 && report.paidOrders === 0;

  return (
    <>
      <p className="text-sm">
        <Link href={`/workshop/batches/${batch.id}`} className="text-ink-soft underline underline-offset-4">← {batch.name}</Link>
      </p>
      <h1 className="mt-2 text-3xl font-medium">Drop report: {batch.designName}, {batch.name}</h1>
      <p className="mt-1 text-ink-soft">
        {batch.earlyAccessAt ? (
          <>Early access opened {formatInZone(new Date(batch.earlyAccessAt), zone)}, the public opening was {formatInZone(new Date(batch.opensAt), zone)}. Times below count from early access.</>
        ) : (
          <>Opened {formatInZone(new Date(batch.opensAt), zone)}.</>
        )}{' '}
        Closes {formatInZone(new Date(batch.closesAt), zone)}.{batch.status === 'cancelled' ? ' This batch was cancelled.' : ''}
      </p>

      {!report.opened ? (
        <p className="mt-6 rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">
          {batch.status === 'draft'
            ? 'This batch is a draft: it has no drop yet, so there is nothing to report.'
            : batch.status === 'cancelled'
              ? 'This batch was cancelled before its drop opened, so there is nothing to report.'
              : `This drop has not opened yet. It opens ${formatInZone(new Date(report.openedAt), zone)}; the report fills in as buyers hold and pay.`}
        </p>
      ) : nothing ? (
        <p className="mt-6 rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">
          Nothing has been held or sold in this drop yet. The chart and figures appear with the first hold.
        </p>
      ) : (
        <ReportBody report={report} />
      )}
    </>
  );
}

function ReportBody({ report }: { report: DropReport }) {
  const { sellOut, holds, oversold } = report;
  const soldOutWords = sellOut.soldOutSeconds === null ? 'Not sold out' : formatElapsed(sellOut.soldOutSeconds);
  const summary =
    `${report.sold} of ${report.stock} masks sold. ` +
    (sellOut.soldOutSeconds === null ? 'The drop did not sell out.' : `Sold out ${formatElapsed(sellOut.soldOutSeconds)} after opening.`);
  const resolved = oversold.refunded + oversold.extraCast;
  return (
    <>
      <section aria-labelledby="report-figures" className="mt-6">
        <h2 id="report-figures" className="sr-only">Figures</h2>
        <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
          <StatCard label="Sold" value={`${report.sold} of ${report.stock}`} note="Paid masks that took stock" />
          <StatCard
            label="Time to sell out"
            value={soldOutWords}
            note="From the opening to the first moment nothing was left to hold (held + sold reached the stock)"
          />
          <StatCard
            label="Time until all paid"
            value={sellOut.allPaidSeconds === null ? 'Not all paid' : formatElapsed(sellOut.allPaidSeconds)}
            note="Until every mask of the stock was paid for"
          />
          <StatCard label="Holds that expired" value={holds.expired} note={`${holds.expiredUnits} mask${holds.expiredUnits === 1 ? '' : 's'} back in stock; ${holds.total} holds in all`} />
          <StatCard label="Late payments" value={report.latePayments} note="Paid after the buyer's hold had ended" />
          <StatCard
            label="Oversold masks"
            value={oversold.lines}
            tone={oversold.open > 0 ? 'warn' : 'plain'}
            note={
              oversold.lines === 0 ? (
                'None'
              ) : (
                <>
                  {oversold.refunded} refunded, {oversold.extraCast} cast as extras
                  {oversold.open > 0 ? (
                    <>
                      , {oversold.open} waiting:{' '}
                      <Link href="/workshop/oversold" className="underline underline-offset-4">decide</Link>
                    </>
                  ) : resolved === oversold.lines ? ': all settled' : ''}
                </>
              )
            }
          />
          <StatCard
            label="Refunds"
            value={report.refunds.count}
            note={`${formatMoney({ amountMinor: report.refunds.amountMinor, currency: report.batch.currency })} paid back${report.refunds.pending > 0 ? `; ${report.refunds.pending} pending` : ''}`}
          />
          <StatCard
            label="Waitlist to order"
            value={report.waitlistConversion.announced > 0 ? `${Math.round((report.waitlistConversion.buyers / report.waitlistConversion.announced) * 100)}%` : '—'}
            note={
              report.waitlistConversion.announced > 0
                ? `${report.waitlistConversion.buyers} of the ${report.waitlistConversion.announced} people the announcement reached bought`
                : `No announcement went out for this batch${report.waitlistConversion.buyers > 0 ? `; ${report.waitlistConversion.buyers} waitlisted people bought` : ''}`
            }
          />
        </dl>
      </section>

      <section aria-labelledby="report-chart" className="mt-8">
        <h2 id="report-chart" className="font-sans text-base font-semibold">Sell-through</h2>
        <div className="mt-2 rounded-sm border border-paper-edge bg-paper p-3">
          <SellThroughChart series={report.series} stock={report.stock} soldOutSeconds={sellOut.soldOutSeconds} summary={summary} />
        </div>
        <details className="mt-2">
          <summary className="cursor-pointer text-sm font-semibold underline underline-offset-4">The same as a table</summary>
          <div className="mt-2">
            <SellThroughTable series={report.series} stock={report.stock} />
          </div>
        </details>
        <p className="mt-2 text-xs text-ink-soft">
          A mask counts as held from the moment a buyer held it until the hold was paid, let go or expired, and as sold from the moment
          its payment arrived. An oversold mask (paid after its stock had gone) is not counted as sold.
        </p>
      </section>

      <section aria-labelledby="report-finishes" className="mt-8">
        <h2 id="report-finishes" className="font-sans text-base font-semibold">By finish</h2>
        <div className="mt-2">
          <FinishTable finishes={report.finishes} />
        </div>
      </section>

      <section aria-labelledby="report-money" className="mt-8">
        <h2 id="report-money" className="font-sans text-base font-semibold">Money</h2>
        <div className="mt-2">
          <ReportMoneyTable report={report} />
        </div>
        <p className="mt-2 text-xs text-ink-soft">
          Card fees are worked out from each payment at the studio&rsquo;s card fee rate; a refund is taken to leave its payment&rsquo;s fee
          with the payment provider. Check your provider&rsquo;s statement for the fees actually charged.
        </p>
      </section>
    </>
  );
}
