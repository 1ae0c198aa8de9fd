import Link from 'next/link';
import { formatMoney } from '@/lib/money';
import type { DropReport } from '@/lib/reports/drop-report';

/** What the drop brought in: paid, paid back, the card fees, and what is left. */
export function ReportMoneyTable({ report }: { report: DropReport }) {
  const m = (minor: number) => formatMoney({ amountMinor: minor, currency: report.batch.currency });
  const { money, cardFee } = report;
  const rate = `${(cardFee.basisPoints / 100).toLocaleString('en-IE', { maximumFractionDigits: 2 })}% + ${m(cardFee.fixedMinor)}`;
  return (
    <div className="overflow-x-auto rounded-sm border border-paper-edge bg-paper">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Money from this drop</caption>
        <tbody className="figures">
          <tr className="border-b border-paper-edge/60">
            <th scope="row" className="px-3 py-2 font-semibold">Paid</th>
            <td className="px-3 py-2 text-ink-soft">{report.paidOrders} paid order{report.paidOrders === 1 ? '' : 's'}, shipping included</td>
            <td className="px-3 py-2 text-right">{m(money.grossMinor)}</td>
          </tr>
          <tr className="border-b border-paper-edge/60">
            <th scope="row" className="px-3 py-2 font-semibold">Refunded</th>
            <td className="px-3 py-2 text-ink-soft">
              {report.refunds.count} refund{report.refunds.count === 1 ? '' : 's'}
              {report.refunds.pending > 0 ? `, and ${report.refunds.pending} still waiting for the payment provider` : ''}
            </td>
            <td className="px-3 py-2 text-right">−{m(money.refundedMinor)}</td>
          </tr>
          <tr className="border-b border-paper-edge/60">
            <th scope="row" className="px-3 py-2 font-semibold">Card fees</th>
            <td className="px-3 py-2 text-ink-soft">
              {rate} a payment, at the rate in{' '}
              <Link href="/workshop/settings#money" className="underline underline-offset-4">
                Settings
              </Link>
            </td>
            <td className="px-3 py-2 text-right">−{m(money.cardFeesMinor)}</td>
          </tr>
        </tbody>
        <tfoot className="figures border-t border-paper-edge">
          <tr>
            <th scope="row" className="px-3 py-2 font-semibold">Net</th>
            <td className="px-3 py-2 text-ink-soft">Tax, materials and your own hours are not taken off</td>
            <td className={`px-3 py-2 text-right font-semibold ${money.netMinor < 0 ? 'text-ember-deep' : ''}`}>{m(money.netMinor)}</td>
          </tr>
        </tfoot>
      </table>
    </div>
  );
}
