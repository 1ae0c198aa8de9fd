import 'server-only';
import type { Transaction } from 'sequelize';
import type { ShippingZone } from '@/lib/checkout/pricing';
import { sql } from '@/lib/db/sql';

/** The studio's shipping zones with their rates, in the order the studio lists them. */
export async function loadShippingZones(studioId: string, transaction?: Transaction): Promise<ShippingZone[]> {
  const rows = await sql<{
    zone_id: string; zone_name: string; countries: string[]; rate_id: string | null; label: string | null;
    up_to_grams: number | null; amount_minor: number | null; min_days: number | null; max_days: number | null;
  }>(
    `SELECT z.id AS zone_id, z.name AS zone_name, z.countries, r.id AS rate_id, r.label, r.up_to_grams, r.amount_minor, r.min_days, r.max_days
       FROM shipping_zones z LEFT JOIN shipping_rates r ON r.zone_id = z.id
      WHERE z.studio_id = $1 ORDER BY z.position, z.name, r.up_to_grams, r.label`,
    [studioId],
    transaction,
  );
  const zones = new Map<string, ShippingZone>();
  for (const row of rows) {
    let zone = zones.get(row.zone_id);
    if (!zone) {
      zone = { id: row.zone_id, name: row.zone_name, countries: row.countries.map((c) => c.trim()), rates: [] };
      zones.set(row.zone_id, zone);
    }
    if (row.rate_id) {
      zone.rates.push({
        id: row.rate_id,
        label: row.label!,
        upToGrams: row.up_to_grams!,
        amountMinor: row.amount_minor!,
        minDays: row.min_days!,
        maxDays: row.max_days!,
      });
    }
  }
  return [...zones.values()];
}

/** Country names for a list of ISO 3166-1 alpha-2 codes, from CLDR through Intl, sorted by name. */
export function countryChoices(codes: Iterable<string>, locale = 'en'): { code: string; name: string }[] {
  const names = new Intl.DisplayNames([locale], { type: 'region' });
  return [...new Set(codes)].map((code) => ({ code, name: names.of(code) ?? code })).sort((a, b) => a.name.localeCompare(b.name, locale));
}
