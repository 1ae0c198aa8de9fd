import type { Metadata } from 'next';
import Link from 'next/link';
import { connection } from 'next/server';
import { requirePageRole } from '@/lib/auth/authorize';
import { hasRole } from '@/lib/auth/roles';
import { requestTime } from '@/lib/clock';
import { todayInZone } from '@/lib/planner/calendar';
import { listBoardBatches, listBoardLines, type BoardBatch, type BoardLine } from '@/lib/production/board';
import { boardSearchSchema } from '@/lib/production/schemas';
import { boardStages, failedStages, isFailed, lineStages, stageLabels } from '@/lib/production/stages';
import { isLate, summarizeBatch } from '@/lib/production/summary';
import { BoardStatus } from './_components/board-status';
import type { BoardCard } from './_components/board-types';
import { StageColumn } from './_components/stage-column';

export const metadata: Metadata = { title: 'Production' };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

const emptyWords: Record<string, string> = {
  to_cast: 'Nothing waits to be cast.',
  cast: 'Nothing waits for trimming.',
  trimmed: 'Nothing waits for paint.',
  painted: 'Nothing waits for packing.',
  packed: 'Nothing packed is waiting to ship.',
  failed: 'No failed castings or paint.',
};

export default async function ProductionPage({ searchParams }: Props) {
  const user = await requirePageRole('staff', '/workshop/production');
  await connection();
  const { batch: wanted } = boardSearchSchema.parse(await searchParams);
  const batches = await listBoardBatches();
  const batch = batches.find((b) => b.id === wanted);
  const lines = await listBoardLines({ batchId: batch?.id });
  const now = new Date(requestTime());
  const isOwner = hasRole(user.role, 'owner');

  const cards = lines
    .filter((line) => line.stage !== 'shipped')
    .map((line): BoardCard => ({
      id: line.id, stage: line.stage, label: `Line ${line.position} of ${line.orderNumber}`, orderNumber: line.orderNumber,
      designName: line.designName, finishName: line.finishName, buyerName: line.buyerName, batchName: line.batchName,
      shipBy: line.shipBy, late: isLate(line.shipBy, todayInZone(line.timeZone, now), line.stage), oversoldOpen: line.oversoldOpen,
    }));

  return (
    <>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-medium">Production</h1>
          <p className="mt-1 text-ink-soft">
            Every paid mask from the mold to the box, one stage at a time. Packed masks wait for shipping.
            {isOwner ? '' : ' Only the maker (owner) marks a mask failed or sends it back for a spare pull.'}
          </p>
        </div>
        <form method="get" className="flex items-end gap-2">
          <label className="grid gap-1 text-sm font-semibold">
            Batch
            <select name="batch" defaultValue={batch?.id ?? ''} className="rounded-sm border border-paper-edge bg-white px-2 py-1 font-normal">
              <option value="">Every batch</option>
              {batches.map((b) => (
                <option key={b.id} value={b.id}>
                  {b.designName}: {b.name} (ships by {b.shipBy})
                </option>
              ))}
            </select>
          </label>
          <button type="submit" className="rounded-full border border-ink px-4 py-1 text-sm font-semibold">
            Show
          </button>
        </form>
      </div>
      {wanted && !batch ? (
        <p className="mt-4 text-sm text-ink-soft">That batch has no paid masks to make, so every batch is shown.</p>
      ) : null}
      {batch ? <BatchSummary batch={batch} lines={lines} now={now} /> : null}
      <div className="mt-6">
        <BoardStatus>
          <div className="mt-2 grid gap-3 md:grid-cols-2 lg:grid-cols-3 xl:grid-cols-6">
            {boardStages.map((stage) => (
              <StageColumn
                key={stage}
                title={stageLabels[stage]}
                stage={stage}
                cards={cards.filter((card) => card.stage === stage)}
                isOwner={isOwner}
                empty={emptyWords[stage]!}
              />
            ))}
            <StageColumn title="Failed" stage={null} cards={cards.filter((card) => isFailed(card.stage))} isOwner={isOwner} empty={emptyWords.failed!} />
          </div>
        </BoardStatus>
      </div>
    </>
  );
}

function daysWords(daysLeft: number): string {
  if (daysLeft > 1) return `${daysLeft} days left`;
  if (daysLeft === 1) return '1 day left';
  if (daysLeft === 0) return 'ships today';
  return `${-daysLeft} day${daysLeft === -1 ? '' : 's'} late`;
}

/** The chosen batch at a glance: where its masks are, what the molds take today, what paint waits for. */
function BatchSummary({ batch, lines, now }: { batch: BoardBatch; lines: BoardLine[]; now: Date }) {
  const summary = summarizeBatch(lines, batch.shipBy, todayInZone(batch.timeZone, now));
  const toCast = summary.toCast.reduce((n, f) => n + f.count, 0);
  const shown = lineStages.filter((stage) => !(failedStages as readonly string[]).includes(stage) || summary.counts[stage] > 0);
  return (
    <section aria-labelledby="batch-summary" className="mt-6 rounded-sm border border-paper-edge bg-paper p-4">
      <h2 id="batch-summary" className="text-xl font-medium">
        {batch.designName}: {batch.name}
      </h2>
      <p className={`mt-1 text-sm ${summary.daysLeft < 0 ? 'font-semibold text-ember-deep' : 'text-ink-soft'}`}>
        Ships by <span className="figures">{batch.shipBy}</span> · {daysWords(summary.daysLeft)} (studio time, {batch.timeZone}).{' '}
        <Link href={`/workshop/batches/${batch.id}`} className="underline underline-offset-4">
          The batch
        </Link>
      </p>
      <dl className="mt-3 flex flex-wrap gap-x-6 gap-y-2 text-sm">
        {shown.map((stage) => (
          <div key={stage}>
            <dt className="text-ink-soft">{stageLabels[stage]}</dt>
            <dd className="figures text-lg font-semibold">{summary.counts[stage]}</dd>
          </div>
        ))}
      </dl>
      <ul className="mt-3 grid gap-1 text-sm">
        <li>
          <span className="font-semibold">Cast today:</span>{' '}
          {toCast === 0
            ? 'nothing waits for the molds.'
            : `${toCast} mask${toCast === 1 ? '' : 's'} — ${summary.toCast.map((f) => `${f.finishName} × ${f.count}`).join(', ')}.`}
        </li>
        <li>
          <span className="font-semibold">Most waiting for paint:</span>{' '}
          {summary.mostWaitingForPaint
            ? `${summary.mostWaitingForPaint.finishName} (${summary.mostWaitingForPaint.count} trimmed).`
            : 'nothing is trimmed and waiting.'}
        </li>
      </ul>
    </section>
  );
}
