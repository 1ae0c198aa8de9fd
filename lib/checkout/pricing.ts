import { minorUnitDigits } from '@/lib/money';

// Pure pricing for Checkout: parcels, shipping options, tax included in a price, and the amounts Stripe is
// sent. No I/O here, so pages, route handlers and tests share exactly the same arithmetic. Every amount is an
// integer count of minor units (see lib/money.ts); anything else is refused with a RangeError, never rounded.

function wholeNumber(name: string, value: number, min = 0): number {
  if (!Number.isSafeInteger(value) || value < min) {
    throw new RangeError(`${name} must be a whole number of at least ${min}, got ${value}`);
  }
  return value;
}

function safeResult(name: string, value: bigint): number {
  if (value > BigInt(Number.MAX_SAFE_INTEGER)) throw new RangeError(`${name} is too large to count exactly`);
  return Number(value);
}

// ---- Parcels ---------------------------------------------------------------------------------------------

/** One packed parcel, in whole millimetres and grams. */
export type Parcel = { lengthMm: number; widthMm: number; heightMm: number; weightG: number };

function checkParcel(parcel: Parcel): void {
  wholeNumber('lengthMm', parcel.lengthMm);
  wholeNumber('widthMm', parcel.widthMm);
  wholeNumber('heightMm', parcel.heightMm);
  wholeNumber('weightG', parcel.weightG);
}

/**
 * Volumetric weight in grams: L×W×H in cm³ divided by the divisor in cm³/kg, as couriers commonly do (common
 * practice, no source; the default divisor of 5000 comes from configuration). Rounded UP to the whole gram.
 *
 * In millimetres this is exact integer arithmetic: cm³ / (cm³/kg) × 1000 g/kg = (mm³ / 1000) / divisor × 1000
 * = mm³ / divisor grams.
 */
export function volumetricWeightG(parcel: Parcel, divisorCm3PerKg: number): number {
  checkParcel(parcel);
  const divisor = BigInt(wholeNumber('divisorCm3PerKg', divisorCm3PerKg, 1));
  const mm3 = BigInt(parcel.lengthMm) * BigInt(parcel.widthMm) * BigInt(parcel.heightMm);
  return safeResult('volumetric weight', (mm3 + divisor - 1n) / divisor);
}

/** The weight a courier charges for: max(actual, volumetric), whole grams. */
export function chargeableWeightG(parcel: Parcel, divisorCm3PerKg: number): number {
  return Math.max(parcel.weightG, volumetricWeightG(parcel, divisorCm3PerKg));
}

/**
 * The parcel for `quantity` masks of one design. Masks nest poorly, so the common practice here is one box per
 * mask, stacked: length and width stay the same, height × quantity, weight × quantity.
 */
export function parcelFor(single: Parcel, quantity: number): Parcel {
  checkParcel(single);
  if (!Number.isInteger(quantity) || quantity < 1) {
    throw new RangeError(`quantity must be a whole number of at least 1, got ${quantity}`);
  }
  const q = BigInt(quantity);
  return {
    lengthMm: single.lengthMm,
    widthMm: single.widthMm,
    heightMm: safeResult('stacked height', BigInt(single.heightMm) * q),
    weightG: safeResult('stacked weight', BigInt(single.weightG) * q),
  };
}

// ---- Shipping ----------------------------------------------------------------------------------------------

export type ShippingRate = {
  id: string;
  label: string;
  upToGrams: number;
  amountMinor: number;
  minDays: number;
  maxDays: number;
};
export type ShippingZone = { id: string; name: string; countries: string[]; rates: ShippingRate[] };
export type ShippingOption = {
  rateId: string;
  zoneName: string;
  label: string;
  amountMinor: number;
  minDays: number;
  maxDays: number;
};

/**
 * The zone whose countries include the ISO 3166-1 alpha-2 code (compared upper-case), or null. If several
 * zones match, the first in array order wins, so a studio can put a narrow zone before a broad one.
 */
export function zoneFor(zones: ShippingZone[], country: string): ShippingZone | null {
  const code = country.trim().toUpperCase();
  return zones.find((zone) => zone.countries.some((c) => c.trim().toUpperCase() === code)) ?? null;
}

/**
 * Stripe Checkout takes at most 5 shipping options per session: https://docs.stripe.com/payments/checkout/shipping
 * (and the API reference of `shipping_options`: "Up to a maximum of 5",
 * https://docs.stripe.com/api/checkout/sessions/create#create_checkout_session-shipping_options).
 */
const STRIPE_MAX_SHIPPING_OPTIONS = 5;

/**
 * For each distinct rate label in the zone, the cheapest rate whose upToGrams >= the chargeable weight (a
 * parcel exactly at a tier's limit still fits that tier); sorted by amount, then label; at most 5. Empty when
 * the parcel is too heavy for every rate. Among equally cheap rates of one label, the first listed wins.
 */
export function shippingOptionsFor(zone: ShippingZone, chargeableG: number): ShippingOption[] {
  wholeNumber('chargeableG', chargeableG);
  const cheapest = new Map<string, ShippingRate>();
  for (const rate of zone.rates) {
    if (rate.upToGrams < chargeableG) continue;
    const best = cheapest.get(rate.label);
    if (!best || rate.amountMinor < best.amountMinor) cheapest.set(rate.label, rate);
  }
  return [...cheapest.values()]
    .sort((a, b) => a.amountMinor - b.amountMinor || (a.label < b.label ? -1 : a.label > b.label ? 1 : 0))
    .slice(0, STRIPE_MAX_SHIPPING_OPTIONS)
    .map((rate) => ({
      rateId: rate.id,
      zoneName: zone.name,
      label: rate.label,
      amountMinor: rate.amountMinor,
      minDays: rate.minDays,
      maxDays: rate.maxDays,
    }));
}

// ---- Tax ---------------------------------------------------------------------------------------------------

/**
 * Prices shown include tax. The tax contained in a gross amount at a rate in basis points (2300 = 23%),
 * rounded half-up to the minor unit: round(gross × bp / (10000 + bp)). Done in BigInt, so it stays exact even
 * where gross × bp is past Number.MAX_SAFE_INTEGER; half-up as floor((2 × gross × bp + d) / (2 × d)).
 */
export function includedTaxMinor(grossMinor: number, rateBasisPoints: number): number {
  const gross = BigInt(wholeNumber('grossMinor', grossMinor));
  const bp = BigInt(wholeNumber('rateBasisPoints', rateBasisPoints));
  const d = 10_000n + bp;
  return Number((2n * gross * bp + d) / (2n * d));
}

export type PricedLine = { unitPriceMinor: number; quantity: number };
export type Quote = {
  currency: string;
  linesMinor: number;
  shippingMinor: number;
  totalMinor: number;
  taxIncludedMinor: number;
  taxRateBasisPoints: number;
};

/**
 * Sum of unit price × quantity over the lines, plus shipping. The tax included is computed once on the TOTAL,
 * goods and shipping together: in the EU shipping commonly follows the VAT rate of the goods it carries
 * (common practice, not checked against a source here). Every number must be a safe non-negative integer,
 * and so must every sum, else RangeError.
 */
export function quote(
  currency: string,
  lines: PricedLine[],
  shippingMinor: number,
  rateBasisPoints: number,
): Quote {
  const code = currency.toUpperCase();
  if (!/^[A-Z]{3}$/.test(code)) throw new RangeError(`currency must be an ISO 4217 code, got ${currency}`);
  let linesMinor = 0n;
  lines.forEach((line, i) => {
    const unit = wholeNumber(`lines[${i}].unitPriceMinor`, line.unitPriceMinor);
    const quantity = wholeNumber(`lines[${i}].quantity`, line.quantity);
    linesMinor += BigInt(unit) * BigInt(quantity);
  });
  const shipping = wholeNumber('shippingMinor', shippingMinor);
  const bp = wholeNumber('rateBasisPoints', rateBasisPoints);
  const lineSum = safeResult('sum of the lines', linesMinor);
  const totalMinor = safeResult('total', linesMinor + BigInt(shipping));
  return {
    currency: code,
    linesMinor: lineSum,
    shippingMinor: shipping,
    totalMinor,
    taxIncludedMinor: includedTaxMinor(totalMinor, bp),
    taxRateBasisPoints: bp,
  };
}

// ---- Stripe amounts ----------------------------------------------------------------------------------------

/**
 * Stripe's zero-decimal currencies: the amount sent is in whole units (JPY 500 = ¥500).
 * Source: https://docs.stripe.com/currencies#zero-decimal. This list was recalled from memory of that page
 * (then compared with copies of the page in the reference search, which list the same 16 codes); check the
 * page again before adding a currency.
 */
// prettier-ignore
export const stripeZeroDecimalCurrencies: ReadonlySet<string> = new Set([
  'BIF', 'CLP', 'DJF', 'GNF', 'JPY', 'KMF', 'KRW', 'MGA', 'PYG', 'RWF', 'UGX', 'VND', 'VUV', 'XAF', 'XOF', 'XPF',
]);

/**
 * The amount to send to Stripe for `currency`. Our amounts are already in minor units as Intl counts them (see
 * lib/money.ts), and for Stripe's zero-decimal currencies minor unit == whole unit, so they pass through.
 *
 * Where Intl says a currency has 0 minor digits but Stripe does not list it as zero-decimal (ISK, HUF, IDR, COP
 * and others, see `Intl.supportedValuesOf('currency')`), Stripe counts the amount in hundredths like any other
 * currency; ISK and HUF are among its "special cases" on https://docs.stripe.com/currencies (5 ISK is sent as
 * 500). We store whole units there, so we refuse rather than charge a hundredth of the price.
 */
export function toStripeAmount(amountMinor: number, currency: string): number {
  wholeNumber('amountMinor', amountMinor);
  const code = currency.toUpperCase();
  if (minorUnitDigits(code) === 0 && !stripeZeroDecimalCurrencies.has(code)) {
    throw new RangeError(
      `Stripe expects ${code} amounts in hundredths, and the app does not support ${code} with Stripe yet`,
    );
  }
  return amountMinor;
}
