'use client';

import type { FormEvent, ReactNode } from 'react';
import { orderStateLabels, orderStates } from '@/lib/orders/states';
import { lineStages, stageLabels } from '@/lib/production/stages';

export type FilterOption = { id: string; label: string };
type Props = {
  params: URLSearchParams;
  batches: FilterOption[];
  finishes: FilterOption[];
  /** Messages the server gave for each field of a bad view, shown under that field. */
  fieldErrors: Record<string, string[]>;
  update: (changes: Record<string, string | undefined>) => void;
  clearFilters: () => void;
  hasFilters: boolean;
};

const inputStyle = 'mt-1 block w-full rounded-sm border border-paper-edge bg-paper px-2 py-1.5 text-sm';

function Field({ name, label, errors, children }: { name: string; label: string; errors?: string[]; children: ReactNode }) {
  return (
    <div>
      <label htmlFor={`filter-${name}`} className="block text-xs font-semibold text-ink-soft">
        {label}
      </label>
      {children}
      {errors?.length ? (
        <p id={`filter-${name}-error`} className="mt-1 text-xs text-ember-deep">
          {errors.join(' ')}
        </p>
      ) : null}
    </div>
  );
}

/** Choices apply as soon as they change; the two typed fields apply on Enter or with the Search button. */
export function OrdersFilters({ params, batches, finishes, fieldErrors, update, clearFilters, hasFilters }: Props) {
  const select = (name: string, label: string, options: [string, string][]) => (
    <Field name={name} label={label} errors={fieldErrors[name]}>
      <select
        id={`filter-${name}`}
        className={inputStyle}
        value={params.get(name) ?? ''}
        onChange={(event) => update({ [name]: event.target.value })}
        aria-describedby={fieldErrors[name] ? `filter-${name}-error` : undefined}
      >
        {options.map(([value, words]) => (
          <option key={value} value={value}>
            {words}
          </option>
        ))}
      </select>
    </Field>
  );

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    update({ q: String(form.get('q') ?? '').trim(), country: String(form.get('country') ?? '').trim().toUpperCase() });
  }

  // Typed fields are reset from the URL whenever it changes (a shared link, Clear filters).
  const typedKey = `${params.get('q') ?? ''}|${params.get('country') ?? ''}`;

  return (
    <form onSubmit={submit} role="search" aria-label="Filter orders" className="mt-6 rounded-sm border border-paper-edge bg-paper p-4">
      <div key={typedKey} className="grid gap-3 sm:grid-cols-[2fr_1fr_auto] sm:items-end">
        <Field name="q" label="Search order number, buyer name or e-mail" errors={fieldErrors.q}>
          <input
            id="filter-q"
            name="q"
            type="search"
            maxLength={100}
            defaultValue={params.get('q') ?? ''}
            className={inputStyle}
            aria-describedby={fieldErrors.q ? 'filter-q-error' : undefined}
          />
        </Field>
        <Field name="country" label="Ships to (country code, e.g. IE)" errors={fieldErrors.country}>
          <input
            id="filter-country"
            name="country"
            maxLength={2}
            autoCapitalize="characters"
            defaultValue={params.get('country') ?? ''}
            className={`${inputStyle} uppercase`}
            aria-describedby={fieldErrors.country ? 'filter-country-error' : undefined}
          />
        </Field>
        <button type="submit" className="rounded-full bg-ink px-5 py-1.5 text-sm font-semibold text-paper">
          Search
        </button>
      </div>
      <div className="mt-3 grid grid-cols-2 gap-3 md:grid-cols-3 lg:grid-cols-6">
        {select('state', 'State', [
          ['', 'Paid and later'],
          ...orderStates.map((state): [string, string] => [state, orderStateLabels[state]]),
          ['all', 'All, with unpaid and cancelled'],
        ])}
        {select('batch', 'Batch', [['', 'Any batch'], ...batches.map((b): [string, string] => [b.id, b.label])])}
        {select('finish', 'Finish', [['', 'Any finish'], ...finishes.map((f): [string, string] => [f.id, f.label])])}
        {select('stage', 'A mask at stage', [['', 'Any stage'], ...lineStages.map((stage): [string, string] => [stage, stageLabels[stage]])])}
        {select('oversold', 'Oversold', [['', 'Either'], ['true', 'Has an oversold mask'], ['false', 'None oversold']])}
        {select('refunded', 'Refunded', [['', 'Either'], ['true', 'Refunded in part or whole'], ['false', 'Not refunded']])}
      </div>
      {hasFilters ? (
        <button type="button" onClick={clearFilters} className="mt-3 text-sm underline underline-offset-4 hover:text-ember-deep">
          Clear filters
        </button>
      ) : null}
    </form>
  );
}
