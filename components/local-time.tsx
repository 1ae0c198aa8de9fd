'use client';

import { formatInZone } from '@/lib/drops/phase';
import { useOwnTimeZone } from '@/lib/hooks/use-clock';

/** A moment in the reader's own time zone, labelled with it (UTC, labelled, until the browser says). */
export function LocalTime({ at }: { at: string }) {
  const zone = useOwnTimeZone();
  return <time dateTime={at}>{formatInZone(new Date(at), zone ?? 'UTC')}</time>;
}
