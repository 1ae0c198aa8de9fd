'use strict';
// Demo product photographs for the seeders, drawn as vector "studio shots" of
// cast-resin animal masks. Pure and deterministic: every bit of jitter comes
// from a PRNG seeded by the design+finish slugs, so re-seeding a database
// yields byte-identical images (and stable ETags / CDN caches).

const W = 1200;
const H = 1500;
const CX = W / 2;

const DESIGNS = [
  { slug: 'ibex', name: 'Ibex' },
  { slug: 'hare', name: 'Hare' },
  { slug: 'moth', name: 'Moth' },
  { slug: 'boar', name: 'Boar' },
  { slug: 'ram', name: 'Ram' },
];

const FINISHES = [
  { slug: 'old-bone', name: 'Old Bone' },
  { slug: 'bog-oak', name: 'Bog Oak' },
  { slug: 'verdigris', name: 'Verdigris' },
  { slug: 'soot-and-gilt', name: 'Soot & Gilt' },
];

// One paint treatment per finish. Every mask part is painted from the same
// table, so a design never needs to know which finish it is wearing.
//   base:   lit -> mid -> turned-away colour of the shared light gradient
//   wash:   what pools in recesses and under edges (the "antiquing" glaze)
//   side:   the cut thickness of the shell, seen at eye holes and turned edges
//   high:   what shows on rubbed high points (polish, sheen, bare copper)
//   accent: stops of a banded gradient used for rims and ridges (gold leaf etc.)
//   tip:    colour fading in towards horn / ear tips
//   tex:    feTurbulence recipe; layers are [colour, gain, offset] so that
//           alpha = gain * noise + offset picks the light or dark side of it
const PALETTES = {
  'old-bone': {
    base: ['#f7f0e0', '#e0cfac', '#a98e67'], wash: '#5b4a39', washAlpha: 0.6,
    side: '#9a8262', hole: '#241b14', high: '#fffcf4', highAlpha: 0.75,
    accent: ['#6f5840', '#98805f', '#5f4a35'], rimAlpha: 0.5, rimWidth: 4, ridgeAlpha: 0.55,
    tip: '#7a5f42', tipAlpha: 0.75, strap: '#5b3f2b',
    tex: { type: 'fractalNoise', freq: '0.014', oct: 3,
      layers: [['#6a553e', -1.8, 0.8], ['#fffaf0', 1.8, -0.82]] },
  },
  'bog-oak': {
    base: ['#6a4a34', '#3b281c', '#1a110b'], wash: '#080403', washAlpha: 0.7,
    side: '#24170f', hole: '#060302', high: '#d4a373', highAlpha: 0.32,
    accent: ['#1c110a', '#7a5238', '#2a1a10'], rimAlpha: 0.6, rimWidth: 3, ridgeAlpha: 0.8,
    tip: '#140c07', tipAlpha: 0.5, strap: '#2a1d15',
    // Strongly anisotropic turbulence: fast across, slow along = grain lines.
    tex: { type: 'turbulence', freq: '0.045 0.0035', oct: 2,
      layers: [['#0c0704', -4.5, 0.85], ['#8a6448', 3.2, -1.25]] },
  },
  verdigris: {
    base: ['#9fd3bd', '#5c9f8b', '#2c6459'], wash: '#17352f', washAlpha: 0.6,
    side: '#7a4a2a', hole: '#0f1c1a', high: '#c27a45', highAlpha: 0.9,
    accent: ['#6b3519', '#c57a48', '#f0b889', '#93532c'], rimAlpha: 0.95, rimWidth: 6, ridgeAlpha: 0.9,
    tip: '#b86d3c', tipAlpha: 0.9, strap: '#3b2a20',
    tex: { type: 'fractalNoise', freq: '0.022', oct: 3,
      layers: [['#cfeadb', 4, -2.2], ['#1d463e', -3.5, 1.55]] },
  },
  'soot-and-gilt': {
    base: ['#3a3633', '#1f1d1b', '#0c0b0a'], wash: '#000000', washAlpha: 0.6,
    side: '#2a2724', hole: '#040404', high: '#8a8178', highAlpha: 0.25,
    accent: ['#6d4b15', '#c9a04a', '#fff0b5', '#b8892f', '#7a5518', '#e9c76e'],
    rimAlpha: 1, rimWidth: 8, ridgeAlpha: 1, tip: '#e2bb5c', tipAlpha: 1, strap: '#141210',
    tex: { type: 'fractalNoise', freq: '0.06', oct: 2,
      layers: [['#5a534c', 1.8, -0.8], ['#000000', -1.8, 0.8]] },
  },
};

// ---- small maths helpers ---------------------------------------------------

const f = (n) => Math.round(n * 10) / 10;
const X = (s, dx) => CX + s * dx; // s = -1 left, +1 right: one code path for both sides

function hash(str) { // FNV-1a, only used to seed the PRNG and feTurbulence
  let h = 2166136261;
  for (const c of str) h = Math.imul(h ^ c.charCodeAt(0), 16777619);
  return h >>> 0;
}

function prng(seed) { // mulberry32
  let a = seed;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function bez(p0, p1, p2, p3, n = 40) { // sample a cubic as a polyline
  const out = [];
  for (let i = 0; i <= n; i++) {
    const t = i / n, u = 1 - t;
    out.push([0, 1].map((j) => u * u * u * p0[j] + 3 * u * u * t * p1[j] + 3 * u * t * t * p2[j] + t * t * t * p3[j]));
  }
  return out;
}

// Frame (point, unit tangent, unit normal) at every sample of a polyline.
function frames(pts) {
  return pts.map((p, i) => {
    const a = pts[Math.max(0, i - 1)], b = pts[Math.min(pts.length - 1, i + 1)];
    const dx = b[0] - a[0], dy = b[1] - a[1], l = Math.hypot(dx, dy) || 1;
    return { p, t: [dx / l, dy / l], n: [-dy / l, dx / l] };
  });
}

const poly = (pts) => 'M' + pts.map((p) => f(p[0]) + ' ' + f(p[1])).join('L') + 'Z';

// Outline of a tapered tube (horn, ear, tusk) around a centreline; `shift`
// slides it sideways (as a fraction of width) for lit/shaded bands on it.
function tubeD(pts, wf, scale = 1, shift = 0) {
  const fr = frames(pts), L = [], R = [];
  fr.forEach(({ p, n }, i) => {
    const t = i / (fr.length - 1), w = wf(t, i), o = shift * w;
    L.push([p[0] + n[0] * (o + (w * scale) / 2), p[1] + n[1] * (o + (w * scale) / 2)]);
    R.push([p[0] + n[0] * (o - (w * scale) / 2), p[1] + n[1] * (o - (w * scale) / 2)]);
  });
  return poly(L.concat(R.reverse()));
}

// A bilaterally symmetric outline from its left half: cubic segments from the
// top centre down to the bottom centre; the right half is the mirror, reversed.
function symPath(start, segs) {
  const m = (x) => f(W - x);
  let d = `M${start[0]} ${start[1]}`;
  segs.forEach((s) => { d += `C${s.join(' ')}`; });
  const ends = [start].concat(segs.map((s) => [s[4], s[5]]));
  for (let i = segs.length - 1; i >= 0; i--) {
    const s = segs[i], e = ends[i];
    d += `C${m(s[2])} ${s[3]} ${m(s[0])} ${s[1]} ${m(e[0])} ${e[1]}`;
  }
  return d + 'Z';
}

const ell = (cx, cy, rx, ry) =>
  `M${f(cx - rx)} ${f(cy)}A${f(rx)} ${f(ry)} 0 1 0 ${f(cx + rx)} ${f(cy)}A${f(rx)} ${f(ry)} 0 1 0 ${f(cx - rx)} ${f(cy)}Z`;

// ---- the painting kit handed to each design -------------------------------

function kit(pal, seed) {
  const rand = prng(seed);
  const defs = [];
  const shapes = []; // every painted silhouette, reused for depth + cast shadow
  let uid = 0;

  // Soft light and shadow are radial-gradient ellipses, not blurred shapes:
  // each librsvg filter costs a canvas-sized pass, and these appear by dozens.
  const blob = (cx, cy, rx, ry, grad, a) =>
    `<ellipse cx="${f(cx)}" cy="${f(cy)}" rx="${f(rx)}" ry="${f(ry)}" fill="url(#${grad})" opacity="${f(a * 100) / 100}"/>`;
  const hi = (cx, cy, rx, ry, a = 1) => blob(cx, cy, rx, ry, 'hiG', pal.highAlpha * a);
  const shade = (cx, cy, rx, ry, a = 1) => blob(cx, cy, rx, ry, 'shG', pal.washAlpha * a);
  const holes = []; // openings are re-stamped above the single texture pass
  const stroke = (d, w, paint = 'url(#acc)', a = pal.ridgeAlpha) =>
    `<path d="${d}" fill="none" stroke="${paint}" stroke-width="${w}" stroke-linecap="round" stroke-linejoin="round" opacity="${a}"/>`;

  // A painted resin part: shared light gradient, the finish's surface texture,
  // a recess wash, clipped modelling on top, then the rim where paint wears.
  function mat(d, { inner = '', wash = true, rim = 1 } = {}) {
    shapes.push(d);
    const id = `c${uid++}`;
    defs.push(`<clipPath id="${id}"><path d="${d}"/></clipPath>`);
    return `<path d="${d}" fill="url(#base)"/>` +
      `<g clip-path="url(#${id})">${wash ? `<path d="${d}" fill="url(#wash)"/>` : ''}${inner}</g>` +
      (rim ? stroke(d, pal.rimWidth * rim, 'url(#acc)', pal.rimAlpha) : '');
  }

  // Horns, ears, tusks: a part shaped along a centreline, with a lit band on
  // the upper side, shade on the lower, growth ridges and a coloured tip.
  function tube(pts, wf, { ridges = 0, from = 0.08, to = 0.92, tip = 0.55, bulge = 0.35, inner = '', rim = 1 } = {}) {
    const fr = frames(pts), last = fr[fr.length - 1].p, mid = fr[Math.round(tip * (fr.length - 1))].p;
    // Nested translucent bands fake a soft falloff without a blur filter.
    const band = (fill, a, shift, scales) => scales.map((sc) =>
      `<path d="${tubeD(pts, wf, sc, shift)}" fill="${fill}" opacity="${f((a * 100) / scales.length) / 100}"/>`).join('');
    let extra = band(pal.wash, pal.washAlpha * 1.2, 0.34, [0.5, 0.36, 0.22]) + band(pal.high, pal.highAlpha, -0.22, [0.3, 0.18, 0.08]);
    for (let j = 0; j < ridges; j++) {
      const i = Math.round((from + ((to - from) * j) / Math.max(1, ridges - 1)) * (fr.length - 1));
      const { p, t, n } = fr[i], w = wf(i / (fr.length - 1), i) / 2, b = w * 2 * bulge;
      const arc = (o) => `M${f(p[0] + n[0] * w + t[0] * o)} ${f(p[1] + n[1] * w + t[1] * o)}` +
        `Q${f(p[0] + t[0] * (b + o))} ${f(p[1] + t[1] * (b + o))} ${f(p[0] - n[0] * w + t[0] * o)} ${f(p[1] - n[1] * w + t[1] * o)}`;
      extra += stroke(arc(-3), f(Math.max(1.5, w * 0.09)), pal.high, pal.highAlpha * 0.7) + stroke(arc(0), f(Math.max(2, w * 0.14)));
    }
    if (tip < 1) {
      const id = `t${uid++}`;
      defs.push(`<linearGradient id="${id}" gradientUnits="userSpaceOnUse" x1="${f(mid[0])}" y1="${f(mid[1])}" x2="${f(last[0])}" y2="${f(last[1])}">` +
        `<stop offset="0" stop-color="${pal.tip}" stop-opacity="0"/><stop offset="0.8" stop-color="${pal.tip}" stop-opacity="${pal.tipAlpha}"/></linearGradient>`);
      extra += `<path d="${tubeD(pts, wf)}" fill="url(#${id})"/>`;
    }
    return mat(tubeD(pts, wf), { inner: extra + inner, wash: false, rim });
  }

  // An eye opening cut through the shell: a soft socket, the dark hollow, and
  // the lit lower wall of the cut that tells you the shell has thickness.
  function eye(cx, cy, w, h, tilt) {
    const l = cx - w / 2, r = cx + w / 2;
    const hole = `M${f(l)} ${cy}Q${f(cx - w * 0.1)} ${f(cy - h * 1.1)} ${f(r)} ${f(cy - h * 0.1)}Q${f(cx)} ${f(cy + h * 0.9)} ${f(l)} ${cy}Z`;
    const wall = `M${f(r - 8)} ${f(cy - h * 0.02)}Q${f(cx)} ${f(cy + h * 0.62)} ${f(l + 8)} ${f(cy)}`;
    const g = (inner) => `<g transform="rotate(${tilt} ${cx} ${cy})">${inner}</g>`;
    const cut = `<path d="${hole}" fill="url(#hole)"/>${stroke(wall, 7, pal.side, 0.9)}` +
      stroke(hole, f(pal.rimWidth * 0.8), 'url(#acc)', pal.rimAlpha);
    holes.push(g(cut));
    return g(shade(cx, cy - h * 0.1, w * 0.8, h * 1.45, 1.1) + cut);
  }
  const hole = (svg) => { holes.push(svg); return svg; };
  // The strap hint: where it's tied on at the temple, a short bend of it shows
  // before it turns away behind the shell.
  const back = [];
  const strap = (dx, y) => both((s) => {
    const d = `M${X(s, dx - 30)} ${y}C${X(s, dx + 30)} ${y - 6} ${X(s, dx + 52)} ${y + 30} ${X(s, dx + 38)} ${y + 70}Q${X(s, dx + 24)} ${y + 100} ${X(s, dx - 20)} ${y + 120}`;
    back.push(stroke(d, 14, pal.strap, 1) + stroke(d, 3, '#fff', 0.14));
    return '';
  });
  const tipSpot = (cx, cy, r) => blob(cx, cy, r, r, 'tipG', pal.tipAlpha);

  const both = (fn) => fn(-1) + fn(1);
  return { pal, rand, defs, shapes, holes, back, mat, tube, eye, hole, strap, tipSpot, hi, shade, stroke, both };
}

// ---- the designs -----------------------------------------------------------
// Each returns its parts back-to-front. Coordinates live in the 1200x1500 box
// with the face centred on x = 600; `s` picks the side for mirrored parts.

function ibex(k) {
  const shell = symPath([600, 520], [
    [525, 518, 445, 535, 410, 595], [378, 655, 384, 770, 405, 850],
    [428, 940, 500, 1055, 530, 1150], [546, 1198, 574, 1216, 600, 1216]]);
  const horn = (s) => bez([X(s, 58), 620], [X(s, 78), 390], [X(s, 150), 205], [X(s, 330), 128], 60);
  const beard = 'M560 1190Q600 1205 640 1190Q636 1260 606 1318Q598 1290 586 1270Q566 1240 560 1190Z';
  return [
    k.strap(190, 800, 1318),
    k.both((s) => k.tube(bez([X(s, 150), 650], [X(s, 220), 600], [X(s, 290), 585], [X(s, 345), 610], 20),
      (t) => 64 * Math.sin(Math.PI * (0.25 + 0.75 * t)) ** 0.7, { tip: 0.7 })),
    k.both((s) => k.tube(horn(s), (t) => 96 * (1 - t) ** 0.85 + 10, { ridges: 17, to: 0.88, bulge: 0.3 })),
    k.mat(shell, { inner: k.hi(600, 610, 150, 45) + k.hi(600, 930, 34, 190, 0.8) +
      k.both((s) => k.shade(X(s, 75), 980, 40, 170, 0.55) + k.hi(X(s, 165), 880, 40, 60, 0.5)) }),
    k.both((s) => k.eye(X(s, 115), 790, 118, 50, s * -14)),
    k.stroke('M585 1150Q600 1162 615 1150', 4, 'url(#acc)'),
    k.both((s) => k.hole(k.stroke(`M${X(s, 22)} 1120Q${X(s, 30)} 1135 ${X(s, 20)} 1142`, 6, k.pal.hole, 0.85))),
    k.mat(beard, { inner: [0, 1, 2, 3, 4].map((i) => k.stroke(`M${580 + i * 10} 1205Q${585 + i * 9} 1260 ${600 + (i - 2) * 3} ${1300 - Math.abs(i - 2) * 18}`, 3)).join('') }),
  ].join('');
}

function hare(k) {
  const shell = symPath([600, 545], [
    [515, 542, 452, 575, 430, 645], [410, 712, 392, 800, 372, 880],
    [352, 965, 368, 1060, 430, 1120], [490, 1170, 550, 1178, 600, 1176]]);
  const ear = (t) => 132 * Math.sin(Math.PI * (0.14 + 0.86 * t)) ** 0.55;
  const ears = [bez([525, 640], [505, 400], [488, 220], [462, 70], 48),
    bez([675, 640], [702, 400], [735, 255], [860, 235], 48)]; // the right ear flops outward
  const inner = (pts) => [0.56, 0.46, 0.34].map((sc) => `<path d="${tubeD(pts, ear, sc, 0.03)}" fill="${k.pal.wash}" opacity="${f(k.pal.washAlpha * 30) / 100}"/>`).join('');
  return [
    k.strap(215, 800, 1178),
    ears.map((pts) => k.tube(pts, ear, { tip: 0.7, inner: inner(pts) })).join(''),
    k.mat(shell, { inner: k.hi(600, 640, 110, 50) + k.both((s) => k.hi(X(s, 160), 950, 90, 80, 0.7) + k.shade(X(s, 95), 1110, 60, 50, 0.5)) }),
    k.both((s) => k.eye(X(s, 122), 790, 108, 56, s * -6)),
    k.both((s) => k.mat(ell(X(s, 44), 1048, 54, 46), { inner: k.hi(X(s, 38), 1030, 26, 18) })),
    k.mat('M566 982Q600 968 634 982Q620 1012 600 1018Q580 1012 566 982Z', { inner: `<rect x="500" y="900" width="200" height="200" fill="${k.pal.tip}" opacity="${k.pal.tipAlpha}"/>` }),
    k.stroke('M600 1018L600 1046M600 1046Q588 1070 562 1068M600 1046Q612 1070 638 1068', 5, k.pal.hole, 0.8),
    k.both((s) => [0, 1, 2].map((i) => `<circle cx="${X(s, 40 + i * 22)}" cy="${1040 + i * 8}" r="4" fill="${k.pal.hole}" opacity="0.6"/>`).join('')),
  ].join('');
}

function moth(k) {
  const wings = symPath([600, 610], [
    [540, 566, 430, 452, 320, 448], [222, 444, 170, 512, 188, 600],
    [206, 690, 282, 772, 362, 800], [420, 822, 446, 890, 472, 968], [502, 1044, 552, 1100, 600, 1108]]);
  const hindwing = (s) => `M${X(s, 60)} 860C${X(s, 160)} 790 ${X(s, 320)} 800 ${X(s, 335)} 900C${X(s, 345)} 990 ${X(s, 230)} 1060 ${X(s, 110)} 1020Z`;
  // Broad bipectinate antennae: a serrated feather blade combed with barbs.
  const antenna = (s) => {
    const pts = bez([X(s, 30), 640], [X(s, 50), 430], [X(s, 150), 250], [X(s, 330), 170], 70);
    const wf = (t, i) => (104 * Math.sin(Math.PI * Math.min(1, t * 1.12)) ** 0.75 + 8) * (i % 2 ? 0.84 : 1);
    const barbs = frames(pts).filter((_, i) => i > 6 && i % 2 === 0).map(({ p, t, n }, j) => {
      const w = wf((j * 2 + 8) / 70, 0) / 2;
      return [1, -1].map((q) => `M${f(p[0])} ${f(p[1])}L${f(p[0] + n[0] * w * q + t[0] * w * 0.5)} ${f(p[1] + n[1] * w * q + t[1] * w * 0.5)}`).join('');
    }).join('');
    return k.tube(pts, wf, { tip: 0.8, rim: 0.5, inner: k.stroke(barbs, 3) + k.stroke(poly(pts).slice(0, -1), 7) });
  };
  // Furry collar: a crescent ruff under the chin whose outer edge is a row of
  // jittered pointed tufts, combed with light and dark hairs.
  const ruff = [], hairs = [];
  const at = (a, r, cy = 1030) => [600 + Math.cos(a) * r * 1.15, cy + Math.sin(a) * r * 0.7];
  for (let i = 0; i <= 40; i++) {
    const a = Math.PI * (0.04 + (0.92 * i) / 40), r = 215 + (i % 2 ? -18 : 14 + k.rand() * 14);
    ruff.push(at(a, r));
  }
  for (let i = 40; i >= 0; i--) ruff.push(at(Math.PI * (0.04 + (0.92 * i) / 40), 120, 1000));
  for (let i = 0; i < 90; i++) {
    const a = Math.PI * (0.06 + 0.88 * k.rand()), p0 = at(a, 110 + k.rand() * 40, 1000), p1 = at(a + (k.rand() - 0.5) * 0.08, 190 + k.rand() * 35);
    hairs.push(`M${f(p0[0])} ${f(p0[1])}L${f(p1[0])} ${f(p1[1])}`);
  }
  const body = symPath([600, 560], [[560, 560, 538, 640, 536, 760], [534, 900, 556, 1040, 600, 1090]]);
  const veins = (s) => [[230, 520], [205, 630], [260, 740], [350, 790]].map(([x, y]) => `M${X(s, 90)} 700Q${X(s, (90 + 600 - x) / 2)} ${(700 + y) / 2 - 40} ${X(s, 600 - x)} ${y}`).join('');
  // Wing eye-spots are painted markings, so they get a pale centre rather
  // than a dark pupil: they must never be mistaken for the real eye holes.
  const ocellus = (s) => { const x = X(s, 300), y = 610;
    return `<ellipse cx="${x}" cy="${y}" rx="64" ry="56" fill="url(#acc)" opacity="${k.pal.ridgeAlpha * 0.7}"/>` +
      `<ellipse cx="${x}" cy="${y}" rx="46" ry="40" fill="${k.pal.wash}" opacity="${k.pal.washAlpha + 0.2}"/>` +
      `<ellipse cx="${x + s * 4}" cy="${y - 4}" rx="22" ry="18" fill="url(#acc)"/>` + k.hi(x + s * 6, y - 8, 16, 12); };
  return [
    k.strap(150, 780, 1232),
    k.both(antenna),
    k.both((s) => k.mat(hindwing(s), { inner: k.shade(X(s, 200), 930, 130, 90, 0.6) + k.stroke(`M${X(s, 80)} 880Q${X(s, 200)} 880 ${X(s, 300)} 930`, 3) })),
    k.mat(wings, { inner: k.hi(430, 560, 120, 60) + k.hi(770, 560, 120, 60) + k.both((s) => k.stroke(veins(s), 4) + ocellus(s)) }),
    k.mat(body, { inner: k.hi(585, 700, 22, 110) + [0, 1, 2, 3].map((i) => k.stroke(`M545 ${860 + i * 40}Q600 ${880 + i * 40} 655 ${860 + i * 40}`, 3, k.pal.wash, 0.6)).join(''), rim: 0.6 }),
    k.both((s) => k.eye(X(s, 145), 720, 112, 58, s * -10)),
    k.mat(poly(ruff), { rim: 0.5, inner: k.stroke(hairs.join(''), 3, k.pal.wash, 0.55) + k.stroke(hairs.slice(0, 45).join(''), 2, k.pal.high, k.pal.highAlpha * 0.6) + k.shade(600, 1000, 170, 40, 0.8) }),
  ].join('');
}

function boar(k) {
  const shell = symPath([600, 500], [
    [505, 498, 410, 515, 372, 585], [336, 655, 326, 770, 350, 870],
    [376, 975, 442, 1060, 500, 1108], [540, 1140, 570, 1150, 600, 1150]]);
  const bristles = [];
  for (let i = -11; i <= 11; i++) {
    const a = (i * 5.4 * Math.PI) / 180, len = 170 - Math.abs(i) * 9 + k.rand() * 28, bx = 600 + i * 13, by = 530 + Math.abs(i) * 3;
    bristles.push(poly([[bx - 13, by], [bx + Math.sin(a) * len, by - Math.cos(a) * len], [bx + 13, by]]));
  }
  const snout = symPath([600, 770], [[566, 770, 532, 790, 528, 850], [522, 930, 474, 990, 472, 1060], [470, 1130, 530, 1178, 600, 1178]]);
  const ear = (s) => `M${X(s, 160)} 560Q${X(s, 250)} 470 ${X(s, 345)} 405Q${X(s, 340)} 520 ${X(s, 262)} 640Z`;
  return [
    k.strap(250, 760, 1180),
    k.mat(bristles.join(''), { wash: false, rim: 0.5, inner: k.stroke(bristles.join(''), 3, k.pal.wash, 0.6) }),
    k.both((s) => k.mat(ear(s), { inner: `<path d="M${X(s, 200)} 570Q${X(s, 260)} 510 ${X(s, 318)} 450Q${X(s, 310)} 540 ${X(s, 262)} 610Z" fill="${k.pal.wash}" opacity="${k.pal.washAlpha * 0.8}"/>` })),
    k.mat(shell, { inner: k.hi(600, 600, 170, 60) + k.both((s) => k.hi(X(s, 200), 880, 70, 90, 0.6) + k.shade(X(s, 150), 850, 50, 140, 0.6)) }),
    k.both((s) => k.shade(X(s, 120), 688, 80, 26, 0.9) + k.eye(X(s, 138), 730, 90, 38, s * -18)),
    k.both((s) => k.tube(bez([X(s, 118), 1110], [X(s, 205), 1135], [X(s, 262), 1060], [X(s, 258), 930], 30), (t) => 46 * (1 - t) + 5, { tip: 0.4, ridges: 0 })),
    k.mat(snout, { inner: k.hi(600, 860, 34, 90) + k.both((s) => k.shade(X(s, 85), 960, 30, 120, 0.6)) }),
    k.mat(ell(600, 1088, 124, 78), { inner: k.shade(600, 1140, 130, 40, 0.8) + k.hi(575, 1040, 70, 22, 0.9) }),
    k.both((s) => k.hole(`<ellipse cx="${X(s, 44)}" cy="1094" rx="19" ry="29" transform="rotate(${s * -12} ${X(s, 44)} 1094)" fill="url(#hole)"/>`)),
  ].join('');
}

function ram(k) {
  const shell = symPath([600, 500], [
    [512, 498, 436, 520, 408, 596], [382, 666, 398, 800, 428, 890],
    [458, 990, 496, 1090, 520, 1168], [536, 1212, 570, 1228, 600, 1228]]);
  // Spiral horn: up from the crown, out, down past the cheek and curling in,
  // with the radius shrinking faster than the horn thins so the coils stay apart.
  const horn = (s) => {
    const pts = [], cx = X(s, 290), cy = 660;
    for (let i = 0; i <= 90; i++) {
      const u = i / 90, a = (-150 + 440 * u) * Math.PI / 180, r = 200 - 150 * u;
      pts.push([cx + s * r * Math.cos(a), cy + r * Math.sin(a)]);
    }
    return k.tube(pts, (t) => 128 * (1 - t) ** 0.8 + 22, { ridges: 30, from: 0.03, to: 0.95, bulge: 0.22, tip: 1,
      inner: k.tipSpot(cx + s * 20, cy - 20, 130) });
  };
  const brow = symPath([600, 625], [[530, 590, 440, 590, 396, 648], [420, 720, 520, 690, 600, 712]]);
  const nose = symPath([600, 690], [[572, 690, 552, 740, 550, 820], [546, 930, 532, 1040, 542, 1130], [552, 1180, 578, 1190, 600, 1190]]);
  return [
    k.strap(185, 820, 1230),
    k.mat(shell, { inner: k.both((s) => k.shade(X(s, 150), 930, 70, 180, 0.6)) }),
    k.mat(nose, { inner: k.hi(600, 900, 26, 220) + k.both((s) => k.shade(X(s, 55), 940, 22, 200, 0.7)), rim: 0.5 }),
    k.both((s) => k.eye(X(s, 128), 780, 108, 46, s * -12)),
    k.mat(brow, { inner: k.hi(540, 630, 110, 24) + k.hi(660, 630, 110, 24) + k.shade(600, 720, 260, 22, 0.8), rim: 0.8 }),
    k.both((s) => k.hole(k.stroke(`M${X(s, 20)} 1140Q${X(s, 48)} 1138 ${X(s, 52)} 1165`, 9, k.pal.hole, 0.85))),
    k.stroke('M560 1196Q600 1210 640 1196', 4),
    k.both(horn),
  ].join('');
}

// Each design with the y of its lowest point, so every mask sits on the floor.
const DRAW = {
  ibex: [ibex, 1318], hare: [hare, 1178], moth: [moth, 1232], boar: [boar, 1180], ram: [ram, 1230],
};
const FLOOR = 1282;

// ---- the photograph --------------------------------------------------------

function gradientStops(colours) {
  return colours.map((c, i) => `<stop offset="${f(i / (colours.length - 1))}" stop-color="${c}"/>`).join('');
}
const softSpot = (id, colour) =>
  `<radialGradient id="${id}"><stop offset="0" stop-color="${colour}"/><stop offset="0.5" stop-color="${colour}" stop-opacity="0.5"/><stop offset="1" stop-color="${colour}" stop-opacity="0"/></radialGradient>`;

function maskSvg(designSlug, finishSlug, { width = 1200, height = 1500, view = 'front' } = {}) {
  if (!DRAW[designSlug]) throw new Error(`Unknown mask design slug: ${JSON.stringify(designSlug)}`);
  if (!PALETTES[finishSlug]) throw new Error(`Unknown mask finish slug: ${JSON.stringify(finishSlug)}`);
  if (view !== 'front' && view !== 'three-quarter') throw new Error(`Unknown mask view: ${JSON.stringify(view)}`);
  if (!(width > 0 && height > 0)) throw new Error(`Bad mask image size: ${width}x${height}`);

  const pal = PALETTES[finishSlug];
  const seed = hash(`${designSlug}/${finishSlug}`);
  const k = kit(pal, seed);
  const [draw, bottom] = DRAW[designSlug];
  const body = draw(k);
  const turned = view === 'three-quarter';
  // An affine "turn" pivoting on the floor contact: squeeze and shear the mask
  // and let the shell's side wall show on the near edge. Not true perspective,
  // but at card size it reads as a second camera angle.
  const pose = `translate(0 ${FLOOR - bottom})` +
    (turned ? ` translate(${600 + 24} ${bottom}) skewY(-6) scale(0.85 1) translate(-600 ${-bottom})` : '');
  const depth = turned ? [30, 5] : [0, 9];
  const shapes = k.shapes.join('');
  const t = pal.tex;
  const texLayers = t.layers.map(([c, g, o], i) =>
    `<feColorMatrix in="n" type="matrix" values="0 0 0 0 0 0 0 0 0 0 0 0 0 0 0 ${g} 0 0 0 ${o}" result="a${i}"/>` +
    `<feFlood flood-color="${c}"/><feComposite in2="a${i}" operator="in" result="l${i}"/>`).join('');
  const sx = turned ? 636 : 604;

  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${W} ${H}" preserveAspectRatio="xMidYMid slice">` +
    '<defs>' +
    // Warm paper sweep lit from upper left, darkening towards the floor.
    '<radialGradient id="bg" gradientUnits="userSpaceOnUse" cx="520" cy="560" r="1050"><stop offset="0" stop-color="#f4f0ea"/><stop offset="0.55" stop-color="#e4ded5"/><stop offset="1" stop-color="#bdb5aa"/></radialGradient>' +
    '<linearGradient id="floor" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#8a7f72" stop-opacity="0"/><stop offset="1" stop-color="#8a7f72" stop-opacity="0.22"/></linearGradient>' +
    `<radialGradient id="base" gradientUnits="userSpaceOnUse" cx="520" cy="560" r="760" fx="480" fy="470">${gradientStops(pal.base)}</radialGradient>` +
    `<radialGradient id="wash" cx="0.48" cy="0.4" r="0.64"><stop offset="0.45" stop-color="${pal.wash}" stop-opacity="0"/><stop offset="0.8" stop-color="${pal.wash}" stop-opacity="${f(pal.washAlpha * 40) / 100}"/><stop offset="1" stop-color="${pal.wash}" stop-opacity="${pal.washAlpha}"/></radialGradient>` +
    `<radialGradient id="hole" cx="0.5" cy="0.7" r="0.7"><stop offset="0" stop-color="${pal.hole}"/><stop offset="1" stop-color="#000"/></radialGradient>` +
    `<linearGradient id="acc" gradientUnits="userSpaceOnUse" x1="0" y1="0" x2="190" y2="140" spreadMethod="reflect">${gradientStops(pal.accent)}</linearGradient>` +
    softSpot('hiG', pal.high) + softSpot('shG', pal.wash) + softSpot('tipG', pal.tip) + softSpot('flG', '#2e271f') +
    `<filter id="tex" x="0" y="0" width="1" height="1" color-interpolation-filters="sRGB"><feTurbulence type="${t.type}" baseFrequency="${t.freq}" numOctaves="${t.oct}" seed="${seed % 997}" stitchTiles="stitch" result="n"/>` +
    `${texLayers}<feMerge result="m">${t.layers.map((_, i) => `<feMergeNode in="l${i}"/>`).join('')}</feMerge><feComposite in="m" in2="SourceAlpha" operator="in"/></filter>` +
    // The noise is rendered once into a stitched tile and repeated: a fraction
    // of the pixels of running the filter over the whole mask.
    '<pattern id="texP" patternUnits="userSpaceOnUse" width="480" height="640"><rect width="480" height="640" filter="url(#tex)"/></pattern>' +
    k.defs.join('') +
    '</defs>' +
    `<rect width="${W}" height="${H}" fill="url(#bg)"/><rect y="1050" width="${W}" height="450" fill="url(#floor)"/>` +
    `<ellipse cx="${sx}" cy="${FLOOR + 4}" rx="360" ry="52" fill="url(#flG)" opacity="0.45"/>` +
    `<ellipse cx="${sx}" cy="${FLOOR}" rx="200" ry="20" fill="url(#flG)" opacity="0.6"/>` +
    `<g transform="${pose}">${k.back.join('')}` +
    // One blurred cast shadow and one texture pass over the union of all parts;
    // openings are stamped again on top so the texture never fills them.
    [36, 22, 10].map((w, i) => `<path d="${shapes}" transform="translate(${16 + i * 6} ${20 + i * 6})" fill="#3b342c" stroke="#3b342c" stroke-width="${w}" stroke-linejoin="round" opacity="0.07"/>`).join('') +
    `<path d="${shapes}" transform="translate(${depth[0]} ${depth[1]})" fill="${pal.side}"/>` +
    `${body}<path d="${shapes}" fill="url(#texP)"/>${k.holes.join('')}</g></svg>`;
}

module.exports = { DESIGNS, FINISHES, maskSvg };
