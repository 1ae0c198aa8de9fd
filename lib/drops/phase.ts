// A drop's phase follows from its times, the clock and its stock; it is never stored or scheduled.
// Plain data and functions: the server and the browser's countdown both use them.

export const dropPhases = ['upcoming', 'early_access', 'open', 'sold_out', 'closed', 'cancelled'] as const;
export type DropPhase = (typeof dropPhases)[number];

export type DropTimes = {
  status: 'draft' | 'scheduled' | 'cancelled';
  earlyAccessAt: Date | null;
  opensAt: Date;
  closesAt: Date;
};

/** `available` is the batch's unheld, unsold units in all finishes; `held` those held by buyers now. */
export function dropPhase(times: DropTimes, now: Date, stock: { available: number; held: number }): DropPhase {
  if (times.status === 'cancelled') return 'cancelled';
  const t = now.getTime();
  if (t >= times.closesAt.getTime()) return 'closed';
  const started = t >= (times.earlyAccessAt ?? times.opensAt).getTime();
  // Sold out only when nothing is available and nothing may come back from a hold.
  if (started && stock.available <= 0 && stock.held <= 0) return 'sold_out';
  if (t >= times.opensAt.getTime()) return 'open';
  if (times.earlyAccessAt && t >= times.earlyAccessAt.getTime()) return 'early_access';
  return 'upcoming';
}

/** The next moment the phase changes by the clock alone, for a countdown; null when none is coming. */
export function nextChange(times: DropTimes, now: Date): { at: Date; to: DropPhase } | null {
  if (times.status === 'cancelled') return null;
  const t = now.getTime();
  if (times.earlyAccessAt && t < times.earlyAccessAt.getTime()) return { at: times.earlyAccessAt, to: 'early_access' };
  if (t < times.opensAt.getTime()) return { at: times.opensAt, to: 'open' };
  if (t < times.closesAt.getTime()) return { at: times.closesAt, to: 'closed' };
  return null;
}

/** "2 d 3 h", "14:05", "0:09": what is left until `at`, for people. */
export function formatCountdown(ms: number): string {
  const s = Math.max(0, Math.ceil(ms / 1000));
  const days = Math.floor(s / 86_400);
  const hours = Math.floor((s % 86_400) / 3600);
  const minutes = Math.floor((s % 3600) / 60);
  const seconds = s % 60;
  if (days > 0) return `${days} d ${hours} h`;
  if (hours > 0) return `${hours}:${String(minutes).padStart(2, '0')}:${String(seconds).padStart(2, '0')}`;
  return `${minutes}:${String(seconds).padStart(2, '0')}`;
}

/** A moment in the given IANA zone, with the zone's own short name, e.g. "Sun 29 Mar, 19:00 CEST". */
export function formatInZone(at: Date, timeZone: string, locale = 'en-GB'): string {
  return new Intl.DateTimeFormat(locale, {
    timeZone,
    weekday: 'short',
    day: 'numeric',
    month: 'short',
    hour: '2-digit',
    minute: '2-digit',
    timeZoneName: 'short',
  }).format(at);
}

/** Local wall-clock time in a zone to UTC, through Intl's IANA data (for planning "19:00 in Berlin"). */
export function zonedTimeToUtc(local: { year: number; month: number; day: number; hour: number; minute: number }, timeZone: string): Date {
  const guess = Date.UTC(local.year, local.month - 1, local.day, local.hour, local.minute);
  // The zone's offset at the guess, then once more at the corrected time (the offset can change between).
  let utc = guess - offsetMs(new Date(guess), timeZone);
  utc = guess - offsetMs(new Date(utc), timeZone);
  return new Date(utc);
}

function offsetMs(at: Date, timeZone: string): number {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    })
      .formatToParts(at)
      .map((p) => [p.type, p.value]),
  ) as Record<string, string>;
  const asUtc = Date.UTC(+parts.year!, +parts.month! - 1, +parts.day!, +parts.hour!, +parts.minute!, +parts.second!);
  return asUtc - Math.floor(at.getTime() / 1000) * 1000;
}
