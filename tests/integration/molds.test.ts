import { beforeAll, describe, expect, it } from 'vitest';
import type { CurrentUser } from '@/lib/auth/session';
import { withAppDatabase } from './support/app-database';
import { query } from './support/database';

// The molds' server functions and the planner's loading, against a database migrated and seeded the way the
// demo is, with the table's own CHECKs tried directly.
const db = withAppDatabase('molds', { seed: true });

const molds = () => import('@/lib/molds/molds');

// Changes to molds are made by a signed-in owner (and logged under their name).
let owner: CurrentUser;
beforeAll(async () => {
  const [row] = await query<{ id: string; email: string }>(db.current().url, `SELECT id, email FROM users WHERE role = 'owner' ORDER BY email LIMIT 1`);
  owner = { id: row!.id, email: row!.email, name: 'Owner', role: 'owner' };
});

async function designId(slug: string): Promise<string> {
  const [row] = await query<{ id: string }>(db.current().url, `SELECT id FROM designs WHERE slug = $1`, [slug]);
  return row!.id;
}

async function sqlError(text: string, params: unknown[] = []): Promise<string | undefined> {
  try {
    await query(db.current().url, text, params);
    return undefined;
  } catch (error) {
    return (error as { constraint?: string }).constraint ?? (error as Error).message;
  }
}

describe('the demo molds', () => {
  it('lists each design with its molds, retired ones marked with their day', async () => {
    const designs = await (await molds()).listMoldsByDesign();
    const published = await query<{ slug: string }>(db.current().url, `SELECT slug FROM designs WHERE status = 'published'`);
    for (const { slug } of published) {
      const design = designs.find((d) => d.slug === slug)!;
      expect(design.molds.filter((m) => !m.retiredAt).length, slug).toBeGreaterThanOrEqual(2);
    }
    const ibexA = designs.find((d) => d.slug === 'ibex')!.molds.find((m) => m.label === 'Ibex A')!;
    expect(ibexA.retiredAt).not.toBeNull();
    expect(ibexA.retiredOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  });
});

describe('adding, counting and retiring molds', () => {
  it('adds a mold and refuses a second one of the same name for the design', async () => {
    const { addMold } = await molds();
    const hare = await designId('hare');
    const mold = await addMold(owner, { designId: hare, label: 'Hare C', madeOn: '2026-11-02', pullsSoFar: 0, expectedLifePulls: 40, notes: '' });
    expect(mold).toMatchObject({ label: 'Hare C', madeOn: '2026-11-02', pullsSoFar: 0, expectedLifePulls: 40, retiredAt: null });
    await expect(addMold(owner, { designId: hare, label: 'Hare C', madeOn: '2026-11-02', pullsSoFar: 0, expectedLifePulls: 40, notes: '' })).rejects.toMatchObject({
      code: 'mold_label_taken',
      status: 409,
    });
  });

  it('refuses a mold made after today, or for a design that does not exist', async () => {
    const { addMold } = await molds();
    await expect(addMold(owner, { designId: await designId('moth'), label: 'Moth Z', madeOn: '2999-01-01', pullsSoFar: 0, expectedLifePulls: 40, notes: '' })).rejects.toMatchObject({
      code: 'made_on_in_future',
      status: 422,
    });
    await expect(
      addMold(owner, { designId: '00000000-0000-4000-8000-000000000000', label: 'Nobody', madeOn: '2026-01-01', pullsSoFar: 0, expectedLifePulls: 40, notes: '' }),
    ).rejects.toMatchObject({ status: 404 });
    const [{ count }] = (await query<{ count: string }>(db.current().url, `SELECT count(*) FROM molds WHERE label IN ('Moth Z', 'Nobody')`)) as [{ count: string }];
    expect(count).toBe('0');
  });

  it('counts every pull when several are recorded at once', async () => {
    const { addMold, recordPulls } = await molds();
    const mold = await addMold(owner, { designId: await designId('boar'), label: 'Boar C', madeOn: '2026-10-01', pullsSoFar: 3, expectedLifePulls: 45, notes: '' });
    await Promise.all(Array.from({ length: 12 }, () => recordPulls(owner, { moldId: mold.id, pulls: 1 })));
    const [row] = await query<{ pulls_so_far: number }>(db.current().url, `SELECT pulls_so_far FROM molds WHERE id = $1`, [mold.id]);
    expect(row!.pulls_so_far).toBe(15);
  });

  it('retires a mold once; a retired mold takes no more pulls', async () => {
    const { addMold, recordPulls, retireMold } = await molds();
    const mold = await addMold(owner, { designId: await designId('ibex'), label: 'Ibex Test', madeOn: '2026-09-01', pullsSoFar: 10, expectedLifePulls: 40, notes: '' });
    const retired = await retireMold(owner, { moldId: mold.id });
    expect(retired.retiredAt).not.toBeNull();
    await expect(retireMold(owner, { moldId: mold.id })).rejects.toMatchObject({ code: 'mold_retired', status: 409 });
    await expect(recordPulls(owner, { moldId: mold.id, pulls: 2 })).rejects.toMatchObject({ code: 'mold_retired', status: 409 });
    const [row] = await query<{ pulls_so_far: number }>(db.current().url, `SELECT pulls_so_far FROM molds WHERE id = $1`, [mold.id]);
    expect(row!.pulls_so_far).toBe(10);
    await expect(recordPulls(owner, { moldId: '00000000-0000-4000-8000-000000000000', pulls: 1 })).rejects.toMatchObject({ status: 404 });
  });
});

describe('the rules the tables keep', () => {
  it('refuses negative pulls, no life, a blank name and a nonsense calendar', async () => {
    const ibex = await designId('ibex');
    const insert = (pulls: number, life: number, label = 'Check') =>
      sqlError(`INSERT INTO molds (design_id, label, made_on, pulls_so_far, expected_life_pulls) VALUES ($1, $2, '2026-01-01', $3, $4)`, [ibex, label, pulls, life]);
    expect(await insert(-1, 40)).toBe('molds_pulls_not_negative');
    expect(await insert(0, 0)).toBe('molds_life_positive');
    expect(await insert(0, 40, '  ')).toBe('molds_label_present');
    expect(await sqlError(`UPDATE studios SET working_days = '{0,1}'`)).toBe('studios_working_days_iso');
    expect(await sqlError(`UPDATE studios SET working_days = '{}'`)).toBe('studios_working_days_iso');
    expect(await sqlError(`UPDATE studios SET working_hours_per_day = 0`)).toBe('studios_working_hours_sensible');
    expect(await sqlError(`UPDATE studios SET planner_defaults = '[]'`)).toBe('studios_planner_defaults_object');
  });
});

describe("the planner's loading", () => {
  it("gives the studio's calendar and defaults, a published design's finishes and only its molds in use", async () => {
    const { loadPlanner } = await import('@/lib/planner/load');
    const { studio, designs, design } = await loadPlanner('ibex');
    expect(studio!.calendar.workingDays).toEqual([1, 2, 3, 4, 5]);
    expect(studio!.calendar.hoursPerDay).toBe(7);
    expect(studio!.calendar.holidays.length).toBeGreaterThanOrEqual(2);
    for (const day of studio!.calendar.holidays) expect(day >= studio!.today).toBe(true);
    expect(studio!.defaults.resinPricePerKgMinor).toBeGreaterThan(0);
    expect(designs.map((d) => d.slug)).not.toContain('ram'); // a draft

    const finishes = await query<{ id: string; price: number }>(
      db.current().url,
      `SELECT f.id, d.base_price_minor + f.price_difference_minor AS price FROM finishes f JOIN designs d ON d.id = f.design_id
        WHERE d.slug = 'ibex' AND f.status = 'published' ORDER BY f.position`,
    );
    expect(design!.finishes.map((f) => [f.finishId, f.priceMinor])).toEqual(finishes.map((f) => [f.id, f.price]));
    const inUse = await query<{ label: string }>(
      db.current().url,
      `SELECT m.label FROM molds m JOIN designs d ON d.id = m.design_id WHERE d.slug = 'ibex' AND m.retired_at IS NULL ORDER BY m.made_on, m.label`,
    );
    expect(design!.molds.map((m) => m.label)).toEqual(inUse.map((m) => m.label));
    expect(design!.molds.map((m) => m.label)).not.toContain('Ibex A');
    expect(design!.shell.ruleOfThumb).toBe('half-ellipsoid');
  });

  it('has no design for a draft or an unknown name', async () => {
    const { loadPlanner } = await import('@/lib/planner/load');
    expect((await loadPlanner('ram')).design).toBeNull();
    expect((await loadPlanner('nothing-here')).design).toBeNull();
  });
});
