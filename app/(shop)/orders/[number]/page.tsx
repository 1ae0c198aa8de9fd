import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { Price } from '@/components/ui/price';
import { getCurrentUser } from '@/lib/auth/session';
import { formatInZone } from '@/lib/drops/phase';
import { getOrderForBuyer, type OrderView } from '@/lib/orders/queries';
import { orderNumberSchema } from '@/lib/orders/schemas';
import { orderStateLabels } from '@/lib/orders/states';
import { syncReturningBuyer } from '@/lib/orders/sweeps';
import { PaymentWatch } from './_components/payment-watch';

type Props = { params: Promise<{ number: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> };

export const metadata: Metadata = { title: 'Your order', robots: { index: false } };

const countryName = (code: string) => new Intl.DisplayNames(['en'], { type: 'region' }).of(code) ?? code;
const one = (value: string | string[] | undefined) => (typeof value === 'string' ? value : null);

const stages = ['to_cast', 'cast', 'trimmed', 'painted', 'packed', 'shipped'] as const;
const stageWords: Record<string, string> = {
  to_cast: 'Waiting to be cast', cast: 'Cast', trimmed: 'Trimmed', painted: 'Painted', packed: 'Packed', shipped: 'Shipped',
  failed_casting: 'Casting failed: the studio is casting another', failed_paint: 'Paint failed: the studio is repainting',
};

export default async function OrderPage({ params, searchParams }: Props) {
  const parsed = orderNumberSchema.safeParse((await params).number);
  if (!parsed.success) notFound();
  const query = await searchParams;
  const token = one(query.token);
  const user = await getCurrentUser();
  const who = { userId: user?.id ?? null, token };
  let order = await getOrderForBuyer(parsed.data, who);
  if (!order) notFound();
  const sessionId = one(query.session_id);
  if (order.state === 'awaiting_payment' && sessionId) {
    await syncReturningBuyer(order.id, sessionId);
    order = (await getOrderForBuyer(parsed.data, who)) ?? order;
  }
  const money = (amountMinor: number) => ({ amountMinor, currency: order.currency });
  const justPaid = one(query.paid) === '1' && order.paidAt !== null;
  const oversold = order.lines.filter((line) => line.oversold && !line.refunded && line.oversoldResolution !== 'extra_cast');
  return (
    <article className="mx-auto max-w-3xl py-10">
      <p className="text-sm font-semibold uppercase tracking-[0.18em] text-ink-faint">{order.studioName} · order</p>
      <h1 className="mt-2 text-4xl font-medium">
        Order <span className="figures">{order.number}</span>
      </h1>
      <p className="mt-2 text-lg" data-testid="order-state">
        <span className="font-semibold">{orderStateLabels[order.state]}</span>
        {order.paidAt ? <span className="text-ink-soft"> · paid {formatInZone(new Date(order.paidAt), order.timeZone)}</span> : null}
      </p>
      {justPaid ? (
        <p role="status" className="mt-4 rounded-sm border-2 border-moss bg-paper p-4">
          Thank you: your payment went through. A confirmation is on its way to <strong>{order.email}</strong>.
        </p>
      ) : null}
      {order.state === 'awaiting_payment' ? <PaymentWatch number={order.number} token={token} state={order.state} /> : null}
      {order.state === 'cancelled' ? (
        <p className="mt-4 rounded-sm border border-paper-edge bg-paper p-4">
          This order was not paid before its payment page ran out, so nothing was charged and the mask went back on sale.
        </p>
      ) : null}
      {oversold.length > 0 ? (
        <p role="alert" className="mt-4 rounded-sm border-2 border-ember bg-ember-wash p-4">
          Your payment arrived after the last {oversold.length === 1 ? 'mask' : 'masks'} had gone. The studio will write within two working days and
          either cast an extra for you or refund you in full. You do not need to do anything.
        </p>
      ) : null}

      <section aria-labelledby="lines-title" className="mt-8">
        <h2 id="lines-title" className="text-2xl font-medium">What you ordered</h2>
        <ul className="mt-3 divide-y divide-paper-edge border-y border-paper-edge">
          {order.lines.map((line) => (
            <li key={line.id} className="grid gap-2 py-4 sm:grid-cols-[1fr_auto]">
              <div>
                <p className="font-semibold">
                  {line.designName} in {line.finishName}
                </p>
                <p className="text-sm text-ink-soft">{order.batchName}</p>
                {order.paidAt ? <LineProgress stage={line.stage} refunded={line.refunded} /> : null}
              </div>
              <p className="sm:text-right">
                <Price value={money(line.unitPriceMinor)} />
                {line.refunded ? <span className="block text-sm font-semibold">Refunded</span> : null}
              </p>
            </li>
          ))}
        </ul>
        <Totals order={order} />
      </section>

      <div className="mt-8 grid gap-8 sm:grid-cols-2">
        <section aria-labelledby="ship-title">
          <h2 id="ship-title" className="text-xl font-medium">Shipping</h2>
          {order.shipment ? (
            <div className="mt-2 rounded-sm border-2 border-moss bg-paper p-4" data-testid="order-shipment">
              <p className="font-semibold">
                <span aria-hidden="true">✓ </span>Sent {formatInZone(new Date(order.shipment.shippedAt), order.timeZone)} with {order.shipment.carrierName}
              </p>
              <p className="mt-1">
                Tracking number <span className="figures font-semibold">{order.shipment.trackingNumber}</span>
              </p>
              {order.shipment.trackingUrl ? (
                <p className="mt-2">
                  <a href={order.shipment.trackingUrl} target="_blank" rel="noopener noreferrer" className="font-semibold underline underline-offset-4">
                    Track your parcel<span className="sr-only"> on the {order.shipment.carrierName} site (opens in a new tab)</span>
                  </a>
                </p>
              ) : null}
            </div>
          ) : null}
          <p className="mt-2">{order.shippingLabel}, {order.shippingMinDays === order.shippingMaxDays ? `${order.shippingMinDays}` : `${order.shippingMinDays}–${order.shippingMaxDays}`} working days after dispatch.</p>
          {order.shipment ? null : (
            <p className="mt-1 text-ink-soft">
              The studio plans to ship by <time dateTime={order.shipBy}>{new Date(`${order.shipBy}T12:00:00Z`).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })}</time>.
            </p>
          )}
          {order.shipTo?.address ? (
            <address className="mt-3 not-italic">
              {[order.shipTo.name, order.shipTo.address.line1, order.shipTo.address.line2, [order.shipTo.address.postal_code, order.shipTo.address.city].filter(Boolean).join(' '), order.shipTo.address.state, order.shipTo.address.country ? countryName(order.shipTo.address.country) : null]
                .filter(Boolean)
                .map((part, index) => (
                  <span key={index} className="block">{part}</span>
                ))}
            </address>
          ) : null}
        </section>
        {order.refunds.length > 0 ? (
          <section aria-labelledby="refunds-title">
            <h2 id="refunds-title" className="text-xl font-medium">Refunds</h2>
            <ul className="mt-2 grid gap-2">
              {order.refunds.filter((r) => r.reason !== 'duplicate_payment').map((refund) => (
                <li key={refund.id} className="flex justify-between gap-3">
                  <span>{refund.status === 'succeeded' ? 'Refunded' : refund.status === 'pending' ? 'Refund on its way' : 'Refund not completed'} · {formatInZone(new Date(refund.createdAt), order.timeZone)}</span>
                  <Price value={money(refund.amountMinor)} />
                </li>
              ))}
            </ul>
            <p className="mt-2 text-sm text-ink-soft">Banks usually take 5 to 10 working days to show a refund on the card.</p>
          </section>
        ) : null}
      </div>

      <p className="mt-10 flex flex-wrap gap-4">
        <Link href={`/designs/${order.designSlug}`} className="underline underline-offset-4">About the {order.designName}</Link>
        {user ? <Link href="/account" className="underline underline-offset-4">All your orders</Link> : null}
      </p>
    </article>
  );
}

function Totals({ order }: { order: OrderView }) {
  const money = (amountMinor: number) => ({ amountMinor, currency: order.currency });
  return (
    <dl className="ml-auto mt-4 grid max-w-sm grid-cols-[1fr_auto] gap-x-6 gap-y-1">
      <dt>Masks</dt>
      <dd className="text-right"><Price value={money(order.linesMinor)} /></dd>
      <dt>Shipping ({order.shippingLabel})</dt>
      <dd className="text-right"><Price value={money(order.shippingMinor)} /></dd>
      <dt className="font-semibold">Total</dt>
      <dd className="text-right font-semibold" data-testid="order-total"><Price value={money(order.totalMinor)} /></dd>
      <dt className="text-sm text-ink-soft">Includes {order.taxLabel} at {(order.taxRateBasisPoints / 100).toLocaleString('en', { maximumFractionDigits: 2 })}%</dt>
      <dd className="text-right text-sm text-ink-soft"><Price value={money(order.taxIncludedMinor)} /></dd>
      {order.refundedMinor > 0 ? (
        <>
          <dt>Refunded</dt>
          <dd className="text-right">− <Price value={money(order.refundedMinor)} /></dd>
        </>
      ) : null}
    </dl>
  );
}

function LineProgress({ stage, refunded }: { stage: string; refunded: boolean }) {
  if (refunded) return null;
  const index = stages.indexOf(stage as (typeof stages)[number]);
  if (index < 0) return <p className="mt-2 text-sm font-semibold">{stageWords[stage] ?? stage}</p>;
  return (
    <ol className="mt-2 flex flex-wrap gap-x-3 gap-y-1 text-xs" aria-label={`Progress: ${stageWords[stage] ?? stage}`}>
      {stages.map((s, i) => (
        <li key={s} className={i <= index ? 'font-semibold text-ink' : 'text-ink-faint'} aria-current={i === index ? 'step' : undefined}>
          <span aria-hidden="true">{i < index ? '✓ ' : i === index ? '● ' : '○ '}</span>
          {stageWords[s]}
        </li>
      ))}
    </ol>
  );
}
