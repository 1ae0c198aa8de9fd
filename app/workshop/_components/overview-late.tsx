import Link from 'next/link';
import type { LateOrder } from '@/lib/reports/overview';

/** Orders whose batch's ship-by day has passed with masks still not shipped. */
export function OverviewLate({ late, today, timeZone }: { late: LateOrder[]; today: string; timeZone: string }) {
  if (late.length === 0) {
    return <p className="mt-2 rounded-sm border border-paper-edge bg-paper px-4 py-4 text-ink-soft">No order is past its ship-by date.</p>;
  }
  return (
    <>
      <div className="mt-2 overflow-x-auto rounded-sm border border-ember bg-paper">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Late orders: past the ship-by date and not shipped</caption>
          <thead className="border-b border-paper-edge text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">Order</th>
              <th scope="col" className="px-3 py-2 font-semibold">Buyer</th>
              <th scope="col" className="px-3 py-2 font-semibold">Batch</th>
              <th scope="col" className="px-3 py-2 font-semibold">Ship by</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Late by</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Masks not shipped</th>
            </tr>
          </thead>
          <tbody>
            {late.map((order) => (
              <tr key={order.number} className="border-b border-paper-edge/60 last:border-0">
                <th scope="row" className="px-3 py-2 font-semibold">
                  <Link href={`/workshop/orders/${order.number}`} className="underline underline-offset-4">{order.number}</Link>
                </th>
                <td className="px-3 py-2">{order.buyerName}</td>
                <td className="px-3 py-2">{order.designName}: {order.batchName}</td>
                <td className="figures px-3 py-2">{order.shipBy}</td>
                <td className="figures px-3 py-2 text-right font-semibold text-ember-deep">
                  <span aria-hidden="true">▲ </span>
                  {order.daysLate} day{order.daysLate === 1 ? '' : 's'}
                </td>
                <td className="figures px-3 py-2 text-right">{order.masksLeft}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-xs text-ink-soft">Counted against today, {today}, in the studio&rsquo;s zone ({timeZone}).</p>
    </>
  );
}
