'use client';

import { useActionState, useEffect, useId, useRef, useState, type FormEvent } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import type { ActionResult } from '@/lib/auth/action';
import { formatMoney } from '@/lib/money';
import { refundReasonLabels, refundReasons, type RefundReason } from '@/lib/orders/schemas';
import { refundOrderAction } from '../actions';
import { parseAmount } from './refund-amount';

export type RefundableLine = { id: string; label: string; unitPriceMinor: number };

type Props = {
  orderNumber: string;
  currency: string;
  buyer: string;
  /** What is paid and not yet refunded or on its way back. */
  leftMinor: number;
  shippingMinor: number;
  /** The masks not refunded yet and not in a refund that is still on its way. */
  lines: RefundableLine[];
};

type Mode = 'all' | 'lines' | 'amount';
type Problems = Partial<Record<'mode' | 'lineIds' | 'amount' | 'reason' | 'note', string>>;

const inputStyle = 'rounded-sm border border-paper-edge bg-white px-3 py-2 aria-[invalid]:border-ember';

export function RefundForm({ orderNumber, currency, buyer, leftMinor, shippingMinor, lines }: Props) {
  const [mode, setMode] = useState<Mode>('all');
  const [chosen, setChosen] = useState<string[]>([]);
  const [amountText, setAmountText] = useState('');
  const [reason, setReason] = useState<RefundReason | ''>('');
  const [note, setNote] = useState('');
  const [restock, setRestock] = useState(false);
  const [stage, setStage] = useState<'edit' | 'confirm'>('edit');
  const [problems, setProblems] = useState<Problems>({});
  const [showServerErrors, setShowServerErrors] = useState(false);
  const confirmRef = useRef<HTMLHeadingElement>(null);
  const reviewRef = useRef<HTMLButtonElement>(null);
  const backToEdit = useRef(false);
  const ids = { amount: useId(), lines: useId(), reason: useId(), note: useId(), status: useId() };

  const [state, action, pending] = useActionState(
    async (previous: ActionResult | null, formData: FormData) => {
      const result = await refundOrderAction(previous, formData);
      setStage('edit');
      setShowServerErrors(true);
      if (result.ok) {
        setMode('all');
        setChosen([]);
        setAmountText('');
        setReason('');
        setNote('');
        setRestock(false);
      }
      return result;
    },
    null,
  );

  useEffect(() => {
    if (stage === 'confirm') confirmRef.current?.focus();
    if (stage === 'edit' && backToEdit.current) {
      backToEdit.current = false;
      reviewRef.current?.focus();
    }
  }, [stage]);

  const money = (amountMinor: number) => formatMoney({ amountMinor, currency });
  const chosenLines = lines.filter((line) => chosen.includes(line.id));
  const parsedAmount = parseAmount(amountText, currency);
  // The same sum the server makes: chosen masks, plus shipping when no mask of the order is left to ship.
  const amountMinor =
    mode === 'all'
      ? leftMinor
      : mode === 'lines'
        ? chosenLines.length > 0
          ? Math.min(
              leftMinor,
              chosenLines.reduce((sum, line) => sum + line.unitPriceMinor, 0) +
                (chosenLines.length === lines.length ? shippingMinor : 0),
            )
          : null
        : parsedAmount.ok
          ? parsedAmount.amountMinor
          : null;

  const problem = (field: keyof Problems) =>
    problems[field] ?? (showServerErrors ? fieldError(state, field) : undefined);

  function review() {
    const found: Problems = {};
    if (mode === 'lines' && chosenLines.length === 0) found.lineIds = 'Choose at least one mask to refund.';
    if (mode === 'amount') {
      if (!parsedAmount.ok) found.amount = parsedAmount.message;
      else if (parsedAmount.amountMinor > leftMinor)
        found.amount = `At most ${money(leftMinor)} is left to refund on this order.`;
    }
    if (!reason) found.reason = 'Choose a reason for the refund.';
    setProblems(found);
    setShowServerErrors(false);
    if (Object.keys(found).length === 0) setStage('confirm');
  }

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    // Enter in a field, or the first button, leads to the confirm step; only its own button refunds.
    if (stage === 'edit') {
      event.preventDefault();
      review();
    }
  }

  const toggle = (id: string, on: boolean) =>
    setChosen((now) => (on ? [...now, id] : now.filter((other) => other !== id)));
  const what =
    mode === 'all'
      ? 'everything that is left on the order'
      : mode === 'lines'
        ? `${chosenLines.length === 1 ? 'one mask' : `${chosenLines.length} masks`}: ${chosenLines.map((line) => line.label).join('; ')}${chosenLines.length === lines.length && shippingMinor > 0 ? ', and the shipping' : ''}`
        : 'an amount, no masks';

  // Field errors show by their fields; any about the hidden fields (a stale or altered page) show here.
  const shownFields = ['lineIds', 'amount', 'reason', 'note'];
  const otherErrors =
    state && !state.ok && state.error.fieldErrors
      ? Object.entries(state.error.fieldErrors).filter(([field]) => !shownFields.includes(field))
      : [];
  const statusState: ActionResult | null =
    state && !state.ok && state.error.fieldErrors
      ? showServerErrors && otherErrors.length > 0
        ? {
            ok: false,
            error: {
              code: state.error.code,
              message: `${otherErrors.flatMap(([, messages]) => messages).join(' ')} Reload the order and try again.`,
            },
          }
        : null
      : state;
  const describe = (field: keyof Problems, id: string) => ({
    'aria-invalid': problem(field) ? true : undefined,
    'aria-describedby': id,
  });

  if (leftMinor <= 0) {
    // Kept mounted after the last refund, so its outcome is still announced.
    return (
      <div className="grid gap-1">
        <p className="text-sm text-ink-soft">
          Nothing is left to refund on this order (refunds still on their way count too).
        </p>
        <FormStatus id={ids.status} state={statusState} />
      </div>
    );
  }

  return (
    <form
      action={action}
      onSubmit={onSubmit}
      className="grid gap-4 rounded-sm border border-paper-edge bg-paper p-5"
    >
      <input type="hidden" name="number" value={orderNumber} />
      <input type="hidden" name="currency" value={currency} />
      <input type="hidden" name="mode" value={mode} />
      <input type="hidden" name="lineIds" value={mode === 'lines' ? chosen.join(',') : ''} />
      <input type="hidden" name="amount" value={mode === 'amount' ? amountText : ''} />
      <input type="hidden" name="reason" value={reason} />
      <input type="hidden" name="note" value={note} />
      {restock && mode !== 'amount' ? <input type="hidden" name="restock" value="on" /> : null}

      <fieldset disabled={stage === 'confirm' || pending} className="grid gap-4 disabled:opacity-70">
        <fieldset className="grid gap-2">
          <legend className="mb-1 text-sm font-semibold">What to refund</legend>
          <label className="flex items-center gap-2">
            <input type="radio" name="refund-mode" checked={mode === 'all'} onChange={() => setMode('all')} />
            <span>
              Whole order (what is left) <span className="text-ink-soft">· {money(leftMinor)}</span>
            </span>
          </label>
          <label className="flex items-center gap-2">
            <input
              type="radio"
              name="refund-mode"
              checked={mode === 'lines'}
              onChange={() => setMode('lines')}
              disabled={lines.length === 0}
            />
            <span>
              Chosen masks
              {lines.length === 0 ? (
                <span className="text-ink-soft"> · no mask is left to refund on its own</span>
              ) : null}
            </span>
          </label>
          <label className="flex items-center gap-2">
            <input
              type="radio"
              name="refund-mode"
              checked={mode === 'amount'}
              onChange={() => setMode('amount')}
            />
            <span>An amount</span>
          </label>
        </fieldset>

        {mode === 'lines' ? (
          <fieldset className="grid gap-1" aria-describedby={ids.lines}>
            <legend className="mb-1 text-sm font-semibold">Masks to refund</legend>
            {lines.map((line) => (
              <label key={line.id} className="flex items-center gap-2">
                <input
                  type="checkbox"
                  checked={chosen.includes(line.id)}
                  onChange={(event) => toggle(line.id, event.target.checked)}
                />
                <span>
                  {line.label} <span className="figures text-ink-soft">· {money(line.unitPriceMinor)}</span>
                </span>
              </label>
            ))}
            <p className="text-sm text-ink-soft">
              When every mask left is chosen, the shipping goes back too.
            </p>
            <p id={ids.lines} className="min-h-5 text-sm font-semibold text-ember-deep">
              {problem('lineIds') ?? ''}
            </p>
          </fieldset>
        ) : null}

        {mode === 'amount' ? (
          <div className="grid gap-1">
            <label htmlFor={`${ids.amount}-input`} className="text-sm font-semibold">
              Amount in {currency}
            </label>
            <input
              id={`${ids.amount}-input`}
              inputMode="decimal"
              autoComplete="off"
              value={amountText}
              onChange={(event) => setAmountText(event.target.value)}
              {...describe('amount', ids.amount)}
              className={`${inputStyle} figures max-w-48`}
            />
            <p id={ids.amount} className="min-h-5 text-sm font-semibold text-ember-deep">
              {problem('amount') ?? ''}
            </p>
          </div>
        ) : null}

        <div className="grid gap-1">
          <label htmlFor={`${ids.reason}-input`} className="text-sm font-semibold">
            Reason
          </label>
          <select
            id={`${ids.reason}-input`}
            value={reason}
            onChange={(event) => setReason(event.target.value as RefundReason | '')}
            {...describe('reason', ids.reason)}
            className={`${inputStyle} max-w-sm`}
          >
            <option value="">Choose a reason</option>
            {refundReasons.map((value) => (
              <option key={value} value={value}>
                {refundReasonLabels[value]}
              </option>
            ))}
          </select>
          <p id={ids.reason} className="min-h-5 text-sm font-semibold text-ember-deep">
            {problem('reason') ?? ''}
          </p>
        </div>

        <div className="grid gap-1">
          <label htmlFor={`${ids.note}-input`} className="text-sm font-semibold">
            Note (optional, kept with the refund)
          </label>
          <textarea
            id={`${ids.note}-input`}
            rows={2}
            maxLength={500}
            value={note}
            onChange={(event) => setNote(event.target.value)}
            {...describe('note', ids.note)}
            className={inputStyle}
          />
          <p id={ids.note} className="min-h-5 text-sm font-semibold text-ember-deep">
            {problem('note') ?? ''}
          </p>
        </div>

        <label className="flex items-start gap-2">
          <input
            type="checkbox"
            className="mt-1.5"
            checked={restock && mode !== 'amount'}
            disabled={mode === 'amount'}
            onChange={(event) => setRestock(event.target.checked)}
          />
          <span>
            Put the refunded masks back on sale
            <span className="block text-sm text-ink-soft">
              {mode === 'amount'
                ? 'An amount gives no masks back.'
                : 'Only masks that were counted as sold go back; oversold ones never were.'}
            </span>
          </span>
        </label>

        {stage === 'edit' ? (
          <div>
            <button
              ref={reviewRef}
              type="submit"
              disabled={pending}
              className="rounded-full bg-ink px-5 py-2 font-semibold text-paper disabled:opacity-60"
            >
              {amountMinor !== null ? `Check the refund of ${money(amountMinor)}` : 'Check the refund'}
            </button>
          </div>
        ) : null}
      </fieldset>

      {stage === 'confirm' && amountMinor !== null ? (
        <div className="grid gap-3 rounded-sm border border-ink p-4">
          <h3 ref={confirmRef} tabIndex={-1} className="font-sans text-base font-semibold">
            Refund {money(amountMinor)} to {buyer}?
          </h3>
          <p className="text-sm text-ink-soft">
            For {what}. Reason: {reason ? refundReasonLabels[reason] : ''}.
            {restock && mode !== 'amount' ? ' The refunded masks go back on sale.' : ''} This cannot be
            undone.
          </p>
          <div className="flex flex-wrap gap-2">
            <button
              type="submit"
              disabled={pending}
              className="rounded-full bg-ember px-5 py-2 font-semibold text-paper disabled:opacity-60"
            >
              {pending ? `Refunding ${money(amountMinor)}…` : `Refund ${money(amountMinor)}`}
            </button>
            <button
              type="button"
              disabled={pending}
              onClick={() => {
                backToEdit.current = true;
                setStage('edit');
              }}
              className="rounded-full border border-paper-edge px-5 py-2 hover:border-ink disabled:opacity-60"
            >
              Change
            </button>
          </div>
        </div>
      ) : null}

      <FormStatus id={ids.status} state={statusState} />
    </form>
  );
}
