'use client';

import { createContext, useContext, useState, type ReactNode } from 'react';
import { FormStatus } from '@/components/ui/form-status';
import type { ActionResult } from '@/lib/auth/action';

// A decided mask leaves the queue (or loses its buttons) as soon as the page refreshes, so the outcome
// is announced here, above the list, where it stays after the row has gone.
const ReportContext = createContext<(result: ActionResult) => void>(() => undefined);

export function DecisionStatus({ children }: { children: ReactNode }) {
  const [last, setLast] = useState<ActionResult | null>(null);
  return (
    <ReportContext value={setLast}>
      <FormStatus state={last} />
      {children}
    </ReportContext>
  );
}

export const useReportDecision = () => useContext(ReportContext);
