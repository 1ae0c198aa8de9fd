'use client';

import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { palette } from '@/tailwind.config';
import type { DailyConfirmed } from '@/lib/waitlist/workshop-view';

// Lines differ by dash as well as colour, so the chart reads without colour too; the legend names each.
const strokes = [
  { color: palette.ink.DEFAULT, dash: undefined },
  { color: palette.moss.DEFAULT, dash: '6 3' },
  { color: palette.ember.DEFAULT, dash: '2 3' },
  { color: palette.ink.faint, dash: '10 4 2 4' },
  { color: palette.ember.deep, dash: '1 5' },
];

const shortDay = (day: string) => new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', timeZone: 'UTC' }).format(new Date(`${day}T00:00:00Z`));

/** Confirmed people on each design's list at the end of each day. The table beside it holds the same figures. */
export function WaitlistChart({ days, designs, summary }: { days: DailyConfirmed[]; designs: { id: string; name: string }[]; summary: string }) {
  const data = days.map((d) => ({ day: d.day, ...Object.fromEntries(designs.map((design) => [design.id, d.counts[design.id] ?? 0])) }));
  return (
    <figure>
      <figcaption className="mb-1 text-sm font-semibold">Confirmed people by day</figcaption>
      <p className="mb-2 text-xs text-ink-soft">{summary}</p>
      <div className="h-64 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 8, right: 8, bottom: 8, left: 0 }} title="Confirmed people by day" desc={summary}>
            <CartesianGrid vertical={false} stroke={palette.paper.edge} strokeDasharray="2 4" />
            <XAxis dataKey="day" tickFormatter={shortDay} tick={{ fontSize: 12, fill: palette.ink.soft }} minTickGap={24} />
            <YAxis allowDecimals={false} width={48} tick={{ fontSize: 12, fill: palette.ink.soft }} />
            <Tooltip labelFormatter={(day) => shortDay(String(day))} />
            <Legend wrapperStyle={{ fontSize: 12 }} />
            {designs.map((design, i) => {
              const stroke = strokes[i % strokes.length]!;
              return (
                <Line key={design.id} type="monotone" dataKey={design.id} name={design.name} stroke={stroke.color} strokeDasharray={stroke.dash} strokeWidth={2} dot={false} isAnimationActive={false} />
              );
            })}
          </LineChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
