'use client';

import type { ReactNode } from 'react';

export const inputClass =
  'w-full rounded-sm border border-paper-edge bg-white px-3 py-2 figures aria-[invalid]:border-ember aria-[invalid]:bg-ember-wash/40';

export type FieldProps = {
  id: string;
  label: string;
  /** Said to screen readers after the label, where the visible label leans on its surroundings ("of Old Bone"). */
  srLabel?: string;
  value: string;
  onChange: (value: string) => void;
  error?: string;
  hint?: ReactNode;
  unit?: string;
  /** A rule of thumb (or a value recalled from memory) rather than the studio's own figure. */
  ruleOfThumb?: boolean;
  type?: 'text' | 'date';
  inputMode?: 'numeric' | 'decimal';
};

/** A labelled input with its hint and its inline error, both tied to it for screen readers. */
export function Field({ id, label, srLabel, value, onChange, error, hint, unit, ruleOfThumb, type = 'text', inputMode = 'decimal' }: FieldProps) {
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  return (
    <div className="grid content-start gap-1">
      <label htmlFor={id} className="text-sm font-semibold">
        {label}
        {srLabel ? <span className="sr-only"> {srLabel}</span> : null}
        {unit ? <span className="font-normal text-ink-soft"> ({unit})</span> : null}
        {ruleOfThumb ? (
          <span className="ml-2 whitespace-nowrap rounded-full bg-paper-deep px-2 py-0.5 text-xs font-semibold text-ink-soft">rule of thumb</span>
        ) : null}
      </label>
      <input
        id={id}
        type={type}
        inputMode={type === 'text' ? inputMode : undefined}
        autoComplete="off"
        value={value}
        onChange={(event) => onChange(event.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={hint ? `${hintId} ${errorId}` : errorId}
        className={inputClass}
      />
      {hint ? (
        <p id={hintId} className="text-xs text-ink-faint">
          {hint}
        </p>
      ) : null}
      <p id={errorId} className="min-h-5 text-sm font-semibold text-ember-deep">
        {error ? (
          <>
            <span aria-hidden="true">▲ </span>
            {error}
          </>
        ) : null}
      </p>
    </div>
  );
}

export function Group({ title, children, note }: { title: string; children: ReactNode; note?: ReactNode }) {
  return (
    <fieldset className="rounded-sm border border-paper-edge bg-paper p-4">
      <legend className="px-1 font-sans text-base font-semibold">{title}</legend>
      {note ? <div className="mb-3 text-sm text-ink-soft">{note}</div> : null}
      <div className="grid gap-x-4 sm:grid-cols-2">{children}</div>
    </fieldset>
  );
}
