'use client';

import { useActionState } from 'react';
import { FormStatus } from '@/components/ui/form-status';
import type { Role } from '@/lib/auth/roles';
import { changeRoleAction, removePersonAction } from '../actions';

export function PersonActions({ userId, role, label }: { userId: string; role: Role; label: string }) {
  const [changeState, change, changing] = useActionState(changeRoleAction, null);
  const [removeState, remove, removing] = useActionState(removePersonAction, null);
  const otherRole = role === 'owner' ? 'staff' : 'owner';
  return (
    <div className="flex flex-wrap items-center justify-end gap-2">
      <form action={change}>
        <input type="hidden" name="userId" value={userId} />
        <input type="hidden" name="role" value={otherRole} />
        <button type="submit" disabled={changing} className="rounded-full border border-paper-edge px-3 py-1 text-sm hover:border-ink disabled:opacity-60">
          {otherRole === 'owner' ? `Make ${label} an owner` : `Make ${label} a studio hand`}
        </button>
      </form>
      <form
        action={remove}
        onSubmit={(event) => {
          if (!window.confirm(`Remove ${label} from the workshop? They keep their buyer account.`)) event.preventDefault();
        }}
      >
        <input type="hidden" name="userId" value={userId} />
        <button type="submit" disabled={removing} className="rounded-full border border-ember/50 px-3 py-1 text-sm text-ember-deep hover:border-ember disabled:opacity-60">
          Remove {label}
        </button>
      </form>
      <div className="basis-full text-right">
        <FormStatus state={removeState ?? changeState} />
      </div>
    </div>
  );
}
