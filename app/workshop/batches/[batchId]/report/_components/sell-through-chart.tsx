'use client';

import { Area, AreaChart, CartesianGrid, Legend, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { palette } from '@/tailwind.config';
import { chooseBucketSeconds, formatElapsed, formatElapsedTick, type SellThroughSeries } from '@/lib/reports/sell-through';

type Props = { series: SellThroughSeries; stock: number; soldOutSeconds: number | null; summary: string };

/** About eight round ticks over the span, on the same steps the series uses. */
function elapsedTicks(spanSeconds: number): number[] {
  const step = chooseBucketSeconds(spanSeconds, 8);
  const ticks: number[] = [];
  for (let t = 0; t <= spanSeconds; t += step) ticks.push(t);
  return ticks;
}

/** Sold and held masks stacked over time since the opening, against the batch's stock. */
export function SellThroughChart({ series, stock, soldOutSeconds, summary }: Props) {
  const span = series.points.at(-1)?.t ?? 0;
  const top = Math.max(stock, ...series.points.map((p) => p.held + p.sold), 1);
  return (
    <figure>
      <figcaption className="mb-1 text-sm font-semibold">Held and sold since the opening</figcaption>
      <p className="mb-2 text-xs text-ink-soft">
        Sold masks (solid) with the masks in running holds stacked on top (lighter, dashed edge); the dashed line is the stock. One point every{' '}
        {formatElapsed(series.bucketSeconds)}. The table below lists the same points.
      </p>
      <div className="h-64 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <AreaChart data={series.points} margin={{ top: 12, right: 16, bottom: 8, left: 0 }} title="Held and sold since the opening" desc={summary}>
            <CartesianGrid stroke={palette.paper.edge} strokeDasharray="2 4" />
            <XAxis
              type="number"
              dataKey="t"
              domain={[0, span]}
              ticks={elapsedTicks(span)}
              tickFormatter={formatElapsedTick}
              tick={{ fontSize: 12, fill: palette.ink.soft }}
              name="Time since opening"
            />
            <YAxis domain={[0, top]} allowDecimals={false} width={36} tick={{ fontSize: 12, fill: palette.ink.soft }} />
            <Tooltip
              labelFormatter={(t) => `${formatElapsed(Number(t))} after opening`}
              formatter={(value, name) => [`${String(value)} mask${value === 1 ? '' : 's'}`, name]}
            />
            <Legend wrapperStyle={{ fontSize: 12 }} />
            <ReferenceLine
              y={stock}
              stroke={palette.ink.DEFAULT}
              strokeDasharray="6 3"
              label={{ value: `Stock ${stock}`, position: 'insideTopLeft', fontSize: 12, fill: palette.ink.DEFAULT }}
            />
            {soldOutSeconds !== null && soldOutSeconds <= span ? (
              <ReferenceLine
                x={soldOutSeconds}
                stroke={palette.ember.DEFAULT}
                strokeDasharray="2 3"
                label={{ value: 'Sold out', position: 'insideTopRight', fontSize: 12, fill: palette.ember.deep }}
              />
            ) : null}
            <Area
              dataKey="sold"
              name="Sold"
              stackId="units"
              type="stepAfter"
              stroke={palette.moss.DEFAULT}
              fill={palette.moss.DEFAULT}
              fillOpacity={0.8}
              isAnimationActive={false}
            />
            <Area
              dataKey="held"
              name="Held"
              stackId="units"
              type="stepAfter"
              stroke={palette.ink.faint}
              strokeDasharray="4 2"
              fill={palette.ink.faint}
              fillOpacity={0.25}
              isAnimationActive={false}
            />
          </AreaChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
