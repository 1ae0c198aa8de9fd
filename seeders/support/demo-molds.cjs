'use strict';

// The demo studio's molds and working calendar. Invented demo data: every mold, count and amount here
// belongs to the demo alone. Dates are relative to the day the seed runs, so the demo never looks stale.

// Per published design, two or three molds: pulls so far and expected life (some tens of pulls for a
// brush-on silicone mold, common practice). Hare A is near the end of its life (4 of 40 left), Ibex A is
// already retired, so the molds page shows each state.
const molds = {
  ibex: [
    { label: 'Ibex A', madeDaysAgo: 420, pullsSoFar: 47, expectedLifePulls: 45, retiredDaysAgo: 90, notes: 'Tore at the left horn tip; kept as a reference.' },
    { label: 'Ibex B', madeDaysAgo: 150, pullsSoFar: 22, expectedLifePulls: 40, notes: '' },
    { label: 'Ibex C', madeDaysAgo: 40, pullsSoFar: 6, expectedLifePulls: 40, notes: 'Thicker print coat at the horn ridges.' },
  ],
  hare: [
    { label: 'Hare A', madeDaysAgo: 300, pullsSoFar: 36, expectedLifePulls: 40, notes: 'Ear sockets starting to lose their edge.' },
    { label: 'Hare B', madeDaysAgo: 95, pullsSoFar: 14, expectedLifePulls: 40, notes: '' },
  ],
  moth: [
    // The Moth's thin wing-brows pull hard on the silicone, so its molds are expected to give fewer pulls.
    { label: 'Moth A', madeDaysAgo: 200, pullsSoFar: 18, expectedLifePulls: 35, notes: '' },
    { label: 'Moth B', madeDaysAgo: 60, pullsSoFar: 9, expectedLifePulls: 35, notes: '' },
  ],
  boar: [
    { label: 'Boar A', madeDaysAgo: 260, pullsSoFar: 30, expectedLifePulls: 45, notes: '' },
    { label: 'Boar B', madeDaysAgo: 120, pullsSoFar: 11, expectedLifePulls: 45, notes: 'Tusks are cast separately, not in this mold.' },
  ],
};

// Marrowgate works Monday to Friday, 7 hours a day (invented).
const calendar = { workingDays: [1, 2, 3, 4, 5], hoursPerDay: 7 };

// The studio's own money settings for the planner, in euro cents: invented demo figures, not any supplier's
// or payment provider's prices.
const plannerMoney = {
  resinPricePerKgMinor: 2800,
  paintCostPerMaskMinor: 650,
  packagingPerMaskMinor: 480,
  cardFeeBasisPoints: 160,
  cardFeeFixedMinor: 22,
};

const DAY = 86_400_000;
const iso = (ms) => new Date(ms).toISOString().slice(0, 10);
const utc = (y, m, d) => Date.UTC(y, m - 1, d);
const weekday = (ms) => new Date(ms).getUTCDay(); // 0 = Sunday

function firstMonday(y, m) {
  let ms = utc(y, m, 1);
  while (weekday(ms) !== 1) ms += DAY;
  return ms;
}
function lastMonday(y, m) {
  let ms = utc(y, m + 1, 1) - DAY;
  while (weekday(ms) !== 1) ms -= DAY;
  return ms;
}
function stBrigid(y) {
  // From 2023: the first Monday in February, or 1 February when that is a Friday.
  return weekday(utc(y, 2, 1)) === 5 ? utc(y, 2, 1) : firstMonday(y, 2);
}

/**
 * Irish public holidays from fixed rules, as recalled from memory (not checked against the official list;
 * Easter Monday and substitute days are left out). Demo data: the studio marks these as days it does not work.
 */
function irishHolidays(year) {
  return [
    utc(year, 1, 1),
    stBrigid(year),
    utc(year, 3, 17),
    firstMonday(year, 5),
    firstMonday(year, 6),
    firstMonday(year, 8),
    lastMonday(year, 10),
    utc(year, 12, 25),
    utc(year, 12, 26),
  ];
}

/** The holidays in the six months after `now`, so the planner's schedules cross a couple of them. */
function upcomingHolidays(now) {
  const start = utc(now.getUTCFullYear(), now.getUTCMonth() + 1, now.getUTCDate());
  const end = start + 183 * DAY;
  const year = now.getUTCFullYear();
  return [...irishHolidays(year), ...irishHolidays(year + 1)].filter((ms) => ms >= start && ms < end).map(iso);
}

module.exports = { molds, calendar, plannerMoney, upcomingHolidays, irishHolidays, DAY };
