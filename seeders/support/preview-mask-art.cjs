'use strict';
// Eyeball the seeder mask pictures: renders every design x finish x view to
// PNG plus a contact sheet. `--time` instead renders all at full size to WebP
// and reports how long that took (the seeders' real workload).
//   node seeders/support/preview-mask-art.cjs [outDir] [--time]
const fs = require('fs');
const path = require('path');
const sharp = require('sharp');
const { DESIGNS, FINISHES, maskSvg } = require('./mask-art.cjs');

const args = process.argv.slice(2);
const timing = args.includes('--time');
const out = args.find((a) => !a.startsWith('--')) || '/tmp/mask-preview';
const VIEWS = ['front', 'three-quarter'];

(async () => {
  fs.mkdirSync(out, { recursive: true });
  const started = Date.now();
  const tiles = [];
  let warnings = 0;
  for (const d of DESIGNS) for (const fin of FINISHES) for (const view of VIEWS) {
    const size = timing ? { width: 1200, height: 1500 } : { width: 480, height: 600 };
    const svg = maskSvg(d.slug, fin.slug, { ...size, view });
    // librsvg silently ignores dangling url(#id) references, so check them here.
    const ids = new Set([...svg.matchAll(/ id="([^"]+)"/g)].map((m) => m[1]));
    for (const [, ref] of svg.matchAll(/url\(#([^)]+)\)/g)) if (!ids.has(ref)) { warnings += 1; console.warn(`${d.slug}/${fin.slug}/${view}: no #${ref}`); }
    // failOn 'warning' + the event: a librsvg complaint about our SVG must be loud.
    const img = sharp(Buffer.from(svg), { failOn: 'warning' })
      .on('warning', (w) => { warnings += 1; console.warn(`${d.slug}/${fin.slug}/${view}: ${w}`); });
    const buf = await (timing ? img.webp({ quality: 82 }) : img.png()).toBuffer();
    if (timing) continue;
    fs.writeFileSync(path.join(out, `${d.slug}--${fin.slug}--${view}.png`), buf);
    tiles.push(buf);
  }
  if (timing) return console.log(`rendered ${DESIGNS.length * FINISHES.length * VIEWS.length} WebP at 1200x1500 in ${Date.now() - started} ms, ${warnings} warning(s)`);
  // Rows are designs; columns are finishes, each as front + three-quarter.
  const tw = 240, th = 300, cols = FINISHES.length * VIEWS.length;
  const composites = await Promise.all(tiles.map(async (buf, i) => ({
    input: await sharp(buf).resize(tw, th).toBuffer(), left: (i % cols) * tw, top: Math.floor(i / cols) * th,
  })));
  await sharp({ create: { width: cols * tw, height: DESIGNS.length * th, channels: 3, background: '#ffffff' } })
    .composite(composites).png().toFile(path.join(out, 'sheet.png'));
  console.log(`wrote ${tiles.length} previews and sheet.png to ${out} in ${Date.now() - started} ms, ${warnings} warning(s)`);
})().catch((e) => { console.error(e); process.exit(1); });
