import { describe, expect, it } from 'vitest';
import { localTimeToUtc, utcToLocalInput } from '@/lib/drops/local-time';

// The zone rules are the IANA tz database's, read through Intl. The EU's summer-time rule (Directive
// 2000/84/EC): clocks go forward at 01:00 UTC on the last Sunday of March and back at 01:00 UTC on the last
// Sunday of October. Ireland follows the same days (Europe/Dublin: GMT in winter, IST = UTC+1 in summer).
describe('a wall-clock time in the studio’s zone', () => {
  it('is one instant on an ordinary day, in summer and in winter', () => {
    expect(localTimeToUtc('2027-06-12T19:00', 'Europe/Dublin')).toEqual({ kind: 'ok', at: new Date('2027-06-12T18:00:00Z') });
    expect(localTimeToUtc('2027-01-12T19:00', 'Europe/Dublin')).toEqual({ kind: 'ok', at: new Date('2027-01-12T19:00:00Z') });
    expect(localTimeToUtc('2027-06-12T19:00', 'America/New_York')).toEqual({ kind: 'ok', at: new Date('2027-06-12T23:00:00Z') });
  });

  it('does not exist in the hour the clocks skip (28 March 2027, 01:00–02:00 in Dublin)', () => {
    const result = localTimeToUtc('2027-03-28T01:30', 'Europe/Dublin');
    expect(result.kind).toBe('missing');
    expect(result.kind === 'missing' && result.message).toMatch(/does not happen/);
    // Either side of the gap is fine.
    expect(localTimeToUtc('2027-03-28T00:59', 'Europe/Dublin')).toEqual({ kind: 'ok', at: new Date('2027-03-28T00:59:00Z') });
    expect(localTimeToUtc('2027-03-28T02:00', 'Europe/Dublin')).toEqual({ kind: 'ok', at: new Date('2027-03-28T01:00:00Z') });
  });

  it('happens twice in the hour the clocks repeat (31 October 2027, 01:00–02:00 in Dublin), and both readings are given', () => {
    const result = localTimeToUtc('2027-10-31T01:30', 'Europe/Dublin');
    expect(result.kind).toBe('twice');
    if (result.kind !== 'twice') return;
    expect(result.earlier.toISOString()).toBe('2027-10-31T00:30:00.000Z');
    expect(result.later.toISOString()).toBe('2027-10-31T01:30:00.000Z');
    expect(localTimeToUtc('2027-10-31T02:00', 'Europe/Dublin')).toEqual({ kind: 'ok', at: new Date('2027-10-31T02:00:00Z') });
  });

  it('refuses what is not a date and time', () => {
    for (const bad of ['2027-02-30T10:00', '2027-13-01T10:00', '2027-01-01T24:00', '2027-01-01 10:00', 'tomorrow', '']) {
      expect(localTimeToUtc(bad, 'Europe/Dublin').kind).toBe('invalid');
    }
  });

  it('goes back to the same wall clock for the form', () => {
    for (const local of ['2027-06-12T19:00', '2027-01-12T07:05', '2027-03-28T02:00', '2027-10-31T02:30']) {
      const result = localTimeToUtc(local, 'Europe/Dublin');
      expect(result.kind).toBe('ok');
      if (result.kind === 'ok') expect(utcToLocalInput(result.at, 'Europe/Dublin')).toBe(local);
    }
  });
});
