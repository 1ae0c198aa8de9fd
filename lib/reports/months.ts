// Calendar months in a studio's own zone, as `YYYY-MM` keys. Plain functions over Intl's IANA time zone data,
// safe to import anywhere.

/** The month `at` falls in, on the wall calendar of `timeZone` (an order paid late on the 31st may be next month there). */
export function monthKeyInZone(at: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit' }).formatToParts(at);
  const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${part('year')}-${part('month')}`;
}

/** `count` month keys ending with `lastKey`, oldest first: lastMonths('2027-02', 3) is 2026-12, 2027-01, 2027-02. */
export function lastMonths(lastKey: string, count: number): string[] {
  const match = /^(\d{4})-(\d{2})$/.exec(lastKey);
  if (!match) throw new RangeError(`Expected a month written YYYY-MM, got ${JSON.stringify(lastKey)}`);
  const last = Number(match[1]) * 12 + (Number(match[2]) - 1);
  return Array.from({ length: count }, (_, i) => {
    const index = last - (count - 1 - i);
    return `${String(Math.floor(index / 12)).padStart(4, '0')}-${String((index % 12) + 1).padStart(2, '0')}`;
  });
}

/** "Mar 2027" for a month key, for axes and tables. */
export function formatMonthKey(key: string, locale = 'en-GB'): string {
  const [year, month] = key.split('-').map(Number) as [number, number];
  return new Intl.DateTimeFormat(locale, { month: 'short', year: 'numeric', timeZone: 'UTC' }).format(new Date(Date.UTC(year, month - 1, 15)));
}
