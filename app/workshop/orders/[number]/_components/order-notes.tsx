'use client';

import { useActionState, useId, useRef } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import type { ActionResult } from '@/lib/auth/action';
import type { OrderNoteView } from '@/lib/orders/queries';
import { addOrderNoteAction } from '../../actions';

/** The studio's notes on the order, oldest first, and a field to add one. Buyers never see these. */
export function OrderNotes({ orderNumber, notes, times }: { orderNumber: string; notes: OrderNoteView[]; times: Record<string, string> }) {
  const formRef = useRef<HTMLFormElement>(null);
  const [state, action, pending] = useActionState(async (previous: ActionResult | null, formData: FormData) => {
    const result = await addOrderNoteAction(previous, formData);
    if (result.ok) formRef.current?.reset();
    return result;
  }, null);
  const ids = { body: useId(), help: useId() };
  const error = fieldError(state, 'body');
  return (
    <div className="grid gap-3 text-sm">
      {notes.length === 0 ? (
        <p className="text-ink-soft">No notes yet.</p>
      ) : (
        <ol className="grid gap-2">
          {notes.map((note) => (
            <li key={note.id} className="rounded-sm border border-paper-edge bg-paper px-3 py-2">
              <p className="whitespace-pre-line break-words">{note.body}</p>
              <p className="mt-1 text-xs text-ink-soft">
                {note.authorName} · <time dateTime={note.createdAt} className="figures">{times[note.id]}</time>
              </p>
            </li>
          ))}
        </ol>
      )}
      <form ref={formRef} action={action} className="grid gap-2">
        <input type="hidden" name="number" value={orderNumber} />
        <label htmlFor={ids.body} className="font-semibold">
          Add a note
        </label>
        <textarea
          id={ids.body}
          name="body"
          rows={3}
          required
          maxLength={2000}
          aria-invalid={error ? true : undefined}
          aria-describedby={`${ids.help}${error ? ` ${ids.body}-error` : ''}`}
          className="rounded-sm border border-paper-edge bg-white px-3 py-2 aria-[invalid]:border-ember"
        />
        <p id={ids.help} className="text-xs text-ink-soft">
          For the studio only; the buyer does not see notes.
        </p>
        {error ? (
          <p id={`${ids.body}-error`} className="text-ember-deep">
            {error}
          </p>
        ) : null}
        <div>
          <button type="submit" disabled={pending} className="rounded-full border border-ink px-4 py-1 font-semibold disabled:opacity-60">
            {pending ? 'Adding…' : 'Add note'}
          </button>
        </div>
        <FormStatus state={state} />
      </form>
    </div>
  );
}
