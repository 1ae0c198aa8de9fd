import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { Price } from '@/components/ui/price';
import { requirePageRole } from '@/lib/auth/authorize';
import { hasRole } from '@/lib/auth/roles';
import { formatInZone } from '@/lib/drops/phase';
import { getOrderByNumber, listOrderNotes, type OrderLineView, type OrderView } from '@/lib/orders/queries';
import { orderNumberSchema, refundReasonLabels } from '@/lib/orders/schemas';
import { addressLockedReason } from '@/lib/orders/shipping-actions';
import type { EmailKind } from '@/lib/orders/shipping-schemas';
import { isFailed, quoteStage, type LineStage } from '@/lib/production/stages';
import { loadStudioSettings } from '@/lib/settings/studio';
import { Flag, Nothing, OrderStateBadge, OversoldBadge, RefundStatus } from '../_components/badges';
import { DecisionStatus } from '../_components/decision-status';
import {
  eventActor,
  eventLabel,
  formatDay,
  oversoldReasonLabels,
  oversoldResolutionLabels,
  refundPendingWords,
  stageLabels,
  stateWords,
} from '../_components/order-words';
import { OversoldDecision } from '../_components/oversold-decision';
import { RefundForm } from '../_components/refund-form';
import { StudioTime } from '../_components/studio-time';
import { AddressPanel } from './_components/address-form';
import { OrderNotes } from './_components/order-notes';
import { ResendEmail } from './_components/resend-email';
import { ShipForm } from './_components/shipping-panel';

type Props = { params: Promise<{ number: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const parsed = orderNumberSchema.safeParse((await params).number);
  return { title: parsed.success ? `Order ${parsed.data}` : 'Order not found' };
}

const isOpenOversold = (line: OrderLineView) =>
  line.oversold && line.oversoldResolution === null && !line.refunded;

/** What is paid and not yet refunded or on its way back (a second payment goes back on its own). */
function leftToRefund(order: OrderView): number {
  const committed = order.refunds
    .filter((refund) => refund.status !== 'failed' && refund.reason !== 'duplicate_payment')
    .reduce((sum, refund) => sum + refund.amountMinor, 0);
  return Math.max(0, order.paidMinor - committed);
}

/** Why the order cannot be marked shipped yet, or null when every mask still to go is packed. */
function notReadyToShip(order: OrderView): string | null {
  if (!order.paidAt || order.paidMinor <= 0) return 'Not paid, so nothing ships.';
  if (order.state === 'refunded' || order.state === 'cancelled') return 'Refunded in full, so nothing ships.';
  const going = order.lines.filter((line) => !line.refunded && !isFailed(line.stage as LineStage));
  if (going.length === 0) return 'No mask is left to ship: each is refunded or failed.';
  if (going.every((line) => line.stage === 'shipped')) return 'Shipped before carriers and tracking numbers were recorded here.';
  const waiting = going.filter((line) => line.stage !== 'packed');
  if (waiting.length === 0) return null;
  const list = waiting.map((line) => `mask ${line.position} at ${quoteStage(line.stage as LineStage)}`).join(', ');
  return `Ships once every mask is packed: ${going.length - waiting.length} of ${going.length} packed (still to go: ${list}).`;
}

const sectionTitle = 'mb-2 font-sans text-base font-semibold';
const box = 'overflow-x-auto rounded-sm border border-paper-edge bg-paper';
const th = 'px-3 py-2 font-semibold';
const td = 'px-3 py-2';

export default async function WorkshopOrderPage({ params }: Props) {
  const { number: raw } = await params;
  const user = await requirePageRole('staff', `/workshop/orders/${raw}`);
  const parsed = orderNumberSchema.safeParse(raw);
  if (!parsed.success) notFound();
  const order = await getOrderByNumber(parsed.data);
  if (!order) notFound();
  const [settings, notes] = await Promise.all([loadStudioSettings(), listOrderNotes(order.id)]);

  const isOwner = hasRole(user.role, 'owner');
  const zone = order.timeZone;
  const money = (amountMinor: number) => ({ amountMinor, currency: order.currency });
  const pendingLineIds = new Set(
    order.refunds.filter((refund) => refund.status === 'pending').flatMap((refund) => refund.lineIds),
  );
  const openOversold = order.lines.filter(isOpenOversold);
  const refundable = order.lines.filter((line) => !line.refunded && !pendingLineIds.has(line.id));
  const left = leftToRefund(order);
  const buyer = order.buyerName ?? order.email;
  const lineLabel = (line: OrderLineView) => `mask ${line.position}, ${line.designName} — ${line.finishName}`;
  const rate = (order.taxRateBasisPoints / 100).toLocaleString('en-GB', { maximumFractionDigits: 2 });
  const shipment = order.shipment;
  const countryName = new Intl.DisplayNames(['en'], { type: 'region' }).of(order.shippingCountry) ?? order.shippingCountry;
  const noteTimes = Object.fromEntries(notes.map((note) => [note.id, formatInZone(new Date(note.createdAt), zone)]));
  const emailKinds: EmailKind[] = order.paidAt ? (shipment ? ['confirmation', 'shipped'] : ['confirmation']) : [];

  return (
    <>
      <p className="text-sm">
        <Link href="/workshop/orders" className="text-ink-soft underline underline-offset-4 hover:text-ink">
          <span aria-hidden="true">← </span>All orders
        </Link>
      </p>
      <div className="mt-2 flex flex-wrap items-center gap-3">
        <h1 className="figures text-3xl font-medium">Order {order.number}</h1>
        <OrderStateBadge state={order.state} />
        {openOversold.length > 0 ? <OversoldBadge count={openOversold.length} /> : null}
      </div>
      <dl className="mt-3 grid gap-x-8 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="text-ink-soft">Buyer</dt>
        <dd>
          {order.buyerName ? `${order.buyerName} · ` : ''}
          <a href={`mailto:${order.email}`} className="underline underline-offset-4">
            {order.email}
          </a>
        </dd>
        <dt className="text-ink-soft">Paid</dt>
        <dd>{order.paidAt ? <StudioTime at={order.paidAt} zone={zone} /> : 'Not paid'}</dd>
        <dt className="text-ink-soft">Drop</dt>
        <dd>
          {order.designName}, {order.batchName} · ships by {formatDay(order.shipBy)}
        </dd>
      </dl>

      {openOversold.length > 0 ? (
        <p className="mt-5 flex gap-2 rounded-sm border border-ember bg-ember-wash px-4 py-3 text-sm text-ember-deep">
          <span aria-hidden="true">▲</span>
          <span>
            <strong>
              {openOversold.length === 1
                ? 'One mask of this order is oversold'
                : `${openOversold.length} masks of this order are oversold`}
              .
            </strong>{' '}
            {isOwner
              ? 'Decide for each in the list of masks below: refund it, or cast an extra.'
              : 'The maker decides for each whether to refund it or cast an extra.'}
          </span>
        </p>
      ) : null}

      <div className="mt-8 grid gap-8 lg:grid-cols-[3fr_2fr]">
        <div className="grid content-start gap-8">
          <section aria-labelledby="lines-title">
            <h2 id="lines-title" className={sectionTitle}>
              Masks
            </h2>
            <DecisionStatus>
              <div className={box}>
                <table className="w-full text-left text-sm">
                  <thead className="border-b border-paper-edge text-ink-soft">
                    <tr>
                      <th scope="col" className={th}>
                        Mask
                      </th>
                      <th scope="col" className={`${th} text-right`}>
                        Price
                      </th>
                      <th scope="col" className={th}>
                        Stage
                      </th>
                      <th scope="col" className={th}>
                        Notes
                      </th>
                    </tr>
                  </thead>
                  <tbody>
                    {order.lines.map((line) => (
                      <tr key={line.id} className="border-b border-paper-edge/60 align-top last:border-0">
                        <th scope="row" className={`${td} font-normal`}>
                          <span className="figures text-ink-faint">{line.position}. </span>
                          <span className="font-semibold">{line.designName}</span> — {line.finishName}
                        </th>
                        <td className={`${td} text-right`}>
                          <Price value={money(line.unitPriceMinor)} />
                        </td>
                        <td className={td}>{(stageLabels as Record<string, string>)[line.stage] ?? line.stage}</td>
                        <td className={td}>
                          <div className="grid justify-items-start gap-1">
                            {line.oversold ? (
                              <span className="flex flex-wrap items-center gap-1">
                                <OversoldBadge />
                                {line.oversoldReason ? (
                                  <span>{oversoldReasonLabels[line.oversoldReason]}</span>
                                ) : null}
                              </span>
                            ) : null}
                            {line.oversoldResolution ? (
                              <span className="text-ink-soft">
                                {oversoldResolutionLabels[line.oversoldResolution]}
                              </span>
                            ) : null}
                            {(line.refunded || line.restocked) && (
                              <span className="flex flex-wrap gap-1">
                                {line.refunded ? <Flag mark="↺">Refunded</Flag> : null}
                                {line.restocked ? <Flag mark="↩">Back on sale</Flag> : null}
                              </span>
                            )}
                            {pendingLineIds.has(line.id) && !isOpenOversold(line) ? (
                              <span className="text-ink-soft">{refundPendingWords}</span>
                            ) : null}
                            {isOpenOversold(line) ? (
                              isOwner ? (
                                <OversoldDecision
                                  lineId={line.id}
                                  orderNumber={order.number}
                                  currency={order.currency}
                                  label={`${order.number}, ${lineLabel(line)}`}
                                  refundPending={pendingLineIds.has(line.id)}
                                />
                              ) : (
                                <span className="text-ink-soft">Waiting for the maker to decide.</span>
                              )
                            ) : null}
                            {!line.oversold &&
                            !line.refunded &&
                            !line.restocked &&
                            !pendingLineIds.has(line.id) ? (
                              <Nothing />
                            ) : null}
                          </div>
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            </DecisionStatus>
          </section>

          <section aria-labelledby="totals-title">
            <h2 id="totals-title" className={sectionTitle}>
              Totals
            </h2>
            <dl className="grid grid-cols-[1fr_auto] gap-x-6 gap-y-1 rounded-sm border border-paper-edge bg-paper px-4 py-3 text-sm">
              <dt>Masks</dt>
              <dd className="text-right">
                <Price value={money(order.linesMinor)} />
              </dd>
              <dt>
                Shipping: {order.shippingLabel}{' '}
                <span className="text-ink-soft">
                  ({order.shippingCountry}, {order.shippingMinDays}–{order.shippingMaxDays} days)
                </span>
              </dt>
              <dd className="text-right">
                <Price value={money(order.shippingMinor)} />
              </dd>
              <dt className="border-t border-paper-edge pt-1 font-semibold">Total</dt>
              <dd className="border-t border-paper-edge pt-1 text-right font-semibold">
                <Price value={money(order.totalMinor)} />
              </dd>
              <dt className="text-ink-soft">
                includes {order.taxLabel} {rate}%
              </dt>
              <dd className="text-right text-ink-soft">
                <Price value={money(order.taxIncludedMinor)} />
              </dd>
              <dt>Paid</dt>
              <dd className="text-right">
                <Price value={money(order.paidMinor)} />
              </dd>
              <dt>Refunded</dt>
              <dd className="text-right">
                <Price value={money(order.refundedMinor)} />
              </dd>
            </dl>
          </section>

          <section aria-labelledby="refunds-title">
            <h2 id="refunds-title" className={sectionTitle}>
              Refunds
            </h2>
            {order.refunds.length === 0 ? (
              <p className="text-sm text-ink-soft">No refunds on this order.</p>
            ) : (
              <div className={box}>
                <table className="w-full text-left text-sm">
                  <thead className="border-b border-paper-edge text-ink-soft">
                    <tr>
                      <th scope="col" className={th}>
                        When
                      </th>
                      <th scope="col" className={`${th} text-right`}>
                        Amount
                      </th>
                      <th scope="col" className={th}>
                        Reason
                      </th>
                      <th scope="col" className={th}>
                        Status
                      </th>
                    </tr>
                  </thead>
                  <tbody>
                    {order.refunds.map((refund) => (
                      <tr key={refund.id} className="border-b border-paper-edge/60 align-top last:border-0">
                        <td className={td}>
                          <StudioTime at={refund.createdAt} zone={zone} />
                        </td>
                        <td className={`${td} text-right`}>
                          <Price value={money(refund.amountMinor)} />
                          <span className="block text-xs text-ink-faint">
                            {refund.lineIds.length === 0
                              ? 'an amount'
                              : refund.lineIds.length === 1
                                ? '1 mask'
                                : `${refund.lineIds.length} masks`}
                          </span>
                        </td>
                        <td className={td}>
                          {refundReasonLabels[refund.reason]}
                          {refund.note ? <span className="block text-ink-soft">{refund.note}</span> : null}
                        </td>
                        <td className={td}>
                          <RefundStatus status={refund.status} failure={refund.failure} />
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            )}
          </section>

          <section aria-labelledby="events-title">
            <h2 id="events-title" className={sectionTitle}>
              What happened
            </h2>
            {order.events.length === 0 ? (
              <p className="text-sm text-ink-soft">Nothing recorded yet.</p>
            ) : (
              <div className={box}>
                <table className="w-full text-left text-sm">
                  <thead className="border-b border-paper-edge text-ink-soft">
                    <tr>
                      <th scope="col" className={th}>
                        When
                      </th>
                      <th scope="col" className={th}>
                        What
                      </th>
                      <th scope="col" className={th}>
                        State
                      </th>
                      <th scope="col" className={th}>
                        Who
                      </th>
                    </tr>
                  </thead>
                  <tbody>
                    {order.events.map((event) => {
                      const from = stateWords(event.fromState);
                      const to = stateWords(event.toState);
                      return (
                        <tr key={event.id} className="border-b border-paper-edge/60 align-top last:border-0">
                          <td className={td}>
                            <StudioTime at={event.createdAt} zone={zone} />
                          </td>
                          <td className={td}>
                            {eventLabel(event)}
                            {typeof event.data.amountMinor === 'number' ? (
                              <span className="text-ink-soft">
                                {' '}
                                · <Price value={money(event.data.amountMinor)} />
                              </span>
                            ) : null}
                          </td>
                          <td className={td}>
                            {from && to ? (
                              <>
                                {from} <span aria-hidden="true">→</span>
                                <span className="sr-only">to</span> {to}
                              </>
                            ) : to ? (
                              <>
                                <span aria-hidden="true">→ </span>
                                <span className="sr-only">to </span>
                                {to}
                              </>
                            ) : (
                              <Nothing words="No change" />
                            )}
                          </td>
                          <td className={td}>
                            {event.actorName ?? (
                              <span className="text-ink-soft">{eventActor(event.type)}</span>
                            )}
                          </td>
                        </tr>
                      );
                    })}
                  </tbody>
                </table>
              </div>
            )}
          </section>
        </div>

        <div className="grid content-start gap-8">
          <section aria-labelledby="shipping-title">
            <h2 id="shipping-title" className={sectionTitle}>
              Shipping
            </h2>
            {shipment ? (
              <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 rounded-sm border border-moss bg-paper px-4 py-3 text-sm">
                <dt className="text-ink-soft">State</dt>
                <dd className="font-semibold">
                  <span aria-hidden="true">✓ </span>Shipped
                </dd>
                <dt className="text-ink-soft">Carrier</dt>
                <dd>{shipment.carrierName}</dd>
                <dt className="text-ink-soft">Tracking</dt>
                <dd className="figures break-all">
                  {shipment.trackingUrl ? (
                    <a href={shipment.trackingUrl} target="_blank" rel="noopener noreferrer" className="underline underline-offset-4">
                      {shipment.trackingNumber}
                      <span className="sr-only"> (opens the carrier’s tracking page in a new tab)</span>
                    </a>
                  ) : (
                    shipment.trackingNumber
                  )}
                </dd>
                <dt className="text-ink-soft">Sent</dt>
                <dd>
                  <StudioTime at={shipment.shippedAt} zone={zone} />
                </dd>
              </dl>
            ) : (
              <ShipForm
                orderNumber={order.number}
                carriers={(settings?.carriers ?? []).map((carrier) => ({ id: carrier.id, name: carrier.name }))}
                notReady={notReadyToShip(order)}
                isOwner={isOwner}
              />
            )}
            <p className="mt-3 text-sm">
              <a
                href={`/api/workshop/orders/packing-slips?${new URLSearchParams({ number: order.number })}`}
                target="_blank"
                rel="noopener"
                className="underline underline-offset-4"
              >
                Packing slip (PDF)<span className="sr-only">, opens in a new tab</span>
              </a>
            </p>
          </section>

          <section aria-labelledby="ship-title">
            <h2 id="ship-title" className={sectionTitle}>
              Ship to
            </h2>
            <AddressPanel
              orderNumber={order.number}
              shipTo={order.shipTo}
              country={order.shippingCountry}
              countryName={countryName}
              lockedReason={order.paidAt ? addressLockedReason(order.lines, shipment !== null) : 'Not paid: the address comes with the payment.'}
            />
            {order.buyerNote ? (
              <p className="mt-2 rounded-sm border border-paper-edge bg-paper px-4 py-3 text-sm">
                <span className="block text-ink-soft">The buyer’s note</span>
                <span className="whitespace-pre-line">{order.buyerNote}</span>
              </p>
            ) : null}
          </section>

          <section aria-labelledby="notes-title">
            <h2 id="notes-title" className={sectionTitle}>
              Studio notes
            </h2>
            <OrderNotes orderNumber={order.number} notes={notes} times={noteTimes} />
          </section>

          <section aria-labelledby="emails-title">
            <h2 id="emails-title" className={sectionTitle}>
              E-mails to the buyer
            </h2>
            <ResendEmail orderNumber={order.number} kinds={emailKinds} email={order.email} />
          </section>

          <section aria-labelledby="refund-title">
            <h2 id="refund-title" className={sectionTitle}>
              Refund
            </h2>
            {!isOwner ? (
              <p className="text-sm text-ink-soft">Only the maker (owner) can refund.</p>
            ) : order.paidMinor <= 0 ? (
              <p className="text-sm text-ink-soft">
                This order has not been paid, so there is nothing to refund.
              </p>
            ) : (
              <RefundForm
                orderNumber={order.number}
                currency={order.currency}
                buyer={buyer}
                leftMinor={left}
                shippingMinor={order.shippingMinor}
                lines={refundable.map((line) => ({
                  id: line.id,
                  label: lineLabel(line),
                  unitPriceMinor: line.unitPriceMinor,
                }))}
              />
            )}
          </section>
        </div>
      </div>
    </>
  );
}
