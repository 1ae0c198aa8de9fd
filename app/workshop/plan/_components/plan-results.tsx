'use client';

import { formatDay, formatMinutes } from '@/lib/planner/format';
import type { PlannerDesign, PlannerStudio } from '@/lib/planner/load';
import type { LargestBatch, Plan } from '@/lib/planner/plan';
import { stageLabels } from '@/lib/planner/schedule';
import { nearEndShare } from '@/lib/molds/life';
import { Field } from './fields';
import { MoneyTable } from './money-table';
import { ScheduleChart } from './schedule-chart';
import { ScheduleTable } from './schedule-table';

type Props = {
  plan: Plan;
  largest: LargestBatch | null;
  studio: PlannerStudio;
  design: PlannerDesign;
  target: { value: string; error?: string; onChange: (value: string) => void };
  /** The date the largest batch was worked out for (a moment behind the field while typing). */
  targetDate: string | null;
  onUseQuantities: (perFinish: { finishId: string; quantity: number }[]) => void;
};

const days = (n: number) => `${n} working day${n === 1 ? '' : 's'}`;

function Figure({ label, value, detail }: { label: string; value: string; detail?: string }) {
  return (
    <div className="rounded-sm border border-paper-edge bg-paper px-3 py-2">
      <dt className="text-xs text-ink-soft">{label}</dt>
      <dd className="figures text-lg font-semibold">{value}</dd>
      {detail ? <dd className="text-xs text-ink-soft">{detail}</dd> : null}
    </div>
  );
}

export function PlanResults({ plan, largest, studio, design, target, targetDate, onUseQuantities }: Props) {
  const { schedule } = plan;
  const { stages, moldNeed } = schedule;
  const bottleneck = stages[schedule.bottleneck];
  const capacityWords: Record<string, string> = {
    moldMaking: 'one new mold after another',
    casting: 'the molds’ pulls a day',
    trimming: `${studio.calendar.hoursPerDay} working hours a day`,
    painting: 'the painting hours a day',
    packing: 'the working hours a day',
    handling: 'the handling days',
  };

  return (
    <>
      <section aria-labelledby="plan-numbers-title">
        <h2 id="plan-numbers-title" className="text-2xl font-medium">The plan</h2>
        <p role="status" aria-live="polite" className="mt-1 text-ink-soft">
          {schedule.units} masks ship by <strong className="text-ink">{formatDay(schedule.shipBy)}</strong>. Bottleneck:{' '}
          <strong className="text-ink">{stageLabels[schedule.bottleneck].toLowerCase()}</strong>, {days(bottleneck.ownDays)} of its own work at{' '}
          {capacityWords[schedule.bottleneck]}.
        </p>
        <dl className="mt-3 grid grid-cols-2 gap-2 sm:grid-cols-3 xl:grid-cols-4">
          <Figure label="Masks" value={String(schedule.units)} />
          <Figure label="Pulls to cast" value={String(schedule.pulls)} detail={`${schedule.pulls - schedule.units} for failed pulls`} />
          <Figure label="Casting" value={days(stages.casting.activeDays)} />
          <Figure label="Trimming" value={formatMinutes(stages.trimming.work)} detail={days(stages.trimming.activeDays)} />
          <Figure label="Painting" value={days(stages.painting.activeDays)} detail={`${formatMinutes(stages.painting.work)} in all`} />
          <Figure label="Packing" value={days(stages.packing.activeDays)} detail={`${formatMinutes(stages.packing.work)} in all`} />
          <Figure label="Starts" value={formatDay(schedule.startOn)} />
          <Figure label="Ship-by date" value={formatDay(schedule.shipBy)} detail={`${days(schedule.totalWorkingDays)} from the start`} />
        </dl>
      </section>

      <section aria-labelledby="plan-molds-title">
        <h2 id="plan-molds-title" className="font-sans text-base font-semibold">Molds</h2>
        {moldNeed.newMolds > 0 ? (
          <p className="mt-1 flex gap-2 rounded-sm border border-ember bg-ember-wash px-3 py-2 text-sm text-ember-deep">
            <span aria-hidden="true">▲</span>
            <span>
              <strong>
                Make {moldNeed.newMolds === 1 ? 'a new mold' : `${moldNeed.newMolds} new molds`} first.
              </strong>{' '}
              The molds in use have {moldNeed.remainingPulls} pulls left and the batch needs {schedule.pulls}. A new mold takes
              about {days(schedule.newMoldLeadDays)} from the first coat to its first pull
              {moldNeed.newMolds > 1 ? ', one after another' : ''}; casting with the molds left goes on meanwhile.
            </span>
          </p>
        ) : (
          <p className="mt-1 text-sm text-ink-soft">
            <span aria-hidden="true">✓ </span>No new mold needed: the molds in use have {moldNeed.remainingPulls} pulls left for the {schedule.pulls} this batch casts.
          </p>
        )}
        {schedule.molds.length > 0 ? (
          <div className="mt-2 overflow-x-auto rounded-sm border border-paper-edge bg-paper">
            <table className="w-full text-left text-sm">
              <caption className="sr-only">Each mold’s life before and after the batch</caption>
              <thead className="border-b border-paper-edge text-ink-soft">
                <tr>
                  <th scope="col" className="px-3 py-2 font-semibold">Mold</th>
                  <th scope="col" className="px-3 py-2 text-right font-semibold">Left before</th>
                  <th scope="col" className="px-3 py-2 text-right font-semibold">Pulls in batch</th>
                  <th scope="col" className="px-3 py-2 text-right font-semibold">Left after</th>
                  <th scope="col" className="px-3 py-2 font-semibold">After the batch</th>
                </tr>
              </thead>
              <tbody className="figures">
                {schedule.molds.map((mold) => {
                  const nearEnd = mold.remainingAfter < nearEndShare * mold.expectedLifePulls;
                  return (
                    <tr key={mold.id} className="border-b border-paper-edge/60 last:border-0">
                      <th scope="row" className="px-3 py-2 font-semibold">
                        {mold.label}
                        {mold.isNew ? <span className="block text-xs font-normal text-ink-soft">ready {formatDay(mold.readyOn)}</span> : null}
                      </th>
                      <td className="px-3 py-2 text-right">{mold.remainingBefore}</td>
                      <td className="px-3 py-2 text-right">{mold.pullsInBatch}</td>
                      <td className="px-3 py-2 text-right">{mold.remainingAfter}</td>
                      <td className={`px-3 py-2 ${nearEnd ? 'font-semibold text-ember-deep' : ''}`}>
                        {mold.remainingAfter === 0 ? (
                          <><span aria-hidden="true">■ </span>Used up</>
                        ) : nearEnd ? (
                          <><span aria-hidden="true">▲ </span>Near the end of its life</>
                        ) : (
                          'In use'
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        ) : null}
      </section>

      <section aria-labelledby="plan-schedule-title">
        <h2 id="plan-schedule-title" className="font-sans text-base font-semibold">Schedule</h2>
        <div className="mt-2 rounded-sm border border-paper-edge bg-paper p-3">
          <ScheduleChart schedule={schedule} />
        </div>
        <details className="mt-2">
          <summary className="cursor-pointer text-sm font-semibold underline underline-offset-4">Day by day ({days(schedule.days.length)})</summary>
          <div className="mt-2">
            <ScheduleTable schedule={schedule} />
          </div>
        </details>
        <p className="mt-2 text-xs text-ink-soft">
          How this is worked out: casting is limited by the molds; mold making, trimming and packing share the working hours; painting
          has its own hours. A stage takes up a mask the working day after the stage before finished it, since resin and paint cure
          overnight (common practice). The ship-by date is the last handling day.
        </p>
      </section>

      <section aria-labelledby="plan-largest-title">
        <h2 id="plan-largest-title" className="font-sans text-base font-semibold">The largest batch by a date</h2>
        <div className="mt-2 grid gap-3 rounded-sm border border-paper-edge bg-paper p-4 sm:grid-cols-[12rem_1fr] sm:items-start">
          <Field id="plan-shipByTarget" label="Ship by" type="date" value={target.value} onChange={target.onChange} error={target.error} />
          <div className="text-sm" role="status" aria-live="polite">
            {!largest || !targetDate ? (
              <p className="text-ink-soft">Enter a date to see the most masks that ship by then.</p>
            ) : largest.quantity === 0 ? (
              <p>Not even one mask ships by {formatDay(targetDate)} with these hours and molds.</p>
            ) : (
              <>
                <p>
                  {largest.atLimit ? 'At least ' : 'At most '}
                  <strong className="figures">{largest.quantity} masks</strong> in this mix of finishes ship by {formatDay(targetDate)}
                  {largest.shipBy ? ` (on ${formatDay(largest.shipBy)})` : ''}:{' '}
                  {largest.perFinish.filter((f) => f.quantity > 0).map((f) => `${f.name} ${f.quantity}`).join(', ')}.
                </p>
                <button
                  type="button"
                  onClick={() => onUseQuantities(largest.perFinish)}
                  className="mt-2 rounded-full border border-paper-edge px-4 py-1.5 text-sm hover:border-ink"
                >
                  Plan with these quantities
                </button>
              </>
            )}
          </div>
        </div>
      </section>

      <section aria-labelledby="plan-money-title">
        <h2 id="plan-money-title" className="font-sans text-base font-semibold">Materials and money per mask</h2>
        <p className="mt-1 text-xs text-ink-soft">
          Resin mass = shell area × wall thickness × density, plus the waste allowance. Shell area, wall thickness, density and waste start
          from rules of thumb (marked beside each field): weigh a real pull to check them.
        </p>
        <div className="mt-2">
          <MoneyTable plan={plan} currency={design.currency} weightG={design.measures.weightG} />
        </div>
      </section>
    </>
  );
}
