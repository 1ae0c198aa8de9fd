'use strict';

// The demo studio's contact details, carriers, boxes and customs defaults. Every name, address and link here
// is invented for the demo: the carriers do not exist and their tracking links lead nowhere.
const { eu } = require('./demo-shipping.cjs');

const contact = {
  contact_email: 'hello@marrowgate.example',
  postal_address: 'Marrowgate Studio\nUnit 4, Tannery Yard\nMarrowgate\nIreland',
};

const carriers = [
  { name: 'Harbour Post', tracking_url_template: 'https://track.harbourpost.example/parcel?code={tracking}' },
  { name: 'Quayline Couriers', tracking_url_template: 'https://quayline.example/t/{tracking}' },
];

// The boxes the studio packs in: inner sizes and the weight of the empty box with its padding.
const parcelSizes = [
  { name: 'Mask box', length_mm: 340, width_mm: 320, height_mm: 160, empty_weight_g: 450 },
  { name: 'Large mask box', length_mm: 400, width_mm: 360, height_mm: 200, empty_weight_g: 600 },
];

// Customs: the demo studio ships from Ireland, inside the EU's customs union (the 27 member states, as
// recalled from memory), so only parcels leaving the EU need a declaration. The HS code is the demo studio's
// own choice (3926.90, "other articles of plastics", recalled from memory); a real studio asks its customs
// authority which heading its masks fall under.
const customs = {
  customs_area: eu.includes('IE') ? eu : [...eu, 'IE'],
  customs_hs_code: '392690',
  customs_description: 'Hand-painted resin masks',
  customs_origin_country: 'IE',
};

module.exports = { contact, carriers, parcelSizes, customs };
