'use strict';

// The demo studio's checkout settings. Rates, zones and parcel sizes are invented for the demo; the
// 23% rate is Ireland's standard VAT rate as recalled from memory (check it before relying on it).
const taxRateBasisPoints = 2300;

// Each mask ships alone in a box with 30 mm of padding on every side; box and padding weigh 450 g.
const padMm = 30;
const packingG = 450;

const eu = ['AT', 'BE', 'BG', 'HR', 'CY', 'CZ', 'DK', 'EE', 'FI', 'FR', 'DE', 'GR', 'HU', 'IT', 'LV', 'LT', 'LU', 'MT', 'NL', 'PL', 'PT', 'RO', 'SK', 'SI', 'ES', 'SE'];

// Labels are plain service levels, not carriers: the studio picks its carriers in the workshop later.
const zones = [
  {
    name: 'Ireland',
    countries: ['IE'],
    rates: [
      { label: 'Tracked post', up_to_grams: 2000, amount_minor: 950, min_days: 1, max_days: 3 },
      { label: 'Tracked post', up_to_grams: 5000, amount_minor: 1250, min_days: 1, max_days: 3 },
      { label: 'Tracked post', up_to_grams: 10000, amount_minor: 1600, min_days: 1, max_days: 3 },
      { label: 'Next-day courier', up_to_grams: 10000, amount_minor: 2400, min_days: 1, max_days: 1 },
    ],
  },
  {
    name: 'European Union',
    countries: eu,
    rates: [
      { label: 'Tracked post', up_to_grams: 2000, amount_minor: 1800, min_days: 3, max_days: 7 },
      { label: 'Tracked post', up_to_grams: 5000, amount_minor: 2600, min_days: 3, max_days: 7 },
      { label: 'Tracked post', up_to_grams: 10000, amount_minor: 3400, min_days: 3, max_days: 7 },
      { label: 'Express courier', up_to_grams: 10000, amount_minor: 5200, min_days: 1, max_days: 3 },
    ],
  },
  {
    name: 'United Kingdom',
    countries: ['GB'],
    rates: [
      { label: 'Tracked post', up_to_grams: 5000, amount_minor: 2400, min_days: 3, max_days: 6 },
      { label: 'Tracked post', up_to_grams: 10000, amount_minor: 3200, min_days: 3, max_days: 6 },
      { label: 'Express courier', up_to_grams: 10000, amount_minor: 4800, min_days: 1, max_days: 3 },
    ],
  },
  {
    name: 'Rest of the world',
    countries: ['US', 'CA', 'AU', 'NZ', 'JP', 'CH', 'NO', 'IS'],
    rates: [
      { label: 'Tracked post', up_to_grams: 5000, amount_minor: 4200, min_days: 7, max_days: 15 },
      { label: 'Tracked post', up_to_grams: 10000, amount_minor: 5900, min_days: 7, max_days: 15 },
      { label: 'Express courier', up_to_grams: 10000, amount_minor: 8900, min_days: 2, max_days: 5 },
    ],
  },
];

module.exports = { taxRateBasisPoints, padMm, packingG, zones, eu };
