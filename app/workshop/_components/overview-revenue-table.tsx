import { formatMoney } from '@/lib/money';
import { formatMonthKey } from '@/lib/reports/months';
import type { MonthRevenue } from '@/lib/reports/overview';

/** The revenue chart's months as a table. */
export function OverviewRevenueTable({ revenue, currency }: { revenue: MonthRevenue[]; currency: string }) {
  const m = (minor: number) => formatMoney({ amountMinor: minor, currency });
  return (
    <div className="overflow-x-auto rounded-sm border border-paper-edge bg-paper">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Revenue by month, the last twelve months</caption>
        <thead className="border-b border-paper-edge text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2 font-semibold">Month</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Orders paid</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Paid</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Refunded</th>
            <th scope="col" className="px-3 py-2 text-right font-semibold">Net</th>
          </tr>
        </thead>
        <tbody className="figures">
          {revenue.map((r) => (
            <tr key={r.month} className="border-b border-paper-edge/60 last:border-0">
              <th scope="row" className="whitespace-nowrap px-3 py-1.5 font-semibold">{formatMonthKey(r.month)}</th>
              <td className="px-3 py-1.5 text-right">{r.orders}</td>
              <td className="px-3 py-1.5 text-right">{m(r.paidMinor)}</td>
              <td className="px-3 py-1.5 text-right">{r.refundedMinor > 0 ? `−${m(r.refundedMinor)}` : m(0)}</td>
              <td className="px-3 py-1.5 text-right font-semibold">{m(r.netMinor)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
