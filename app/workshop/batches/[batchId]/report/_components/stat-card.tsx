import type { ReactNode } from 'react';

/** One figure of a report: a label, the figure in tabular numbers, and a line saying what it counts. */
export function StatCard({ label, value, note, tone = 'plain' }: { label: string; value: ReactNode; note?: ReactNode; tone?: 'plain' | 'warn' }) {
  return (
    <div className={`rounded-sm border bg-paper p-3 ${tone === 'warn' ? 'border-ember' : 'border-paper-edge'}`}>
      <dt className="text-sm text-ink-soft">{label}</dt>
      <dd className={`figures mt-1 text-2xl font-semibold ${tone === 'warn' ? 'text-ember-deep' : ''}`}>
        {tone === 'warn' ? <span aria-hidden="true">▲ </span> : null}
        {value}
      </dd>
      {note ? <dd className="mt-1 text-xs text-ink-soft">{note}</dd> : null}
    </div>
  );
}
