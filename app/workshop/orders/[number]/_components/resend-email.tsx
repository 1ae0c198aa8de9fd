'use client';

import { useActionState } from 'react';
import { FormStatus } from '@/components/ui/form-status';
import { emailKindLabels, type EmailKind } from '@/lib/orders/shipping-schemas';
import { resendOrderEmailAction } from '../../actions';

/** Sends the buyer one of the order's e-mails again, as a new message; each resend is recorded on the order. */
export function ResendEmail({ orderNumber, kinds, email }: { orderNumber: string; kinds: EmailKind[]; email: string }) {
  const [state, action, pending] = useActionState(resendOrderEmailAction, null);
  if (kinds.length === 0) return <p className="text-sm text-ink-soft">Nothing to send yet: the confirmation goes out once the order is paid.</p>;
  return (
    <form action={action} className="grid gap-2 text-sm">
      <input type="hidden" name="number" value={orderNumber} />
      <p className="text-ink-soft">Sends to {email}.</p>
      <div className="flex flex-wrap gap-2">
        {kinds.map((kind) => (
          <button
            key={kind}
            type="submit"
            name="kind"
            value={kind}
            disabled={pending}
            className="rounded-full border border-ink px-3 py-1 font-semibold hover:bg-ink hover:text-paper disabled:opacity-60"
          >
            Resend the {emailKindLabels[kind]}
          </button>
        ))}
      </div>
      <FormStatus state={state} />
    </form>
  );
}
