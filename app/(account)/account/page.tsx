import type { Metadata } from 'next';
import Link from 'next/link';
import { SignOutButton } from '@/components/auth/sign-out-button';
import { LocalTime } from '@/components/local-time';
import { requirePageUser } from '@/lib/auth/authorize';
import { hasRole, roleLabels } from '@/lib/auth/roles';
import { Price } from '@/components/ui/price';
import { listMyActiveHolds } from '@/lib/drops/holds';
import { listBuyerOrders } from '@/lib/orders/queries';
import { orderStateLabels } from '@/lib/orders/states';
import { listMyWaitlistEntries } from '@/lib/waitlist/queries';
import { NameForm } from './_components/name-form';
import { WaitlistList } from './_components/waitlist-list';

export const metadata: Metadata = { title: 'Your account' };

export default async function AccountPage() {
  const user = await requirePageUser('/account');
  const [holds, orders, waitlists] = await Promise.all([listMyActiveHolds(user), listBuyerOrders(user.id), listMyWaitlistEntries({ user })]);
  return (
    <>
      <h1 className="text-4xl font-medium">Your account</h1>
      <dl className="mt-8 grid gap-1">
        <dt className="text-sm text-ink-faint">Signed in as</dt>
        <dd className="text-lg">{user.email}</dd>
        {user.role !== 'customer' ? <dd className="text-sm text-ink-soft">{roleLabels[user.role]}</dd> : null}
      </dl>
      <div className="mt-8">
        <NameForm name={user.name} />
      </div>
      <section className="mt-10" aria-labelledby="holds-title">
        <h2 id="holds-title" className="text-2xl font-medium">
          Held for you
        </h2>
        {holds.length === 0 ? (
          <p className="mt-2 text-ink-soft">Nothing is held for you right now.</p>
        ) : (
          <ul className="mt-3 grid gap-2">
            {holds.map((hold) => (
              <li key={hold.id}>
                <Link href={`/drops/${hold.batchId}`} className="flex justify-between gap-3 rounded-sm border border-ember px-4 py-3">
                  <span className="font-semibold">
                    {hold.quantity} × {hold.designName}, {hold.finishName}
                  </span>
                  <span className="text-sm text-ink-soft">
                    until <LocalTime at={hold.expiresAt} />
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        )}
      </section>
      <section className="mt-10" aria-labelledby="orders-title">
        <h2 id="orders-title" className="text-2xl font-medium">
          Your orders
        </h2>
        {orders.length === 0 ? (
          <p className="mt-2 text-ink-soft">Nothing yet. Masks you buy will be listed here, with where each one has got to.</p>
        ) : (
          <ul className="mt-3 grid gap-2" data-testid="my-orders">
            {orders.map((order) => (
              <li key={order.id}>
                <Link href={`/orders/${order.number}`} className="grid gap-1 rounded-sm border border-paper-edge px-4 py-3 hover:border-ink sm:grid-cols-[1fr_auto]">
                  <span>
                    <span className="figures font-semibold">{order.number}</span> · {order.quantity} × {order.designName}, {order.finishName}
                    <span className="block text-sm text-ink-soft">
                      {orderStateLabels[order.state]}
                      {order.paidAt ? <> · ordered <LocalTime at={order.paidAt} /></> : null}
                    </span>
                  </span>
                  <Price value={{ amountMinor: order.totalMinor, currency: order.currency }} className="sm:text-right" />
                </Link>
              </li>
            ))}
          </ul>
        )}
      </section>
      <section className="mt-10" aria-labelledby="waitlists-title">
        <h2 id="waitlists-title" className="text-2xl font-medium">
          Waitlists
        </h2>
        <WaitlistList entries={waitlists} />
      </section>
      <div className="mt-10 flex flex-wrap items-center gap-4">
        {hasRole(user.role, 'staff') ? (
          <Link href="/workshop" className="rounded-full border border-ink px-5 py-2 font-semibold">
            Open the workshop
          </Link>
        ) : null}
        <SignOutButton className="rounded-full border border-paper-edge px-5 py-2 font-semibold hover:border-ink" />
      </div>
    </>
  );
}
