'use client';

import { useActionState, useEffect, useId, useState } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import type { DesignForBatch } from '@/lib/drops/batches';
import { saveBatchAction } from '../actions';

export type BatchFormValues = {
  batchId?: string; designId: string; name: string; announcement: string; perBuyerLimit: number; holdMinutes: number;
  earlyAccessAt: string; opensAt: string; closesAt: string; shipBy: string; plannedShipBy: string; quantities: Record<string, number>;
};

const input = 'rounded-sm border border-paper-edge bg-white px-3 py-2 aria-[invalid]:border-ember';

function Field({ label, name, error, hint, children }: { label: string; name: string; error?: string; hint?: string; children: (ids: { id: string; describedBy: string }) => React.ReactNode }) {
  const id = useId();
  const errorId = `${id}-error`;
  const hintId = `${id}-hint`;
  return (
    <div className="grid content-start gap-1" data-field={name}>
      <label htmlFor={id} className="text-sm font-semibold">{label}</label>
      {children({ id, describedBy: [hint ? hintId : '', errorId].filter(Boolean).join(' ') })}
      {hint ? <p id={hintId} className="text-xs text-ink-soft">{hint}</p> : null}
      <p id={errorId} className="min-h-4 text-sm font-semibold text-ember-deep">{error ?? ''}</p>
    </div>
  );
}

/** The maker's batch form: stock per finish, limits, the drop's times in the studio's zone, ship-by. */
export function BatchForm({ designs, values, editing, scheduled, locked }: { designs: DesignForBatch[]; values: BatchFormValues; editing: boolean; scheduled: boolean; locked: { times: boolean; hasHolds: boolean } }) {
  const [state, action, pending] = useActionState(saveBatchAction, null);
  const [designId, setDesignId] = useState(values.designId || designs[0]?.id || '');
  const [shipBy, setShipBy] = useState(values.shipBy);
  const [dirty, setDirty] = useState(false);
  const design = designs.find((d) => d.id === designId);
  const err = (field: string) => fieldError(state, field);
  useEffect(() => {
    if (!dirty) return;
    const warn = (event: BeforeUnloadEvent) => event.preventDefault();
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [dirty]);
  const earlier = values.plannedShipBy && shipBy && shipBy < values.plannedShipBy;
  return (
    <form
      action={(formData) => {
        setDirty(false);
        action(formData);
      }}
      onChange={() => setDirty(true)}
      className="grid gap-6"
      noValidate
    >
      {values.batchId ? <input type="hidden" name="batchId" value={values.batchId} /> : null}
      <input type="hidden" name="plannedShipBy" value={values.plannedShipBy} />
      <section className="grid gap-4 rounded-sm border border-paper-edge bg-paper p-5 sm:grid-cols-2">
        <Field label="Design" name="designId" error={err('designId')}>
          {({ id, describedBy }) =>
            editing ? (
              <>
                <input type="hidden" name="designId" value={designId} />
                <p id={id} aria-describedby={describedBy} className="py-2 font-semibold">{design?.name}</p>
              </>
            ) : (
              <select id={id} name="designId" value={designId} onChange={(e) => setDesignId(e.target.value)} aria-describedby={describedBy} className={input}>
                {designs.map((d) => (
                  <option key={d.id} value={d.id}>{d.name}{d.status !== 'published' ? ' (draft)' : ''}</option>
                ))}
              </select>
            )
          }
        </Field>
        <Field label="Batch name" name="name" error={err('name')} hint='Shown on the drop page, e.g. "Spring batch".'>
          {({ id, describedBy }) => <input id={id} name="name" defaultValue={values.name} required maxLength={80} aria-invalid={err('name') ? true : undefined} aria-describedby={describedBy} className={input} />}
        </Field>
        <div className="sm:col-span-2">
          <Field label="Announcement" name="announcement" error={err('announcement')} hint="A few sentences for the drop page and, later, the waitlist e-mail.">
            {({ id, describedBy }) => <textarea id={id} name="announcement" defaultValue={values.announcement} rows={3} maxLength={4000} aria-describedby={describedBy} className={input} />}
          </Field>
        </div>
      </section>

      <fieldset className="grid gap-4 rounded-sm border border-paper-edge bg-paper p-5">
        <legend className="px-1 font-semibold">Masks per finish</legend>
        {locked.hasHolds ? <p className="text-sm text-ink-soft">Buyers have held from this batch, so each quantity can only grow.</p> : null}
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          {(design?.finishes ?? []).map((finish) => (
            <Field key={finish.id} label={`${finish.name}${finish.status !== 'published' ? ' (not published)' : ''}`} name={`qty.${finish.id}`} error={err(`qty.${finish.id}`)}>
              {({ id, describedBy }) => (
                <input id={id} name={`qty.${finish.id}`} type="number" inputMode="numeric" min={0} max={10000} step={1} defaultValue={values.quantities[finish.id] ?? 0} aria-invalid={err(`qty.${finish.id}`) ? true : undefined} aria-describedby={describedBy} className={`${input} figures`} />
              )}
            </Field>
          ))}
        </div>
        <p className="text-sm font-semibold text-ember-deep">{err('quantities') ?? ''}</p>
      </fieldset>

      <fieldset className="grid gap-4 rounded-sm border border-paper-edge bg-paper p-5 sm:grid-cols-3">
        <legend className="px-1 font-semibold">The drop, in studio time ({design?.timeZone ?? 'the studio’s zone'})</legend>
        {locked.times ? <p className="text-sm text-ink-soft sm:col-span-3">The drop has opened, so its opening times stay as they are.</p> : null}
        <Field label="Early access for the waitlist (optional)" name="earlyAccessAt" error={err('earlyAccessAt')}>
          {({ id, describedBy }) => <input id={id} name="earlyAccessAt" type="datetime-local" defaultValue={values.earlyAccessAt} readOnly={locked.times} aria-invalid={err('earlyAccessAt') ? true : undefined} aria-describedby={describedBy} className={input} />}
        </Field>
        <Field label="Opens to everyone" name="opensAt" error={err('opensAt')}>
          {({ id, describedBy }) => <input id={id} name="opensAt" type="datetime-local" required defaultValue={values.opensAt} readOnly={locked.times} aria-invalid={err('opensAt') ? true : undefined} aria-describedby={describedBy} className={input} />}
        </Field>
        <Field label="Closes" name="closesAt" error={err('closesAt')}>
          {({ id, describedBy }) => <input id={id} name="closesAt" type="datetime-local" required defaultValue={values.closesAt} aria-invalid={err('closesAt') ? true : undefined} aria-describedby={describedBy} className={input} />}
        </Field>
        <Field label="Per-buyer limit" name="perBuyerLimit" error={err('perBuyerLimit')} hint="How many masks one buyer may hold or buy from this batch.">
          {({ id, describedBy }) => <input id={id} name="perBuyerLimit" type="number" min={1} max={10} step={1} defaultValue={values.perBuyerLimit} aria-invalid={err('perBuyerLimit') ? true : undefined} aria-describedby={describedBy} className={input} />}
        </Field>
        <Field label="Hold minutes" name="holdMinutes" error={err('holdMinutes')} hint="How long a held mask waits while its buyer pays.">
          {({ id, describedBy }) => <input id={id} name="holdMinutes" type="number" min={1} max={60} step={1} defaultValue={values.holdMinutes} aria-invalid={err('holdMinutes') ? true : undefined} aria-describedby={describedBy} className={input} />}
        </Field>
        <Field label="Ships by" name="shipBy" error={err('shipBy')} hint={values.plannedShipBy ? `The plan says ${values.plannedShipBy}.` : 'The promise buyers see; the planner computes one.'}>
          {({ id, describedBy }) => <input id={id} name="shipBy" type="date" required value={shipBy} onChange={(e) => setShipBy(e.target.value)} aria-invalid={err('shipBy') ? true : undefined} aria-describedby={describedBy} className={input} />}
        </Field>
        {earlier ? (
          <p role="status" className="rounded-sm border-2 border-ember bg-ember-wash p-3 text-sm sm:col-span-3">
            This is earlier than the plan&apos;s {values.plannedShipBy}: buyers would be promised a date the plan says cannot be reached.
          </p>
        ) : null}
      </fieldset>

      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" name="intent" value="schedule" disabled={pending} className="rounded-full bg-ink px-6 py-2.5 font-semibold text-paper disabled:opacity-60">
          {pending ? 'Saving…' : scheduled ? 'Save changes' : 'Schedule the batch'}
        </button>
        {locked.times ? null : (
          <button type="submit" name="intent" value="draft" disabled={pending} className="rounded-full border border-ink px-5 py-2 font-semibold disabled:opacity-50">
            {scheduled ? 'Take back to draft' : 'Save as draft'}
          </button>
        )}
        {dirty ? <span className="text-sm text-ink-soft">Unsaved changes</span> : null}
      </div>
      <FormStatus state={state} />
    </form>
  );
}
