import { describe, expect, it } from 'vitest';
import { roles, type Role } from '@/lib/auth/roles';
import { checkMove, failureFor, lineStages, nextStage, previousStage, type LineStage } from '@/lib/production/stages';
import { isLate, summarizeBatch } from '@/lib/production/summary';

// The whole rule, written out move by move: every other pair of stages is refused for everyone.
const allowed: { from: LineStage; to: LineStage; needs: Role; kind: string }[] = [
  { from: 'to_cast', to: 'cast', needs: 'staff', kind: 'forward' },
  { from: 'cast', to: 'trimmed', needs: 'staff', kind: 'forward' },
  { from: 'trimmed', to: 'painted', needs: 'staff', kind: 'forward' },
  { from: 'painted', to: 'packed', needs: 'staff', kind: 'forward' },
  { from: 'cast', to: 'to_cast', needs: 'staff', kind: 'back' },
  { from: 'trimmed', to: 'cast', needs: 'staff', kind: 'back' },
  { from: 'painted', to: 'trimmed', needs: 'staff', kind: 'back' },
  { from: 'packed', to: 'painted', needs: 'staff', kind: 'back' },
  { from: 'to_cast', to: 'failed_casting', needs: 'owner', kind: 'fail' },
  { from: 'cast', to: 'failed_casting', needs: 'owner', kind: 'fail' },
  { from: 'trimmed', to: 'failed_paint', needs: 'owner', kind: 'fail' },
  { from: 'painted', to: 'failed_paint', needs: 'owner', kind: 'fail' },
  { from: 'failed_casting', to: 'to_cast', needs: 'owner', kind: 'recast' },
  { from: 'failed_paint', to: 'to_cast', needs: 'owner', kind: 'recast' },
];
const rank: Record<Role, number> = { customer: 0, staff: 1, owner: 2 };

const everyMove = lineStages.flatMap((from) => lineStages.flatMap((to) => roles.map((role) => ({ from, to, role }))));

describe('checkMove, every pair of stages for every role', () => {
  it.each(everyMove)('$from → $to by $role', ({ from, to, role }) => {
    const rule = allowed.find((a) => a.from === from && a.to === to);
    const result = checkMove(from, to, role);
    if (rule && rank[role] >= rank[rule.needs]) {
      expect(result).toEqual({ ok: true, kind: rule.kind });
    } else {
      expect(result.ok).toBe(false);
      if (!result.ok) expect(result.message.length).toBeGreaterThan(10);
    }
  });
});

describe('why a move is refused', () => {
  const reason = (from: LineStage, to: LineStage, role: Role, flags = {}) => {
    const result = checkMove(from, to, role, flags);
    return result.ok ? 'ok' : result.reason;
  };

  it('a buyer moves nothing', () => {
    expect(reason('to_cast', 'cast', 'customer')).toBe('not_staff');
  });

  it('a studio hand may not mark failed or send back for a spare pull; the owner may', () => {
    expect(reason('cast', 'failed_casting', 'staff')).toBe('owner_only');
    expect(reason('painted', 'failed_paint', 'staff')).toBe('owner_only');
    expect(reason('failed_casting', 'to_cast', 'staff')).toBe('owner_only');
    expect(reason('cast', 'failed_casting', 'owner')).toBe('ok');
  });

  it('no skipping, forward or back, not even for the owner', () => {
    expect(reason('to_cast', 'trimmed', 'owner')).toBe('skips_stages');
    expect(reason('packed', 'cast', 'owner')).toBe('skips_stages');
    const skip = checkMove('to_cast', 'painted', 'staff');
    expect(skip.ok ? '' : skip.message).toContain('Cast');
  });

  it('shipping is not on the board, and nothing leaves shipped', () => {
    expect(reason('packed', 'shipped', 'owner')).toBe('shipping_step');
    expect(reason('shipped', 'packed', 'owner')).toBe('already_shipped');
  });

  it('each failure belongs to its own stages', () => {
    expect(reason('trimmed', 'failed_casting', 'owner')).toBe('wrong_failure');
    expect(reason('cast', 'failed_paint', 'owner')).toBe('wrong_failure');
    expect(reason('packed', 'failed_paint', 'owner')).toBe('wrong_failure');
    expect(reason('failed_paint', 'failed_casting', 'owner')).toBe('wrong_failure');
    expect(reason('failed_paint', 'trimmed', 'owner')).toBe('failed_goes_to_cast');
  });

  it('refunded and undecided oversold masks stay put, whoever asks', () => {
    expect(reason('to_cast', 'cast', 'owner', { refunded: true })).toBe('refunded');
    expect(reason('to_cast', 'cast', 'owner', { oversoldOpen: true })).toBe('oversold_open');
    expect(reason('cast', 'failed_casting', 'owner', { oversoldOpen: true })).toBe('oversold_open');
  });

  it('a move to where the mask already is says so', () => {
    expect(reason('cast', 'cast', 'staff')).toBe('same_stage');
  });
});

describe('the board’s buttons follow the same rule', () => {
  it.each(lineStages)('from %s', (stage) => {
    const next = nextStage(stage);
    const back = previousStage(stage);
    const failure = failureFor(stage);
    if (next) expect(checkMove(stage, next, 'staff')).toMatchObject({ ok: true, kind: 'forward' });
    if (back) expect(checkMove(stage, back, 'staff')).toMatchObject({ ok: true, kind: 'back' });
    if (failure) expect(checkMove(stage, failure, 'owner')).toMatchObject({ ok: true, kind: 'fail' });
    // Every forward move the rule allows has its button.
    for (const rule of allowed.filter((a) => a.from === stage && a.kind === 'forward')) expect(next).toBe(rule.to);
  });

  it('packed has no next stage on the board', () => {
    expect(nextStage('packed')).toBeNull();
  });
});

describe('late and the batch summary', () => {
  it('late only once the studio’s day is past ship-by, and never when shipped', () => {
    expect(isLate('2026-12-20', '2026-12-20', 'painted')).toBe(false);
    expect(isLate('2026-12-20', '2026-12-21', 'painted')).toBe(true);
    expect(isLate('2026-12-20', '2026-12-21', 'shipped')).toBe(false);
  });

  it('counts stages, lists what waits for the molds by finish (not an undecided oversold mask), and the finish most waiting for paint', () => {
    const lines = [
      { stage: 'to_cast', finishName: 'Ash' },
      { stage: 'to_cast', finishName: 'Ash', oversoldOpen: true },
      { stage: 'to_cast', finishName: 'Old bone' },
      { stage: 'to_cast', finishName: 'Old bone' },
      { stage: 'trimmed', finishName: 'Ash' },
      { stage: 'trimmed', finishName: 'Soot' },
      { stage: 'trimmed', finishName: 'Soot' },
      { stage: 'shipped', finishName: 'Ash' },
    ] as const;
    const summary = summarizeBatch([...lines], '2027-01-10', '2026-12-31');
    expect(summary.counts).toMatchObject({ to_cast: 4, trimmed: 3, shipped: 1, cast: 0, failed_paint: 0 });
    expect(summary.toCast).toEqual([
      { finishName: 'Old bone', count: 2 },
      { finishName: 'Ash', count: 1 },
    ]);
    expect(summary.mostWaitingForPaint).toEqual({ finishName: 'Soot', count: 2 });
    // Across the new year: 31 Dec to 10 Jan.
    expect(summary.daysLeft).toBe(10);
    expect(summarizeBatch([], '2026-12-30', '2027-01-02')).toMatchObject({ daysLeft: -3, mostWaitingForPaint: null, toCast: [] });
  });
});
