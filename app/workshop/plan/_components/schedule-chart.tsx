'use client';

import {
  CartesianGrid,
  Legend,
  Line,
  LineChart,
  ReferenceArea,
  ResponsiveContainer,
  Scatter,
  ScatterChart,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';
import { palette } from '@/tailwind.config';
import { formatShortDay } from '@/lib/planner/format';
import { stageKeys, stageLabels, type Schedule, type ScheduleDay, type StageKey } from '@/lib/planner/schedule';

const worksOn: Record<StageKey, (day: ScheduleDay) => boolean> = {
  moldMaking: (d) => d.moldMakingMinutes > 0,
  casting: (d) => d.pulls > 0,
  trimming: (d) => d.trimMinutes > 0,
  painting: (d) => d.paintMinutes > 0,
  packing: (d) => d.packMinutes > 0,
  handling: (d) => d.handling,
};

type Run = { stage: StageKey; row: number; start: number; end: number };

/** Each stage's unbroken runs of working days, for drawing as bars. */
function stageRuns(days: ScheduleDay[]): Run[] {
  const runs: Run[] = [];
  stageKeys.forEach((stage, row) => {
    let start: number | null = null;
    days.forEach((day, i) => {
      const works = worksOn[stage](day);
      if (works && start === null) start = i;
      if (!works && start !== null) {
        runs.push({ stage, row, start, end: i - 1 });
        start = null;
      }
    });
    if (start !== null) runs.push({ stage, row, start, end: days.length - 1 });
  });
  return runs;
}

function dayTicks(count: number): number[] {
  const step = Math.max(1, Math.ceil(count / 8));
  const ticks: number[] = [];
  for (let i = 0; i < count; i += step) ticks.push(i);
  return ticks;
}

// Dashes as well as colours tell the molds' lines apart.
const moldStrokes = [
  { stroke: palette.moss.DEFAULT, dash: undefined },
  { stroke: palette.ink.DEFAULT, dash: '6 3' },
  { stroke: palette.ember.DEFAULT, dash: '2 3' },
  { stroke: palette.ink.faint, dash: '10 4 2 4' },
];

export function ScheduleChart({ schedule }: { schedule: Schedule }) {
  const { days } = schedule;
  const runs = stageRuns(days);
  const ticks = dayTicks(days.length);
  const dayLabel = (i: number) => (days[i] ? formatShortDay(days[i].date) : '');
  const points = runs.map((run) => ({
    x: (run.start + run.end) / 2,
    y: run.row,
    label: `${stageLabels[run.stage]}: ${dayLabel(run.start)}${run.end > run.start ? ` – ${dayLabel(run.end)}` : ''} (${run.end - run.start + 1} working day${run.end > run.start ? 's' : ''})`,
  }));

  const lifeData = days.map((day) => ({ x: day.index, ...day.moldLife }));
  const maxLife = Math.max(1, ...schedule.molds.map((m) => m.remainingBefore));

  return (
    <div className="grid gap-6">
      <figure>
        <figcaption className="mb-1 text-sm font-semibold">Stages by working day</figcaption>
        <p className="mb-2 text-xs text-ink-soft">
          Each bar is a run of working days on which the stage has work; the bottleneck, {stageLabels[schedule.bottleneck].toLowerCase()},
          is marked ▲. The table below lists the same days.
        </p>
        <div className="h-64 w-full">
          <ResponsiveContainer width="100%" height="100%">
            <ScatterChart margin={{ top: 8, right: 16, bottom: 8, left: 8 }}>
              <CartesianGrid horizontal={false} stroke={palette.paper.edge} strokeDasharray="2 4" />
              <XAxis
                type="number"
                dataKey="x"
                domain={[-0.5, days.length - 0.5]}
                ticks={ticks}
                tickFormatter={dayLabel}
                tick={{ fontSize: 12, fill: palette.ink.soft }}
                allowDecimals={false}
                name="Working day"
              />
              <YAxis
                type="number"
                dataKey="y"
                domain={[-0.5, stageKeys.length - 0.5]}
                ticks={stageKeys.map((_, i) => i)}
                tickFormatter={(i: number) => `${stageKeys[i] === schedule.bottleneck ? '▲ ' : ''}${stageLabels[stageKeys[i]!]}`}
                tick={{ fontSize: 12, fill: palette.ink.DEFAULT }}
                reversed
                width={110}
                interval={0}
                name="Stage"
              />
              {runs.map((run) => (
                <ReferenceArea
                  key={`${run.stage}-${run.start}`}
                  x1={run.start - 0.45}
                  x2={run.end + 0.45}
                  y1={run.row - 0.32}
                  y2={run.row + 0.32}
                  fill={run.stage === schedule.bottleneck ? palette.ember.DEFAULT : palette.moss.DEFAULT}
                  fillOpacity={run.stage === 'handling' ? 0.45 : 0.9}
                  stroke="none"
                />
              ))}
              <Scatter data={points} fill="transparent" isAnimationActive={false} />
              <Tooltip
                cursor={false}
                content={({ active, payload }) => {
                  const point = payload?.[0]?.payload as { label?: string } | undefined;
                  return active && point?.label ? (
                    <div className="rounded-sm border border-paper-edge bg-white px-2 py-1 text-xs shadow-sm">{point.label}</div>
                  ) : null;
                }}
              />
            </ScatterChart>
          </ResponsiveContainer>
        </div>
      </figure>

      {schedule.molds.length > 0 ? (
        <figure>
          <figcaption className="mb-1 text-sm font-semibold">Pulls left in each mold</figcaption>
          <p className="mb-2 text-xs text-ink-soft">At the end of each working day; a new mold&rsquo;s line starts on the day it is ready.</p>
          <div className="h-56 w-full">
            <ResponsiveContainer width="100%" height="100%">
              <LineChart data={lifeData} margin={{ top: 8, right: 16, bottom: 8, left: 8 }}>
                <CartesianGrid stroke={palette.paper.edge} strokeDasharray="2 4" />
                <XAxis
                  type="number"
                  dataKey="x"
                  domain={[-0.5, days.length - 0.5]}
                  ticks={ticks}
                  tickFormatter={dayLabel}
                  tick={{ fontSize: 12, fill: palette.ink.soft }}
                />
                <YAxis domain={[0, maxLife]} allowDecimals={false} width={40} tick={{ fontSize: 12, fill: palette.ink.soft }} />
                <Tooltip labelFormatter={(i) => dayLabel(Number(i))} formatter={(value) => [`${String(value)} pulls left`]} />
                <Legend wrapperStyle={{ fontSize: 12 }} />
                {schedule.molds.map((mold, i) => {
                  const look = moldStrokes[i % moldStrokes.length]!;
                  return (
                    <Line
                      key={mold.id}
                      dataKey={mold.id}
                      name={mold.label}
                      type="stepAfter"
                      stroke={look.stroke}
                      strokeDasharray={look.dash}
                      strokeWidth={2}
                      dot={false}
                      connectNulls={false}
                      isAnimationActive={false}
                    />
                  );
                })}
              </LineChart>
            </ResponsiveContainer>
          </div>
        </figure>
      ) : null}
    </div>
  );
}
