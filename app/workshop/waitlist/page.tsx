import type { Metadata } from 'next';
import { requirePageRole } from '@/lib/auth/authorize';
import { formatInZone } from '@/lib/drops/phase';
import { loadStudioSettings } from '@/lib/settings/studio';
import { getDailyConfirmed, getWaitlistDesigns, listAnnouncementProgress, listBatchConversions, waitlistDays } from '@/lib/waitlist/workshop-view';
import { AnnouncementProgressList } from './_components/announcement-progress';
import { WaitlistChart } from './_components/waitlist-chart';

export const metadata: Metadata = { title: 'Waitlist' };

const n = (value: number) => value.toLocaleString('en-GB');
const th = 'py-2 pr-3 font-semibold';
const td = 'figures py-2 pr-3';

export default async function WaitlistPage() {
  await requirePageRole('staff', '/workshop/waitlist');
  const settings = await loadStudioSettings();
  const zone = settings?.timeZone ?? 'UTC';
  const [designs, days, announcements, conversions] = await Promise.all([
    getWaitlistDesigns(),
    getDailyConfirmed(zone),
    listAnnouncementProgress(),
    listBatchConversions(),
  ]);
  const totals = designs.reduce((t, d) => ({ confirmed: t.confirmed + d.confirmed, left30: t.left30 + d.leftLast30Days }), { confirmed: 0, left30: 0 });
  const first = days[0];
  const last = days.at(-1);
  const summary = designs.length
    ? `Over the last ${waitlistDays} days (studio time, ${zone}): ` +
      designs.map((d) => `${d.designName} ${n(first?.counts[d.designId] ?? 0)} → ${n(last?.counts[d.designId] ?? 0)}`).join(', ') + '.'
    : 'No designs yet.';
  const recentDays = days.slice(-14).reverse();

  return (
    <>
      <h1 className="text-3xl font-medium">Waitlist</h1>
      <p className="mt-1 text-ink-soft">
        People who asked to hear about each design&rsquo;s next batch and confirmed their address: {n(totals.confirmed)} now,{' '}
        {n(totals.left30)} left in the last 30 days. Days are the studio&rsquo;s ({zone}).
      </p>
      <p className="mt-3">
        <a href="/api/workshop/waitlist/export" className="rounded-full border border-ink px-4 py-1 text-sm font-semibold" download>
          Download the waitlist (CSV)
        </a>
      </p>

      <section aria-labelledby="by-design" className="mt-8">
        <h2 id="by-design" className="text-xl font-medium">By design</h2>
        {designs.length === 0 ? (
          <p className="mt-3 rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">No designs yet.</p>
        ) : (
          <div className="mt-3 overflow-x-auto">
            <table className="w-full min-w-[28rem] text-left text-sm">
              <thead className="text-ink-soft">
                <tr>
                  <th scope="col" className={th}>Design</th>
                  <th scope="col" className={th}>Confirmed</th>
                  <th scope="col" className={th}>Waiting to confirm</th>
                  <th scope="col" className={th}>Left</th>
                  <th scope="col" className={th}>Left in 30 days</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-paper-edge">
                {designs.map((d) => (
                  <tr key={d.designId}>
                    <th scope="row" className="py-2 pr-3 font-normal">{d.designName}</th>
                    <td className={td}>{n(d.confirmed)}</td>
                    <td className={td}>{n(d.pending)}</td>
                    <td className={td}>{n(d.left)}</td>
                    <td className={td}>{n(d.leftLast30Days)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>

      <section aria-labelledby="over-time" className="mt-8">
        <h2 id="over-time" className="text-xl font-medium">Over time</h2>
        <div className="mt-3">
          <WaitlistChart days={days} designs={designs.map((d) => ({ id: d.designId, name: d.designName }))} summary={summary} />
        </div>
        <details className="mt-3 text-sm">
          <summary className="cursor-pointer text-ink-soft hover:text-ink">The last 14 days as a table</summary>
          <div className="mt-2 overflow-x-auto">
            <table className="w-full text-left">
              <thead className="text-ink-soft">
                <tr>
                  <th scope="col" className={th}>Day</th>
                  {designs.map((d) => (
                    <th key={d.designId} scope="col" className={th}>{d.designName}</th>
                  ))}
                </tr>
              </thead>
              <tbody className="divide-y divide-paper-edge">
                {recentDays.map((day) => (
                  <tr key={day.day}>
                    <th scope="row" className="figures py-2 pr-3 font-normal">{day.day}</th>
                    {designs.map((d) => (
                      <td key={d.designId} className={td}>{n(day.counts[d.designId] ?? 0)}</td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </details>
      </section>

      <section aria-labelledby="sending" className="mt-8">
        <h2 id="sending" className="text-xl font-medium">Sending</h2>
        <p className="mt-1 text-sm text-ink-soft">
          Messages go out at the studio&rsquo;s mail rate; a refused message is tried again later, and an address the mail server rejects for good is
          never written to again.
        </p>
        <div className="mt-3">
          <AnnouncementProgressList initial={{ announcements, unfinished: announcements.some((a) => a.unfinished) }} />
        </div>
      </section>

      <section aria-labelledby="bought" className="mt-8">
        <h2 id="bought" className="text-xl font-medium">Who bought</h2>
        <p className="mt-1 text-sm text-ink-soft">
          Paid orders of each batch from someone on the design&rsquo;s waitlist before the drop opened, matched by address or account.
        </p>
        {conversions.length === 0 ? (
          <p className="mt-3 rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">No scheduled batches yet.</p>
        ) : (
          <div className="mt-3 overflow-x-auto">
            <table className="w-full min-w-[32rem] text-left text-sm">
              <thead className="text-ink-soft">
                <tr>
                  <th scope="col" className={th}>Batch</th>
                  <th scope="col" className={th}>Opens</th>
                  <th scope="col" className={th}>Told</th>
                  <th scope="col" className={th}>Bought from the list</th>
                  <th scope="col" className={th}>All paid orders</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-paper-edge">
                {conversions.map((c) => (
                  <tr key={c.batchId}>
                    <th scope="row" className="py-2 pr-3 font-normal">
                      {c.batchName} <span className="text-ink-soft">({c.designName})</span>
                    </th>
                    <td className="figures py-2 pr-3">{formatInZone(new Date(c.opensAt), zone)}</td>
                    <td className={td}>{n(c.announced)}</td>
                    <td className={td}>
                      {n(c.buyers)}
                      {c.announced > 0 ? <span className="text-ink-soft"> ({((c.buyers / c.announced) * 100).toFixed(1)}% of those told)</span> : null}
                    </td>
                    <td className={td}>{n(c.paidOrders)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </>
  );
}
