'use client';

import { Bar, BarChart, CartesianGrid, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { palette } from '@/tailwind.config';
import { formatMoney, minorUnitDigits } from '@/lib/money';
import { formatMonthKey } from '@/lib/reports/months';
import type { MonthRevenue } from '@/lib/reports/overview';

/** Net revenue (paid less refunded) for each of the last twelve months, as bars. */
export function OverviewRevenueChart({ revenue, currency, summary }: { revenue: MonthRevenue[]; currency: string; summary: string }) {
  const unit = 10 ** minorUnitDigits(currency);
  const data = revenue.map((r) => ({ month: r.month, net: r.netMinor / unit, netMinor: r.netMinor }));
  const whole = (value: number) =>
    new Intl.NumberFormat('en-IE', { style: 'currency', currency, notation: 'compact', maximumFractionDigits: 1 }).format(value);
  return (
    <figure>
      <figcaption className="mb-1 text-sm font-semibold">Revenue by month</figcaption>
      <p className="mb-2 text-xs text-ink-soft">What each month&rsquo;s paid orders brought in, less what was refunded on them. The table below lists the same months.</p>
      <div className="h-56 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={data} margin={{ top: 8, right: 8, bottom: 8, left: 8 }} title="Revenue by month" desc={summary}>
            <CartesianGrid vertical={false} stroke={palette.paper.edge} strokeDasharray="2 4" />
            <XAxis dataKey="month" tickFormatter={(m: string) => formatMonthKey(m).split(' ')[0]!} tick={{ fontSize: 12, fill: palette.ink.soft }} interval={0} />
            <YAxis tickFormatter={whole} width={56} tick={{ fontSize: 12, fill: palette.ink.soft }} />
            <ReferenceLine y={0} stroke={palette.ink.faint} />
            <Tooltip
              cursor={{ fill: palette.paper.deep }}
              labelFormatter={(m) => formatMonthKey(String(m))}
              formatter={(_value, _name, item) => [formatMoney({ amountMinor: (item.payload as { netMinor: number }).netMinor, currency }), 'Net']}
            />
            <Bar dataKey="net" name="Net" fill={palette.moss.DEFAULT} isAnimationActive={false} />
          </BarChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
