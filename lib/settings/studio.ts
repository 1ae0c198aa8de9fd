import 'server-only';
import type { Transaction } from 'sequelize';
import { sql } from '@/lib/db/sql';
import { readPlannerDefaults } from '@/lib/planner/defaults';

export type Carrier = { id: string; name: string; trackingUrlTemplate: string; position: number };
export type ParcelSize = { id: string; name: string; lengthMm: number; widthMm: number; heightMm: number; emptyWeightG: number; position: number };

/** Everything the workshop, e-mails and documents need to know about the studio, read in one place. */
export type StudioSettings = {
  id: string;
  slug: string;
  name: string;
  /** ISO 4217 code of the studio's prices. */
  currency: string;
  /** IANA zone the studio works in. */
  timeZone: string;
  /** ISO 3166-1 alpha-2 code of the country the studio ships from. */
  country: string;
  contactEmail: string | null;
  /** Multi-line postal address, as printed on slips and at the foot of e-mails. */
  postalAddress: string;
  /** How many e-mails a minute the outbox sends at most, across every process. */
  mailPerMinute: number;
  taxLabel: string;
  taxRateBasisPoints: number;
  volumetricDivisor: number;
  /** ISO weekdays (1 = Monday) the studio works. */
  workingDays: number[];
  hoursPerDay: number;
  /** Holidays as YYYY-MM-DD, in order. */
  holidays: string[];
  cardFeeBasisPoints: number;
  cardFeeFixedMinor: number;
  carriers: Carrier[];
  parcelSizes: ParcelSize[];
  customs: {
    /** Countries inside the studio's customs area: parcels to them need no declaration. */
    area: string[];
    /** The studio's own HS code for its masks (6 digits, or 8–10 with a national extension); null until chosen. */
    hsCode: string | null;
    description: string;
    originCountry: string | null;
  };
};

type StudioRow = {
  id: string; slug: string; name: string; currency: string; time_zone: string; country: string;
  contact_email: string | null; postal_address: string; mail_per_minute: number; tax_label: string; tax_rate_bp: number; volumetric_divisor: number;
  working_days: number[]; working_hours_per_day: string; holidays: string[]; planner_defaults: unknown;
  customs_area: string[]; customs_hs_code: string | null; customs_description: string; customs_origin_country: string | null;
};

/** The studio's settings (the first studio: one installation serves one studio), or null before any exists. */
export async function loadStudioSettings(transaction?: Transaction): Promise<StudioSettings | null> {
  const [row] = await sql<StudioRow>(
    `SELECT id, slug, name, currency, time_zone, country, contact_email, postal_address, mail_per_minute, tax_label, tax_rate_bp,
            volumetric_divisor, working_days, working_hours_per_day::text AS working_hours_per_day,
            ARRAY(SELECT to_char(h, 'YYYY-MM-DD') FROM unnest(holidays) AS h ORDER BY h) AS holidays, planner_defaults,
            customs_area, customs_hs_code, customs_description, customs_origin_country
       FROM studios ORDER BY created_at LIMIT 1`,
    [],
    transaction,
  );
  if (!row) return null;
  const [carriers, parcelSizes] = await Promise.all([
    sql<{ id: string; name: string; tracking_url_template: string; position: number }>(
      `SELECT id, name, tracking_url_template, position FROM carriers WHERE studio_id = $1 ORDER BY position, name`,
      [row.id],
      transaction,
    ),
    sql<{ id: string; name: string; length_mm: number; width_mm: number; height_mm: number; empty_weight_g: number; position: number }>(
      `SELECT id, name, length_mm, width_mm, height_mm, empty_weight_g, position FROM parcel_sizes WHERE studio_id = $1 ORDER BY position, name`,
      [row.id],
      transaction,
    ),
  ]);
  const planner = readPlannerDefaults(row.planner_defaults);
  return {
    id: row.id,
    slug: row.slug,
    name: row.name,
    currency: row.currency,
    timeZone: row.time_zone,
    country: row.country.trim(),
    contactEmail: row.contact_email,
    postalAddress: row.postal_address,
    mailPerMinute: row.mail_per_minute,
    taxLabel: row.tax_label,
    taxRateBasisPoints: row.tax_rate_bp,
    volumetricDivisor: row.volumetric_divisor,
    workingDays: row.working_days.map(Number),
    hoursPerDay: Number(row.working_hours_per_day),
    holidays: row.holidays,
    cardFeeBasisPoints: planner.cardFeeBasisPoints,
    cardFeeFixedMinor: planner.cardFeeFixedMinor,
    carriers: carriers.map((c) => ({ id: c.id, name: c.name, trackingUrlTemplate: c.tracking_url_template, position: c.position })),
    parcelSizes: parcelSizes.map((p) => ({
      id: p.id, name: p.name, lengthMm: p.length_mm, widthMm: p.width_mm, heightMm: p.height_mm, emptyWeightG: p.empty_weight_g, position: p.position,
    })),
    customs: {
      area: row.customs_area.map((c) => c.trim()),
      hsCode: row.customs_hs_code,
      description: row.customs_description,
      originCountry: row.customs_origin_country?.trim() ?? null,
    },
  };
}

/**
 * Why the studio's currency can no longer change, or null while it still can: batches and orders keep their
 * prices as minor units of the studio's currency, so a new code would silently re-read every one of them.
 */
export async function currencyLockReason(studioId: string, transaction?: Transaction): Promise<string | null> {
  const [row] = await sql<{ batches: number; orders: number }>(
    `SELECT (SELECT count(*)::int FROM batches b JOIN designs d ON d.id = b.design_id WHERE d.studio_id = $1) AS batches,
            (SELECT count(*)::int FROM orders WHERE studio_id = $1) AS orders`,
    [studioId],
    transaction,
  );
  if (!row || (row.batches === 0 && row.orders === 0)) return null;
  const what = [row.batches > 0 ? 'batches' : '', row.orders > 0 ? 'orders' : ''].filter(Boolean).join(' and ');
  return `The currency can no longer change: the studio has ${what}, whose prices are stored as amounts of the current currency’s smallest unit (cents, pence…). A new currency would change what every one of them is worth.`;
}
