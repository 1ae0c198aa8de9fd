import 'server-only';
import { AppError } from '@/lib/api/errors';
import { writeAudit, type AuditActor } from '@/lib/audit/log';
import { inTransaction, sql } from '@/lib/db/sql';
import { requestTime } from '@/lib/clock';
import { todayInZone } from '@/lib/planner/calendar';
import type { AddMoldInput, RecordPullsInput, RetireMoldInput } from './schemas';

// The studio's molds: each design's silicone molds with their jackets, and their life in pulls. Every change is
// one statement (with its audit entry in the same transaction), so two people recording pulls at once both count.

type Actor = Exclude<AuditActor, 'system'>;

const pullWords = (n: number) => (n === 1 ? '1 pull' : `${n} pulls`);

export type MoldView = {
  id: string;
  designId: string;
  label: string;
  madeOn: string;
  pullsSoFar: number;
  expectedLifePulls: number;
  retiredAt: string | null;
  /** The day it was retired on the studio's calendar. */
  retiredOn: string | null;
  notes: string;
};

export type DesignMolds = {
  designId: string;
  slug: string;
  name: string;
  status: 'draft' | 'published' | 'retired';
  molds: MoldView[];
};

type MoldRow = {
  id: string;
  design_id: string;
  label: string;
  made_on: string;
  pulls_so_far: number;
  expected_life_pulls: number;
  retired_at: Date | null;
  retired_on: string | null;
  notes: string;
};

const moldColumns = `m.id, m.design_id, m.label, to_char(m.made_on, 'YYYY-MM-DD') AS made_on, m.pulls_so_far,
  m.expected_life_pulls, m.retired_at, m.notes,
  (SELECT to_char(m.retired_at AT TIME ZONE s.time_zone, 'YYYY-MM-DD') FROM designs d JOIN studios s ON s.id = d.studio_id
    WHERE d.id = m.design_id) AS retired_on`;

const toView = (row: MoldRow): MoldView => ({
  id: row.id,
  designId: row.design_id,
  label: row.label,
  madeOn: row.made_on,
  pullsSoFar: row.pulls_so_far,
  expectedLifePulls: row.expected_life_pulls,
  retiredAt: row.retired_at ? new Date(row.retired_at).toISOString() : null,
  retiredOn: row.retired_on,
  notes: row.notes,
});

const moldNotFound = () => new AppError('mold_not_found', 'That mold no longer exists. Reload the page.', 404);
const moldRetired = (label: string) =>
  new AppError('mold_retired', `${label} is retired: it takes no more pulls. Add a new mold instead.`, 409);

/** Today on the shop studio's wall calendar, for a form's default date. */
export async function studioToday(): Promise<string> {
  const [studio] = await sql<{ time_zone: string }>(`SELECT time_zone FROM studios ORDER BY created_at LIMIT 1`);
  return todayInZone(studio?.time_zone ?? 'UTC', new Date(requestTime()));
}

/** Every design of the shop's studio (drafts too: their molds are made before they are published) with its molds. */
export async function listMoldsByDesign(): Promise<DesignMolds[]> {
  const designs = await sql<{ id: string; slug: string; name: string; status: DesignMolds['status'] }>(
    `SELECT d.id, d.slug, d.name, d.status FROM designs d
      WHERE d.studio_id = (SELECT id FROM studios ORDER BY created_at LIMIT 1)
      ORDER BY d.position, d.name`,
  );
  const molds = await sql<MoldRow>(
    `SELECT ${moldColumns} FROM molds m WHERE m.design_id = ANY($1::uuid[]) ORDER BY m.made_on, m.label`,
    [designs.map((d) => d.id)],
  );
  return designs.map((d) => ({
    designId: d.id,
    slug: d.slug,
    name: d.name,
    status: d.status,
    molds: molds.filter((m) => m.design_id === d.id).map(toView),
  }));
}

/** One design's molds, oldest first; retired ones only when asked for. */
export async function listMoldsOfDesign(designId: string, { includeRetired = false } = {}): Promise<MoldView[]> {
  const rows = await sql<MoldRow>(
    `SELECT ${moldColumns} FROM molds m WHERE m.design_id = $1 AND ($2 OR m.retired_at IS NULL) ORDER BY m.made_on, m.label`,
    [designId, includeRetired],
  );
  return rows.map(toView);
}

export async function addMold(actor: Actor, input: AddMoldInput): Promise<MoldView> {
  const [design] = await sql<{ id: string; name: string; time_zone: string }>(
    `SELECT d.id, d.name, s.time_zone FROM designs d JOIN studios s ON s.id = d.studio_id
      WHERE d.id = $1 AND s.id = (SELECT id FROM studios ORDER BY created_at LIMIT 1)`,
    [input.designId],
  );
  if (!design) throw new AppError('design_not_found', 'That design no longer exists. Reload the page.', 404);
  const today = todayInZone(design.time_zone, new Date(requestTime()));
  if (input.madeOn > today) {
    throw new AppError('made_on_in_future', `A mold cannot have been made after today (${today}). Check the date.`, 422, {
      fields: { madeOn: ['A mold cannot have been made after today.'] },
    });
  }
  try {
    return await inTransaction(async (transaction) => {
      const [row] = await sql<MoldRow>(
        `INSERT INTO molds AS m (design_id, label, made_on, pulls_so_far, expected_life_pulls, notes)
         VALUES ($1, $2, $3::date, $4, $5, $6) RETURNING ${moldColumns}`,
        [design.id, input.label, input.madeOn, input.pullsSoFar, input.expectedLifePulls, input.notes],
        transaction,
      );
      const mold = toView(row!);
      await writeAudit(
        {
          actor,
          action: 'mold.added',
          subject: { type: 'mold', id: mold.id },
          summary: `Added ${mold.label} for ${design.name} (${pullWords(mold.pullsSoFar)} of ${mold.expectedLifePulls} used)`,
          after: { madeOn: mold.madeOn, pullsSoFar: mold.pullsSoFar, expectedLifePulls: mold.expectedLifePulls },
        },
        transaction,
      );
      return mold;
    });
  } catch (error) {
    const original = (error as { original?: { code?: string; constraint?: string } }).original;
    if (original?.code === '23505' && original.constraint === 'molds_design_label_unique') {
      throw new AppError('mold_label_taken', `The ${design.name} already has a mold called “${input.label}”. Choose another name.`, 409, {
        fields: { label: ['Another mold of this design has this name.'] },
      });
    }
    throw error;
  }
}

async function explainMissing(moldId: string): Promise<never> {
  const [row] = await sql<{ label: string }>(`SELECT label FROM molds WHERE id = $1`, [moldId]);
  if (!row) throw moldNotFound();
  throw moldRetired(row.label);
}

/** Adds pulls to a mold's count in one statement; a retired mold is refused (409). */
export async function recordPulls(actor: Actor, input: RecordPullsInput): Promise<MoldView> {
  const mold = await inTransaction(async (transaction) => {
    const [row] = await sql<MoldRow>(
      `UPDATE molds AS m SET pulls_so_far = m.pulls_so_far + $2, updated_at = now()
        WHERE m.id = $1 AND m.retired_at IS NULL RETURNING ${moldColumns}`,
      [input.moldId, input.pulls],
      transaction,
    );
    if (!row) return null;
    const view = toView(row);
    await writeAudit(
      {
        actor,
        action: 'mold.pulls_recorded',
        subject: { type: 'mold', id: view.id },
        summary: `Recorded ${pullWords(input.pulls)} on ${view.label} (${view.pullsSoFar} of ${view.expectedLifePulls})`,
        before: { pullsSoFar: view.pullsSoFar - input.pulls },
        after: { pullsSoFar: view.pullsSoFar },
      },
      transaction,
    );
    return view;
  });
  return mold ?? explainMissing(input.moldId);
}

/** Retires a mold: it keeps its record and count but takes no more pulls and leaves the planner's molds. */
export async function retireMold(actor: Actor, input: RetireMoldInput): Promise<MoldView> {
  const mold = await inTransaction(async (transaction) => {
    const [row] = await sql<MoldRow>(
      `UPDATE molds AS m SET retired_at = now(), updated_at = now()
        WHERE m.id = $1 AND m.retired_at IS NULL RETURNING ${moldColumns}`,
      [input.moldId],
      transaction,
    );
    if (!row) return null;
    const view = toView(row);
    await writeAudit(
      {
        actor,
        action: 'mold.retired',
        subject: { type: 'mold', id: view.id },
        summary: `Retired ${view.label} after ${pullWords(view.pullsSoFar)} of ${view.expectedLifePulls}`,
        before: { retired: false },
        after: { retired: true, pullsSoFar: view.pullsSoFar },
      },
      transaction,
    );
    return view;
  });
  if (mold) return mold;
  const [existing] = await sql<{ label: string }>(`SELECT label FROM molds WHERE id = $1`, [input.moldId]);
  if (!existing) throw moldNotFound();
  throw new AppError('mold_retired', `${existing.label} is already retired.`, 409);
}
