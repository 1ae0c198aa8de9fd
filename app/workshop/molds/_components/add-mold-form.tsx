'use client';

import { useActionState } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import { addMoldAction } from '../actions';

type DesignOption = { id: string; name: string; status: string };

const inputClass = 'rounded-sm border border-paper-edge bg-white px-3 py-2 aria-[invalid]:border-ember';

function Field({ id, label, error, children, hint }: { id: string; label: string; error?: string; hint?: string; children: React.ReactNode }) {
  return (
    <div className="grid content-start gap-1">
      <label htmlFor={id} className="text-sm font-semibold">{label}</label>
      {children}
      {hint ? <p id={`${id}-hint`} className="text-xs text-ink-faint">{hint}</p> : null}
      <p id={`${id}-error`} className="min-h-5 text-sm font-semibold text-ember-deep">{error ?? ''}</p>
    </div>
  );
}

export function AddMoldForm({ designs, today }: { designs: DesignOption[]; today: string }) {
  const [state, action, pending] = useActionState(addMoldAction, null);
  const errors = {
    designId: fieldError(state, 'designId'),
    label: fieldError(state, 'label'),
    madeOn: fieldError(state, 'madeOn'),
    pullsSoFar: fieldError(state, 'pullsSoFar'),
    expectedLifePulls: fieldError(state, 'expectedLifePulls'),
    notes: fieldError(state, 'notes'),
  };
  const describe = (id: string, hint = false) => [hint ? `${id}-hint` : '', `${id}-error`].filter(Boolean).join(' ');
  return (
    <form action={action} className="grid gap-x-4 gap-y-1 rounded-sm border border-paper-edge bg-paper p-5 sm:grid-cols-2 lg:grid-cols-3">
      <Field id="mold-design" label="Design" error={errors.designId}>
        <select id="mold-design" name="designId" required className={inputClass} aria-invalid={errors.designId ? true : undefined} aria-describedby={describe('mold-design')}>
          {designs.map((d) => (
            <option key={d.id} value={d.id}>{d.status === 'published' ? d.name : `${d.name} (${d.status})`}</option>
          ))}
        </select>
      </Field>
      <Field id="mold-label" label="Name" error={errors.label} hint="How the bench calls it, e.g. “Ibex C”.">
        <input id="mold-label" name="label" required maxLength={60} autoComplete="off" className={inputClass} aria-invalid={errors.label ? true : undefined} aria-describedby={describe('mold-label', true)} />
      </Field>
      <Field id="mold-made-on" label="Made on" error={errors.madeOn}>
        <input id="mold-made-on" name="madeOn" type="date" required max={today} defaultValue={today} className={inputClass} aria-invalid={errors.madeOn ? true : undefined} aria-describedby={describe('mold-made-on')} />
      </Field>
      <Field id="mold-pulls" label="Pulls so far" error={errors.pullsSoFar}>
        <input id="mold-pulls" name="pullsSoFar" type="number" inputMode="numeric" min={0} step={1} defaultValue={0} className={inputClass} aria-invalid={errors.pullsSoFar ? true : undefined} aria-describedby={describe('mold-pulls')} />
      </Field>
      <Field id="mold-life" label="Expected life (pulls)" error={errors.expectedLifePulls} hint="Rule of thumb: some tens of pulls for brush-on silicone.">
        <input id="mold-life" name="expectedLifePulls" type="number" inputMode="numeric" min={1} step={1} defaultValue={40} required className={inputClass} aria-invalid={errors.expectedLifePulls ? true : undefined} aria-describedby={describe('mold-life', true)} />
      </Field>
      <Field id="mold-notes" label="Notes (optional)" error={errors.notes}>
        <input id="mold-notes" name="notes" maxLength={2000} className={inputClass} aria-invalid={errors.notes ? true : undefined} aria-describedby={describe('mold-notes')} />
      </Field>
      <div className="flex flex-wrap items-center gap-4 sm:col-span-2 lg:col-span-3">
        <button type="submit" disabled={pending} className="rounded-full bg-ink px-5 py-2 font-semibold text-paper disabled:opacity-60">
          {pending ? 'Adding…' : 'Add mold'}
        </button>
        <FormStatus state={state && !state.ok && state.error.fieldErrors ? null : state} />
      </div>
    </form>
  );
}
