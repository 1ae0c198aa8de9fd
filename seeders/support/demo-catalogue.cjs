'use strict';

// The invented demo studio. Every name, price and measure here belongs to the demo alone.

const studio = {
  slug: 'marrowgate',
  name: 'Marrowgate Studio',
  time_zone: 'Europe/Dublin',
  currency: 'EUR',
  country: 'IE',
};

// Price differences in euro cents and paint hours per finish; a finish's hours are the demo's own
// estimates for one mask, not figures from elsewhere.
const finishes = {
  'old-bone': {
    name: 'Old Bone',
    description: 'Ivory base coat, a brown-grey wash worked into every recess and wiped back, matte seal.',
    price_difference_minor: 0,
    paint_hours: 3,
  },
  'bog-oak': {
    name: 'Bog Oak',
    description: 'Near-black brown with dry-brushed grain and a low wax sheen, like wood from the peat.',
    price_difference_minor: 1500,
    paint_hours: 3.5,
  },
  verdigris: {
    name: 'Verdigris',
    description: 'Copper metallic under a stippled blue-green patina, rubbed back on the high points.',
    price_difference_minor: 3500,
    paint_hours: 5,
  },
  'soot-and-gilt': {
    name: 'Soot & Gilt',
    description: 'Matte soot black with hand-laid imitation gold leaf on the ridges and edges.',
    price_difference_minor: 5500,
    paint_hours: 6,
  },
};

const materials =
  'Slush-cast polyurethane resin shell, about 3 mm thick, from a brush-on silicone mold in a fibreglass ' +
  'jacket. Foam padding at brow and cheeks, adjustable elastic strap, hand-painted acrylics under a matte ' +
  'polyurethane varnish.';
const care =
  'Dust with a soft dry brush. Wipe the inside with a damp cloth and let it dry fully. Keep out of hot ' +
  'cars and direct sun: the resin softens with heat. Store face up on its stand, not on the horns or ears.';

const designs = [
  {
    slug: 'ibex',
    name: 'Ibex',
    summary: 'A wild goat with swept-back, ridged horns and a narrow, bearded muzzle.',
    story:
      'Sculpted over a winter from sketches of a herd on a scree slope, the Ibex carries its horns back ' +
      'over the head so the mask stays balanced when worn. Each horn ridge is cut by hand in the clay.',
    base_price_minor: 24000,
    width_mm: 180, height_mm: 340, depth_mm: 150, weight_g: 560,
    status: 'published', position: 1,
    finishes: ['old-bone', 'bog-oak', 'verdigris', 'soot-and-gilt'],
  },
  {
    slug: 'hare',
    name: 'Hare',
    summary: 'Tall ears, one a little bent, and the soft round cheeks of a field hare.',
    story:
      'The Hare began as a small maquette for a midsummer play. Its ears are cast separately and set into ' +
      'the shell, so they stand upright without weighing on the wearer.',
    base_price_minor: 18500,
    width_mm: 170, height_mm: 360, depth_mm: 120, weight_g: 420,
    status: 'published', position: 2,
    finishes: ['old-bone', 'bog-oak', 'verdigris'],
  },
  {
    slug: 'moth',
    name: 'Moth',
    summary: 'Feathered antennae and broad, soft wing-brows with painted eye-spots.',
    story:
      'A night visitor at the workshop window. The wing-brows are thin, so the Moth is the lightest mask ' +
      'the studio casts, and the one that takes the longest to paint.',
    base_price_minor: 21000,
    width_mm: 260, height_mm: 280, depth_mm: 100, weight_g: 380,
    status: 'published', position: 3,
    // Soot & Gilt is still being tested on this design: a draft, so the shop must not show it.
    finishes: ['old-bone', 'verdigris', 'soot-and-gilt'],
    draftFinishes: ['soot-and-gilt'],
  },
  {
    slug: 'boar',
    name: 'Boar',
    summary: 'A heavy snout, upturned tusks and a bristled ridge running up the brow.',
    story:
      'The Boar is the heaviest sculpt in the studio, built up in oil clay over a week. The tusks are cast ' +
      'in a harder resin and fitted after trimming.',
    base_price_minor: 22500,
    width_mm: 200, height_mm: 250, depth_mm: 190, weight_g: 620,
    status: 'published', position: 4,
    finishes: ['old-bone', 'bog-oak', 'soot-and-gilt'],
  },
  {
    slug: 'ram',
    name: 'Ram',
    summary: 'Thick curled horns either side of a heavy brow and a long roman nose.',
    story: 'The Ram is still on the bench: the mold is being made and the first pulls are not yet painted.',
    base_price_minor: 26000,
    width_mm: 300, height_mm: 260, depth_mm: 170, weight_g: 640,
    // Not yet published: the shop must not show it.
    status: 'draft', position: 5,
    finishes: ['old-bone', 'bog-oak'],
  },
];

const views = [
  { view: 'front', label: 'seen from the front' },
  { view: 'three-quarter', label: 'seen from a three-quarter angle' },
];

/** The file name of one rendered photo, shared by the seeder and the renderer. */
function photoFileName(designSlug, finishSlug, view) {
  return `${designSlug}-${finishSlug}-${view}.webp`;
}

module.exports = { studio, finishes, designs, views, materials, care, photoFileName };
