import 'server-only';
import { requestTime } from '@/lib/clock';
import { sql } from '@/lib/db/sql';
import { todayInZone, type IsoDate, type WorkingCalendar } from './calendar';
import { readPlannerDefaults, type PlannerDefaults } from './defaults';
import { estimateShellAreaCm2, type ShellEstimate } from './materials';

// What the planner page needs from the database: the studio's calendar and defaults, the published designs to
// choose from, and the chosen design's published finishes and molds in use. Everything after this is computed
// in the browser with the pure planner module.

export type PlannerStudio = {
  name: string;
  currency: string;
  timeZone: string;
  today: IsoDate;
  calendar: WorkingCalendar;
  defaults: PlannerDefaults;
  taxRateBasisPoints: number;
};

export type PlannerFinish = { finishId: string; slug: string; name: string; paintHoursPerMask: number; priceMinor: number };
export type PlannerMold = { id: string; label: string; pullsSoFar: number; expectedLifePulls: number };

export type PlannerDesign = {
  slug: string;
  name: string;
  currency: string;
  measures: { widthMm: number | null; heightMm: number | null; depthMm: number | null; weightG: number | null };
  shell: ShellEstimate;
  finishes: PlannerFinish[];
  molds: PlannerMold[];
};

export type PlannerPageData = {
  studio: PlannerStudio | null;
  designs: { slug: string; name: string }[];
  design: PlannerDesign | null;
};

type StudioRow = {
  id: string;
  name: string;
  currency: string;
  time_zone: string;
  tax_rate_bp: number;
  working_days: number[];
  working_hours_per_day: string;
  holidays: string[];
  planner_defaults: unknown;
};

// The planner's schema takes at most 400 holidays; past ones do not matter to a plan starting today or later.
const maxHolidays = 400;

export async function loadPlanner(designSlug: string | undefined): Promise<PlannerPageData> {
  const [studio] = await sql<StudioRow>(
    `SELECT id, name, currency, time_zone, tax_rate_bp, working_days, working_hours_per_day::text AS working_hours_per_day,
            ARRAY(SELECT to_char(h, 'YYYY-MM-DD') FROM unnest(holidays) AS h ORDER BY h) AS holidays, planner_defaults
       FROM studios ORDER BY created_at LIMIT 1`,
  );
  if (!studio) return { studio: null, designs: [], design: null };
  const today = todayInZone(studio.time_zone, new Date(requestTime()));

  const designs = await sql<{ id: string; slug: string; name: string }>(
    `SELECT d.id, d.slug, d.name FROM designs d
      WHERE d.studio_id = $1 AND d.status = 'published'
        AND EXISTS (SELECT 1 FROM finishes f WHERE f.design_id = d.id AND f.status = 'published')
      ORDER BY d.position, d.name`,
    [studio.id],
  );

  const plannerStudio: PlannerStudio = {
    name: studio.name,
    currency: studio.currency,
    timeZone: studio.time_zone,
    today,
    calendar: {
      workingDays: studio.working_days.map(Number),
      hoursPerDay: Number(studio.working_hours_per_day),
      holidays: studio.holidays.filter((h) => h >= today).slice(0, maxHolidays),
    },
    defaults: readPlannerDefaults(studio.planner_defaults),
    taxRateBasisPoints: studio.tax_rate_bp,
  };

  const chosen = designSlug ? designs.find((d) => d.slug === designSlug) : undefined;
  if (!chosen) return { studio: plannerStudio, designs: designs.map(({ slug, name }) => ({ slug, name })), design: null };

  const [[row], finishes, molds] = await Promise.all([
    sql<{ width_mm: number | null; height_mm: number | null; depth_mm: number | null; weight_g: number | null; base_price_minor: number; currency: string }>(
      `SELECT width_mm, height_mm, depth_mm, weight_g, base_price_minor, currency FROM designs WHERE id = $1`,
      [chosen.id],
    ),
    sql<{ id: string; slug: string; name: string; paint_hours: string; price_difference_minor: number }>(
      `SELECT id, slug, name, paint_hours::text AS paint_hours, price_difference_minor FROM finishes
        WHERE design_id = $1 AND status = 'published' ORDER BY position, name`,
      [chosen.id],
    ),
    sql<{ id: string; label: string; pulls_so_far: number; expected_life_pulls: number }>(
      `SELECT id, label, pulls_so_far, expected_life_pulls FROM molds
        WHERE design_id = $1 AND retired_at IS NULL ORDER BY made_on, label`,
      [chosen.id],
    ),
  ]);
  const measures = { widthMm: row!.width_mm, heightMm: row!.height_mm, depthMm: row!.depth_mm, weightG: row!.weight_g };
  return {
    studio: plannerStudio,
    designs: designs.map(({ slug, name }) => ({ slug, name })),
    design: {
      slug: chosen.slug,
      name: chosen.name,
      currency: row!.currency,
      measures,
      shell: estimateShellAreaCm2(measures),
      finishes: finishes.map((f) => ({
        finishId: f.id,
        slug: f.slug,
        name: f.name,
        paintHoursPerMask: Number(f.paint_hours),
        priceMinor: row!.base_price_minor + f.price_difference_minor,
      })),
      molds: molds.map((m) => ({ id: m.id, label: m.label, pullsSoFar: m.pulls_so_far, expectedLifePulls: m.expected_life_pulls })),
    },
  };
}
