/** Money is an integer count of the currency's minor units plus its ISO 4217 code. */
export type Money = { amountMinor: number; currency: string };

/** How many minor-unit digits a currency has (2 for EUR, 0 for JPY, 3 for BHD), from Intl's ISO 4217 data. */
// Building an Intl.NumberFormat costs far more than using one: a CSV of 100,000 orders asks for the same
// currency's digits 700,000 times. Both are kept per currency (and locale) for the life of the process.
const digitsByCurrency = new Map<string, number>();
export function minorUnitDigits(currency: string): number {
  let digits = digitsByCurrency.get(currency);
  if (digits === undefined) {
    digits = new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
    digitsByCurrency.set(currency, digits);
  }
  return digits;
}

const formatters = new Map<string, Intl.NumberFormat>();
function moneyFormatter(locale: string, currency: string, digits: number): Intl.NumberFormat {
  const key = `${locale}|${currency}`;
  let formatter = formatters.get(key);
  if (!formatter) {
    formatter = new Intl.NumberFormat(locale, { style: 'currency', currency, minimumFractionDigits: digits, maximumFractionDigits: digits });
    formatters.set(key, formatter);
  }
  return formatter;
}

/** A price as a person reads it, e.g. "€185.00" in English or "185,00 €" in German. */
export function formatMoney({ amountMinor, currency }: Money, locale = 'en-IE'): string {
  if (!Number.isSafeInteger(amountMinor)) throw new RangeError(`amountMinor must be a whole number, got ${amountMinor}`);
  const digits = minorUnitDigits(currency);
  return moneyFormatter(locale, currency, digits).format(amountMinor / 10 ** digits);
}
