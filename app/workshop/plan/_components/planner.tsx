'use client';

import Link from 'next/link';
import { useDeferredValue, useMemo, useState } from 'react';
import { openBatchHref } from '@/lib/planner/link';
import type { PlannerDesign, PlannerStudio } from '@/lib/planner/load';
import { largestBatchBy, planBatch, type LargestBatch, type Plan } from '@/lib/planner/plan';
import { PlanTooLongError } from '@/lib/planner/schedule';
import { InputsForm } from './inputs-form';
import { buildInput, initialFormState, type FieldKey, type FormState } from './plan-form';
import { PlanResults } from './plan-results';

type Outcome =
  | {
      kind: 'plan';
      plan: Plan;
      quantities: { finishId: string; quantity: number }[];
      largest: LargestBatch | null;
      target: string | null;
    }
  | { kind: 'invalid' }
  | { kind: 'too-long'; message: string };

/** The planner: the maker's inputs on one side, the plan recomputed in the browser on the other. */
export function Planner({ studio, design, canOpenBatch }: { studio: PlannerStudio; design: PlannerDesign; canOpenBatch: boolean }) {
  const [state, setState] = useState<FormState>(() => initialFormState(studio, design));
  // Typing stays quick: the plan (and its charts) follow a moment behind the keys.
  const deferred = useDeferredValue(state);

  const outcome = useMemo<Outcome>(() => {
    const built = buildInput(deferred, studio, design);
    if (!built.ok) return { kind: 'invalid' };
    try {
      const plan = planBatch(built.input);
      const largest = built.target ? largestBatchBy(built.input, built.target) : null;
      const quantities = built.input.finishes.map((f) => ({ finishId: f.finishId, quantity: f.quantity }));
      return { kind: 'plan', plan, quantities, largest, target: built.target };
    } catch (error) {
      if (error instanceof PlanTooLongError) return { kind: 'too-long', message: error.message };
      throw error;
    }
  }, [deferred, studio, design]);

  // Messages follow what is typed now, not the deferred copy, so a fixed field clears at once.
  const errors = useMemo(() => buildInput(state, studio, design).errors, [state, studio, design]);

  const setField = (key: FieldKey, value: string) => setState((s) => ({ ...s, fields: { ...s.fields, [key]: value } }));
  const setFinish = (finishId: string, field: 'quantity' | 'price' | 'paintHours', value: string) =>
    setState((s) => ({ ...s, finishes: { ...s.finishes, [finishId]: { ...s.finishes[finishId]!, [field]: value } } }));
  const useQuantities = (perFinish: { finishId: string; quantity: number }[]) =>
    setState((s) => ({
      ...s,
      finishes: Object.fromEntries(
        Object.entries(s.finishes).map(([id, fields]) => [id, { ...fields, quantity: String(perFinish.find((p) => p.finishId === id)?.quantity ?? 0) }]),
      ),
    }));
  const reset = () => setState(initialFormState(studio, design));

  const openHref =
    outcome.kind === 'plan'
      ? openBatchHref({ designSlug: design.slug, shipBy: outcome.plan.schedule.shipBy, quantities: outcome.quantities })
      : null;

  return (
    <div className="mt-6 grid gap-8 lg:grid-cols-[minmax(0,25rem)_minmax(0,1fr)]">
      <InputsForm studio={studio} design={design} state={state} errors={errors} setField={setField} setFinish={setFinish} onReset={reset} />
      <div id="plan-results" tabIndex={-1} className="grid content-start gap-6 focus:outline-none">
        {outcome.kind === 'invalid' ? (
          <p role="status" className="rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">
            {errors.finishes
              ? `${errors.finishes} The plan appears here as you type.`
              : 'Some fields need a change before the plan can be worked out: see the messages beside them.'}
          </p>
        ) : outcome.kind === 'too-long' ? (
          <p role="status" className="rounded-sm border border-ember bg-ember-wash px-4 py-4 text-ember-deep">
            <span aria-hidden="true">▲ </span>
            {outcome.message}
          </p>
        ) : (
          <PlanResults
            plan={outcome.plan}
            largest={outcome.largest}
            targetDate={outcome.target}
            target={{ value: state.fields.shipByTarget, error: errors.shipByTarget, onChange: (v) => setField('shipByTarget', v) }}
            studio={studio}
            design={design}
            onUseQuantities={useQuantities}
          />
        )}

        <section aria-labelledby="open-batch-title" className="rounded-sm border border-paper-edge bg-paper p-4">
          <h2 id="open-batch-title" className="font-sans text-base font-semibold">Open a batch</h2>
          {!canOpenBatch ? (
            <p className="mt-1 text-sm text-ink-soft">Only the maker (owner) opens batches; this plan is for reading.</p>
          ) : openHref ? (
            <>
              <p className="mt-1 text-sm text-ink-soft">Takes the quantities and the ship-by date above to the new batch form.</p>
              <Link href={openHref} className="mt-3 inline-block rounded-full bg-ink px-5 py-2 font-semibold text-paper hover:bg-ink-soft">
                Open a batch with this plan
              </Link>
            </>
          ) : (
            <p className="mt-1 text-sm text-ink-soft">Correct the plan first; then a batch can be opened with it.</p>
          )}
        </section>
      </div>
    </div>
  );
}
