import { describe, expect, it } from 'vitest';
import { moldLife } from '@/lib/molds/life';
import { addMoldSchema, recordPullsSchema } from '@/lib/molds/schemas';

describe("a mold's life", () => {
  it('is near the end of its life with less than 15% of its expected life left', () => {
    // 40 pulls: 15% is 6. 35 used → 5 left (12.5%): near the end. 34 used → 6 left (exactly 15%): not yet.
    expect(moldLife({ pullsSoFar: 35, expectedLifePulls: 40 })).toMatchObject({ left: 5, nearEnd: true, worn: false });
    expect(moldLife({ pullsSoFar: 34, expectedLifePulls: 40 })).toMatchObject({ left: 6, nearEnd: false });
    expect(moldLife({ pullsSoFar: 0, expectedLifePulls: 40 })).toMatchObject({ left: 40, usedShare: 0, nearEnd: false });
  });

  it('counts a mold cast past its expected life as worn, with nothing left rather than less than nothing', () => {
    expect(moldLife({ pullsSoFar: 47, expectedLifePulls: 45 })).toMatchObject({ left: 0, nearEnd: true, worn: true });
    expect(moldLife({ pullsSoFar: 47, expectedLifePulls: 45 }).usedShare).toBeGreaterThan(1);
  });
});

describe('the molds forms', () => {
  const designId = '6f1c2b8e-3d4a-4c5b-9e6f-7a8b9c0d1e2f';

  it('reads a new mold from form text; blank pulls so far are none', () => {
    expect(addMoldSchema.parse({ designId, label: ' Ibex D ', madeOn: '2026-11-30', pullsSoFar: '', expectedLifePulls: '40', notes: '' })).toEqual({
      designId, label: 'Ibex D', madeOn: '2026-11-30', pullsSoFar: 0, expectedLifePulls: 40, notes: '',
    });
  });

  it('refuses what the table would refuse, with a message for the field', () => {
    const issues = (input: Record<string, string>) =>
      addMoldSchema.safeParse({ designId, label: 'Ibex D', madeOn: '2026-11-30', pullsSoFar: '0', expectedLifePulls: '40', ...input }).error?.issues.map((i) => i.path[0]);
    expect(issues({ label: '   ' })).toEqual(['label']);
    expect(issues({ expectedLifePulls: '0' })).toEqual(['expectedLifePulls']);
    expect(issues({ pullsSoFar: '-2' })).toEqual(['pullsSoFar']);
    expect(issues({ pullsSoFar: '2.5' })).toEqual(['pullsSoFar']);
    expect(issues({ madeOn: '2026-02-30' })).toEqual(['madeOn']);
    expect(issues({ designId: 'ibex' })).toEqual(['designId']);
    expect(recordPullsSchema.safeParse({ moldId: designId, pulls: '0' }).success).toBe(false);
    expect(recordPullsSchema.parse({ moldId: designId, pulls: '3' }).pulls).toBe(3);
  });
});
