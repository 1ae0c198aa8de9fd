import type { Metadata } from 'next';
import Link from 'next/link';
import { Price } from '@/components/ui/price';
import { requirePageRole } from '@/lib/auth/authorize';
import { hasRole } from '@/lib/auth/roles';
import { listDesignsForHomeCached } from '@/lib/catalogue/cached';
import { listOversoldLines } from '@/lib/orders/queries';
import { DecisionStatus } from '../orders/_components/decision-status';
import { oversoldReasonLabels, refundPendingWords } from '../orders/_components/order-words';
import { OversoldDecision } from '../orders/_components/oversold-decision';
import { StudioTime } from '../orders/_components/studio-time';

export const metadata: Metadata = { title: 'Oversold' };

export default async function OversoldPage() {
  const user = await requirePageRole('staff', '/workshop/oversold');
  const [lines, { studio }] = await Promise.all([listOversoldLines(), listDesignsForHomeCached()]);
  const zone = studio?.timeZone ?? 'UTC';
  const isOwner = hasRole(user.role, 'owner');
  return (
    <>
      <h1 className="text-3xl font-medium">Oversold</h1>
      <p className="mt-1 text-ink-soft">
        Masks paid for after the stock had gone, oldest first. Each needs a decision: refund the buyer, or
        cast an extra.
        {isOwner ? '' : ' Only the maker (owner) can decide.'} Times are the studio&rsquo;s ({zone}).
      </p>
      {/* Mounted whether or not anything is left, so the last decision's outcome stays on screen. */}
      <div className="mt-4">
        <DecisionStatus>
          {lines.length === 0 ? (
            <p className="mt-2 rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">
              Nothing oversold. When a payment arrives after its hold ended and the stock has gone, it appears
              here.
            </p>
          ) : (
            <div className="mt-2 overflow-x-auto rounded-sm border border-paper-edge bg-paper">
              <table className="w-full text-left text-sm">
                <caption className="sr-only">Oversold masks waiting for a decision, oldest first</caption>
                <thead className="border-b border-paper-edge text-ink-soft">
                  <tr>
                    <th scope="col" className="px-3 py-2 font-semibold">
                      Order
                    </th>
                    <th scope="col" className="px-3 py-2 font-semibold">
                      Buyer
                    </th>
                    <th scope="col" className="px-3 py-2 font-semibold">
                      Mask
                    </th>
                    <th scope="col" className="px-3 py-2 text-right font-semibold">
                      Amount
                    </th>
                    <th scope="col" className="px-3 py-2 font-semibold">
                      Why
                    </th>
                    <th scope="col" className="px-3 py-2 font-semibold">
                      Paid
                    </th>
                    <th scope="col" className="px-3 py-2 font-semibold">
                      Decision
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {lines.map((line) => (
                    <tr key={line.lineId} className="border-b border-paper-edge/60 align-top last:border-0">
                      <th scope="row" className="px-3 py-2 font-semibold">
                        <Link
                          href={`/workshop/orders/${line.orderNumber}`}
                          className="figures underline underline-offset-4 hover:text-ember-deep"
                        >
                          {line.orderNumber}
                        </Link>
                      </th>
                      <td className="px-3 py-2">
                        {line.buyerName ? <span className="block">{line.buyerName}</span> : null}
                        <span className={line.buyerName ? 'block text-ink-soft' : 'block'}>{line.email}</span>
                      </td>
                      <td className="px-3 py-2">
                        {line.designName} — {line.finishName}
                        <span className="block text-xs text-ink-faint">{line.batchName}</span>
                      </td>
                      <td className="px-3 py-2 text-right">
                        <Price value={{ amountMinor: line.unitPriceMinor, currency: line.currency }} />
                      </td>
                      <td className="px-3 py-2">{oversoldReasonLabels[line.reason]}</td>
                      <td className="px-3 py-2">
                        <StudioTime at={line.paidAt} zone={zone} />
                      </td>
                      <td className="px-3 py-2">
                        {isOwner ? (
                          <OversoldDecision
                            lineId={line.lineId}
                            orderNumber={line.orderNumber}
                            currency={line.currency}
                            label={`${line.orderNumber}, ${line.designName} — ${line.finishName}`}
                            refundPending={line.refundPending}
                          />
                        ) : (
                          <span className="text-ink-soft">
                            {line.refundPending ? refundPendingWords : 'Waiting for the maker'}
                          </span>
                        )}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </DecisionStatus>
      </div>
    </>
  );
}
