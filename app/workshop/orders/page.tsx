import type { Metadata } from 'next';
import Link from 'next/link';
import { Price } from '@/components/ui/price';
import { requirePageRole } from '@/lib/auth/authorize';
import { listDesignsForHomeCached } from '@/lib/catalogue/cached';
import { listWorkshopOrders } from '@/lib/orders/queries';
import { Nothing, OrderStateBadge, OversoldBadge } from './_components/badges';
import { StudioTime } from './_components/studio-time';

export const metadata: Metadata = { title: 'Orders' };

export default async function WorkshopOrdersPage() {
  await requirePageRole('staff', '/workshop/orders');
  const [orders, { studio }] = await Promise.all([listWorkshopOrders(), listDesignsForHomeCached()]);
  const zone = studio?.timeZone ?? 'UTC';
  return (
    <>
      <h1 className="text-3xl font-medium">Orders</h1>
      <p className="mt-1 text-ink-soft">Paid orders, newest first. Times are the studio&rsquo;s ({zone}).</p>
      {orders.length === 0 ? (
        <p className="mt-6 rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">
          No paid orders yet. When a buyer pays for a drop, the order appears here with its masks, total and
          state.
        </p>
      ) : (
        <div className="mt-6 overflow-x-auto rounded-sm border border-paper-edge bg-paper">
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Paid orders, newest first</caption>
            <thead className="border-b border-paper-edge text-ink-soft">
              <tr>
                <th scope="col" className="px-3 py-2 font-semibold">
                  Order
                </th>
                <th scope="col" className="px-3 py-2 font-semibold">
                  Paid
                </th>
                <th scope="col" className="px-3 py-2 font-semibold">
                  Buyer
                </th>
                <th scope="col" className="px-3 py-2 font-semibold">
                  Masks
                </th>
                <th scope="col" className="px-3 py-2 text-right font-semibold">
                  Total
                </th>
                <th scope="col" className="px-3 py-2 text-right font-semibold">
                  Refunded
                </th>
                <th scope="col" className="px-3 py-2 font-semibold">
                  State
                </th>
              </tr>
            </thead>
            <tbody>
              {orders.map((order) => (
                <tr key={order.id} className="border-b border-paper-edge/60 align-top last:border-0">
                  <th scope="row" className="px-3 py-2 font-semibold">
                    <Link
                      href={`/workshop/orders/${order.number}`}
                      className="figures underline underline-offset-4 hover:text-ember-deep"
                    >
                      {order.number}
                    </Link>
                  </th>
                  <td className="px-3 py-2">
                    {order.paidAt ? (
                      <StudioTime at={order.paidAt} zone={zone} />
                    ) : (
                      <Nothing words="Not paid" />
                    )}
                  </td>
                  <td className="px-3 py-2">
                    {order.buyerName ? <span className="block">{order.buyerName}</span> : null}
                    <span className={order.buyerName ? 'block text-ink-soft' : 'block'}>{order.email}</span>
                  </td>
                  <td className="px-3 py-2">
                    {order.designName} — {order.finishName}{' '}
                    <span className="figures">× {order.quantity}</span>
                    <span className="block text-xs text-ink-faint">{order.batchName}</span>
                  </td>
                  <td className="px-3 py-2 text-right">
                    <Price value={{ amountMinor: order.totalMinor, currency: order.currency }} />
                  </td>
                  <td className="px-3 py-2 text-right">
                    {order.refundedMinor > 0 ? (
                      <Price value={{ amountMinor: order.refundedMinor, currency: order.currency }} />
                    ) : (
                      <Nothing />
                    )}
                  </td>
                  <td className="px-3 py-2">
                    <span className="flex flex-wrap gap-1">
                      <OrderStateBadge state={order.state} />
                      {order.oversoldOpen > 0 ? <OversoldBadge count={order.oversoldOpen} /> : null}
                    </span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
