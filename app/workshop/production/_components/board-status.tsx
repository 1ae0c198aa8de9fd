'use client';

import { createContext, useActionState, useContext, useState, type ReactNode } from 'react';
import { FormStatus } from '@/components/ui/form-status';
import type { ActionResult, FormAction } from '@/lib/auth/action';

// A moved mask leaves its column as soon as the board refreshes, so the outcome is announced once, above
// the board, where it stays after the card has gone.
const ReportContext = createContext<(result: ActionResult) => void>(() => undefined);

export function BoardStatus({ children }: { children: ReactNode }) {
  const [last, setLast] = useState<ActionResult | null>(null);
  // A bulk move that was refused says why for each mask.
  const problems = last && !last.ok && (last.error.fieldErrors?.lines?.length ?? 0) > 1 ? last.error.fieldErrors!.lines! : [];
  return (
    <ReportContext value={setLast}>
      {/* Always there, so screen readers hear each outcome; it takes room only once it has something to say. */}
      <div className={last ? 'sticky top-0 z-10 -mx-2 bg-paper-deep/90 px-2 py-1' : ''}>
        <FormStatus state={last} />
        {problems.length > 0 ? (
          <ul className="list-disc pb-1 pl-5 text-sm text-ember-deep">
            {problems.map((problem, index) => (
              <li key={index}>{problem}</li>
            ))}
          </ul>
        ) : null}
      </div>
      {children}
    </ReportContext>
  );
}

/** A server action bound for a form, whose outcome goes to the board's status line. */
export function useBoardAction(action: FormAction, onDone?: (result: ActionResult) => void) {
  const report = useContext(ReportContext);
  const [, dispatch, pending] = useActionState(async (previous: ActionResult | null, formData: FormData) => {
    const result = await action(previous, formData);
    report(result);
    onDone?.(result);
    return result;
  }, null);
  return [dispatch, pending] as const;
}
