'use strict';
// Demo product photographs for the seeders, drawn as vector "studio shots" of
// cast-resin animal masks. Pure and deterministic: every bit of jitter comes
// from a PRNG seeded by the design+finish slugs, so re-seeding a database
// yields byte-identical images (and stable ETags / CDN caches).

const W = 1200;
const H = 1500;
const CX = W / 2;

const named = (pairs) => pairs.map(([slug, name]) => ({ slug, name }));
const DESIGNS = named([['ibex', 'Ibex'], ['hare', 'Hare'], ['moth', 'Moth'], ['boar', 'Boar'], ['ram', 'Ram']]);
const FINISHES = named([['old-bone', 'Old Bone'], ['bog-oak', 'Bog Oak'], ['verdigris', 'Verdigris'], ['soot-and-gilt', 'Soot & Gilt']]);

// One paint treatment per finish. Every mask part is painted from the same
// table, so a design never needs to know which finish it is wearing.
//   base:   lit -> mid -> turned-away colour of the shared light gradient
//   wash:   what pools in recesses and under edges (the "antiquing" glaze)
//   side:   the cut thickness of the shell, seen at eye holes and turned edges
//   high:   what shows on rubbed high points (polish, sheen, bare copper)
//   accent: stops of a banded gradient used for rims and ridges (gold leaf etc.)
//   tip:    colour fading in towards horn / ear tips
//   tex:    which seeded surface texture (see TEXTURES) and its two inks
const PALETTES = {
  'old-bone': {
    base: ['#f7f0e0', '#dfcdaa', '#a68a62'], wash: '#56463a', washAlpha: 0.72,
    side: '#9a8262', hole: '#241b14', high: '#fffcf4', highAlpha: 0.75,
    accent: ['#6f5840', '#98805f', '#5f4a35'], rimAlpha: 0.5, rimWidth: 4, ridgeAlpha: 0.55,
    tip: '#7a5f42', tipAlpha: 0.75,
    tex: { kind: 'bone', dark: '#5e4a36', light: '#fffaf0' },
  },
  'bog-oak': {
    base: ['#6a4a34', '#3b281c', '#1a110b'], wash: '#080403', washAlpha: 0.7,
    side: '#24170f', hole: '#060302', high: '#d4a373', highAlpha: 0.32,
    accent: ['#1c110a', '#7a5238', '#2a1a10'], rimAlpha: 0.6, rimWidth: 3, ridgeAlpha: 0.8,
    tip: '#140c07', tipAlpha: 0.5,
    tex: { kind: 'grain', dark: '#0b0604', light: '#9a7454' },
  },
  verdigris: {
    base: ['#9fd3bd', '#5c9f8b', '#2c6459'], wash: '#17352f', washAlpha: 0.6,
    side: '#7a4a2a', hole: '#0f1c1a', high: '#c27a45', highAlpha: 0.9,
    accent: ['#6b3519', '#c57a48', '#f0b889', '#93532c'], rimAlpha: 0.95, rimWidth: 6, ridgeAlpha: 0.9,
    tip: '#b86d3c', tipAlpha: 0.9,
    tex: { kind: 'crust', dark: '#173a33', light: '#b3dfcc' },
  },
  'soot-and-gilt': {
    base: ['#3a3633', '#1f1d1b', '#0c0b0a'], wash: '#000000', washAlpha: 0.6,
    side: '#2a2724', hole: '#040404', high: '#8a8178', highAlpha: 0.35,
    accent: ['#6d4b15', '#c9a04a', '#fff0b5', '#b8892f', '#7a5518', '#e9c76e'],
    rimAlpha: 1, rimWidth: 8, ridgeAlpha: 1, tip: '#e2bb5c', tipAlpha: 1,
    tex: { kind: 'powder', dark: '#000000', light: '#6a625a' },
  },
};

// ---- small maths helpers ---------------------------------------------------

const f = (n) => Math.round(n * 10) / 10;
const X = (s, dx) => CX + s * dx; // s = -1 left, +1 right: one code path for both sides

function hash(str) { // FNV-1a, only used to seed the PRNG
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
  // (Likewise fill-/stroke-opacity, never `opacity`, which forces an offscreen
  // group per element.)
  const blob = (cx, cy, rx, ry, grad, a) =>
    `<ellipse cx="${f(cx)}" cy="${f(cy)}" rx="${f(rx)}" ry="${f(ry)}" fill="url(#${grad})" fill-opacity="${f(a * 100) / 100}"/>`;
  const hi = (cx, cy, rx, ry, a = 1) => blob(cx, cy, rx, ry, 'hiG', pal.highAlpha * a);
  const shade = (cx, cy, rx, ry, a = 1) => blob(cx, cy, rx, ry, 'shG', pal.washAlpha * a);
  const holes = []; // openings are re-stamped above the single texture pass
  const stroke = (d, w, paint = 'url(#acc)', a = pal.ridgeAlpha) =>
    `<path d="${d}" fill="none" stroke="${paint}" stroke-width="${w}" stroke-linecap="round" stroke-linejoin="round" stroke-opacity="${a}"/>`;

  // A painted resin part: shared light gradient, a recess wash and clipped
  // modelling on top, then the rim where the paint wears through. (Surface
  // texture is one pass over all parts at the end, see maskSvg.)
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
      `<path d="${tubeD(pts, wf, sc, shift)}" fill="${fill}" fill-opacity="${f((a * 100) / scales.length) / 100}"/>`).join('');
    let extra = band(pal.wash, pal.washAlpha * 1.2, 0.34, [0.52, 0.43, 0.34, 0.25, 0.16]) + band(pal.high, pal.highAlpha, -0.22, [0.3, 0.24, 0.18, 0.12, 0.06]);
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
  const tipSpot = (cx, cy, r) => blob(cx, cy, r, r, 'tipG', pal.tipAlpha);

  const both = (fn) => fn(-1) + fn(1);
  return { pal, rand, defs, shapes, holes, mat, tube, eye, hole, tipSpot, hi, shade, stroke, both };
}

// ---- the designs -----------------------------------------------------------
// Each returns its parts back-to-front. Coordinates live in the 1200x1500 box
// with the face centred on x = 600; `s` picks the side for mirrored parts.

function ibex(k) {
  const shell = symPath([600, 520], [
    [525, 518, 445, 535, 410, 595], [378, 655, 384, 770, 405, 850],
    [428, 940, 500, 1055, 530, 1150], [546, 1198, 574, 1216, 600, 1216]]);
  const horn = (s) => bez([X(s, 58), 620], [X(s, 78), 390], [X(s, 150), 205], [X(s, 330), 128], 60);
  const beard = 'M564 1172Q600 1196 636 1172Q638 1260 606 1318Q598 1290 586 1270Q562 1240 564 1172Z';
  return [
    k.both((s) => k.tube(bez([X(s, 150), 650], [X(s, 220), 600], [X(s, 290), 585], [X(s, 345), 610], 20),
      (t) => 64 * Math.sin(Math.PI * (0.25 + 0.75 * t)) ** 0.7, { tip: 0.7, inner: k.shade(X(s, 270), 608, 60, 14, 1.2) })),
    k.both((s) => k.tube(horn(s), (t) => 96 * (1 - t) ** 0.85 + 10, { ridges: 17, to: 0.88, bulge: 0.3 })),
    k.mat(shell, { inner: k.hi(600, 610, 150, 45) + k.hi(600, 930, 34, 190, 0.8) +
      k.both((s) => k.shade(X(s, 75), 980, 40, 170, 0.55) + k.hi(X(s, 165), 880, 40, 60, 0.5)) }),
    // carved planes: a brow ridge over each eye, the muzzle's flanks below
    k.both((s) => k.hi(X(s, 120), 722, 70, 16, 0.8) + k.stroke(`M${X(s, 52)} 748Q${X(s, 118)} 708 ${X(s, 186)} 752`, 5) +
      k.stroke(`M${X(s, 58)} 850Q${X(s, 62)} 980 ${X(s, 34)} 1100`, 3, k.pal.wash, 0.4)),
    k.both((s) => k.eye(X(s, 115), 790, 118, 50, s * -14)),
    k.stroke('M585 1150Q600 1162 615 1150', 4, 'url(#acc)'),
    k.both((s) => k.hole(k.stroke(`M${X(s, 22)} 1120Q${X(s, 30)} 1135 ${X(s, 20)} 1142`, 6, k.pal.hole, 0.85))),
    k.mat(beard, { inner: [0, 1, 2, 3, 4].map((i) => k.stroke(`M${580 + i * 10} 1205Q${585 + i * 9} 1260 ${600 + (i - 2) * 3} ${1300 - Math.abs(i - 2) * 18}`, 3)).join('') }),
  ].join('');
}

function hare(k) {
  const shell = symPath([600, 545], [
    [515, 542, 455, 570, 438, 640], [422, 705, 420, 770, 394, 850],
    [356, 950, 362, 1070, 440, 1128], [500, 1172, 550, 1180, 600, 1178]]);
  const ear = (t) => 132 * Math.sin(Math.PI * (0.14 + 0.86 * t)) ** 0.55;
  const ears = [bez([525, 640], [505, 400], [488, 220], [462, 70], 48),
    bez([675, 640], [702, 400], [735, 255], [860, 235], 48)]; // the right ear flops outward
  const inner = (pts) => [0.56, 0.46, 0.34].map((sc) => `<path d="${tubeD(pts, ear, sc, 0.03)}" fill="${k.pal.wash}" fill-opacity="${f(k.pal.washAlpha * 40) / 100}"/>`).join('') +
    k.stroke(tubeD(pts, ear, 0.58, 0.03), 3, 'url(#acc)', k.pal.rimAlpha * 0.6);
  return [
    ears.map((pts) => k.tube(pts, ear, { tip: 0.7, inner: inner(pts) })).join(''),
    k.mat(shell, { inner: k.hi(600, 640, 110, 50) + k.both((s) => k.hi(X(s, 160), 950, 90, 80, 0.7) + k.shade(X(s, 95), 1110, 60, 50, 0.5)) }),
    k.both((s) => k.eye(X(s, 122), 790, 108, 56, s * -6)),
    k.both((s) => k.mat(ell(X(s, 44), 1048, 54, 46), { inner: k.hi(X(s, 38), 1030, 30, 22), rim: 0.35 })),
    k.mat('M566 982Q600 968 634 982Q620 1012 600 1018Q580 1012 566 982Z', { inner: `<rect x="500" y="900" width="200" height="200" fill="${k.pal.tip}" fill-opacity="${k.pal.tipAlpha}"/>` }),
    k.stroke('M600 1018L600 1046M600 1046Q588 1070 562 1068M600 1046Q612 1070 638 1068', 5, k.pal.hole, 0.8),
    k.both((s) => [0, 1, 2].map((i) => `<circle cx="${X(s, 40 + i * 22)}" cy="${1040 + i * 8}" r="4" fill="${k.pal.hole}" fill-opacity="0.6"/>`).join('')),
  ].join('');
}

// Fur as rows of seeded, jittered teardrop tufts pointing away from (cx, cy)
// along an elliptical arc; returns the tuft outlines and a hair-stroke path.
function tufts(k, cx, cy, { r, len, w, n, a0 = 0, a1 = Math.PI, sx = 1.2, sy = 0.8 }) {
  let d = '', hairs = '';
  for (let i = 0; i < n; i++) {
    const a = a0 + ((a1 - a0) * (i + 0.5)) / n + (k.rand() - 0.5) * 0.1, L = len * (0.75 + 0.5 * k.rand());
    const u = [Math.cos(a) * sx, Math.sin(a) * sy], v = [-u[1], u[0]];
    const b = [cx + u[0] * r, cy + u[1] * r], P = (du, dv) => `${f(b[0] + u[0] * du + v[0] * dv)} ${f(b[1] + u[1] * du + v[1] * dv)}`;
    d += `M${P(0, w / 2)}Q${P(L * 0.7, w * 0.62)} ${P(L, 0)}Q${P(L * 0.7, -w * 0.62)} ${P(0, -w / 2)}Q${P(-w * 0.45, 0)} ${P(0, w / 2)}Z`;
    hairs += `M${P(L * 0.15, w * 0.12)}L${P(L * 0.8, 0)}M${P(L * 0.1, -w * 0.25)}L${P(L * 0.6, -w * 0.12)}`;
  }
  return [d, hairs];
}

function moth(k) {
  const wings = symPath([600, 610], [
    [540, 566, 430, 452, 320, 448], [222, 444, 170, 512, 188, 600],
    [206, 690, 282, 772, 362, 800], [420, 822, 446, 890, 472, 968], [502, 1044, 552, 1060, 600, 1060]]);
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
  // Fur is painted in rows, outermost first, so each row's rim reads as the
  // shadowed edge of the row in front of it.
  const fur = (rows) => rows.map(([cx, cy, o]) => {
    const [d, hairs] = tufts(k, cx, cy, o);
    return k.mat(d, { wash: false, rim: 0.25, inner: k.stroke(hairs, 2.5, k.pal.wash, 0.5) + k.shade(cx, cy, o.r * 1.2 + 20, o.r * 0.8 + 20, 0.6) });
  }).join('');
  const veins = (s) => [[230, 520], [205, 630], [260, 740], [350, 790]].map(([x, y]) => `M${X(s, 90)} 700Q${X(s, (90 + 600 - x) / 2)} ${(700 + y) / 2 - 40} ${X(s, 600 - x)} ${y}`).join('');
  // Wing eye-spots are painted markings, so they get a pale centre rather
  // than a dark pupil: they must never be mistaken for the real eye holes.
  const ocellus = (s) => { const x = X(s, 300), y = 610;
    return `<ellipse cx="${x}" cy="${y}" rx="64" ry="56" fill="url(#acc)" fill-opacity="${k.pal.ridgeAlpha * 0.7}"/>` +
      `<ellipse cx="${x}" cy="${y}" rx="46" ry="40" fill="${k.pal.wash}" fill-opacity="${k.pal.washAlpha + 0.2}"/>` +
      `<ellipse cx="${x + s * 4}" cy="${y - 4}" rx="22" ry="18" fill="url(#acc)"/>` + k.hi(x + s * 6, y - 8, 16, 12); };
  return [
    k.both(antenna),
    k.both((s) => k.mat(hindwing(s), { inner: k.shade(X(s, 200), 930, 130, 90, 0.6) + k.stroke(`M${X(s, 80)} 880Q${X(s, 200)} 880 ${X(s, 300)} 930`, 3) })),
    k.mat(wings, { inner: k.hi(430, 560, 120, 60) + k.hi(770, 560, 120, 60) + k.both((s) => k.stroke(veins(s), 4) + ocellus(s)) }),
    k.shade(600, 650, 70, 110, 0.5),
    k.both((s) => k.eye(X(s, 145), 720, 112, 58, s * -10)),
    fur([[600, 900, { r: 160, len: 110, w: 40, n: 28, a0: -0.08, a1: Math.PI + 0.08 }],
      [600, 900, { r: 110, len: 100, w: 38, n: 22, a0: 0, a1: Math.PI }],
      [600, 900, { r: 60, len: 90, w: 36, n: 16, a0: 0.1, a1: Math.PI - 0.1 }],
      [600, 890, { r: 14, len: 80, w: 34, n: 9, a0: 0.25, a1: Math.PI - 0.25 }]]),
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
    k.mat(bristles.join(''), { wash: false, rim: 0.5, inner: k.stroke(bristles.join(''), 3, k.pal.wash, 0.6) }),
    k.both((s) => k.mat(ear(s), { inner: `<path d="M${X(s, 200)} 570Q${X(s, 260)} 510 ${X(s, 318)} 450Q${X(s, 310)} 540 ${X(s, 262)} 610Z" fill="${k.pal.wash}" fill-opacity="${k.pal.washAlpha * 0.8}"/>` })),
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
  ibex: [ibex, 1318], hare: [hare, 1178], moth: [moth, 1150], boar: [boar, 1180], ram: [ram, 1230],
};
const FLOOR = 1282;

// ---- surface textures ------------------------------------------------------
// Seeded vector marks, clipped to the mask. feTurbulence would look similar
// but costs ~0.1 s per octave per full-size image; these cost a few ms.
// Marks are scattered over the whole design box; the clip hides the misses.

const dots = (rand, n, r0, r1) => {
  let d = '';
  for (let i = 0; i < n; i++) {
    const x = 140 + rand() * 920, y = 60 + rand() * 1280, r = r0 + rand() * (r1 - r0);
    d += `M${f(x - r)} ${f(y)}a${f(r)} ${f(r)} 0 1 0 ${f(2 * r)} 0a${f(r)} ${f(r)} 0 1 0 ${f(-2 * r)} 0`;
  }
  return d;
};
const spots = (rand, n, grad, [r0, r1], [a0, a1], at = () => [140 + rand() * 920, 60 + rand() * 1280]) =>
  Array.from({ length: n }, () => {
    const [x, y] = at(), r = r0 + rand() * (r1 - r0);
    return `<ellipse cx="${f(x)}" cy="${f(y)}" rx="${f(r)}" ry="${f(r * (0.55 + rand() * 0.45))}" fill="url(#${grad})" fill-opacity="${f((a0 + rand() * (a1 - a0)) * 100) / 100}"/>`;
  }).join('');

const TEXTURES = {
  // Old bone: blotches where the wash settled, fine specks, hairline crazing.
  bone: (rand, t) => {
    let craze = '';
    for (let i = 0; i < 26; i++) {
      let x = 140 + rand() * 920, y = 60 + rand() * 1280;
      craze += `M${f(x)} ${f(y)}`;
      for (let j = 0; j < 6; j++) { x += (rand() - 0.5) * 50; y += (rand() - 0.3) * 40; craze += `L${f(x)} ${f(y)}`; }
    }
    return spots(rand, 50, 'txD', [30, 120], [0.25, 0.55]) + spots(rand, 24, 'txL', [30, 90], [0.3, 0.6]) +
      `<path d="${dots(rand, 260, 0.8, 2.6)}" fill="${t.dark}" fill-opacity="0.35"/>` +
      `<path d="${craze}" fill="none" stroke="${t.dark}" stroke-width="1.3" stroke-opacity="0.3"/>`;
  },
  // Bog oak: long wavering grain lines down the block the mask was cut from.
  grain: (rand, t) => {
    let out = '';
    for (let x = 140; x < 1060; x += 7 + rand() * 12) {
      const ph = rand() * 6, ph2 = rand() * 6, amp = 6 + rand() * 12;
      let d = '';
      for (let y = 40; y <= 1360; y += 40) d += `${d ? 'L' : 'M'}${f(x + amp * Math.sin(y / 190 + ph) + 4 * Math.sin(y / 47 + ph2))} ${y}`;
      const light = rand() < 0.22;
      out += `<path d="${d}" fill="none" stroke="${light ? t.light : t.dark}" stroke-width="${f(1 + rand() * 2.6)}" stroke-opacity="${f((light ? 0.12 + rand() * 0.14 : 0.25 + rand() * 0.4) * 100) / 100}"/>`;
    }
    return out;
  },
  // Verdigris: clustered pale crust blooms over the green, and dark pitting.
  crust: (rand, t) => {
    let out = '';
    for (let c = 0; c < 60; c++) {
      const cx = 140 + rand() * 920, cy = 60 + rand() * 1280;
      const near = () => [cx + (rand() + rand() - 1) * 60, cy + (rand() + rand() - 1) * 50];
      out += spots(rand, 8, 'txL', [4, 18], [0.3, 0.7], near);
    }
    return spots(rand, 36, 'txD', [40, 110], [0.25, 0.5]) + out +
      `<path d="${dots(rand, 420, 1, 3.2)}" fill="${t.dark}" fill-opacity="0.45"/><path d="${dots(rand, 300, 0.8, 2.2)}" fill="${t.light}" fill-opacity="0.45"/>`;
  },
  // Soot: a dry, powdery matte black; the faintest sheen in patches.
  powder: (rand, t) => spots(rand, 18, 'txL', [40, 120], [0.06, 0.14]) + spots(rand, 18, 'txD', [40, 120], [0.2, 0.4]) +
    `<path d="${dots(rand, 600, 0.7, 1.8)}" fill="${t.light}" fill-opacity="0.3"/>`,
};

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
    softSpot('hiG', pal.high) + softSpot('shG', pal.wash) + softSpot('tipG', pal.tip) + softSpot('flG', '#2e271f') + softSpot('txL', t.light) + softSpot('txD', t.dark) +
    `<clipPath id="all"><path d="${shapes}"/></clipPath>` +
    k.defs.join('') +
    '</defs>' +
    `<rect width="${W}" height="${H}" fill="url(#bg)"/><rect y="1050" width="${W}" height="450" fill="url(#floor)"/>` +
    `<ellipse cx="${sx}" cy="${FLOOR + 4}" rx="360" ry="52" fill="url(#flG)" fill-opacity="0.45"/>` +
    `<ellipse cx="${sx}" cy="${FLOOR}" rx="200" ry="20" fill="url(#flG)" fill-opacity="0.6"/>` +
    `<g transform="${pose}">` +
    // A soft cast shadow and one texture pass over the union of all parts;
    // openings are stamped again on top so the texture never fills them.
    [40, 28, 16, 6].map((w, i) => `<path d="${shapes}" transform="translate(${16 + i * 5} ${20 + i * 5})" fill="#3b342c" stroke="#3b342c" stroke-width="${w}" stroke-linejoin="round" fill-opacity="0.055" stroke-opacity="0.055"/>`).join('') +
    `<path d="${shapes}" transform="translate(${depth[0]} ${depth[1]})" fill="${pal.side}"/>` +
    `${body}<g clip-path="url(#all)">${TEXTURES[t.kind](k.rand, t)}</g>${k.holes.join('')}</g></svg>`;
}

module.exports = { DESIGNS, FINISHES, maskSvg };
