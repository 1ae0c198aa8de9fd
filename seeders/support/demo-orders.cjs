'use strict';

// The sold-out Autumn batch's orders, so the production board, the orders table and the order pages show
// work in every stage. Buyers, names and addresses are invented; e-mails use reserved example domains.
// Times are offsets from the moment the batch opened: it sold out within minutes, the work came after.
const MINUTE = 60_000;
const HOUR = 60 * MINUTE;
const DAY = 24 * HOUR;

const { carriers } = require('./demo-settings.cjs');

const batchName = 'Autumn batch';
const makers = { hand: 'kit@marrowgate.example', owner: 'ines@marrowgate.example' };

// When a mask reached each stage, in days after the batch opened (each order a few hours apart).
const stageDays = { cast: 11, trimmed: 15, painted: 22, packed: 30, shipped: 33 };
const failedAfterDays = 1;

/**
 * One order per buyer, one mask each: the batch allowed one per buyer. `holdAt` is when the buyer held the
 * mask and `paidAfter` how long paying took, both in seconds; `stage` is where the mask is now.
 */
const orders = [
  { email: 'orla.venn@example.com', name: 'Orla Venn', finish: 'soot-and-gilt', holdAt: 4, paidAfter: 51, stage: 'shipped', shipping: 'Tracked post', tracking: 'HP 2207 1184 IE',
    address: { line1: '12 Tallow Lane', city: 'Galway', postal_code: 'H91 X0Q1', country: 'IE' } },
  { email: 'bram.okkel@example.net', name: 'Bram Okkel', finish: 'old-bone', holdAt: 6, paidAfter: 64, stage: 'shipped', shipping: 'Tracked post', tracking: 'HP 2207 1191 IE',
    address: { line1: 'Lindengracht 300', city: 'Amsterdam', postal_code: '1015 ZZ', country: 'NL' } },
  { email: 'sive.marlow@example.com', name: 'Sive Marlow', finish: 'bog-oak', holdAt: 9, paidAfter: 78, stage: 'packed', shipping: 'Next-day courier',
    address: { line1: '3 Ropewalk Terrace', line2: 'Flat 2', city: 'Cork', postal_code: 'T12 Z9Z9', country: 'IE' } },
  { email: 'dara.fenwick@example.org', name: 'Dara Fenwick', finish: 'old-bone', holdAt: 11, paidAfter: 92, stage: 'painted', shipping: 'Tracked post',
    address: { line1: '41 Chandler Quay', city: 'Dublin', postal_code: 'D08 Q0Q0', country: 'IE' },
    refund: { amount: 'shipping', afterDays: 36, reason: 'other', note: 'Shipping paid back: the batch ships after its ship-by date.' } },
  { email: 'lise@haverkamp.example', name: 'Lise Haverkamp', finish: 'soot-and-gilt', holdAt: 15, paidAfter: 70, stage: 'painted', shipping: 'Express courier',
    address: { line1: 'Kesselstraße 9', city: 'Leipzig', postal_code: '04109', country: 'DE' } },
  { email: 'cathal.brine@example.com', name: 'Cathal Brine', finish: 'bog-oak', holdAt: 22, paidAfter: 105, stage: 'trimmed', shipping: 'Tracked post',
    address: { line1: 'Mill House, Weir Road', city: 'Kilkenny', postal_code: 'R95 Y0Y0', country: 'IE' } },
  { email: 'noor.ashgrove@example.org', name: 'Noor Ashgrove', finish: 'old-bone', holdAt: 30, paidAfter: 88, stage: 'trimmed', shipping: 'Tracked post',
    address: { line1: '7 Kiln Yard', city: 'Leeds', postal_code: 'LS1 0XX', country: 'GB' } },
  { email: 'aoife.tansy@example.com', name: 'Aoife Tansy', finish: 'bog-oak', holdAt: 41, paidAfter: 120, stage: 'cast', shipping: 'Tracked post',
    address: { line1: '28 Saddler Street', city: 'Limerick', postal_code: 'V94 W0W0', country: 'IE' } },
  { email: 'remy@castellan.example', name: 'Rémy Castellan', finish: 'old-bone', holdAt: 58, paidAfter: 97, stage: 'cast', shipping: 'Tracked post',
    address: { line1: '5 rue des Fondeurs', city: 'Lyon', postal_code: '69002', country: 'FR' } },
  { email: 'fintan.oakes@example.com', name: 'Fintan Oakes', finish: 'soot-and-gilt', holdAt: 75, paidAfter: 134, stage: 'failed_casting', shipping: 'Tracked post',
    address: { line1: '2 Cooper Lane', city: 'Sligo', postal_code: 'F91 V0V0', country: 'IE' } },
  { email: 'wren.halloway@example.net', name: 'Wren Halloway', finish: 'bog-oak', holdAt: 126, paidAfter: 151, stage: 'to_cast', shipping: 'Tracked post',
    address: { line1: '880 Larch Avenue', city: 'Portland', state: 'OR', postal_code: '97201', country: 'US' } },
  { email: 'maeve.corrigan@example.com', name: 'Maeve Corrigan', finish: 'old-bone', holdAt: 410, paidAfter: 163, stage: 'to_cast', shipping: 'Tracked post',
    address: { line1: '16 Tanner Row', city: 'Waterford', postal_code: 'X91 T0T0', country: 'IE' } },
];

// ---- Shipping: the shipped orders went with the demo's first carrier; the link is kept as it was then ----

const shippingCarrier = carriers.find((carrier) => carrier.name === 'Harbour Post');

/** The same rule as lib/settings/shipping-rules.ts `trackingUrl`: the template with the number, percent-encoded, in place. */
function trackingUrl(template, trackingNumber) {
  return template.split('{tracking}').join(encodeURIComponent(trackingNumber));
}

/** What a shipped demo order records of its parcel: carrier, tracking number and link, and when it left. */
function shipmentOf(buyer, shippedAt) {
  if (buyer.stage !== 'shipped') return { carrier_name: null, tracking_number: null, tracking_url: null, shipped_at: null };
  if (!buyer.tracking) throw new Error(`The shipped demo order of ${buyer.email} needs a tracking number.`);
  return {
    carrier_name: shippingCarrier.name,
    tracking_number: buyer.tracking,
    tracking_url: trackingUrl(shippingCarrier.tracking_url_template, buyer.tracking),
    shipped_at: shippedAt,
  };
}

// ---- Pricing, the same rules as lib/checkout/pricing.ts (that file is TypeScript; seeders are plain CommonJS) ----

/** max(actual, volumetric) in whole grams, volumetric rounded up: mm³ / divisor. One box per mask, stacked. */
function chargeableWeightG(parcel, quantity, divisor) {
  const mm3 = BigInt(parcel.lengthMm) * BigInt(parcel.widthMm) * BigInt(parcel.heightMm * quantity);
  const d = BigInt(divisor);
  return Math.max(parcel.weightG * quantity, Number((mm3 + d - 1n) / d));
}

/** The cheapest rate of that label whose tier holds the weight, or null (first listed wins a tie). */
function shippingRateFor(rates, label, chargeableG) {
  let best = null;
  for (const rate of rates) {
    if (rate.label !== label || rate.up_to_grams < chargeableG) continue;
    if (!best || rate.amount_minor < best.amount_minor) best = rate;
  }
  return best;
}

/** Tax contained in a gross amount, half-up: round(gross × bp / (10000 + bp)). */
function includedTaxMinor(grossMinor, rateBasisPoints) {
  const bp = BigInt(rateBasisPoints);
  const d = 10_000n + bp;
  return Number((2n * BigInt(grossMinor) * bp + d) / (2n * d));
}

module.exports = { batchName, makers, stageDays, failedAfterDays, orders, shippingCarrier, trackingUrl, shipmentOf, chargeableWeightG, shippingRateFor, includedTaxMinor, MINUTE, HOUR, DAY };
