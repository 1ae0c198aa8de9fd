import currencyCodesIso from 'currency-codes';
import { describe, expect, it } from 'vitest';
import {
  calendarSchema,
  carrierSchema,
  countryCodes,
  currencyCodes,
  customsSchema,
  hsCodeField,
  moneySchema,
  parcelSizeSchema,
  rateSchema,
  studioDetailsSchema,
  trackingTemplateProblem,
  zoneSchema,
} from '@/lib/settings/schemas';

// What each settings form must refuse. The outside facts are checked against their own sources: time zones
// against the IANA data as Intl carries it (ICU), currencies against the `currency-codes` package (ISO 4217,
// list published on the date it states), country names against CLDR through Intl.DisplayNames.

const studio = {
  name: 'Marrowgate Studio',
  contactEmail: 'hello@marrowgate.example',
  mailPerMinute: '600',
  postalAddress: 'Marrowgate Studio\nUnit 4, Tannery Yard\nMarrowgate\nIreland',
  country: 'IE',
  currency: 'EUR',
  timeZone: 'Europe/Dublin',
};

const messages = (
  result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } },
  field: string,
) =>
  (result.error?.issues ?? [])
    .filter((issue) => String(issue.path[0]) === field)
    .map((issue) => issue.message);

describe('the studio form', () => {
  it('takes the demo studio as it is, with the address kept on its lines', () => {
    const parsed = studioDetailsSchema.parse(studio);
    // The form's text becomes a whole number of e-mails a minute.
    expect(parsed).toEqual({ ...studio, mailPerMinute: 600 });
    expect(parsed.postalAddress.split('\n')).toHaveLength(4);
  });

  it('accepts every IANA zone Intl knows, each of which Intl can format a time in', () => {
    // Source: the tz database through ICU, as Intl.supportedValuesOf('timeZone') lists it.
    for (const timeZone of Intl.supportedValuesOf('timeZone')) {
      expect(studioDetailsSchema.safeParse({ ...studio, timeZone }).success, timeZone).toBe(true);
      expect(() => new Intl.DateTimeFormat('en', { timeZone })).not.toThrow();
    }
  });

  it('accepts UTC, which the tz data has though Intl lists only zones tied to a place', () => {
    expect(new Intl.DateTimeFormat('en', { timeZone: 'Etc/UTC' }).resolvedOptions().timeZone).toBe('UTC');
    expect(studioDetailsSchema.parse({ ...studio, timeZone: 'UTC' }).timeZone).toBe('UTC');
  });

  it('refuses a time zone that is not in the list', () => {
    for (const timeZone of [
      'Mars/Olympus_Mons',
      'Europe/Dubln',
      'europe/dublin ',
      'GMT+25',
      '',
      'Europe/Dublin\u0000',
    ]) {
      const result = studioDetailsSchema.safeParse({ ...studio, timeZone });
      expect(result.success, JSON.stringify(timeZone)).toBe(false);
      expect(messages(result, 'timeZone')[0]).toMatch(/time zone/);
    }
  });

  it('accepts only ISO 4217 currencies, as the currency-codes package lists them', () => {
    const iso = new Set(currencyCodesIso.codes());
    const accepted = currencyCodes();
    // Recalled from memory: the Caribbean guilder (XCG) came into ISO 4217 for use from 2025, after the package's
    // list was published; ICU already has it.
    const newerThanThePackage = ['XCG'];
    expect(accepted.filter((code) => !iso.has(code))).toEqual(newerThanThePackage);
    for (const code of accepted)
      expect(studioDetailsSchema.safeParse({ ...studio, currency: code }).success, code).toBe(true);
  });

  it('refuses codes that are not a currency a shop is paid in', () => {
    const iso = new Set(currencyCodesIso.codes());
    // Not in ISO 4217 at all, withdrawn from it (the kuna, since Croatia's euro), or ISO's codes for gold, tests
    // and "no currency", which are in the list but are not money.
    for (const code of ['EUX', 'ABC', 'EURO', 'E', 'HRK', 'XAU', 'XTS', 'XXX', 'XDR']) {
      const result = studioDetailsSchema.safeParse({ ...studio, currency: code });
      expect(result.success, code).toBe(false);
      expect(messages(result, 'currency')[0]).toMatch(/ISO 4217/);
    }
    expect(iso.has('HRK')).toBe(false);
    expect(iso.has('XAU')).toBe(true);
  });

  it('knows the 249 countries of ISO 3166-1, each with a CLDR name', () => {
    // Recalled from memory: ISO 3166-1 assigns 249 alpha-2 codes.
    const codes = countryCodes();
    expect(codes).toHaveLength(249);
    const names = new Intl.DisplayNames(['en'], { type: 'region', fallback: 'none' });
    for (const code of codes) {
      expect(code).toMatch(/^[A-Z]{2}$/);
      expect(names.of(code), code).toBeTruthy();
    }
    expect(codes).toEqual(expect.arrayContaining(['IE', 'GB', 'DE', 'JP', 'CW', 'SS']));
  });

  it('refuses codes that are not ISO 3166-1 countries, even where Intl can name them', () => {
    // UK and EU are reserved, XK and QO are user-assigned (Intl names them), YU and AN are no longer assigned.
    for (const country of ['UK', 'EU', 'XK', 'QO', 'ZZ', 'YU', 'AN', 'IRL', 'I', '12', '']) {
      const result = studioDetailsSchema.safeParse({ ...studio, country });
      expect(result.success, country).toBe(false);
      expect(messages(result, 'country')).not.toHaveLength(0);
    }
    expect(studioDetailsSchema.parse({ ...studio, country: ' ie ' }).country).toBe('IE');
  });

  it('refuses control characters in text, and line breaks where the text is one line', () => {
    for (const name of [
      'Marrow\u0000gate',
      'Marrowgate\nStudio',
      'Marrow\u0007gate',
      'Marrowgate \u202Eoiduts',
      '   ',
    ]) {
      expect(studioDetailsSchema.safeParse({ ...studio, name }).success, JSON.stringify(name)).toBe(false);
    }
    expect(
      studioDetailsSchema.safeParse({ ...studio, postalAddress: 'Unit 4\u0000\nMarrowgate' }).success,
    ).toBe(false);
    expect(
      studioDetailsSchema.parse({ ...studio, postalAddress: 'Unit 4\r\nMarrowgate' }).postalAddress,
    ).toBe('Unit 4\nMarrowgate');
  });

  it('takes an empty contact e-mail as none, and refuses one that is not an address', () => {
    expect(studioDetailsSchema.parse({ ...studio, contactEmail: '  ' }).contactEmail).toBeNull();
    expect(
      studioDetailsSchema.parse({ ...studio, contactEmail: 'Hello@Marrowgate.example' }).contactEmail,
    ).toBe('hello@marrowgate.example');
    expect(studioDetailsSchema.safeParse({ ...studio, contactEmail: 'hello at marrowgate' }).success).toBe(
      false,
    );
  });
});

describe('the working calendar', () => {
  const base = { day1: 'on', day2: 'on', day3: 'on', day4: 'on', day5: 'on', hoursPerDay: '7', holidays: '' };

  it('reads the ticked weekdays, hours and holidays', () => {
    expect(
      calendarSchema.parse({
        ...base,
        day6: 'on',
        hoursPerDay: '7,5',
        holidays: '2026-12-26,2026-12-25,2026-12-25',
      }),
    ).toEqual({
      workingDays: [1, 2, 3, 4, 5, 6],
      hoursPerDay: 7.5,
      holidays: ['2026-12-25', '2026-12-26'],
    });
  });

  it('refuses no working day, hours out of a day, and dates that are not real', () => {
    expect(
      messages(calendarSchema.safeParse({ hoursPerDay: '7', holidays: '' }), 'workingDays'),
    ).not.toHaveLength(0);
    for (const hoursPerDay of ['0', '25', '-1', 'seven', '7.555', '']) {
      expect(calendarSchema.safeParse({ ...base, hoursPerDay }).success, hoursPerDay).toBe(false);
    }
    for (const holiday of ['2027-02-29', '2026-13-01', '2026-04-31', '25/12/2026', '2026-12-25T00:00']) {
      expect(
        messages(calendarSchema.safeParse({ ...base, holidays: holiday }), 'holidays'),
        holiday,
      ).not.toHaveLength(0);
    }
    expect(calendarSchema.parse({ ...base, holidays: '2028-02-29' }).holidays).toEqual(['2028-02-29']);
  });
});

describe('money', () => {
  const base = {
    currency: 'EUR',
    taxLabel: 'VAT',
    taxRate: '23',
    cardFeePercent: '1.5',
    cardFeeFixed: '0.25',
    volumetricDivisor: '5000',
  };

  it('stores percentages as basis points and the fixed fee in minor units of the currency', () => {
    expect(moneySchema.parse(base)).toEqual({
      currency: 'EUR',
      taxLabel: 'VAT',
      taxRate: 2300,
      cardFeePercent: 150,
      cardFeeFixedMinor: 25,
      volumetricDivisor: 5000,
    });
    expect(moneySchema.parse({ ...base, taxRate: '13,5' }).taxRate).toBe(1350);
    // ISO 4217 gives the yen no minor unit: 30 is thirty yen.
    expect(moneySchema.parse({ ...base, currency: 'JPY', cardFeeFixed: '30' }).cardFeeFixedMinor).toBe(30);
  });

  it('refuses rates out of range, more decimals than allowed, and negative fees', () => {
    expect(messages(moneySchema.safeParse({ ...base, taxRate: '101' }), 'taxRate')).not.toHaveLength(0);
    expect(messages(moneySchema.safeParse({ ...base, taxRate: '23.456' }), 'taxRate')).not.toHaveLength(0);
    expect(
      messages(moneySchema.safeParse({ ...base, cardFeePercent: '15' }), 'cardFeePercent'),
    ).not.toHaveLength(0);
    expect(
      messages(moneySchema.safeParse({ ...base, cardFeeFixed: '-0.25' }), 'cardFeeFixed'),
    ).not.toHaveLength(0);
    expect(
      messages(moneySchema.safeParse({ ...base, currency: 'JPY', cardFeeFixed: '0.5' }), 'cardFeeFixed'),
    ).not.toHaveLength(0);
    expect(
      messages(moneySchema.safeParse({ ...base, volumetricDivisor: '500' }), 'volumetricDivisor'),
    ).not.toHaveLength(0);
    expect(messages(moneySchema.safeParse({ ...base, taxLabel: 'V\u0000AT' }), 'taxLabel')).not.toHaveLength(
      0,
    );
  });
});

describe('shipping zones and rates', () => {
  it('reads a zone’s countries from one field, once each and in order', () => {
    expect(zoneSchema.parse({ name: 'Near Europe', countries: 'ie, FR  DE,FR' })).toEqual({
      name: 'Near Europe',
      countries: ['DE', 'FR', 'IE'],
    });
  });

  it('refuses a zone without countries or with codes that are not countries', () => {
    expect(messages(zoneSchema.safeParse({ name: 'Nowhere', countries: '' }), 'countries')).not.toHaveLength(
      0,
    );
    const wrong = zoneSchema.safeParse({ name: 'Odd', countries: 'IE,UK,XK' });
    expect(messages(wrong, 'countries')[0]).toContain('UK, XK');
  });

  const rate = {
    zoneId: '00000000-0000-4000-8000-000000000001',
    currency: 'EUR',
    label: 'Tracked post',
    upToGrams: '2000',
    amount: '9.50',
    minDays: '1',
    maxDays: '3',
  };

  it('reads a rate in minor units', () => {
    expect(rateSchema.parse(rate)).toMatchObject({
      upToGrams: 2000,
      amountMinor: 950,
      minDays: 1,
      maxDays: 3,
    });
  });

  it('refuses fewer most days than fewest days, and weights beyond a parcel', () => {
    expect(
      messages(rateSchema.safeParse({ ...rate, minDays: '5', maxDays: '3' }), 'maxDays'),
    ).not.toHaveLength(0);
    expect(messages(rateSchema.safeParse({ ...rate, upToGrams: '0' }), 'upToGrams')).not.toHaveLength(0);
    expect(messages(rateSchema.safeParse({ ...rate, upToGrams: '70001' }), 'upToGrams')).not.toHaveLength(0);
    expect(messages(rateSchema.safeParse({ ...rate, amount: '9.505' }), 'amount')).not.toHaveLength(0);
  });
});

describe('parcel sizes', () => {
  it('keeps to the table’s bounds', () => {
    const box = { name: 'Mask box', lengthMm: '340', widthMm: '320', heightMm: '160', emptyWeightG: '450' };
    expect(parcelSizeSchema.parse(box)).toEqual({
      name: 'Mask box',
      lengthMm: 340,
      widthMm: 320,
      heightMm: 160,
      emptyWeightG: 450,
    });
    expect(messages(parcelSizeSchema.safeParse({ ...box, heightMm: '9' }), 'heightMm')).not.toHaveLength(0);
    expect(messages(parcelSizeSchema.safeParse({ ...box, lengthMm: '34.5' }), 'lengthMm')).not.toHaveLength(
      0,
    );
    expect(
      messages(parcelSizeSchema.safeParse({ ...box, emptyWeightG: '-1' }), 'emptyWeightG'),
    ).not.toHaveLength(0);
  });
});

describe('carriers’ tracking links', () => {
  it('accepts an https link with the placeholder', () => {
    const carrier = {
      name: 'Harbour Post',
      trackingUrlTemplate: 'https://track.harbourpost.example/parcel?code={tracking}',
    };
    expect(carrierSchema.parse(carrier)).toEqual(carrier);
  });

  it('refuses a link that is not https, has no {tracking}, or is not a web address', () => {
    for (const template of [
      'http://track.harbourpost.example/{tracking}',
      'https://track.harbourpost.example/parcel',
      'javascript:alert(1)//{tracking}',
      'ftp://files.example/{tracking}',
      'https://{tracking}',
      'https://track .example/{tracking}',
      'HTTPS://TRACK.EXAMPLE/{TRACKING}',
    ]) {
      expect(trackingTemplateProblem(template), template).not.toBeNull();
      expect(
        carrierSchema.safeParse({ name: 'Quayline Couriers', trackingUrlTemplate: template }).success,
        template,
      ).toBe(false);
    }
  });

  it('refuses control characters in a carrier’s name', () => {
    expect(
      carrierSchema.safeParse({
        name: 'Quayline\tCouriers',
        trackingUrlTemplate: 'https://quayline.example/t/{tracking}',
      }).success,
    ).toBe(false);
  });
});

describe('customs', () => {
  it('takes an HS code of 6, 8 or 10 digits, with dots or spaces between them', () => {
    expect(hsCodeField.parse('3926.90')).toBe('392690');
    expect(hsCodeField.parse('3926 90 00')).toBe('39269000');
    expect(hsCodeField.parse('3926900000')).toBe('3926900000');
    expect(hsCodeField.parse('')).toBeNull();
  });

  it('refuses HS codes of other lengths or with letters', () => {
    for (const code of ['3926', '39269', '3926900', '392690000', '39269000001', 'ABCDEF', '3926-90']) {
      expect(hsCodeField.safeParse(code).success, code).toBe(false);
    }
  });

  it('reads the customs area as countries, and the country of origin as one', () => {
    const parsed = customsSchema.parse({
      area: 'IE, FR, DE',
      hsCode: '',
      description: 'Hand-painted resin masks',
      originCountry: 'IE',
    });
    expect(parsed).toEqual({
      area: ['DE', 'FR', 'IE'],
      hsCode: null,
      description: 'Hand-painted resin masks',
      originCountry: 'IE',
    });
    expect(customsSchema.parse({ area: '', hsCode: '', description: '', originCountry: '' })).toMatchObject({
      area: [],
      originCountry: null,
    });
    expect(
      messages(
        customsSchema.safeParse({ area: 'EU', hsCode: '', description: '', originCountry: '' }),
        'area',
      ),
    ).not.toHaveLength(0);
    expect(
      messages(
        customsSchema.safeParse({ area: '', hsCode: '', description: '', originCountry: 'UK' }),
        'originCountry',
      ),
    ).not.toHaveLength(0);
    expect(
      messages(
        customsSchema.safeParse({ area: '', hsCode: '', description: 'Masks\u0000', originCountry: '' }),
        'description',
      ),
    ).not.toHaveLength(0);
  });
});
