import { describe, expect, it } from 'vitest';
import { dropPhase, formatCountdown, formatInZone, nextChange, zonedTimeToUtc, type DropTimes } from '@/lib/drops/phase';

const times: DropTimes = {
  status: 'scheduled',
  earlyAccessAt: new Date('2027-03-28T17:00:00Z'),
  opensAt: new Date('2027-03-28T18:00:00Z'),
  closesAt: new Date('2027-03-30T18:00:00Z'),
};
const some = { available: 5, held: 0 };
const at = (iso: string) => new Date(iso);

describe('a drop’s phase', () => {
  it('follows the clock: upcoming, early access, open, closed', () => {
    expect(dropPhase(times, at('2027-03-28T16:59:59Z'), some)).toBe('upcoming');
    expect(dropPhase(times, at('2027-03-28T17:00:00Z'), some)).toBe('early_access');
    expect(dropPhase(times, at('2027-03-28T18:00:00Z'), some)).toBe('open');
    expect(dropPhase(times, at('2027-03-30T18:00:00Z'), some)).toBe('closed');
  });

  it('is sold out only when nothing is left and nothing is held that could come back', () => {
    expect(dropPhase(times, at('2027-03-28T18:30:00Z'), { available: 0, held: 2 })).toBe('open');
    expect(dropPhase(times, at('2027-03-28T18:30:00Z'), { available: 0, held: 0 })).toBe('sold_out');
    // Before anything starts, an empty batch is still just upcoming.
    expect(dropPhase(times, at('2027-03-28T12:00:00Z'), { available: 0, held: 0 })).toBe('upcoming');
  });

  it('says when the next change comes', () => {
    expect(nextChange(times, at('2027-03-28T12:00:00Z'))).toEqual({ at: times.earlyAccessAt, to: 'early_access' });
    expect(nextChange(times, at('2027-03-28T17:30:00Z'))).toEqual({ at: times.opensAt, to: 'open' });
    expect(nextChange({ ...times, status: 'cancelled' }, at('2027-03-28T12:00:00Z'))).toBeNull();
  });

  it('counts down in figures a person reads at a glance', () => {
    expect(formatCountdown(9_000)).toBe('0:09');
    expect(formatCountdown(14 * 60_000 + 5_000)).toBe('14:05');
    expect(formatCountdown(3 * 3600_000 + 61_000)).toBe('3:01:01');
    expect(formatCountdown(2 * 86_400_000 + 3 * 3600_000)).toBe('2 d 3 h');
    expect(formatCountdown(-5)).toBe('0:00');
  });
});

// Across Europe/Berlin's spring change. Source of the expected offsets: the IANA tz database
// (zone Europe/Berlin, rule EU: clocks go from 02:00 CET (+01) to 03:00 CEST (+02) on the last Sunday of
// March, at 01:00 UTC), read here through Node's ICU, which ships that database.
describe('drop times across a daylight-saving change', () => {
  it('plans 19:00 Berlin time as 18:00 UTC before the change and 17:00 UTC after it', () => {
    expect(zonedTimeToUtc({ year: 2027, month: 3, day: 27, hour: 19, minute: 0 }, 'Europe/Berlin').toISOString()).toBe('2027-03-27T18:00:00.000Z');
    expect(zonedTimeToUtc({ year: 2027, month: 3, day: 28, hour: 19, minute: 0 }, 'Europe/Berlin').toISOString()).toBe('2027-03-28T17:00:00.000Z');
  });

  it('keeps the phase right when early access and opening straddle the change', () => {
    // Early access 01:30 CET (00:30 UTC), opening 03:30 CEST (01:30 UTC): an hour apart, not two.
    const straddle: DropTimes = {
      status: 'scheduled',
      earlyAccessAt: zonedTimeToUtc({ year: 2027, month: 3, day: 28, hour: 1, minute: 30 }, 'Europe/Berlin'),
      opensAt: zonedTimeToUtc({ year: 2027, month: 3, day: 28, hour: 3, minute: 30 }, 'Europe/Berlin'),
      closesAt: new Date('2027-03-29T00:00:00Z'),
    };
    expect(straddle.opensAt.getTime() - straddle.earlyAccessAt!.getTime()).toBe(3600_000);
    expect(dropPhase(straddle, at('2027-03-28T01:00:00Z'), some)).toBe('early_access');
    expect(dropPhase(straddle, at('2027-03-28T01:30:00Z'), some)).toBe('open');
  });

  it('labels times with the zone’s own abbreviation, before and after', () => {
    expect(formatInZone(at('2027-03-27T18:00:00Z'), 'Europe/Berlin')).toMatch(/19:00 CET$/);
    expect(formatInZone(at('2027-03-28T17:00:00Z'), 'Europe/Berlin')).toMatch(/19:00 CEST$/);
  });
});
