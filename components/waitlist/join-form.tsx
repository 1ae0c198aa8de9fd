'use client';

import { useMutation } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { ApiError, readApiResponse } from '@/lib/api/client';

export type JoinFormDesign = { id: string; name: string; finishes: { id: string; name: string }[] };
type JoinSource = 'design_page' | 'drop_page' | 'waitlist_page' | 'account';
type JoinAnswer = { email: string; results: { designId: string; designName: string; outcome: string; message: string }[] };

function browserTimeZone(): string | undefined {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || undefined;
  } catch {
    return undefined;
  }
}

/**
 * The waitlist form. With one design (`compact`) it asks only for the address and, optionally, finishes;
 * with several it lists them as checkboxes. A signed-in buyer's address is shown and fixed.
 */
export function JoinForm({
  designs,
  fixedEmail,
  source,
  preselected = [],
  compact = false,
  heading = 'Join the waitlist',
}: {
  designs: JoinFormDesign[];
  fixedEmail: string | null;
  source: JoinSource;
  preselected?: string[];
  compact?: boolean;
  heading?: string;
}) {
  const baseId = useId();
  const [email, setEmail] = useState(fixedEmail ?? '');
  const [chosen, setChosen] = useState<string[]>(compact ? designs.map((d) => d.id) : preselected);
  const [finishes, setFinishes] = useState<string[]>([]);
  const join = useMutation({
    mutationFn: async () =>
      readApiResponse<JoinAnswer>(
        await fetch('/api/waitlist', {
          method: 'POST',
          headers: { 'Content-Type': 'application/json' },
          body: JSON.stringify({
            ...(fixedEmail ? {} : { email }),
            designIds: chosen,
            finishIds: finishes.filter((id) => designs.some((d) => chosen.includes(d.id) && d.finishes.some((f) => f.id === id))),
            timeZone: browserTimeZone(),
            source,
          }),
        }),
      ),
  });

  const error = join.error instanceof ApiError ? join.error : join.error ? new ApiError('network', 'We could not reach the shop. Check your connection and try again.', 0) : null;
  const fields = (error?.details?.fields ?? {}) as Record<string, string[] | undefined>;
  const emailProblem = fields.email?.[0];
  const designProblem = fields.designIds?.[0];
  const finishProblem = fields.finishIds?.[0];
  const general = error && !emailProblem && !designProblem && !finishProblem ? error.message : null;
  const toggle = (list: string[], id: string) => (list.includes(id) ? list.filter((x) => x !== id) : [...list, id]);

  if (join.isSuccess) {
    return (
      <section aria-labelledby={`${baseId}-done`} className="rounded-sm border border-moss/40 bg-moss-wash p-5" data-testid="waitlist-result">
        <h2 id={`${baseId}-done`} className="font-sans text-lg font-semibold">
          {join.data.results.every((r) => r.outcome === 'already_confirmed') ? 'You are on the list' : 'Check your inbox'}
        </h2>
        <ul role="status" className="mt-2 grid gap-1">
          {join.data.results.map((r) => (
            <li key={r.designId}>{r.message}</li>
          ))}
        </ul>
        <p className="mt-2 text-sm text-ink-soft">Until you use the link in that e-mail, nothing else is sent to this address.</p>
        <button type="button" onClick={() => join.reset()} className="mt-3 text-sm font-semibold underline underline-offset-4">
          Join another waitlist
        </button>
      </section>
    );
  }

  const shown = designs.filter((d) => chosen.includes(d.id) && d.finishes.length > 1);
  return (
    <form
      noValidate
      aria-labelledby={`${baseId}-title`}
      className="rounded-sm border border-paper-edge bg-paper p-5"
      onSubmit={(event) => {
        event.preventDefault();
        join.mutate();
      }}
    >
      <h2 id={`${baseId}-title`} className="font-sans text-lg font-semibold">
        {heading}
      </h2>
      <p className="mt-1 text-sm text-ink-soft">
        We write once to confirm, then only when a new batch opens. Leave at any time with one click.
      </p>

      <label htmlFor={`${baseId}-email`} className="mt-4 block font-semibold">
        E-mail address
      </label>
      <input
        id={`${baseId}-email`}
        name="email"
        type="email"
        inputMode="email"
        autoComplete="email"
        required
        readOnly={Boolean(fixedEmail)}
        value={email}
        onChange={(event) => setEmail(event.target.value)}
        aria-invalid={emailProblem ? true : undefined}
        aria-describedby={`${baseId}-email-note`}
        className="mt-1 block w-full rounded-sm border border-paper-edge bg-white px-4 py-3 read-only:bg-paper-deep aria-[invalid]:border-ember"
        placeholder="you@example.com"
      />
      <p id={`${baseId}-email-note`} className="mt-1 min-h-5 text-sm">
        {emailProblem ? (
          <span className="font-semibold text-ember-deep">{emailProblem}</span>
        ) : fixedEmail ? (
          <span className="text-ink-soft">The address you are signed in with.</span>
        ) : null}
      </p>

      {compact ? null : (
        <fieldset className="mt-3" aria-describedby={`${baseId}-designs-note`}>
          <legend className="font-semibold">Designs</legend>
          <div className="mt-1 grid gap-1 sm:grid-cols-2">
            {designs.map((d) => (
              <label key={d.id} className="flex items-center gap-2 py-1">
                <input type="checkbox" checked={chosen.includes(d.id)} onChange={() => setChosen((c) => toggle(c, d.id))} className="h-5 w-5" />
                {d.name}
              </label>
            ))}
          </div>
          <p id={`${baseId}-designs-note`} className="min-h-5 text-sm font-semibold text-ember-deep">
            {designProblem ?? ''}
          </p>
        </fieldset>
      )}

      {shown.map((d) => (
        <fieldset key={d.id} className="mt-3" aria-describedby={`${baseId}-finish-note`}>
          <legend className="font-semibold">
            {compact ? 'Finishes' : `${d.name}: finishes`} <span className="font-normal text-ink-soft">(optional: none ticked means any)</span>
          </legend>
          <div className="mt-1 flex flex-wrap gap-x-5">
            {d.finishes.map((f) => (
              <label key={f.id} className="flex items-center gap-2 py-1">
                <input type="checkbox" checked={finishes.includes(f.id)} onChange={() => setFinishes((c) => toggle(c, f.id))} className="h-5 w-5" />
                {f.name}
              </label>
            ))}
          </div>
        </fieldset>
      ))}
      <p id={`${baseId}-finish-note`} className="min-h-5 text-sm font-semibold text-ember-deep">
        {finishProblem ?? ''}
      </p>

      <p aria-live="assertive" role={general ? 'alert' : undefined} className="min-h-5 text-sm font-semibold text-ember-deep">
        {general ?? ''}
      </p>
      <button
        type="submit"
        disabled={join.isPending || chosen.length === 0}
        className="mt-2 w-full rounded-full bg-ink px-6 py-3 font-semibold text-paper hover:bg-ink-soft disabled:opacity-60 sm:w-auto"
      >
        {join.isPending ? 'Sending…' : 'Join the waitlist'}
      </button>
      {chosen.length === 0 ? <p className="mt-2 text-sm text-ink-soft">Tick at least one design.</p> : null}
    </form>
  );
}
