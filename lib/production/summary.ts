// Plain arithmetic over a batch's masks, safe to import anywhere.
import { toDayNumber, type IsoDate } from '@/lib/planner/calendar';
import { lineStages, type LineStage } from './stages';

/** Late: the studio's today is past the ship-by day and the mask has not gone. */
export function isLate(shipBy: IsoDate, today: IsoDate, stage: LineStage): boolean {
  return stage !== 'shipped' && toDayNumber(today) > toDayNumber(shipBy);
}

export type FinishCount = { finishName: string; count: number };

export type BatchSummary = {
  counts: Record<LineStage, number>;
  /** Masks waiting in the mold queue, by finish, largest first (an undecided oversold mask is not cast yet). */
  toCast: FinishCount[];
  /** The finish with the most masks trimmed and waiting for paint, or null when none wait. */
  mostWaitingForPaint: FinishCount | null;
  /** Calendar days from the studio's today to ship-by; negative once it has passed. */
  daysLeft: number;
};

function byFinish(lines: { finishName: string }[]): FinishCount[] {
  const counts = new Map<string, number>();
  for (const line of lines) counts.set(line.finishName, (counts.get(line.finishName) ?? 0) + 1);
  return [...counts]
    .map(([finishName, count]) => ({ finishName, count }))
    .sort((a, b) => b.count - a.count || a.finishName.localeCompare(b.finishName));
}

export function summarizeBatch(
  lines: { stage: LineStage; finishName: string; oversoldOpen?: boolean }[],
  shipBy: IsoDate,
  today: IsoDate,
): BatchSummary {
  const counts = Object.fromEntries(lineStages.map((stage) => [stage, 0])) as Record<LineStage, number>;
  for (const line of lines) counts[line.stage] += 1;
  return {
    counts,
    toCast: byFinish(lines.filter((line) => line.stage === 'to_cast' && !line.oversoldOpen)),
    mostWaitingForPaint: byFinish(lines.filter((line) => line.stage === 'trimmed'))[0] ?? null,
    daysLeft: toDayNumber(shipBy) - toDayNumber(today),
  };
}
