'use strict';

const fs = require('node:fs/promises');
const path = require('node:path');
const sharp = require('sharp');
const { maskSvg } = require('./mask-art.cjs');
const { designs, views, photoFileName } = require('./demo-catalogue.cjs');

const PHOTO_WIDTH = 1200;
const PHOTO_HEIGHT = 1500;
const outDir = path.resolve(__dirname, '../../public/media/demo');

/**
 * Renders every demo photo from its SVG drawing to WebP with sharp. Existing files are kept, so a
 * restart costs nothing; returns the number of files written.
 */
async function renderDemoArt({ force = false } = {}) {
  await fs.mkdir(outDir, { recursive: true });
  let written = 0;
  for (const design of designs) {
    for (const finish of design.finishes) {
      for (const { view } of views) {
        const file = path.join(outDir, photoFileName(design.slug, finish, view));
        if (!force && (await exists(file))) continue;
        const svg = maskSvg(design.slug, finish, { width: PHOTO_WIDTH, height: PHOTO_HEIGHT, view });
        await sharp(Buffer.from(svg)).webp({ quality: 82 }).toFile(`${file}.tmp`);
        await fs.rename(`${file}.tmp`, file);
        written += 1;
      }
    }
  }
  return written;
}

async function exists(file) {
  try {
    await fs.access(file);
    return true;
  } catch {
    return false;
  }
}

module.exports = { renderDemoArt, PHOTO_WIDTH, PHOTO_HEIGHT, outDir };

if (require.main === module) {
  renderDemoArt({ force: process.argv.includes('--force') }).then(
    (count) => console.log(`demo art: ${count} photo(s) rendered into ${path.relative(process.cwd(), outDir)}`),
    (error) => {
      console.error(error);
      process.exit(1);
    },
  );
}
