'use client';

import { formatCountdown } from '@/lib/drops/phase';
import { useClock } from '@/lib/hooks/use-clock';

/** A quiet countdown to `at` by this device's clock (the drop page itself follows the server's). */
export function Countdown({ at, className = '' }: { at: string; className?: string }) {
  const now = useClock();
  return (
    <time dateTime={at} className={`figures ${className}`}>
      {now === null ? '—' : formatCountdown(new Date(at).getTime() - now)}
    </time>
  );
}
