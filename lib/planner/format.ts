import { toDayNumber, type IsoDate } from './calendar';

// Dates as people read them at the bench. The date is already the studio's; formatting it in UTC only keeps
// Intl from shifting a whole day by the viewer's zone.

const dayFormat = new Intl.DateTimeFormat('en-IE', { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
const shortFormat = new Intl.DateTimeFormat('en-IE', { weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' });

const asUtcDate = (date: IsoDate) => new Date(toDayNumber(date) * 86_400_000);

/** "Wed 10 Mar 2027". */
export function formatDay(date: IsoDate): string {
  return dayFormat.format(asUtcDate(date));
}

/** "Wed 10 Mar", for chart axes and tables within one season. */
export function formatShortDay(date: IsoDate): string {
  return shortFormat.format(asUtcDate(date));
}

/** Minutes as hours and minutes: "5 h 30 min", "45 min", "0 h". */
export function formatMinutes(minutes: number): string {
  const whole = Math.round(minutes);
  const h = Math.floor(whole / 60);
  const m = whole % 60;
  if (h === 0) return m === 0 ? '0 h' : `${m} min`;
  return m === 0 ? `${h} h` : `${h} h ${m} min`;
}
