'use client';

import { useActionState, useId } from 'react';
import { FormStatus, fieldError } from '@/components/ui/form-status';
import { invitePersonAction } from '../actions';

export function InviteForm() {
  const [state, action, pending] = useActionState(invitePersonAction, null);
  const emailError = fieldError(state, 'email');
  const emailErrorId = useId();
  return (
    <form action={action} className="grid gap-3 rounded-sm border border-paper-edge bg-paper p-5 sm:grid-cols-[2fr_2fr_1fr_auto] sm:items-end">
      <div className="grid gap-1">
        <label htmlFor="invite-email" className="text-sm font-semibold">E-mail</label>
        <input
          id="invite-email"
          name="email"
          type="email"
          required
          autoComplete="off"
          aria-invalid={emailError ? true : undefined}
          aria-describedby={emailErrorId}
          className="rounded-sm border border-paper-edge bg-white px-3 py-2 aria-[invalid]:border-ember"
        />
      </div>
      <div className="grid gap-1">
        <label htmlFor="invite-name" className="text-sm font-semibold">Name (optional)</label>
        <input id="invite-name" name="name" maxLength={120} className="rounded-sm border border-paper-edge bg-white px-3 py-2" />
      </div>
      <div className="grid gap-1">
        <label htmlFor="invite-role" className="text-sm font-semibold">Role</label>
        <select id="invite-role" name="role" defaultValue="staff" className="rounded-sm border border-paper-edge bg-white px-3 py-2">
          <option value="staff">Studio hand</option>
          <option value="owner">Maker (owner)</option>
        </select>
      </div>
      <button type="submit" disabled={pending} className="rounded-full bg-ink px-5 py-2 font-semibold text-paper disabled:opacity-60">
        {pending ? 'Inviting…' : 'Invite'}
      </button>
      <p id={emailErrorId} className="text-sm font-semibold text-ember-deep sm:col-span-4">{emailError ?? ''}</p>
      <div className="sm:col-span-4">
        <FormStatus state={state && !state.ok && state.error.fieldErrors ? null : state} />
      </div>
    </form>
  );
}
