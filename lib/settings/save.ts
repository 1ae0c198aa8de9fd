import 'server-only';
import type { Transaction } from 'sequelize';
import { AppError } from '@/lib/api/errors';
import { writeAudit, type AuditActor } from '@/lib/audit/log';
import { inTransaction, sql } from '@/lib/db/sql';
import { minorUnitDigits } from '@/lib/money';
import { readPlannerDefaults } from '@/lib/planner/defaults';
import type {
  CalendarInput,
  CarrierInput,
  CustomsInput,
  MoneyInput,
  ParcelSizeInput,
  RateInput,
  StudioDetailsInput,
  ZoneInput,
} from './schemas';
import { countryName } from './schemas';
import { currencyLockReason } from './studio';

// Saving the studio's settings. Each save is one transaction that first locks the studio's row, so two people
// saving at once take turns (two zones cannot both claim a country), and writes one audit entry with what
// changed, before and after. A save that changes nothing writes nothing. The lock is FOR NO KEY UPDATE, so
// checkout can still write orders that refer to the studio meanwhile.

type Actor = Exclude<AuditActor, 'system'>;

/** What a save did, for the action's status line and for the caches it must drop. */
export type SettingsChange = { changed: string[]; message: string };

type Locked = {
  id: string;
  name: string;
  currency: string;
  time_zone: string;
  country: string;
  contact_email: string | null;
  postal_address: string;
  mail_per_minute: number;
  tax_label: string;
  tax_rate_bp: number;
  volumetric_divisor: number;
  working_days: number[];
  working_hours_per_day: string;
  holidays: string[];
  planner_defaults: unknown;
  customs_area: string[];
  customs_hs_code: string | null;
  customs_description: string;
  customs_origin_country: string | null;
};

async function lockStudio(transaction: Transaction): Promise<Locked> {
  const [row] = await sql<Locked>(
    `SELECT id, name, currency, time_zone, country, contact_email, postal_address, mail_per_minute, tax_label, tax_rate_bp, volumetric_divisor,
            working_days, working_hours_per_day::text AS working_hours_per_day,
            ARRAY(SELECT to_char(h, 'YYYY-MM-DD') FROM unnest(holidays) AS h ORDER BY h) AS holidays, planner_defaults,
            customs_area, customs_hs_code, customs_description, customs_origin_country
       FROM studios ORDER BY created_at LIMIT 1 FOR NO KEY UPDATE`,
    [],
    transaction,
  );
  if (!row) throw new AppError('studio_missing', 'The shop has no studio yet. Run the set-up first.', 404);
  return {
    ...row,
    country: row.country.trim(),
    customs_area: row.customs_area.map((c) => c.trim()),
    customs_origin_country: row.customs_origin_country?.trim() ?? null,
    working_days: row.working_days.map(Number),
  };
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/** One audit entry about the studio's settings, in the save's own transaction: `settings.<what>`. */
function auditSettings(
  transaction: Transaction,
  actor: Actor,
  studio: Locked,
  what: string,
  summary: string,
  before: unknown,
  after: unknown,
): Promise<void> {
  return writeAudit(
    { actor, action: `settings.${what}`, subject: studioSubject(studio), summary, before, after },
    transaction,
  );
}

/** Only the keys whose value differs, on both sides. */
function changes<T extends Record<string, unknown>>(before: T, after: T) {
  const keys = Object.keys(after).filter((key) => !same(before[key], after[key]));
  return {
    keys,
    before: Object.fromEntries(keys.map((key) => [key, before[key]])),
    after: Object.fromEntries(keys.map((key) => [key, after[key]])),
  };
}

const fieldError = (code: string, field: string, message: string, status = 409) =>
  new AppError(code, message, status, { fields: { [field]: [message] } });

const nothingChanged: SettingsChange = { changed: [], message: 'Nothing had changed, so nothing was saved.' };

const studioSubject = (studio: { id: string }) => ({ type: 'studio', id: studio.id });

const uniqueViolation = (error: unknown, constraint: string) => {
  const original = (error as { original?: { code?: string; constraint?: string } }).original;
  return original?.code === '23505' && original.constraint === constraint;
};

// ---- 1. Studio --------------------------------------------------------------------------------------------

const studioLabels: Record<string, string> = {
  name: 'name',
  contactEmail: 'contact e-mail',
  mailPerMinute: 'e-mails a minute',
  postalAddress: 'postal address',
  country: 'country',
  currency: 'currency',
  timeZone: 'time zone',
};

export async function updateStudioDetails(actor: Actor, input: StudioDetailsInput): Promise<SettingsChange> {
  return inTransaction(async (transaction) => {
    const studio = await lockStudio(transaction);
    const before = {
      name: studio.name,
      contactEmail: studio.contact_email,
      mailPerMinute: studio.mail_per_minute,
      postalAddress: studio.postal_address,
      country: studio.country,
      currency: studio.currency,
      timeZone: studio.time_zone,
    };
    const diff = changes(before, { ...input });
    if (diff.keys.length === 0) return nothingChanged;

    if (diff.keys.includes('currency')) {
      const locked = await currencyLockReason(studio.id, transaction);
      if (locked) throw fieldError('currency_locked', 'currency', locked);
      // Designs (and shipping rates) keep plain minor units. With the same number of decimals they carry over;
      // with another number (EUR has 2, JPY none) each amount would change a hundredfold, so the maker re-enters them.
      if (minorUnitDigits(studio.currency) !== minorUnitDigits(input.currency)) {
        const [priced] = await sql<{ n: number }>(
          `SELECT (SELECT count(*)::int FROM designs WHERE studio_id = $1)
                + (SELECT count(*)::int FROM shipping_rates r JOIN shipping_zones z ON z.id = r.zone_id WHERE z.studio_id = $1) AS n`,
          [studio.id],
          transaction,
        );
        if ((priced?.n ?? 0) > 0) {
          throw fieldError(
            'currency_decimals_differ',
            'currency',
            `${input.currency} has ${minorUnitDigits(input.currency)} decimals and ${studio.currency} has ${minorUnitDigits(studio.currency)}: ` +
              'the prices and shipping rates already entered would change in value. Delete them first, or keep the currency.',
          );
        }
      }
      await sql(
        `UPDATE designs SET currency = $2, updated_at = now() WHERE studio_id = $1 RETURNING id`,
        [studio.id, input.currency],
        transaction,
      );
    }

    await sql(
      `UPDATE studios SET name = $2, contact_email = $3, postal_address = $4, country = $5, currency = $6, time_zone = $7, mail_per_minute = $8,
              updated_at = now()
        WHERE id = $1 RETURNING id`,
      [
        studio.id,
        input.name,
        input.contactEmail,
        input.postalAddress,
        input.country,
        input.currency,
        input.timeZone,
        input.mailPerMinute,
      ],
      transaction,
    );
    await auditSettings(
      transaction,
      actor,
      studio,
      'studio_changed',
      `Changed the studio’s ${diff.keys.map((key) => studioLabels[key] ?? key).join(', ')}`,
      diff.before,
      diff.after,
    );
    return { changed: diff.keys, message: 'The studio’s details are saved.' };
  });
}

// ---- 2. Working calendar ----------------------------------------------------------------------------------

export async function updateCalendar(actor: Actor, input: CalendarInput): Promise<SettingsChange> {
  return inTransaction(async (transaction) => {
    const studio = await lockStudio(transaction);
    const before = {
      workingDays: studio.working_days,
      hoursPerDay: Number(studio.working_hours_per_day),
      holidays: studio.holidays,
    };
    const diff = changes(before, { ...input });
    if (diff.keys.length === 0) return nothingChanged;
    await sql(
      `UPDATE studios SET working_days = $2::smallint[], working_hours_per_day = $3, holidays = $4::date[], updated_at = now()
        WHERE id = $1 RETURNING id`,
      [studio.id, input.workingDays, input.hoursPerDay, input.holidays],
      transaction,
    );
    await auditSettings(
      transaction,
      actor,
      studio,
      'calendar_changed',
      'Changed the working calendar',
      diff.before,
      diff.after,
    );
    return {
      changed: diff.keys,
      message: 'The working calendar is saved. The planner counts with it from now on.',
    };
  });
}

// ---- 3. Money ---------------------------------------------------------------------------------------------

export async function updateMoney(actor: Actor, input: MoneyInput): Promise<SettingsChange> {
  return inTransaction(async (transaction) => {
    const studio = await lockStudio(transaction);
    if (input.currency !== studio.currency) {
      throw fieldError(
        'currency_changed',
        'cardFeeFixed',
        `The studio’s currency is now ${studio.currency}. Reload the page and enter the fixed fee again.`,
      );
    }
    const planner = readPlannerDefaults(studio.planner_defaults);
    const before = {
      taxLabel: studio.tax_label,
      taxRateBasisPoints: studio.tax_rate_bp,
      cardFeeBasisPoints: planner.cardFeeBasisPoints,
      cardFeeFixedMinor: planner.cardFeeFixedMinor,
      volumetricDivisor: studio.volumetric_divisor,
    };
    const after = {
      taxLabel: input.taxLabel,
      taxRateBasisPoints: input.taxRate,
      cardFeeBasisPoints: input.cardFeePercent,
      cardFeeFixedMinor: input.cardFeeFixedMinor,
      volumetricDivisor: input.volumetricDivisor,
    };
    const diff = changes(before, after);
    if (diff.keys.length === 0) return nothingChanged;
    // `||` merges the two keys into the stored object: the planner's other rules stay as they are.
    await sql(
      `UPDATE studios SET tax_label = $2, tax_rate_bp = $3, volumetric_divisor = $4,
              planner_defaults = planner_defaults || jsonb_build_object('cardFeeBasisPoints', $5::int, 'cardFeeFixedMinor', $6::int),
              updated_at = now()
        WHERE id = $1 RETURNING id`,
      [
        studio.id,
        input.taxLabel,
        input.taxRate,
        input.volumetricDivisor,
        input.cardFeePercent,
        input.cardFeeFixedMinor,
      ],
      transaction,
    );
    await auditSettings(
      transaction,
      actor,
      studio,
      'money_changed',
      'Changed the tax, card fee or volumetric divisor',
      { ...diff.before, currency: studio.currency },
      { ...diff.after, currency: studio.currency },
    );
    return {
      changed: diff.keys,
      message: 'The money settings are saved. Checkout uses them from the next order on.',
    };
  });
}

// ---- 4. Shipping zones and rates --------------------------------------------------------------------------

type ZoneRow = { id: string; name: string; countries: string[] };

async function zonesOf(studioId: string, transaction: Transaction): Promise<ZoneRow[]> {
  const rows = await sql<ZoneRow>(
    `SELECT id, name, countries FROM shipping_zones WHERE studio_id = $1 ORDER BY position, name`,
    [studioId],
    transaction,
  );
  return rows.map((row) => ({ ...row, countries: row.countries.map((c) => c.trim()) }));
}

const zoneNotFound = () =>
  new AppError('zone_not_found', 'That shipping zone no longer exists. Reload the page.', 404);

export async function saveZone(actor: Actor, input: ZoneInput): Promise<SettingsChange> {
  return inTransaction(async (transaction) => {
    const studio = await lockStudio(transaction);
    const zones = await zonesOf(studio.id, transaction);
    const current = input.zoneId ? zones.find((zone) => zone.id === input.zoneId) : undefined;
    if (input.zoneId && !current) throw zoneNotFound();
    const others = zones.filter((zone) => zone.id !== input.zoneId);

    const sameName = others.find(
      (zone) => zone.name.toLocaleLowerCase('en') === input.name.toLocaleLowerCase('en'),
    );
    if (sameName)
      throw fieldError(
        'zone_name_taken',
        'name',
        `There is already a zone called “${sameName.name}”. Choose another name.`,
      );
    // A buyer's country must lead to one zone, or checkout could not say which rates apply.
    const clashes = input.countries.flatMap((code) => {
      const holder = others.find((zone) => zone.countries.includes(code));
      return holder ? [`${countryName(code)} (${code}) is already in the zone “${holder.name}”`] : [];
    });
    if (clashes.length > 0) {
      throw fieldError(
        'country_in_two_zones',
        'countries',
        `${clashes.join('; ')}. A country belongs to one zone only: take it out of that zone first.`,
      );
    }

    if (!current) {
      const [row] = await sql<{ id: string }>(
        `INSERT INTO shipping_zones (studio_id, name, countries, position)
         VALUES ($1, $2, $3::char(2)[], COALESCE((SELECT max(position) + 1 FROM shipping_zones WHERE studio_id = $1), 0)) RETURNING id`,
        [studio.id, input.name, input.countries],
        transaction,
      );
      await auditSettings(
        transaction,
        actor,
        studio,
        'zone_added',
        `Added the shipping zone ${input.name} (${input.countries.join(', ')})`,
        null,
        { zoneId: row!.id, name: input.name, countries: input.countries },
      );
      return {
        changed: ['zone'],
        message: `The zone ${input.name} is added. Add its rates next: buyers there cannot pay until it has one.`,
      };
    }

    const diff = changes(
      { name: current.name, countries: current.countries },
      { name: input.name, countries: input.countries },
    );
    if (diff.keys.length === 0) return nothingChanged;
    await sql(
      `UPDATE shipping_zones SET name = $2, countries = $3::char(2)[], updated_at = now() WHERE id = $1 RETURNING id`,
      [current.id, input.name, input.countries],
      transaction,
    );
    await auditSettings(
      transaction,
      actor,
      studio,
      'zone_changed',
      `Changed the shipping zone ${current.name}`,
      { zoneId: current.id, ...diff.before },
      { zoneId: current.id, ...diff.after },
    );
    return { changed: ['zone'], message: `The zone ${input.name} is saved.` };
  });
}

export async function deleteZone(actor: Actor, input: { zoneId: string }): Promise<SettingsChange> {
  return inTransaction(async (transaction) => {
    const studio = await lockStudio(transaction);
    const [zone] = await sql<ZoneRow & { rates: number }>(
      `DELETE FROM shipping_zones z WHERE z.id = $1 AND z.studio_id = $2
       RETURNING z.id, z.name, z.countries, (SELECT count(*)::int FROM shipping_rates WHERE zone_id = z.id) AS rates`,
      [input.zoneId, studio.id],
      transaction,
    );
    if (!zone) throw zoneNotFound();
    const countries = zone.countries.map((c) => c.trim());
    await auditSettings(
      transaction,
      actor,
      studio,
      'zone_deleted',
      `Deleted the shipping zone ${zone.name} with its ${zone.rates === 1 ? 'rate' : `${zone.rates} rates`}`,
      { zoneId: zone.id, name: zone.name, countries, rates: zone.rates },
      null,
    );
    return {
      changed: ['zone'],
      message: `The zone ${zone.name} is deleted. Buyers in ${countries.join(', ')} can no longer pay for shipping.`,
    };
  });
}

type RateRow = {
  id: string;
  zone_id: string;
  label: string;
  up_to_grams: number;
  amount_minor: number;
  min_days: number;
  max_days: number;
};
const rateView = (
  rate: Pick<RateRow, 'label' | 'up_to_grams' | 'amount_minor' | 'min_days' | 'max_days'>,
) => ({
  label: rate.label,
  upToGrams: rate.up_to_grams,
  amountMinor: rate.amount_minor,
  minDays: rate.min_days,
  maxDays: rate.max_days,
});

export async function saveRate(actor: Actor, input: RateInput): Promise<SettingsChange> {
  return inTransaction(async (transaction) => {
    const studio = await lockStudio(transaction);
    if (input.currency !== studio.currency) {
      throw fieldError(
        'currency_changed',
        'amount',
        `The studio’s currency is now ${studio.currency}. Reload the page and enter the amount again.`,
      );
    }
    const zone = (await zonesOf(studio.id, transaction)).find((z) => z.id === input.zoneId);
    if (!zone) throw zoneNotFound();
    const after = rateView({
      label: input.label,
      up_to_grams: input.upToGrams,
      amount_minor: input.amountMinor,
      min_days: input.minDays,
      max_days: input.maxDays,
    });

    if (!input.rateId) {
      const [row] = await sql<{ id: string }>(
        `INSERT INTO shipping_rates (zone_id, label, up_to_grams, amount_minor, min_days, max_days) VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
        [zone.id, input.label, input.upToGrams, input.amountMinor, input.minDays, input.maxDays],
        transaction,
      );
      await auditSettings(
        transaction,
        actor,
        studio,
        'rate_added',
        `Added the rate ${input.label} up to ${input.upToGrams} g to ${zone.name}`,
        null,
        { rateId: row!.id, zone: zone.name, ...after, currency: studio.currency },
      );
      return { changed: ['rate'], message: `The rate ${input.label} is added to ${zone.name}.` };
    }

    const [current] = await sql<RateRow>(
      `SELECT id, zone_id, label, up_to_grams, amount_minor, min_days, max_days FROM shipping_rates WHERE id = $1 AND zone_id = $2 FOR UPDATE`,
      [input.rateId, zone.id],
      transaction,
    );
    if (!current) throw new AppError('rate_not_found', 'That rate no longer exists. Reload the page.', 404);
    const diff = changes(rateView(current), after);
    if (diff.keys.length === 0) return nothingChanged;
    await sql(
      `UPDATE shipping_rates SET label = $2, up_to_grams = $3, amount_minor = $4, min_days = $5, max_days = $6, updated_at = now()
        WHERE id = $1 RETURNING id`,
      [current.id, input.label, input.upToGrams, input.amountMinor, input.minDays, input.maxDays],
      transaction,
    );
    await auditSettings(
      transaction,
      actor,
      studio,
      'rate_changed',
      `Changed the rate ${current.label} up to ${current.up_to_grams} g of ${zone.name}`,
      { rateId: current.id, ...diff.before, currency: studio.currency },
      { rateId: current.id, ...diff.after, currency: studio.currency },
    );
    return { changed: ['rate'], message: `The rate ${input.label} of ${zone.name} is saved.` };
  });
}

export async function deleteRate(actor: Actor, input: { rateId: string }): Promise<SettingsChange> {
  return inTransaction(async (transaction) => {
    const studio = await lockStudio(transaction);
    const [rate] = await sql<RateRow & { zone_name: string }>(
      `DELETE FROM shipping_rates r USING shipping_zones z
        WHERE r.id = $1 AND z.id = r.zone_id AND z.studio_id = $2
       RETURNING r.id, r.zone_id, r.label, r.up_to_grams, r.amount_minor, r.min_days, r.max_days, z.name AS zone_name`,
      [input.rateId, studio.id],
      transaction,
    );
    if (!rate) throw new AppError('rate_not_found', 'That rate no longer exists. Reload the page.', 404);
    await auditSettings(
      transaction,
      actor,
      studio,
      'rate_deleted',
      `Deleted the rate ${rate.label} up to ${rate.up_to_grams} g of ${rate.zone_name}`,
      { rateId: rate.id, zone: rate.zone_name, ...rateView(rate), currency: studio.currency },
      null,
    );
    return { changed: ['rate'], message: `The rate ${rate.label} of ${rate.zone_name} is deleted.` };
  });
}

// ---- 5. Parcel sizes --------------------------------------------------------------------------------------

type BoxRow = {
  id: string;
  name: string;
  length_mm: number;
  width_mm: number;
  height_mm: number;
  empty_weight_g: number;
};
const boxView = (box: Omit<BoxRow, 'id'>) => ({
  name: box.name,
  lengthMm: box.length_mm,
  widthMm: box.width_mm,
  heightMm: box.height_mm,
  emptyWeightG: box.empty_weight_g,
});
const boxNotFound = () =>
  new AppError('parcel_size_not_found', 'That box no longer exists. Reload the page.', 404);

export async function saveParcelSize(actor: Actor, input: ParcelSizeInput): Promise<SettingsChange> {
  try {
    return await inTransaction(async (transaction) => {
      const studio = await lockStudio(transaction);
      const after = boxView({
        name: input.name,
        length_mm: input.lengthMm,
        width_mm: input.widthMm,
        height_mm: input.heightMm,
        empty_weight_g: input.emptyWeightG,
      });
      if (!input.parcelSizeId) {
        const [row] = await sql<{ id: string }>(
          `INSERT INTO parcel_sizes (studio_id, name, length_mm, width_mm, height_mm, empty_weight_g, position)
           VALUES ($1, $2, $3, $4, $5, $6, COALESCE((SELECT max(position) + 1 FROM parcel_sizes WHERE studio_id = $1), 0)) RETURNING id`,
          [studio.id, input.name, input.lengthMm, input.widthMm, input.heightMm, input.emptyWeightG],
          transaction,
        );
        await auditSettings(
          transaction,
          actor,
          studio,
          'parcel_size_added',
          `Added the box ${input.name} (${input.lengthMm} × ${input.widthMm} × ${input.heightMm} mm)`,
          null,
          { parcelSizeId: row!.id, ...after },
        );
        return { changed: ['parcelSize'], message: `The box ${input.name} is added.` };
      }
      const [current] = await sql<BoxRow>(
        `SELECT id, name, length_mm, width_mm, height_mm, empty_weight_g FROM parcel_sizes WHERE id = $1 AND studio_id = $2 FOR UPDATE`,
        [input.parcelSizeId, studio.id],
        transaction,
      );
      if (!current) throw boxNotFound();
      const diff = changes(boxView(current), after);
      if (diff.keys.length === 0) return nothingChanged;
      await sql(
        `UPDATE parcel_sizes SET name = $2, length_mm = $3, width_mm = $4, height_mm = $5, empty_weight_g = $6, updated_at = now() WHERE id = $1 RETURNING id`,
        [current.id, input.name, input.lengthMm, input.widthMm, input.heightMm, input.emptyWeightG],
        transaction,
      );
      await auditSettings(
        transaction,
        actor,
        studio,
        'parcel_size_changed',
        `Changed the box ${current.name}`,
        { parcelSizeId: current.id, ...diff.before },
        { parcelSizeId: current.id, ...diff.after },
      );
      return { changed: ['parcelSize'], message: `The box ${input.name} is saved.` };
    });
  } catch (error) {
    if (uniqueViolation(error, 'parcel_sizes_studio_name_unique')) {
      throw fieldError(
        'parcel_size_name_taken',
        'name',
        `There is already a box called “${input.name}”. Choose another name.`,
      );
    }
    throw error;
  }
}

export async function deleteParcelSize(
  actor: Actor,
  input: { parcelSizeId: string },
): Promise<SettingsChange> {
  return inTransaction(async (transaction) => {
    const studio = await lockStudio(transaction);
    const [box] = await sql<BoxRow>(
      `DELETE FROM parcel_sizes WHERE id = $1 AND studio_id = $2 RETURNING id, name, length_mm, width_mm, height_mm, empty_weight_g`,
      [input.parcelSizeId, studio.id],
      transaction,
    );
    if (!box) throw boxNotFound();
    await auditSettings(
      transaction,
      actor,
      studio,
      'parcel_size_deleted',
      `Deleted the box ${box.name}`,
      { parcelSizeId: box.id, ...boxView(box) },
      null,
    );
    return { changed: ['parcelSize'], message: `The box ${box.name} is deleted.` };
  });
}

// ---- 6. Carriers ------------------------------------------------------------------------------------------

type CarrierRow = { id: string; name: string; tracking_url_template: string };
const carrierNotFound = () =>
  new AppError('carrier_not_found', 'That carrier no longer exists. Reload the page.', 404);

export async function saveCarrier(actor: Actor, input: CarrierInput): Promise<SettingsChange> {
  try {
    return await inTransaction(async (transaction) => {
      const studio = await lockStudio(transaction);
      const after = { name: input.name, trackingUrlTemplate: input.trackingUrlTemplate };
      if (!input.carrierId) {
        const [row] = await sql<{ id: string }>(
          `INSERT INTO carriers (studio_id, name, tracking_url_template, position)
           VALUES ($1, $2, $3, COALESCE((SELECT max(position) + 1 FROM carriers WHERE studio_id = $1), 0)) RETURNING id`,
          [studio.id, input.name, input.trackingUrlTemplate],
          transaction,
        );
        await auditSettings(
          transaction,
          actor,
          studio,
          'carrier_added',
          `Added the carrier ${input.name}`,
          null,
          { carrierId: row!.id, ...after },
        );
        return { changed: ['carrier'], message: `${input.name} is added.` };
      }
      const [current] = await sql<CarrierRow>(
        `SELECT id, name, tracking_url_template FROM carriers WHERE id = $1 AND studio_id = $2 FOR UPDATE`,
        [input.carrierId, studio.id],
        transaction,
      );
      if (!current) throw carrierNotFound();
      const diff = changes({ name: current.name, trackingUrlTemplate: current.tracking_url_template }, after);
      if (diff.keys.length === 0) return nothingChanged;
      await sql(
        `UPDATE carriers SET name = $2, tracking_url_template = $3, updated_at = now() WHERE id = $1 RETURNING id`,
        [current.id, input.name, input.trackingUrlTemplate],
        transaction,
      );
      await auditSettings(
        transaction,
        actor,
        studio,
        'carrier_changed',
        `Changed the carrier ${current.name}`,
        { carrierId: current.id, ...diff.before },
        { carrierId: current.id, ...diff.after },
      );
      return { changed: ['carrier'], message: `${input.name} is saved.` };
    });
  } catch (error) {
    if (uniqueViolation(error, 'carriers_studio_name_unique')) {
      throw fieldError(
        'carrier_name_taken',
        'name',
        `There is already a carrier called “${input.name}”. Choose another name.`,
      );
    }
    throw error;
  }
}

export async function deleteCarrier(actor: Actor, input: { carrierId: string }): Promise<SettingsChange> {
  return inTransaction(async (transaction) => {
    const studio = await lockStudio(transaction);
    const [carrier] = await sql<CarrierRow>(
      `DELETE FROM carriers WHERE id = $1 AND studio_id = $2 RETURNING id, name, tracking_url_template`,
      [input.carrierId, studio.id],
      transaction,
    );
    if (!carrier) throw carrierNotFound();
    await auditSettings(
      transaction,
      actor,
      studio,
      'carrier_deleted',
      `Deleted the carrier ${carrier.name}`,
      {
        carrierId: carrier.id,
        name: carrier.name,
        trackingUrlTemplate: carrier.tracking_url_template,
      },
      null,
    );
    return { changed: ['carrier'], message: `${carrier.name} is deleted.` };
  });
}

// ---- 7. Customs -------------------------------------------------------------------------------------------

export async function updateCustoms(actor: Actor, input: CustomsInput): Promise<SettingsChange> {
  return inTransaction(async (transaction) => {
    const studio = await lockStudio(transaction);
    const before = {
      area: [...studio.customs_area].sort(),
      hsCode: studio.customs_hs_code,
      description: studio.customs_description,
      originCountry: studio.customs_origin_country,
    };
    const diff = changes(before, { ...input });
    if (diff.keys.length === 0) return nothingChanged;
    await sql(
      `UPDATE studios SET customs_area = $2::char(2)[], customs_hs_code = $3, customs_description = $4, customs_origin_country = $5, updated_at = now()
        WHERE id = $1 RETURNING id`,
      [studio.id, input.area, input.hsCode, input.description, input.originCountry],
      transaction,
    );
    await auditSettings(
      transaction,
      actor,
      studio,
      'customs_changed',
      'Changed the customs details',
      diff.before,
      diff.after,
    );
    return { changed: diff.keys, message: 'The customs details are saved.' };
  });
}
