'use strict';

// The demo's drops, relative to the moment they are seeded (or re-timed when the demo starts).
const MINUTE = 60_000;
const DAY = 24 * 60 * MINUTE;

const drops = [
  {
    design: 'ibex',
    name: 'Winter batch',
    perBuyerLimit: 1,
    holdMinutes: 10,
    earlyAccess: null,
    opens: -60 * MINUTE,
    closes: 3 * DAY,
    shipByDays: 42,
    stock: { 'old-bone': 6, 'bog-oak': 4, verdigris: 3, 'soot-and-gilt': 2 },
  },
  {
    design: 'hare',
    name: 'First light',
    perBuyerLimit: 2,
    holdMinutes: 10,
    earlyAccess: 2 * MINUTE,
    opens: 5 * MINUTE,
    closes: 3 * DAY,
    shipByDays: 49,
    stock: { 'old-bone': 8, 'bog-oak': 6, verdigris: 6 },
    earlyAccessFor: ['juno@example.com'],
    retimeOnDemoStart: true,
  },
  {
    design: 'boar',
    name: 'Autumn batch',
    perBuyerLimit: 1,
    holdMinutes: 10,
    earlyAccess: null,
    opens: -40 * DAY,
    closes: -37 * DAY,
    shipByDays: -5,
    stock: { 'old-bone': 5, 'bog-oak': 4, 'soot-and-gilt': 3 },
    soldOut: true,
  },
];

const eyeOpenings = {
  ibex: { width: 36, spacing: 64 },
  hare: { width: 34, spacing: 62 },
  moth: { width: 40, spacing: 66 },
  boar: { width: 32, spacing: 66 },
  ram: { width: 34, spacing: 64 },
};

function at(offsetMs, now = Date.now()) {
  return new Date(now + offsetMs);
}

module.exports = { drops, eyeOpenings, at, MINUTE, DAY };
