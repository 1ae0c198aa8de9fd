import 'server-only';
import { unstable_cache } from 'next/cache';
import { QueryTypes } from 'sequelize';
import type { PhotoView } from '@/lib/catalogue/designs';
import { getDb } from '@/lib/db/connection';
import type { Money } from '@/lib/money';

// What a drop page shows that changes only when the studio edits a batch: cached across requests and
// instances' restarts of the cache, dropped by tag (`batch:<id>`, `drops`) when a batch changes. Live
// stock is never here: it comes from the availability route. Photos: a batch's own photos (batch_id set)
// come first on its drop, then the design's standing photos; another batch's photos never show.
export const dropTags = { all: 'drops', batch: (id: string) => `batch:${id}` };

export type DropFinish = { finishId: string; slug: string; name: string; description: string; price: Money; photo: { src: string; alt: string; width: number; height: number } | null };
export type DropView = {
  id: string;
  name: string;
  status: 'scheduled' | 'cancelled';
  perBuyerLimit: number;
  holdMinutes: number;
  earlyAccessAt: string | null;
  opensAt: string;
  closesAt: string;
  shipBy: string;
  announcement: string;
  design: { slug: string; name: string; summary: string };
  studio: { name: string; timeZone: string };
  finishes: DropFinish[];
  /** The batch's own photos, first shown first; empty when it has none. */
  photos: PhotoView[];
};

async function loadDrop(batchId: string): Promise<DropView | null> {
  const rows = await getDb().sequelize.query<{
    id: string; name: string; status: 'scheduled' | 'cancelled'; per_buyer_limit: number; hold_minutes: number;
    early_access_at: Date | null; opens_at: Date; closes_at: Date; ship_by: string; announcement: string;
    design_slug: string; design_name: string; summary: string; studio_name: string; time_zone: string;
    finish_id: string; finish_slug: string; finish_name: string; description: string; price_minor: number; currency: string;
    src: string | null; alt: string | null; width: number | null; height: number | null; batch_photos: PhotoView[] | null;
  }>(
    `SELECT b.id, b.name, b.status, b.per_buyer_limit, b.hold_minutes, b.early_access_at, b.opens_at, b.closes_at, b.ship_by::text, b.announcement,
            d.slug AS design_slug, d.name AS design_name, d.summary, st.name AS studio_name, st.time_zone,
            f.id AS finish_id, f.slug AS finish_slug, f.name AS finish_name, f.description,
            d.base_price_minor + f.price_difference_minor AS price_minor, d.currency,
            p.src, p.alt, p.width, p.height,
            (SELECT json_agg(json_build_object('src', bp.src, 'alt', bp.alt, 'width', bp.width, 'height', bp.height) ORDER BY bp.position, bp.created_at, bp.id)
               FROM photos bp WHERE bp.batch_id = b.id) AS batch_photos
       FROM batches b JOIN designs d ON d.id = b.design_id JOIN studios st ON st.id = d.studio_id
       JOIN batch_stock s ON s.batch_id = b.id JOIN finishes f ON f.id = s.finish_id
       LEFT JOIN LATERAL (
         SELECT src, alt, width, height FROM photos
          WHERE finish_id = f.id AND (batch_id IS NULL OR batch_id = b.id)
          ORDER BY batch_id IS NULL, position LIMIT 1) p ON true
      WHERE b.id = $1 AND b.status <> 'draft' AND d.status = 'published'
      ORDER BY f.position`,
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  const first = rows[0];
  if (!first) return null;
  return {
    id: first.id,
    name: first.name,
    status: first.status,
    perBuyerLimit: first.per_buyer_limit,
    holdMinutes: first.hold_minutes,
    earlyAccessAt: first.early_access_at?.toISOString() ?? null,
    opensAt: first.opens_at.toISOString(),
    closesAt: first.closes_at.toISOString(),
    shipBy: first.ship_by,
    announcement: first.announcement,
    design: { slug: first.design_slug, name: first.design_name, summary: first.summary },
    studio: { name: first.studio_name, timeZone: first.time_zone },
    finishes: rows.map((r) => ({
      finishId: r.finish_id,
      slug: r.finish_slug,
      name: r.finish_name,
      description: r.description,
      price: { amountMinor: r.price_minor, currency: r.currency },
      photo: r.src ? { src: r.src, alt: r.alt!, width: r.width!, height: r.height! } : null,
    })),
    photos: first.batch_photos ?? [],
  };
}

export function getDrop(batchId: string): Promise<DropView | null> {
  return unstable_cache(() => loadDrop(batchId), ['drop', batchId], {
    tags: [dropTags.all, dropTags.batch(batchId)],
    revalidate: 300,
  })();
}

export type DropSummary = {
  id: string; name: string; designSlug: string; designName: string; earlyAccessAt: string | null; opensAt: string; closesAt: string;
  shipBy: string; units: number; cover: { src: string; alt: string } | null;
};

async function loadDropSummaries(): Promise<DropSummary[]> {
  const rows = await getDb().sequelize.query<{
    id: string; name: string; design_slug: string; design_name: string; early_access_at: Date | null; opens_at: Date; closes_at: Date;
    ship_by: string; units: number; src: string | null; alt: string | null;
  }>(
    `SELECT b.id, b.name, d.slug AS design_slug, d.name AS design_name, b.early_access_at, b.opens_at, b.closes_at, b.ship_by::text, b.announcement,
            (SELECT sum(quantity)::int FROM batch_stock WHERE batch_id = b.id) AS units, p.src, p.alt
       FROM batches b JOIN designs d ON d.id = b.design_id
       LEFT JOIN LATERAL (
         SELECT src, alt FROM photos
          WHERE design_id = d.id AND (batch_id IS NULL OR batch_id = b.id)
          ORDER BY batch_id IS NULL, position LIMIT 1) p ON true
      WHERE b.status = 'scheduled' AND d.status = 'published'
      ORDER BY b.opens_at`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    designSlug: r.design_slug,
    designName: r.design_name,
    earlyAccessAt: r.early_access_at?.toISOString() ?? null,
    opensAt: r.opens_at.toISOString(),
    closesAt: r.closes_at.toISOString(),
    shipBy: r.ship_by,
    units: r.units,
    cover: r.src ? { src: r.src, alt: r.alt! } : null,
  }));
}

/** Every scheduled drop of the shop, past and coming, oldest opening first (pages pick by time). */
export const listDrops = unstable_cache(loadDropSummaries, ['drops'], { tags: [dropTags.all], revalidate: 30 });
