// The studio's working calendar over whole days written as ISO `YYYY-MM-DD` strings. Whole days need no time
// zone: every date here is a day in the studio's own calendar. Pure integer arithmetic on day numbers, with no
// Date and no library, so that tests can check it against an independent implementation (date-fns).

/** A day in the studio's calendar, `YYYY-MM-DD`. */
export type IsoDate = string;

/** ISO weekday numbers the studio works (1 = Monday … 7 = Sunday), its hours a day and its holidays. */
export type WorkingCalendar = { workingDays: number[]; hoursPerDay: number; holidays: IsoDate[] };

const isoDatePattern = /^(\d{4})-(\d{2})-(\d{2})$/;

// Days since 1970-01-01 of a proleptic Gregorian date, and back: Howard Hinnant's "days_from_civil" and
// "civil_from_days" algorithms (chrono-Compatible Low-Level Date Algorithms), in 400-year eras of 146097 days.
function daysFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yearOfEra = y - era * 400;
  const monthFromMarch = (month + 9) % 12;
  const dayOfYear = Math.floor((153 * monthFromMarch + 2) / 5) + day - 1;
  const dayOfEra = yearOfEra * 365 + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100) + dayOfYear;
  return era * 146097 + dayOfEra - 719468;
}

function civilFromDays(dayNumber: number): [number, number, number] {
  const z = dayNumber + 719468;
  const era = Math.floor(z / 146097);
  const dayOfEra = z - era * 146097;
  const yearOfEra = Math.floor(
    (dayOfEra - Math.floor(dayOfEra / 1460) + Math.floor(dayOfEra / 36524) - Math.floor(dayOfEra / 146096)) / 365,
  );
  const dayOfYear = dayOfEra - (365 * yearOfEra + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100));
  const monthFromMarch = Math.floor((5 * dayOfYear + 2) / 153);
  const day = dayOfYear - Math.floor((153 * monthFromMarch + 2) / 5) + 1;
  const month = monthFromMarch < 10 ? monthFromMarch + 3 : monthFromMarch - 9;
  return [yearOfEra + era * 400 + (month <= 2 ? 1 : 0), month, day];
}

const pad = (value: number, width: number) => String(value).padStart(width, '0');

/** True for a real calendar day written `YYYY-MM-DD` (so 2027-02-29 is refused, 2028-02-29 is not). */
export function isIsoDate(value: unknown): value is IsoDate {
  if (typeof value !== 'string') return false;
  const match = isoDatePattern.exec(value);
  if (!match) return false;
  const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])];
  if (month < 1 || month > 12 || day < 1 || day > 31) return false;
  const [y, m, d] = civilFromDays(daysFromCivil(year, month, day));
  return y === year && m === month && d === day;
}

/** Days since 1970-01-01; throws a RangeError for anything that is not a real `YYYY-MM-DD` day. */
export function toDayNumber(date: IsoDate): number {
  if (!isIsoDate(date)) throw new RangeError(`Expected a date written YYYY-MM-DD, got ${JSON.stringify(date)}`);
  return daysFromCivil(Number(date.slice(0, 4)), Number(date.slice(5, 7)), Number(date.slice(8, 10)));
}

export function fromDayNumber(dayNumber: number): IsoDate {
  if (!Number.isSafeInteger(dayNumber)) throw new RangeError(`Expected a whole day number, got ${dayNumber}`);
  const [y, m, d] = civilFromDays(dayNumber);
  return `${pad(y, 4)}-${pad(m, 2)}-${pad(d, 2)}`;
}

export function addDays(date: IsoDate, days: number): IsoDate {
  return fromDayNumber(toDayNumber(date) + days);
}

/** ISO weekday: 1 = Monday … 7 = Sunday. Day 0 (1970-01-01) was a Thursday, ISO weekday 4. */
export function isoWeekday(date: IsoDate): number {
  return ((((toDayNumber(date) + 3) % 7) + 7) % 7) + 1;
}

/** A calendar with its holidays as a set, for the many look-ups a schedule makes. */
type CompiledCalendar = { workingDays: ReadonlySet<number>; holidays: ReadonlySet<IsoDate> };

function compile(calendar: Pick<WorkingCalendar, 'workingDays' | 'holidays'>): CompiledCalendar {
  const workingDays = new Set(calendar.workingDays);
  if (![...workingDays].some((day) => Number.isInteger(day) && day >= 1 && day <= 7)) {
    throw new RangeError('A working calendar needs at least one working weekday (1 = Monday … 7 = Sunday)');
  }
  return { workingDays, holidays: new Set(calendar.holidays) };
}

// However sparse the calendar, a working day comes within this many days (a week plus a year of holidays);
// past that the holidays cover every working weekday for years and the search stops.
const searchLimitDays = 366 * 20;

function isWorking(date: IsoDate, calendar: CompiledCalendar): boolean {
  return calendar.workingDays.has(isoWeekday(date)) && !calendar.holidays.has(date);
}

export function isWorkingDay(date: IsoDate, calendar: Pick<WorkingCalendar, 'workingDays' | 'holidays'>): boolean {
  return isWorking(date, compile(calendar));
}

function nextWorking(from: IsoDate, calendar: CompiledCalendar, includeFrom: boolean): IsoDate {
  let day = toDayNumber(from) + (includeFrom ? 0 : 1);
  for (let step = 0; step < searchLimitDays; step += 1, day += 1) {
    const date = fromDayNumber(day);
    if (isWorking(date, calendar)) return date;
  }
  throw new RangeError(`No working day within ${searchLimitDays} days of ${from}: check the holidays`);
}

/** `date` itself when the studio works that day, otherwise the next day it does. */
export function firstWorkingDayOnOrAfter(date: IsoDate, calendar: Pick<WorkingCalendar, 'workingDays' | 'holidays'>): IsoDate {
  return nextWorking(date, compile(calendar), true);
}

/**
 * The `count`-th working day after `date` (not counting `date` itself); `date` when `count` is 0. For the
 * Monday-to-Friday calendar without holidays this is what date-fns's `addBusinessDays` answers for a count
 * of zero or more (tests/unit/planner-calendar.test.ts compares the two).
 */
export function addWorkingDays(date: IsoDate, count: number, calendar: Pick<WorkingCalendar, 'workingDays' | 'holidays'>): IsoDate {
  if (!Number.isSafeInteger(count) || count < 0) throw new RangeError(`count must be a whole number of at least 0, got ${count}`);
  const compiled = compile(calendar);
  let current = date;
  toDayNumber(current);
  for (let left = count; left > 0; left -= 1) current = nextWorking(current, compiled, false);
  return current;
}

/**
 * Working days from `from` up to `to`: those on or after `from` and before `to`, negative when `to` comes
 * first (then those after `to` up to and including `from`). Matches date-fns's
 * `differenceInBusinessDays(to, from)` for the Monday-to-Friday calendar without holidays.
 */
export function workingDaysBetween(from: IsoDate, to: IsoDate, calendar: Pick<WorkingCalendar, 'workingDays' | 'holidays'>): number {
  const compiled = compile(calendar);
  const start = toDayNumber(from);
  const end = toDayNumber(to);
  const [low, high, sign] = end >= start ? [start, end, 1] : [end + 1, start + 1, -1];
  let count = 0;
  for (let day = low; day < high; day += 1) if (isWorking(fromDayNumber(day), compiled)) count += 1;
  return count === 0 ? 0 : sign * count;
}

/**
 * The studio's working days in order from `start` (itself included when it is one), produced on demand: a
 * schedule asks for day 0, 1, 2, … without knowing beforehand how many it needs.
 */
export function workingDaySequence(start: IsoDate, calendar: Pick<WorkingCalendar, 'workingDays' | 'holidays'>) {
  const compiled = compile(calendar);
  const days: IsoDate[] = [nextWorking(start, compiled, true)];
  return (index: number): IsoDate => {
    if (!Number.isSafeInteger(index) || index < 0) throw new RangeError(`A working-day index is 0 or more, got ${index}`);
    while (days.length <= index) days.push(nextWorking(days[days.length - 1]!, compiled, false));
    return days[index]!;
  };
}

/** Today's date on the studio's wall calendar, for a moment `now`, in the IANA zone `timeZone`. */
export function todayInZone(timeZone: string, now: Date): IsoDate {
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(now);
  const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${part('year')}-${part('month')}-${part('day')}`;
}
