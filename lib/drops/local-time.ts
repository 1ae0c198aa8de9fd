// Turning a wall-clock time the maker types ("2027-03-28T02:30" in Europe/Dublin) into one instant, or
// saying why it cannot be: on a daylight-saving day a local time can be missing (clocks jump forward)
// or happen twice (clocks go back). The zone rules come from the IANA data through Intl.

export type LocalTimeResult =
  | { kind: 'ok'; at: Date }
  | { kind: 'invalid'; message: string }
  | { kind: 'missing'; message: string }
  | { kind: 'twice'; message: string; earlier: Date; later: Date };

const pattern = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/;

function wallClock(at: Date, timeZone: string) {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit' })
      .formatToParts(at)
      .map((p) => [p.type, p.value]),
  ) as Record<string, string>;
  return `${parts.year}-${parts.month}-${parts.day}T${parts.hour}:${parts.minute}`;
}

function offsetMinutes(at: Date, timeZone: string): number {
  const [date, time] = wallClock(at, timeZone).split('T') as [string, string];
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  const [hh, mm] = time.split(':').map(Number) as [number, number];
  return Math.round((Date.UTC(y, m - 1, d, hh, mm) - Math.floor(at.getTime() / 60_000) * 60_000) / 60_000);
}

const readable = (local: string) => local.replace('T', ' at ');

/** Every instant whose wall clock in `timeZone` reads `local`: none, one, or two. */
export function localTimeToUtc(local: string, timeZone: string): LocalTimeResult {
  const match = pattern.exec(local);
  if (!match) return { kind: 'invalid', message: 'Enter the date and time as YYYY-MM-DD HH:MM.' };
  const [, y, mo, d, h, mi] = match.map(Number) as [number, number, number, number, number, number];
  const naive = Date.UTC(y, mo - 1, d, h, mi);
  const check = new Date(naive);
  if (check.getUTCFullYear() !== y || check.getUTCMonth() !== mo - 1 || check.getUTCDate() !== d || h > 23 || mi > 59) return { kind: 'invalid', message: 'That date or time does not exist on the calendar.' };
  // The zone's offsets a day either side cover any change on this day.
  const offsets = new Set([offsetMinutes(new Date(naive - 86_400_000), timeZone), offsetMinutes(new Date(naive + 86_400_000), timeZone), offsetMinutes(new Date(naive), timeZone)]);
  const matches = [...offsets]
    .map((offset) => new Date(naive - offset * 60_000))
    .filter((candidate) => wallClock(candidate, timeZone) === local)
    .sort((a, b) => a.getTime() - b.getTime());
  const unique = matches.filter((m, i) => i === 0 || m.getTime() !== matches[i - 1]!.getTime());
  if (unique.length === 0) {
    return { kind: 'missing', message: `${readable(local)} does not happen in ${timeZone}: the clocks go forward over it that night. Choose a time outside the skipped hour.` };
  }
  if (unique.length > 1) {
    return {
      kind: 'twice',
      message: `${readable(local)} happens twice in ${timeZone} (the clocks go back that night). Choose a time outside the repeated hour, so no buyer reads it wrong.`,
      earlier: unique[0]!,
      later: unique.at(-1)!,
    };
  }
  return { kind: 'ok', at: unique[0]! };
}

/** An instant as the wall-clock value of an `<input type="datetime-local">` in the zone. */
export function utcToLocalInput(at: Date, timeZone: string): string {
  return wallClock(at, timeZone);
}
