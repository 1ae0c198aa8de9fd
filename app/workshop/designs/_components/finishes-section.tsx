'use client';

import { useActionState, useEffect, useOptimistic, useState } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import type { ActionResult } from '@/lib/auth/action';
import type { FinishEditView } from '@/lib/catalogue/editing';
import { slugify } from '@/lib/catalogue/slug';
import { formatMoney } from '@/lib/money';
import type { DesignStatus } from '@/models';
import { addFinishAction, setFinishStatusAction, updateFinishAction } from '../actions';
import { TextArea, TextField, UnsavedNote } from './fields';
import { focusFirstInvalid, statusFor } from './form-state';
import { NameAndSlugFields } from './name-and-slug-fields';
import { StatusBadge, statusMoves } from './status';
import { useSubmitByHand } from './use-submit-by-hand';
import { useUnsavedChanges } from './use-unsaved-changes';

type Row = FinishEditView & { pending?: 'adding' | 'changing' };
type Change = { kind: 'add'; finish: Row } | { kind: 'status'; id: string; status: DesignStatus };

type Design = { id: string; name: string; status: DesignStatus; currency: string; basePriceMinor: number };

const finishFields = ['name', 'slug', 'description', 'priceDifference', 'paintHours'];

/**
 * The finishes of one design: each with its own edit form and state buttons, and a form to add one. Adding
 * and state changes show in the list at once, and fall back to what the server says if it refuses.
 */
export function FinishesSection({ design, finishes }: { design: Design; finishes: FinishEditView[] }) {
  const [rows, apply] = useOptimistic<Row[], Change>(finishes, (current, change) =>
    change.kind === 'add'
      ? [...current, change.finish]
      : current.map((row) => (row.id === change.id ? { ...row, status: change.status, pending: 'changing' } : row)),
  );
  return (
    <section aria-labelledby="finishes-title" className="grid gap-3">
      <h2 id="finishes-title" className="text-2xl font-medium">
        Finishes
      </h2>
      <p className="text-ink-soft">
        A finish shows in the shop when it is published and {design.name} is published too. A published design keeps at
        least one published finish.
      </p>
      {rows.length === 0 ? (
        <p className="rounded-sm border border-paper-edge bg-paper px-4 py-4 text-ink-soft">No finishes yet: add the first one below.</p>
      ) : (
        <ul className="grid gap-3">
          {rows.map((row) => (
            <li key={row.id}>
              <FinishCard design={design} finish={row} onStatus={(id, status) => apply({ kind: 'status', id, status })} />
            </li>
          ))}
        </ul>
      )}
      <AddFinishForm design={design} onAdd={(finish) => apply({ kind: 'add', finish })} />
    </section>
  );
}

function priceLine(design: Design, finish: Pick<Row, 'priceDifferenceMinor' | 'paintHours'>) {
  const money = (amountMinor: number) => formatMoney({ amountMinor, currency: design.currency });
  return `${money(design.basePriceMinor + finish.priceDifferenceMinor)} (base + ${money(finish.priceDifferenceMinor)}) · ${Number(finish.paintHours)} h painting`;
}

function FinishCard({ design, finish, onStatus }: { design: Design; finish: Row; onStatus: (id: string, status: DesignStatus) => void }) {
  if (finish.pending === 'adding') {
    return (
      <div aria-busy="true" className="rounded-sm border border-dashed border-paper-edge bg-paper px-4 py-3">
        <p className="font-semibold">{finish.name}</p>
        <p className="text-sm text-ink-soft">Adding…</p>
      </div>
    );
  }
  return (
    <div className="rounded-sm border border-paper-edge bg-paper">
      <div className="grid gap-2 px-4 py-3 sm:grid-cols-[1fr_auto] sm:items-start">
        <div>
          <p className="flex flex-wrap items-center gap-2">
            <span className="text-lg font-semibold">{finish.name}</span>
            <StatusBadge status={finish.status} />
            {finish.pending === 'changing' ? <span className="text-sm text-ink-soft">Saving…</span> : null}
          </p>
          <p className="figures text-sm text-ink-soft">{priceLine(design, finish)}</p>
          {finish.status === 'published' && design.status !== 'published' ? (
            <p className="text-sm text-ink-soft">Shows in the shop once {design.name} is published.</p>
          ) : null}
        </div>
        <FinishStatusButtons finish={finish} onStatus={onStatus} />
      </div>
      <details className="border-t border-paper-edge">
        <summary className="cursor-pointer px-4 py-2 text-sm font-semibold hover:bg-paper-deep/60">Edit {finish.name}</summary>
        <div className="px-4 pb-4">
          <FinishForm mode="edit" design={design} finish={finish} />
        </div>
      </details>
    </div>
  );
}

function FinishStatusButtons({ finish, onStatus }: { finish: Row; onStatus: (id: string, status: DesignStatus) => void }) {
  const [state, dispatch, pending] = useActionState(async (previous: ActionResult | null, data: FormData) => {
    const status = data.get('status');
    if (status === 'draft' || status === 'published' || status === 'retired') onStatus(finish.id, status);
    return setFinishStatusAction(previous, data);
  }, null);
  return (
    <div className="grid justify-items-start gap-1 sm:justify-items-end">
      <div className="flex flex-wrap gap-2">
        {statusMoves[finish.status].map((move) => (
          <form key={move.to} action={dispatch}>
            <input type="hidden" name="finishId" value={finish.id} />
            <input type="hidden" name="status" value={move.to} />
            <button
              type="submit"
              disabled={pending || Boolean(finish.pending)}
              className="rounded-full border border-paper-edge px-4 py-1.5 text-sm font-semibold hover:border-ink disabled:opacity-60"
            >
              {move.label} {finish.name}
            </button>
          </form>
        ))}
      </div>
      <div className="max-w-sm sm:text-right">
        <FormStatus state={state} />
      </div>
    </div>
  );
}

type FinishFormProps = { design: Design } & ({ mode: 'add'; onAdd: (finish: Row) => void } | { mode: 'edit'; finish: Row });

function AddFinishForm({ design, onAdd }: { design: Design; onAdd: (finish: Row) => void }) {
  return (
    <section aria-labelledby="add-finish-title" className="rounded-sm border border-paper-edge bg-paper p-4 sm:p-5">
      <h3 id="add-finish-title" className="font-sans text-base font-semibold">
        Add a finish
      </h3>
      <p className="mb-3 text-sm text-ink-soft">It starts as a draft; publish it when its photos are in.</p>
      <FinishForm mode="add" design={design} onAdd={onAdd} />
    </section>
  );
}

function FinishForm(props: FinishFormProps) {
  const { design } = props;
  const initial = props.mode === 'edit' ? props.finish : null;
  const { formRef, dirty, onChange, saved } = useUnsavedChanges();
  // Counts the finishes this form has added, so that the next one starts with fresh name and slug fields.
  const [added, setAdded] = useState(0);

  const [state, dispatch, pending] = useActionState(async (previous: ActionResult | null, data: FormData) => {
    if (props.mode === 'add') {
      const name = String(data.get('name') ?? '').trim();
      if (name) {
        props.onAdd({
          id: `adding-${Date.now()}`,
          name,
          slug: String(data.get('slug') ?? '') || slugify(name),
          description: '',
          priceDifferenceMinor: 0,
          priceDifference: '0',
          paintHours: '0',
          status: 'draft',
          photos: [],
          pending: 'adding',
        });
      }
      return addFinishAction(previous, data);
    }
    return updateFinishAction(previous, data);
  }, null);
  const { onSubmit, submitted } = useSubmitByHand(dispatch);

  useEffect(() => {
    if (!state) return;
    if (!state.ok) {
      focusFirstInvalid(formRef.current);
      return;
    }
    if (props.mode === 'add' && formRef.current) {
      // Ready for the next finish.
      formRef.current.reset();
      setAdded((count) => count + 1);
      saved(new FormData(formRef.current));
    } else if (submitted.current) {
      saved(submitted.current);
    }
  }, [state, formRef, saved, submitted, props.mode]);

  const error = (field: string) => fieldError(state, field);
  const label = initial ? initial.name : 'the finish';

  return (
    <form ref={formRef} onSubmit={onSubmit} onChange={onChange} noValidate className="grid gap-x-4 gap-y-1 sm:grid-cols-2">
      <input type="hidden" name="currency" value={design.currency} />
      {props.mode === 'edit' ? (
        <input type="hidden" name="finishId" value={props.finish.id} />
      ) : (
        <input type="hidden" name="designId" value={design.id} />
      )}
      <NameAndSlugFields
        key={added}
        name={initial?.name ?? ''}
        slug={initial?.slug ?? ''}
        slugFollowsName={props.mode === 'add'}
        slugPrefix="?finish="
        slugHint="Lower-case letters, digits and hyphens; unique among this design’s finishes."
        errors={{ name: error('name'), slug: error('slug') }}
      />
      <TextArea
        label="Description"
        name="description"
        defaultValue={initial?.description ?? ''}
        rows={2}
        maxLength={1000}
        className="sm:col-span-2"
        error={error('description')}
      />
      <TextField
        label={`Price difference in ${design.currency}`}
        name="priceDifference"
        defaultValue={initial?.priceDifference ?? '0'}
        inputMode="decimal"
        autoComplete="off"
        prefix={`+ ${design.currency}`}
        hint="Added to the design’s base price; 0 if it costs the same."
        className="figures"
        error={error('priceDifference')}
      />
      <TextField
        label="Paint hours for one mask"
        name="paintHours"
        defaultValue={initial?.paintHours ?? ''}
        inputMode="decimal"
        autoComplete="off"
        suffix="h"
        hint="Up to 200, in hours and hundredths (3.5 is three and a half hours). Batch planning counts with it."
        className="figures"
        error={error('paintHours')}
      />
      <div className="flex flex-wrap items-center gap-x-4 gap-y-1 sm:col-span-2">
        <button type="submit" disabled={pending} className="rounded-full bg-ink px-5 py-2 font-semibold text-paper disabled:opacity-60">
          {props.mode === 'add' ? (pending ? 'Adding…' : 'Add the finish') : pending ? 'Saving…' : `Save ${label}`}
        </button>
        <UnsavedNote dirty={dirty && !pending} />
        <div className="basis-full">
          <FormStatus state={statusFor(state, finishFields)} />
        </div>
      </div>
    </form>
  );
}
