import { z } from 'zod';
import { checkEmailAddress } from '@/lib/auth/email-address';
import { formatMoney, minorUnitDigits } from '@/lib/money';
import { isIsoDate } from '@/lib/planner/calendar';
import { trackingPlaceholder, trackingUrl } from './shipping-rules';

// The settings forms' inputs. Server actions read form data with Object.fromEntries, so every value arrives as
// text (a list travels as one comma-separated field); the schemas turn it into typed input with one message per
// field. The save functions in lib/settings/save.ts take what these schemas give.

// ---- Standards --------------------------------------------------------------------------------------------

// ISO 3166-1 alpha-2 from the CLDR data Intl carries: every two-letter code Intl.DisplayNames can name, less
// what ISO 3166 does not assign to a country. Left out:
// - user-assigned codes (AA, QM–QZ, XA–XZ, ZZ), which CLDR uses for its own regions (XK, QO, ZZ);
// - exceptionally reserved codes (recalled from memory: AC, CP, CQ, DG, EA, EU, EZ, FX, IC, SU, TA, UK, UN);
// - deprecated codes, which Intl.Locale canonicalizes to their successor (YU → RS, ZR → CD, AN → CW).
// That leaves ISO 3166-1's 249 countries and territories (tests/unit/settings-schemas.test.ts checks the count).
const exceptionallyReserved = new Set([
  'AC',
  'CP',
  'CQ',
  'DG',
  'EA',
  'EU',
  'EZ',
  'FX',
  'IC',
  'SU',
  'TA',
  'UK',
  'UN',
]);
const userAssigned = /^(AA|Q[M-Z]|X[A-Z]|ZZ)$/;

let countryCache: readonly string[] | undefined;
/** Every ISO 3166-1 alpha-2 country code, A to Z. */
export function countryCodes(): readonly string[] {
  if (countryCache) return countryCache;
  const names = new Intl.DisplayNames(['en'], { type: 'region', fallback: 'none' });
  const codes: string[] = [];
  for (let a = 65; a <= 90; a += 1) {
    for (let b = 65; b <= 90; b += 1) {
      const code = String.fromCharCode(a, b);
      if (userAssigned.test(code) || exceptionallyReserved.has(code) || !names.of(code)) continue;
      if (new Intl.Locale('und', { region: code }).region !== code) continue;
      codes.push(code);
    }
  }
  countryCache = Object.freeze(codes);
  return countryCache;
}

export const isCountryCode = (code: string) => /^[A-Z]{2}$/.test(code) && countryCodes().includes(code);

/** A country's name in English from CLDR through Intl ("IE" → "Ireland"). */
export function countryName(code: string): string {
  return new Intl.DisplayNames(['en'], { type: 'region' }).of(code) ?? code;
}

// ICU still lists a few currencies ISO 4217 has withdrawn (recalled from memory: the Croatian kuna after the
// euro came in 2023, the old Sierra Leonean leone after redenomination, the Zimbabwean dollar of 2009–2024).
// A shop must not start pricing in them. Nor in the two units of account Intl lists with the currencies
// (recalled from memory: XDR, the IMF's special drawing right, and XSU, the regional sucre), which no card pays in.
const notShopCurrencies = new Set(['HRK', 'SLL', 'ZWL', 'XDR', 'XSU']);

/**
 * ISO 4217 codes a studio may price in: the currencies Intl knows (its data is ICU's copy of ISO 4217, without
 * funds, metals and test codes), less the ones above.
 */
export function currencyCodes(): readonly string[] {
  return Intl.supportedValuesOf('currency').filter((code) => !notShopCurrencies.has(code));
}

/**
 * IANA time zones from the tz data Intl carries (through ICU), canonical names only. Intl's list names only zones
 * tied to a place, so UTC (a zone of the tz data too, and what Intl itself resolves Etc/UTC to) is added.
 */
export function timeZones(): readonly string[] {
  const zones = Intl.supportedValuesOf('timeZone');
  return zones.includes('UTC') ? zones : [...zones, 'UTC'];
}

// ---- Field helpers ----------------------------------------------------------------------------------------

// C0 and C1 control characters (a tab or line break is allowed only where said), and the invisible
// bidirectional controls that make text read differently from how it is stored.
const controlInLine = /[\u0000-\u001F\u007F-\u009F\u202A-\u202E\u2066-\u2069]/;
const controlInBlock = /[\u0000-\u0009\u000B-\u001F\u007F-\u009F\u202A-\u202E\u2066-\u2069]/;

/** Text typed into a field: trimmed, at most `max` characters, no control characters; `min` 1 means required. */
export function plainText(
  what: string,
  { max, min = 0, multiline = false }: { max: number; min?: number; multiline?: boolean },
) {
  return z
    .string({ error: `Enter ${what}.` })
    .transform((value) => (multiline ? value.replace(/\r\n?/g, '\n') : value).trim())
    .pipe(
      z
        .string()
        .min(min, `Enter ${what}.`)
        .max(max, `Keep ${what} to ${max.toLocaleString('en-IE')} characters.`)
        .refine((value) => !(multiline ? controlInBlock : controlInLine).test(value), {
          message: multiline
            ? `${capital(what)} has an invisible control character in it. Type it again, or paste it as plain text.`
            : `${capital(what)} has a line break or an invisible control character in it. Type it again on one line.`,
        }),
    );
}

const capital = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

const blankToUndefined = (value: unknown) =>
  typeof value === 'string' && value.trim() === '' ? undefined : value;

/** A whole number typed into a field. */
export function wholeNumber(what: string, { min, max }: { min: number; max: number }) {
  return z.preprocess(
    (value) => (typeof value === 'string' ? (value.trim() === '' ? undefined : Number(value.trim())) : value),
    z
      .number({
        error: (issue) => (issue.input === undefined ? `Enter ${what}.` : `Enter ${what} as a number.`),
      })
      .int(`Enter ${what} as a whole number.`)
      .min(min, `Enter at least ${min.toLocaleString('en-IE')} for ${what}.`)
      .max(max, `Enter at most ${max.toLocaleString('en-IE')} for ${what}.`),
  );
}

/** A list typed or sent as one field ("IE, FR DE"); an array passes as it is. */
const listOf = (value: unknown) =>
  typeof value === 'string'
    ? value
        .split(/[\s,;]+/)
        .map((item) => item.trim())
        .filter(Boolean)
    : value;

function countryField(what: string) {
  return z
    .string({ error: `Choose ${what}.` })
    .transform((value) => value.trim().toUpperCase())
    .refine((code) => code !== '', `Choose ${what}.`)
    .refine(
      (code) => code === '' || isCountryCode(code),
      `That is not an ISO 3166-1 country code. Choose ${what} from the list.`,
    );
}

function countryList(what: string, { min }: { min: number }) {
  return z.preprocess(
    listOf,
    z
      .array(z.string(), { error: `Choose ${what}.` })
      .transform((codes) => codes.map((code) => code.toUpperCase()))
      .superRefine((codes, ctx) => {
        const unknown = codes.filter((code) => !isCountryCode(code));
        if (unknown.length > 0) {
          ctx.addIssue({
            code: 'custom',
            message: `Not ISO 3166-1 country codes: ${unknown.join(', ')}. Choose countries from the list.`,
          });
        }
        if (codes.length < min)
          ctx.addIssue({
            code: 'custom',
            message: `Choose at least ${min === 1 ? 'one country' : `${min} countries`}.`,
          });
        if (codes.length > 300)
          ctx.addIssue({ code: 'custom', message: 'That is more countries than there are.' });
      })
      .transform((codes) => [...new Set(codes)].sort()),
  );
}

/** A decimal percentage ("23", "13.5", "1,4") to basis points (23 % → 2300); at most two decimals. */
export function percentToBasisPoints(what: string, { max }: { max: number }) {
  return z.string({ error: `Enter ${what}.` }).transform((text, ctx) => {
    const value = text.trim().replace(/\s*%$/, '');
    const match = /^(\d{1,5})(?:[.,](\d{0,2}))?$/.exec(value);
    if (value === '' || !match) {
      ctx.addIssue({
        code: 'custom',
        message: `Enter ${what} as a percentage with at most two decimals, such as 23 or 13.5.`,
      });
      return z.NEVER;
    }
    const bp = Number(match[1]) * 100 + Number((match[2] ?? '').padEnd(2, '0'));
    if (bp > max) {
      ctx.addIssue({ code: 'custom', message: `${capital(what)} can be at most ${max / 100} %.` });
      return z.NEVER;
    }
    return bp;
  });
}

/** Basis points back to what the form shows: 2300 → "23", 1350 → "13.5". */
export function basisPointsToPercent(bp: number): string {
  return String(bp / 100);
}

/**
 * An amount typed in the studio's currency ("9.50", "9,5", "0") to minor units, with the currency's digits from
 * ISO 4217 through Intl (lib/money.ts). Negative amounts, thousands separators, more decimals than the currency
 * has and more than 100,000 are refused.
 */
export function amountToMinor(
  text: string,
  currency: string,
  what: string,
): { ok: true; amountMinor: number } | { ok: false; message: string } {
  const digits = minorUnitDigits(currency);
  const example = digits === 0 ? '950' : `9.${'5'.padEnd(digits, '0')}`;
  const value = text.trim();
  const match = /^(\d{1,9})(?:[.,](\d*))?$/.exec(value);
  if (!match)
    return {
      ok: false,
      message: `Enter ${what} in ${currency} as a number without thousands separators, such as ${example} (0 for none).`,
    };
  const fraction = match[2] ?? '';
  if (fraction.length > digits) {
    return {
      ok: false,
      message:
        digits === 0
          ? `${currency} has no decimals: enter a whole amount.`
          : `${currency} has ${digits} decimals at most, such as ${example}.`,
    };
  }
  const amountMinor = Number(match[1]) * 10 ** digits + Number(fraction.padEnd(digits, '0') || '0');
  const max = 100_000 * 10 ** digits;
  if (amountMinor > max)
    return {
      ok: false,
      message: `${capital(what)} can be at most ${formatMoney({ amountMinor: max, currency })}.`,
    };
  return { ok: true, amountMinor };
}

/** Minor units back to the decimal a form shows: 950 EUR → "9.50". */
export function minorToAmount(amountMinor: number, currency: string): string {
  const digits = minorUnitDigits(currency);
  if (digits === 0) return String(amountMinor);
  return `${Math.trunc(amountMinor / 10 ** digits)}.${String(amountMinor % 10 ** digits).padStart(digits, '0')}`;
}

/** Reads the money field `field` in the form's currency into `<field>Minor`, with its message on the field. */
function withAmount<const F extends string>(field: F, what: string) {
  return <T extends { currency: string } & Record<F, string>>(input: T, ctx: z.RefinementCtx) => {
    const parsed = amountToMinor(input[field], input.currency, what);
    if (!parsed.ok) {
      ctx.addIssue({ code: 'custom', path: [field], message: parsed.message });
      return z.NEVER;
    }
    const rest = Object.fromEntries(Object.entries(input).filter(([key]) => key !== field)) as Omit<T, F>;
    return { ...rest, amountMinor: parsed.amountMinor };
  };
}

const currencyOfForm = z
  .string({ error: 'The form lost its currency. Reload the page and try again.' })
  .regex(/^[A-Z]{3}$/, 'The form lost its currency. Reload the page and try again.');

const id = (what: string) => z.uuid({ error: `That ${what} no longer exists. Reload the page.` });
const optionalId = (what: string) => z.preprocess(blankToUndefined, id(what).optional());

// ---- 1. Studio --------------------------------------------------------------------------------------------

export const studioDetailsSchema = z.object({
  name: plainText('the studio’s name', { min: 1, max: 100 }),
  mailPerMinute: wholeNumber('the e-mails a minute', { min: 1, max: 100_000 }),
  contactEmail: z.preprocess(
    blankToUndefined,
    z
      .string()
      .max(254, 'That is longer than an e-mail address can be.')
      .transform((value, ctx) => {
        const result = checkEmailAddress(value);
        if (result.ok) return result.email;
        ctx.addIssue({
          code: 'custom',
          message: result.problem.message.replace('your e-mail address', 'the studio’s e-mail address'),
        });
        return z.NEVER;
      })
      .optional()
      .transform((value) => value ?? null),
  ),
  postalAddress: plainText('the postal address', { max: 500, multiline: true }).refine(
    (value) => value.split('\n').length <= 10,
    'Keep the postal address to 10 lines.',
  ),
  country: countryField('the country the studio ships from'),
  currency: z
    .string({ error: 'Choose the currency.' })
    .transform((value) => value.trim().toUpperCase())
    .refine(
      (code) => currencyCodes().includes(code),
      'That is not an ISO 4217 currency a shop can price in. Choose one from the list.',
    ),
  timeZone: z
    .string({ error: 'Choose the time zone.' })
    .transform((value) => value.trim())
    .refine(
      (zone) => timeZones().includes(zone),
      'That time zone is not in the IANA time zone list. Choose one from the list, such as Europe/Dublin.',
    ),
});
export type StudioDetailsInput = z.output<typeof studioDetailsSchema>;

// ---- 2. Working calendar ----------------------------------------------------------------------------------

export const isoWeekdays = [
  { day: 1, name: 'Monday' },
  { day: 2, name: 'Tuesday' },
  { day: 3, name: 'Wednesday' },
  { day: 4, name: 'Thursday' },
  { day: 5, name: 'Friday' },
  { day: 6, name: 'Saturday' },
  { day: 7, name: 'Sunday' },
] as const;

/** Each weekday is its own checkbox, `day1` (Monday) … `day7` (Sunday); an array `workingDays` is read too. */
export const calendarSchema = z.preprocess(
  (raw) => {
    if (!raw || typeof raw !== 'object' || Array.isArray(raw)) return raw;
    const source = raw as Record<string, unknown>;
    if (Array.isArray(source.workingDays)) return source;
    const workingDays = isoWeekdays
      .filter(({ day }) => source[`day${day}`] !== undefined && source[`day${day}`] !== '')
      .map(({ day }) => day);
    return { ...source, workingDays };
  },
  z.object({
    workingDays: z
      .array(z.number().int().min(1).max(7), { error: 'Choose the days the studio works.' })
      .min(1, 'Tick at least one working day.')
      .transform((days) => [...new Set(days)].sort((a, b) => a - b)),
    hoursPerDay: z.string({ error: 'Enter the working hours a day.' }).transform((text, ctx) => {
      const value = text.trim();
      const match = /^(\d{1,2})(?:[.,](\d{1,2}))?$/.exec(value);
      const hours = match ? Number(`${match[1]}.${match[2] ?? '0'}`) : Number.NaN;
      if (!match || !(hours > 0) || hours > 24) {
        ctx.addIssue({
          code: 'custom',
          message: 'Enter the working hours a day as a number more than 0 and at most 24, such as 7 or 7.5.',
        });
        return z.NEVER;
      }
      return hours;
    }),
    holidays: z.preprocess(
      (value) => listOf(value ?? ''),
      z
        .array(z.string(), { error: 'The holidays did not arrive. Reload the page.' })
        .max(400, 'Keep the list to 400 holidays; remove the past ones.')
        .superRefine((dates, ctx) => {
          const wrong = dates.filter((date) => !isIsoDate(date));
          if (wrong.length > 0) {
            ctx.addIssue({
              code: 'custom',
              message: `Not real dates written YYYY-MM-DD: ${wrong.slice(0, 5).join(', ')}.`,
            });
          }
        })
        .transform((dates) => [...new Set(dates)].sort()),
    ),
  }),
);
export type CalendarInput = z.output<typeof calendarSchema>;

// ---- 3. Money ---------------------------------------------------------------------------------------------

// The card fee is the studio's own figure from its payment provider's price list; 10 % is our bound for a typo.
export const moneySchema = z
  .object({
    currency: currencyOfForm,
    taxLabel: plainText('the tax’s name', { min: 1, max: 20 }),
    taxRate: percentToBasisPoints('the tax rate', { max: 10_000 }),
    cardFeePercent: percentToBasisPoints('the card fee percentage', { max: 1_000 }),
    cardFeeFixed: z.string({ error: 'Enter the fixed card fee (0 if there is none).' }),
    volumetricDivisor: wholeNumber('the volumetric divisor', { min: 1000, max: 10_000 }),
  })
  .transform(withAmount('cardFeeFixed', 'the fixed card fee'))
  .transform(({ amountMinor, ...rest }) => ({ ...rest, cardFeeFixedMinor: amountMinor }));
export type MoneyInput = z.output<typeof moneySchema>;

// ---- 4. Shipping zones and rates --------------------------------------------------------------------------

export const zoneSchema = z.object({
  zoneId: optionalId('zone'),
  name: plainText('the zone’s name', { min: 1, max: 60 }),
  countries: countryList('the countries of the zone', { min: 1 }),
});
export type ZoneInput = z.output<typeof zoneSchema>;

export const deleteZoneSchema = z.object({ zoneId: id('zone') });

export const rateSchema = z
  .object({
    zoneId: id('zone'),
    rateId: optionalId('rate'),
    currency: currencyOfForm,
    label: plainText('the rate’s label', { min: 1, max: 60 }),
    upToGrams: wholeNumber('the weight the rate goes up to (g)', { min: 1, max: 70_000 }),
    amount: z.string({ error: 'Enter the amount.' }),
    minDays: wholeNumber('the fewest days on the way', { min: 0, max: 365 }),
    maxDays: wholeNumber('the most days on the way', { min: 0, max: 365 }),
  })
  .superRefine((rate, ctx) => {
    if (rate.minDays > rate.maxDays) {
      ctx.addIssue({
        code: 'custom',
        path: ['maxDays'],
        message: 'The most days on the way cannot be fewer than the fewest.',
      });
    }
  })
  .transform(withAmount('amount', 'the amount'));
export type RateInput = z.output<typeof rateSchema>;

export const deleteRateSchema = z.object({ rateId: id('rate') });

// ---- 5. Parcel sizes --------------------------------------------------------------------------------------

// The bounds are the table's own (migrations/20261205090000-add-studio-settings.cjs).
export const parcelSizeSchema = z.object({
  parcelSizeId: optionalId('box'),
  name: plainText('the box’s name', { min: 1, max: 60 }),
  lengthMm: wholeNumber('the inner length (mm)', { min: 10, max: 3000 }),
  widthMm: wholeNumber('the inner width (mm)', { min: 10, max: 3000 }),
  heightMm: wholeNumber('the inner height (mm)', { min: 10, max: 3000 }),
  emptyWeightG: wholeNumber('the empty weight (g)', { min: 0, max: 70_000 }),
});
export type ParcelSizeInput = z.output<typeof parcelSizeSchema>;

export const deleteParcelSizeSchema = z.object({ parcelSizeId: id('box') });

// ---- 6. Carriers ------------------------------------------------------------------------------------------

export const exampleTrackingNumber = 'MG123456789';

/** What is wrong with a tracking link template, or null when it is usable. */
export function trackingTemplateProblem(template: string): string | null {
  if (!template.startsWith('https://'))
    return 'The tracking link must start with https:// so buyers open it safely.';
  if (!template.includes(trackingPlaceholder))
    return `Put ${trackingPlaceholder} where the tracking number goes in the link.`;
  if (/\s/.test(template)) return 'A link has no spaces in it.';
  try {
    const url = new URL(trackingUrl(template, exampleTrackingNumber));
    if (url.protocol !== 'https:' || !url.hostname.includes('.'))
      return 'That is not a web address: check the part after https://.';
  } catch {
    return 'That is not a web address: check the part after https://.';
  }
  return null;
}

export const carrierSchema = z.object({
  carrierId: optionalId('carrier'),
  name: plainText('the carrier’s name', { min: 1, max: 60 }),
  trackingUrlTemplate: plainText('the tracking link', { min: 1, max: 500 }).superRefine((template, ctx) => {
    const problem = trackingTemplateProblem(template);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  }),
});
export type CarrierInput = z.output<typeof carrierSchema>;

export const deleteCarrierSchema = z.object({ carrierId: id('carrier') });

// ---- 7. Customs -------------------------------------------------------------------------------------------

/**
 * An HS code as typed ("3926.90", "3926 90 00") to its digits: the six of the Harmonized System, or eight or ten
 * with a national extension (the pairs the database allows). Which code fits is the studio's question for its
 * customs authority; nothing here suggests one.
 */
export const hsCodeField = z.preprocess(
  blankToUndefined,
  z
    .string()
    .transform((value) => value.replace(/[\s.]/g, ''))
    .refine(
      (digits) => /^\d+$/.test(digits),
      'An HS code has only digits (dots and spaces between them are fine).',
    )
    .refine(
      (digits) => !/^\d+$/.test(digits) || /^\d{6}(\d{2}){0,2}$/.test(digits),
      'An HS code has 6 digits, or 8 or 10 with a national extension.',
    )
    .optional()
    .transform((value) => value ?? null),
);

export const customsSchema = z.object({
  area: countryList('the countries of the customs area', { min: 0 }),
  hsCode: hsCodeField,
  description: plainText('the description of the contents', { max: 200 }),
  originCountry: z.preprocess(
    blankToUndefined,
    countryField('the country of origin')
      .optional()
      .transform((value) => value ?? null),
  ),
});
export type CustomsInput = z.output<typeof customsSchema>;
