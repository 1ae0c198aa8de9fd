/** Money is an integer count of the currency's minor units plus its ISO 4217 code. */
export type Money = { amountMinor: number; currency: string };

/** How many minor-unit digits a currency has (2 for EUR, 0 for JPY, 3 for BHD), from Intl's ISO 4217 data. */
export function minorUnitDigits(currency: string): number {
  return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
}

/** A price as a person reads it, e.g. "€185.00" in English or "185,00 €" in German. */
export function formatMoney({ amountMinor, currency }: Money, locale = 'en-IE'): string {
  if (!Number.isSafeInteger(amountMinor)) throw new RangeError(`amountMinor must be a whole number, got ${amountMinor}`);
  const digits = minorUnitDigits(currency);
  return new Intl.NumberFormat(locale, {
    style: 'currency',
    currency,
    minimumFractionDigits: digits,
    maximumFractionDigits: digits,
  }).format(amountMinor / 10 ** digits);
}
