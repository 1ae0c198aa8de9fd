import currencyCodes from 'currency-codes';
import { describe, expect, it } from 'vitest';
import { formatMoney, minorUnitDigits } from '@/lib/money';

// Outside reference: the ISO 4217 table as published in the `currency-codes` package (its `digits` field
// is the standard's minor unit). Our formatting takes digits from Intl; the two must agree for every
// currency a studio can price in.
const studioCurrencies = ['EUR', 'GBP', 'USD', 'CHF', 'SEK', 'DKK', 'NOK', 'PLN', 'CZK', 'JPY', 'CAD', 'AUD'];

describe('money', () => {
  it.each(studioCurrencies)('uses the ISO 4217 minor unit for %s', (code) => {
    const iso = currencyCodes.code(code);
    expect(iso, `${code} is in ISO 4217`).toBeDefined();
    expect(minorUnitDigits(code)).toBe(iso!.digits);
  });

  it('formats minor units as a person reads them', () => {
    // Expected strings follow CLDR's patterns for these locales, as Node's ICU renders them.
    expect(formatMoney({ amountMinor: 18_500, currency: 'EUR' }, 'en-IE')).toBe('€185.00');
    expect(formatMoney({ amountMinor: 18_500, currency: 'EUR' }, 'de-DE')).toBe('185,00\u00a0€');
    expect(formatMoney({ amountMinor: 18_500, currency: 'JPY' }, 'en-IE')).toBe('JP¥18,500');
  });

  it('refuses fractional and unsafe amounts instead of rounding them', () => {
    expect(() => formatMoney({ amountMinor: 10.5, currency: 'EUR' })).toThrow(RangeError);
    expect(() => formatMoney({ amountMinor: 2 ** 53, currency: 'EUR' })).toThrow(RangeError);
  });
});
