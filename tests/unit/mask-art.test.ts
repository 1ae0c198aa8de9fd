import { createRequire } from 'node:module';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';

const require = createRequire(import.meta.url);
const art = require('../../seeders/support/mask-art.cjs') as {
  DESIGNS: { slug: string; name: string }[];
  FINISHES: { slug: string; name: string }[];
  maskSvg: (design: string, finish: string, options?: { width?: number; height?: number; view?: string }) => string;
};
const catalogue = require('../../seeders/support/demo-catalogue.cjs') as {
  designs: { slug: string; finishes: string[] }[];
};

describe('the demo pictures', () => {
  it('draw every design and finish the demo catalogue names', () => {
    const designs = new Set(art.DESIGNS.map((d) => d.slug));
    const finishes = new Set(art.FINISHES.map((f) => f.slug));
    for (const design of catalogue.designs) {
      expect(designs.has(design.slug), design.slug).toBe(true);
      for (const finish of design.finishes) expect(finishes.has(finish), finish).toBe(true);
    }
  });

  it('render through sharp to an image of the asked size', async () => {
    const svg = art.maskSvg('ibex', 'verdigris', { width: 240, height: 300, view: 'three-quarter' });
    const { info } = await sharp(Buffer.from(svg)).png().toBuffer({ resolveWithObject: true });
    expect([info.width, info.height]).toEqual([240, 300]);
  });

  it('differ by finish, so each photo shows its own paint', async () => {
    const mean = async (finish: string) => {
      const svg = art.maskSvg('hare', finish, { width: 120, height: 150 });
      const stats = await sharp(Buffer.from(svg)).stats();
      return stats.channels.slice(0, 3).map((c) => Math.round(c.mean));
    };
    expect(await mean('old-bone')).not.toEqual(await mean('bog-oak'));
  });

  it('refuse a design or finish they do not know, by name', () => {
    expect(() => art.maskSvg('unicorn', 'old-bone')).toThrow(/unicorn/);
    expect(() => art.maskSvg('ibex', 'chrome')).toThrow(/chrome/);
  });
});
