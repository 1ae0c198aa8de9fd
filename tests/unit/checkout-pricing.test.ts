import currencyCodes from 'currency-codes';
import { describe, expect, it } from 'vitest';
import {
  chargeableWeightG,
  includedTaxMinor,
  parcelFor,
  quote,
  shippingOptionsFor,
  stripeZeroDecimalCurrencies,
  toStripeAmount,
  volumetricWeightG,
  zoneFor,
  type Parcel,
  type ShippingRate,
  type ShippingZone,
} from '@/lib/checkout/pricing';
import { minorUnitDigits } from '@/lib/money';

// Neither `i18n-iso-countries` nor `countries-list` is a dependency, so country codes are checked against
// CLDR's region names as Node's ICU ships them (Intl.DisplayNames). CLDR names more than ISO 3166-1 assigns,
// so the names alone are not enough: DisplayNames echoes an unknown code ("XX"), but names "ZZ" ("Unknown
// Region"), CLDR's aliases of withdrawn or non-ISO codes ("UK" -> GB, "AN" -> CW) and several codes ISO 3166-1
// only reserves. Those are filtered out below.
const cldrRegions = new Intl.DisplayNames(['en'], { type: 'region' });
// ISO 3166-1 user-assigned codes: AA, QM–QZ, XA–XZ and ZZ (the standard leaves them to users; CLDR uses QO,
// XA, XB, XK, ZZ). Exceptionally reserved codes CLDR names as regions: recalled from the ISO 3166-1
// "exceptionally reserved" list (Ascension, Clipperton, Sark, Diego Garcia, Ceuta & Melilla, EU, Eurozone,
// Canary Islands, Tristan da Cunha, UN).
const userAssigned = /^(AA|Q[M-Z]|X[A-Z]|ZZ)$/;
const exceptionallyReserved = new Set(['AC', 'CP', 'CQ', 'DG', 'EA', 'EU', 'EZ', 'IC', 'TA', 'UN']);
function isIsoAlpha2(code: string): boolean {
  if (!/^[A-Z]{2}$/.test(code) || userAssigned.test(code) || exceptionallyReserved.has(code)) return false;
  // A CLDR alias canonicalises to another region ("und-UK" -> "und-GB"): not a current ISO code.
  if (Intl.getCanonicalLocales(`und-${code}`)[0] !== `und-${code}`) return false;
  return cldrRegions.of(code) !== code;
}

const rate = (
  id: string,
  label: string,
  upToGrams: number,
  amountMinor: number,
  minDays = 3,
  maxDays = 5,
): ShippingRate => ({
  id,
  label,
  upToGrams,
  amountMinor,
  minDays,
  maxDays,
});

const euRates: ShippingRate[] = [
  rate('eu-std-2kg', 'Standard', 2_000, 900),
  rate('eu-std-5kg', 'Standard', 5_000, 1_400),
  rate('eu-std-10kg', 'Standard', 10_000, 2_200),
  rate('eu-trk-5kg', 'Tracked', 5_000, 1_600, 2, 4),
  rate('eu-trk-5kg-old', 'Tracked', 5_000, 1_900, 2, 4),
  rate('eu-exp-10kg', 'Express', 10_000, 3_500, 1, 2),
];
const zones: ShippingZone[] = [
  { id: 'ie', name: 'Ireland', countries: ['IE'], rates: [rate('ie-post', 'An Post', 10_000, 700, 1, 3)] },
  // Ireland is listed here too: the narrower zone above must win.
  {
    id: 'eu',
    name: 'European Union',
    countries: ['IE', 'FR', 'DE', 'NL', 'BE', 'ES', 'IT', 'PT', 'AT', 'PL'],
    rates: euRates,
  },
  {
    id: 'uk',
    name: 'United Kingdom',
    countries: ['GB'],
    rates: [rate('uk-std', 'Standard', 5_000, 1_800, 3, 6)],
  },
  {
    id: 'world',
    name: 'Rest of the world',
    countries: ['US', 'CA', 'JP', 'AU', 'NZ', 'CH', 'NO'],
    rates: [],
  },
];
const euZone = zones[1]!;

describe('parcel weight', () => {
  const box: Parcel = { lengthMm: 400, widthMm: 300, heightMm: 200, weightG: 1_200 };

  it('weighs a bulky box by its volume', () => {
    // 40 × 30 × 20 cm = 24,000 cm³; 24,000 / 5000 cm³ per kg = 4.8 kg = 4800 g.
    expect(volumetricWeightG(box, 5000)).toBe(4_800);
    expect(volumetricWeightG(box, 6000)).toBe(4_000);
    expect(chargeableWeightG(box, 5000)).toBe(4_800);
  });

  it('keeps the actual weight of a dense small parcel', () => {
    // 15 × 10 × 5 cm = 750 cm³ → 150 g by volume, but it weighs 900 g.
    const dense: Parcel = { lengthMm: 150, widthMm: 100, heightMm: 50, weightG: 900 };
    expect(volumetricWeightG(dense, 5000)).toBe(150);
    expect(chargeableWeightG(dense, 5000)).toBe(900);
  });

  it('rounds fractional grams up, and only fractional ones', () => {
    // 10.1 cm cube = 1030.301 cm³ → 206.0602 g → 207 g; a 10 cm cube is exactly 200 g and stays 200.
    expect(volumetricWeightG({ lengthMm: 101, widthMm: 101, heightMm: 101, weightG: 0 }, 5000)).toBe(207);
    expect(volumetricWeightG({ lengthMm: 100, widthMm: 100, heightMm: 100, weightG: 0 }, 5000)).toBe(200);
    // 1 mm³ is still a gram to the courier.
    expect(volumetricWeightG({ lengthMm: 1, widthMm: 1, heightMm: 1, weightG: 0 }, 5000)).toBe(1);
  });

  it('refuses a divisor or size that is not a whole positive number', () => {
    expect(() => volumetricWeightG(box, 0)).toThrow(RangeError);
    expect(() => volumetricWeightG(box, 5000.5)).toThrow(RangeError);
    expect(() => volumetricWeightG({ ...box, heightMm: -1 }, 5000)).toThrow(RangeError);
  });
});

describe('parcel for several masks', () => {
  const mask: Parcel = { lengthMm: 300, widthMm: 220, heightMm: 120, weightG: 650 };

  it('stacks one box per mask', () => {
    expect(parcelFor(mask, 1)).toEqual(mask);
    expect(parcelFor(mask, 3)).toEqual({ lengthMm: 300, widthMm: 220, heightMm: 360, weightG: 1_950 });
    // 30 × 22 × 36 cm = 23,760 cm³ → 4752 g by volume: three masks ship as almost 5 kg, not 1.95 kg.
    expect(chargeableWeightG(parcelFor(mask, 3), 5000)).toBe(4_752);
  });

  it.each([0, -1, 1.5, Number.NaN, Number.POSITIVE_INFINITY])('refuses quantity %s', (quantity) => {
    expect(() => parcelFor(mask, quantity)).toThrow(RangeError);
  });
});

describe('shipping zone', () => {
  it('uses only real ISO 3166-1 alpha-2 codes in these zones', () => {
    // The checker itself must say no to codes that look right but are not assigned.
    for (const fake of ['XX', 'ZZ', 'UK', 'EU', 'XK', 'AN', 'ie'])
      expect(isIsoAlpha2(fake), fake).toBe(false);
    // ISO 3166-1 has 249 officially assigned codes (recalled). If a Node upgrade changes this count, CLDR's
    // region list changed: look at what was added before trusting the checker again.
    const all = [...'ABCDEFGHIJKLMNOPQRSTUVWXYZ'].flatMap((a) =>
      [...'ABCDEFGHIJKLMNOPQRSTUVWXYZ'].map((b) => a + b),
    );
    expect(all.filter(isIsoAlpha2)).toHaveLength(249);
    for (const code of zones.flatMap((z) => z.countries)) expect(isIsoAlpha2(code), code).toBe(true);
  });

  it('finds the zone whatever the case of the code, the first listed winning', () => {
    expect(zoneFor(zones, 'ie')?.id).toBe('ie');
    expect(zoneFor(zones, 'Fr')?.id).toBe('eu');
    expect(zoneFor(zones, 'GB')?.id).toBe('uk');
    expect(zoneFor([euZone, zones[0]!], 'IE')?.id).toBe('eu');
  });

  it('has no zone for a country the studio does not ship to', () => {
    expect(zoneFor(zones, 'BR')).toBeNull();
    // "UK" is not Britain's ISO code (GB is): a buyer's "UK" must not silently match something else.
    expect(zoneFor(zones, 'UK')).toBeNull();
    expect(zoneFor(zones, 'XX')).toBeNull();
  });
});

describe('shipping options', () => {
  const amounts = (g: number) => shippingOptionsFor(euZone, g).map((o) => [o.label, o.amountMinor]);

  it('takes the tier whose limit the parcel fits, exactly at the limit included', () => {
    expect(amounts(2_000)).toEqual([
      ['Standard', 900],
      ['Tracked', 1_600],
      ['Express', 3_500],
    ]);
    expect(amounts(2_001)).toEqual([
      ['Standard', 1_400],
      ['Tracked', 1_600],
      ['Express', 3_500],
    ]);
    expect(amounts(5_001)).toEqual([
      ['Standard', 2_200],
      ['Express', 3_500],
    ]);
  });

  it('offers the cheapest rate of each label, with what Checkout shows', () => {
    const tracked = shippingOptionsFor(euZone, 3_000).filter((o) => o.label === 'Tracked');
    expect(tracked).toEqual([
      {
        rateId: 'eu-trk-5kg',
        zoneName: 'European Union',
        label: 'Tracked',
        amountMinor: 1_600,
        minDays: 2,
        maxDays: 4,
      },
    ]);
  });

  it('sorts by amount, then label, and offers at most 5', () => {
    // Stripe Checkout accepts at most 5 shipping options: https://docs.stripe.com/payments/checkout/shipping
    const many: ShippingZone = {
      ...euZone,
      rates: [
        rate('g', 'Courier', 5_000, 2_500),
        rate('f', 'Standard', 5_000, 1_400),
        rate('e', 'Pickup point', 5_000, 1_400),
        rate('d', 'Tracked', 5_000, 1_600),
        rate('c', 'Express', 5_000, 3_500),
        rate('b', 'Same day', 5_000, 5_000),
        rate('a', 'Letterbox', 5_000, 600),
      ],
    };
    const labels = shippingOptionsFor(many, 1_000).map((o) => o.label);
    expect(labels).toEqual(['Letterbox', 'Pickup point', 'Standard', 'Tracked', 'Courier']);
  });

  it('offers nothing when the parcel is too heavy for every rate', () => {
    expect(shippingOptionsFor(euZone, 10_001)).toEqual([]);
    expect(shippingOptionsFor(zones[3]!, 100)).toEqual([]);
  });
});

describe('tax included in a price', () => {
  it('finds the VAT inside a gross price', () => {
    // €295.00 at 23%: 29500 × 2300 / 12300 = 5516.26… → €55.16.
    expect(includedTaxMinor(29_500, 2_300)).toBe(5_516);
  });

  it('rounds an exact half up', () => {
    // At 23% no amount ever sits on a half: the tax is gross × 23 / 123 and 123 is odd. At 20% the tax is
    // gross / 6, so 1503 / 6 = 250.5 exactly: half-up gives 251 (banker's rounding and truncation give 250).
    expect(includedTaxMinor(1_503, 2_000)).toBe(251);
    expect(includedTaxMinor(1_502, 2_000)).toBe(250); // 250.33…
    expect(includedTaxMinor(1_504, 2_000)).toBe(251); // 250.66…
    expect(includedTaxMinor(3, 2_000)).toBe(1); // 0.5
  });

  it('is nothing at 0%', () => {
    expect(includedTaxMinor(29_500, 0)).toBe(0);
    expect(includedTaxMinor(0, 2_300)).toBe(0);
  });

  it('stays exact for large amounts', () => {
    // floor(MAX_SAFE_INTEGER / 10000) = 900719925474; × 23 = 20716558285902 = 123 × 168427303137 + 51,
    // and 51/123 < ½, so the tax is 168427303137.
    expect(includedTaxMinor(900_719_925_474, 2_300)).toBe(168_427_303_137);
    // Past 2^53 for gross × bp: 9007199254740990 × 23 = 123 × 1684273031374331 + 57, 57/123 < ½, so
    // 1684273031374331. Math.round(gross × 2300 / 12300) in floating point says …332 here.
    expect(includedTaxMinor(9_007_199_254_740_990, 2_300)).toBe(1_684_273_031_374_331);
  });

  it('refuses amounts and rates that are not whole and non-negative', () => {
    expect(() => includedTaxMinor(10.5, 2_300)).toThrow(RangeError);
    expect(() => includedTaxMinor(-100, 2_300)).toThrow(RangeError);
    expect(() => includedTaxMinor(100, 23.5)).toThrow(RangeError);
  });
});

describe('quote', () => {
  it('adds the lines and shipping, and takes the tax from the total', () => {
    const q = quote(
      'EUR',
      [
        { unitPriceMinor: 18_500, quantity: 1 },
        { unitPriceMinor: 5_500, quantity: 2 },
      ],
      500,
      2_300,
    );
    // Lines €295.00, shipping €5.00, total €300.00; 30000 × 23 / 123 = 5609.76 → €56.10. Rounding goods
    // (5516.26 → 5516) and shipping (93.496 → 93) apart would give €56.09.
    expect(q).toEqual({
      currency: 'EUR',
      linesMinor: 29_500,
      shippingMinor: 500,
      totalMinor: 30_000,
      taxIncludedMinor: 5_610,
      taxRateBasisPoints: 2_300,
    });
  });

  it('quotes zero-decimal currencies in whole units', () => {
    // Japan's standard consumption tax is 10%: ¥10,800 contains 10800 / 11 = 981.8 → ¥982.
    const q = quote('JPY', [{ unitPriceMinor: 4_800, quantity: 2 }], 1_200, 1_000);
    expect([q.totalMinor, q.taxIncludedMinor]).toEqual([10_800, 982]);
  });

  it('refuses fractional, negative and overflowing input', () => {
    const line = { unitPriceMinor: 18_500, quantity: 1 };
    expect(() => quote('EUR', [{ unitPriceMinor: 185.5, quantity: 1 }], 0, 2_300)).toThrow(RangeError);
    expect(() => quote('EUR', [{ unitPriceMinor: 18_500, quantity: 0.5 }], 0, 2_300)).toThrow(RangeError);
    expect(() => quote('EUR', [{ unitPriceMinor: -18_500, quantity: 1 }], 0, 2_300)).toThrow(RangeError);
    expect(() => quote('EUR', [{ unitPriceMinor: 18_500, quantity: -1 }], 0, 2_300)).toThrow(RangeError);
    expect(() => quote('EUR', [line], -500, 2_300)).toThrow(RangeError);
    expect(() => quote('EUR', [line], 4.5, 2_300)).toThrow(RangeError);
    expect(() => quote('EUR', [line], 500, -1)).toThrow(RangeError);
    expect(() => quote('EUR', [line], Number.NaN, 2_300)).toThrow(RangeError);
    expect(() => quote('EUR', [{ unitPriceMinor: Number.MAX_SAFE_INTEGER, quantity: 2 }], 0, 2_300)).toThrow(
      RangeError,
    );
  });
});

describe('amounts sent to Stripe', () => {
  // Outside references: Stripe's zero-decimal list (https://docs.stripe.com/currencies#zero-decimal), the ISO
  // 4217 table in the `currency-codes` package, and Intl's currency digits (CLDR's, from Node's ICU), which
  // lib/money.ts uses to count minor units.
  // ISO 4217 gives MGA 2 minor digits, while Stripe (and CLDR) treat it as zero-decimal.
  const isoDisagrees = new Set(['MGA']);

  it('lists exactly the zero-decimal currencies on Stripe’s page', () => {
    // https://docs.stripe.com/currencies#zero-decimal (16 codes): a code missing here would be sent as hundredths.
    // prettier-ignore
    const listed = ['BIF', 'CLP', 'DJF', 'GNF', 'JPY', 'KMF', 'KRW', 'MGA', 'PYG', 'RWF', 'UGX', 'VND', 'VUV', 'XAF', 'XOF', 'XPF'];
    expect([...stripeZeroDecimalCurrencies].sort()).toEqual(listed);
  });

  it('knows JPY and KRW as zero-decimal, as ISO 4217 and Intl do', () => {
    for (const code of ['JPY', 'KRW']) {
      expect(stripeZeroDecimalCurrencies.has(code), code).toBe(true);
      expect(minorUnitDigits(code), code).toBe(0);
      expect(currencyCodes.code(code)?.digits, code).toBe(0);
    }
  });

  it.each([...stripeZeroDecimalCurrencies])('has 0 minor digits for zero-decimal %s', (code) => {
    expect(minorUnitDigits(code)).toBe(0);
    expect(currencyCodes.code(code)?.digits).toBe(isoDisagrees.has(code) ? 2 : 0);
  });

  it('sends EUR and JPY amounts unchanged', () => {
    // €185.00 is 18500 cents; ¥18,500 is 18500 yen: Stripe takes both as is.
    expect(toStripeAmount(18_500, 'EUR')).toBe(18_500);
    expect(toStripeAmount(18_500, 'JPY')).toBe(18_500);
    expect(toStripeAmount(18_500, 'jpy')).toBe(18_500);
  });

  it('accepts every currency a studio can price in', () => {
    // The same list as tests/unit/money.test.ts.
    for (const code of ['EUR', 'GBP', 'USD', 'CHF', 'SEK', 'DKK', 'NOK', 'PLN', 'CZK', 'JPY', 'CAD', 'AUD']) {
      expect(() => toStripeAmount(100, code), code).not.toThrow();
    }
  });

  it('refuses ISK rather than charge a hundredth of the price', () => {
    // ISO 4217 gives ISK 0 digits, but Stripe takes ISK amounts in hundredths (5 ISK is sent as 500; special
    // cases on https://docs.stripe.com/currencies). HUF is the same for Intl, which gives it 0 digits.
    expect(currencyCodes.code('ISK')?.digits).toBe(0);
    expect(minorUnitDigits('ISK')).toBe(0);
    expect(() => toStripeAmount(5, 'ISK')).toThrow(RangeError);
    expect(() => toStripeAmount(5, 'ISK')).toThrow(/hundredths/);
    expect(() => toStripeAmount(500, 'HUF')).toThrow(RangeError);
  });

  it('refuses amounts that are not whole', () => {
    expect(() => toStripeAmount(185.5, 'EUR')).toThrow(RangeError);
  });
});
