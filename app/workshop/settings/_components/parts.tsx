'use client';

import { useId, useState, type ReactNode, type SelectHTMLAttributes } from 'react';
import { FormStatus } from '@/components/ui/form-status';
import type { ActionResult } from '@/lib/auth/action';
import { inputStyle } from '../../designs/_components/fields';

export type Choice = { code: string; name: string };

export const sectionBox = 'grid gap-x-4 gap-y-1 rounded-sm border border-paper-edge bg-paper p-4 sm:p-5';
export const primaryButton = 'rounded-full bg-ink px-5 py-2 font-semibold text-paper disabled:opacity-60';
export const quietButton =
  'rounded-full border border-paper-edge px-3 py-1 text-sm hover:border-ink disabled:opacity-60';
export const dangerButton =
  'rounded-full border border-ember/50 px-3 py-1 text-sm text-ember-deep hover:border-ember disabled:opacity-60';

/** A section of the page: its heading, what it is for, and its own form(s). */
export function Section({
  id,
  title,
  intro,
  children,
}: {
  id: string;
  title: string;
  intro?: ReactNode;
  children: ReactNode;
}) {
  return (
    <section aria-labelledby={`${id}-title`} className="mt-10 grid gap-3">
      <h2 id={`${id}-title`} className="text-2xl font-medium">
        {title}
      </h2>
      {intro ? <div className="max-w-3xl text-ink-soft">{intro}</div> : null}
      {children}
    </section>
  );
}

/** The save button with the form's status line beside it. */
export function SaveRow({
  label,
  pending,
  pendingLabel = 'Saving…',
  status,
  className = '',
}: {
  label: string;
  pending: boolean;
  pendingLabel?: string;
  status: ActionResult | null;
  className?: string;
}) {
  return (
    <div className={`flex flex-wrap items-center gap-x-4 gap-y-1 pt-2 ${className}`}>
      <button type="submit" disabled={pending} className={primaryButton}>
        {pending ? pendingLabel : label}
      </button>
      <FormStatus state={status} />
    </div>
  );
}

/** A labelled select with its hint and error, tied together as designs' fields are. */
export function SelectField({
  label,
  hint,
  error,
  className = '',
  children,
  ...select
}: {
  label: string;
  hint?: ReactNode;
  error?: string;
  className?: string;
  children: ReactNode;
  name?: string;
} & SelectHTMLAttributes<HTMLSelectElement>) {
  const id = useId();
  return (
    <div className={`grid content-start gap-1 ${className}`}>
      <label htmlFor={`${id}-input`} className="text-sm font-semibold">
        {label}
      </label>
      <select
        id={`${id}-input`}
        aria-invalid={error ? true : undefined}
        aria-describedby={hint ? `${id}-error ${id}-hint` : `${id}-error`}
        className={inputStyle}
        {...select}
      >
        {children}
      </select>
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      <FieldError id={`${id}-error`} error={error} />
    </div>
  );
}

export function FieldError({ id, error }: { id: string; error?: string }) {
  return (
    <p id={id} className="min-h-5 text-sm font-semibold text-ember-deep">
      {error ? (
        <>
          <span aria-hidden="true">▲ </span>
          {error}
        </>
      ) : null}
    </p>
  );
}

/**
 * A list of codes or dates chosen one by one, sent as one comma-separated field `name` (server actions read
 * form data with Object.fromEntries, which keeps one value per name). Each chosen item has its remove button.
 */
export function ListPicker({
  name,
  label,
  hint,
  error,
  initial,
  choices,
  input,
  addLabel,
  emptyText,
  disabled,
}: {
  name: string;
  label: string;
  hint?: ReactNode;
  error?: string;
  initial: string[];
  /** Options to choose from; without them, a date input. */
  choices?: Choice[];
  input?: 'date';
  addLabel: string;
  emptyText: string;
  disabled?: boolean;
}) {
  const id = useId();
  const [items, setItems] = useState(initial);
  const [draft, setDraft] = useState('');
  const nameOf = (code: string) => choices?.find((c) => c.code === code)?.name ?? code;
  const add = () => {
    const value = draft.trim();
    if (!value || items.includes(value)) return;
    setItems([...items, value].sort());
    setDraft('');
  };
  const describedBy = hint ? `${id}-error ${id}-hint` : `${id}-error`;
  return (
    <div className="grid content-start gap-2" role="group" aria-labelledby={`${id}-label`}>
      <p id={`${id}-label`} className="text-sm font-semibold">
        {label}
      </p>
      <input type="hidden" name={name} value={items.join(',')} />
      {items.length === 0 ? (
        <p className="text-sm text-ink-soft">{emptyText}</p>
      ) : (
        <ul className="flex flex-wrap gap-2" aria-label={`${label}: ${items.length} chosen`}>
          {items.map((item) => (
            <li
              key={item}
              className="inline-flex items-center gap-1 rounded-full border border-paper-edge bg-white py-0.5 pl-3 pr-1 text-sm"
            >
              <span className="figures">{choices ? `${nameOf(item)} (${item})` : item}</span>
              <button
                type="button"
                disabled={disabled}
                onClick={() => setItems(items.filter((i) => i !== item))}
                className="rounded-full px-2 py-0.5 text-ink-soft hover:bg-paper-deep hover:text-ink disabled:opacity-60"
              >
                <span aria-hidden="true">×</span>
                <span className="sr-only">Remove {choices ? nameOf(item) : item}</span>
              </button>
            </li>
          ))}
        </ul>
      )}
      <div className="flex flex-wrap items-end gap-2">
        <label htmlFor={`${id}-draft`} className="sr-only">
          {addLabel}
        </label>
        {choices ? (
          <select
            id={`${id}-draft`}
            value={draft}
            disabled={disabled}
            onChange={(event) => setDraft(event.target.value)}
            aria-invalid={error ? true : undefined}
            aria-describedby={describedBy}
            className={`${inputStyle} max-w-xs`}
          >
            <option value="">Choose…</option>
            {choices
              .filter((c) => !items.includes(c.code))
              .map((c) => (
                <option key={c.code} value={c.code}>
                  {c.name} ({c.code})
                </option>
              ))}
          </select>
        ) : (
          <input
            id={`${id}-draft`}
            type={input ?? 'text'}
            value={draft}
            disabled={disabled}
            onChange={(event) => setDraft(event.target.value)}
            onKeyDown={(event) => {
              if (event.key === 'Enter') {
                event.preventDefault();
                add();
              }
            }}
            aria-invalid={error ? true : undefined}
            aria-describedby={describedBy}
            className={`${inputStyle} max-w-xs`}
          />
        )}
        <button type="button" onClick={add} disabled={disabled || !draft} className={quietButton}>
          {addLabel}
        </button>
      </div>
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      <FieldError id={`${id}-error`} error={error} />
    </div>
  );
}
