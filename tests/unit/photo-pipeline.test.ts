import { createHash } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import zlib from 'node:zlib';
import exifr from 'exifr';
import sharp from 'sharp';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { photoConfig, uploadthingSetup } from '@/lib/photos/config';
import { fetchUploadedFile } from '@/lib/photos/fetch-upload';
import { photoLoader, photoSrcSet } from '@/lib/photos/loader';
import { PhotoRefusedError, processPhoto, type RenditionFile } from '@/lib/photos/process';
import { DEFAULT_PHOTO_MAX_BYTES, DEFAULT_PHOTO_MAX_PIXELS, renditionWidthsFor } from '@/lib/photos/renditions';
import { resolveMediaFile } from '@/lib/photos/store';

// Encoding AVIF at several widths takes seconds on a small machine.
vi.setConfig({ testTimeout: 60_000 });

const limits = { maxBytes: DEFAULT_PHOTO_MAX_BYTES, maxPixels: DEFAULT_PHOTO_MAX_PIXELS };

// GPS tags as a camera writes them (rationals, degrees/minutes/seconds), EXIF 2.3 §4.6.6 (CIPA DC-008).
// The place is invented (a field outside Dublin); what matters is that the tags are there.
const GPS_TAGS = { GPSLatitudeRef: 'N', GPSLatitude: '53/1 16/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '6/1 15/1 0/1' };

/**
 * A real JPEG as a phone writes it: stored 1200 × 800 (landscape), EXIF Orientation 6 and GPS tags, and a
 * red 200 × 200 block in the stored top-left corner, so the direction of the turn can be checked.
 * Observed with sharp 0.35: an Orientation in withExif alone is overwritten by libvips' own orientation
 * field on output, so the orientation is set through withMetadata as well.
 */
async function phoneJpeg(): Promise<Buffer> {
  return sharp({ create: { width: 1200, height: 800, channels: 3, background: '#8a8178' } })
    .composite([{ input: { create: { width: 200, height: 200, channels: 3, background: '#ff0000' } }, top: 0, left: 0 }])
    .jpeg({ quality: 90 })
    .withExif({ IFD0: { Orientation: '6', Make: 'Demold', Model: 'Test rig' }, IFD3: GPS_TAGS })
    .withMetadata({ orientation: 6 })
    .toBuffer();
}

/** The chunk names of a WebP file: "RIFF" size "WEBP", then FourCC + little-endian size + even-padded data (Google's WebP Container Specification). */
function webpChunks(file: Buffer): { name: string; data: Buffer }[] {
  expect(file.toString('ascii', 0, 4)).toBe('RIFF');
  expect(file.toString('ascii', 8, 12)).toBe('WEBP');
  const chunks: { name: string; data: Buffer }[] = [];
  for (let at = 12; at + 8 <= file.length; ) {
    const size = file.readUInt32LE(at + 4);
    chunks.push({ name: file.toString('ascii', at, at + 4), data: file.subarray(at + 8, at + 8 + size) });
    at += 8 + size + (size % 2);
  }
  return chunks;
}

/** Every place a rendition could carry metadata, by the format's own rules; empty when there is none. */
async function metadataFound(rendition: { format: 'webp' | 'avif'; data: Buffer }): Promise<string[]> {
  const found: string[] = [];
  const meta = await sharp(rendition.data).metadata();
  if (meta.exif) found.push('sharp: exif');
  if (meta.xmp) found.push('sharp: xmp');
  if (meta.iptc) found.push('sharp: iptc');
  if (meta.orientation) found.push(`sharp: orientation ${meta.orientation}`);
  if (rendition.format === 'avif') {
    // exifr reads AVIF (HEIF) itself (its README's list of file formats).
    const parsed = await exifr.parse(rendition.data, { tiff: true, exif: true, gps: true, xmp: true, icc: false, iptc: true });
    if (parsed) found.push(`exifr: ${Object.keys(parsed).join(', ')}`);
    if (await exifr.gps(rendition.data)) found.push('exifr: gps');
    // An Exif item in a HEIF file is declared with the item type "Exif" (ISO/IEC 23008-12, Annex A).
    if (rendition.data.includes(Buffer.from('Exif'))) found.push('avif: Exif item');
  } else {
    // exifr does not read WebP (not in its README's formats), so the container's own EXIF and XMP
    // chunks are looked for, and any EXIF found is handed to exifr as the TIFF block it is.
    for (const chunk of webpChunks(rendition.data)) {
      if (chunk.name === 'EXIF' || chunk.name === 'XMP ') {
        found.push(`webp: ${chunk.name.trim()} chunk`);
        // libwebp writes the block with JPEG's "Exif\0\0" prefix before the TIFF header; exifr wants the TIFF.
        const tiff = chunk.data.subarray(0, 6).toString('latin1') === 'Exif\0\0' ? chunk.data.subarray(6) : chunk.data;
        const gps = chunk.name === 'EXIF' ? await exifr.gps(tiff).catch(() => undefined) : undefined;
        if (gps) found.push('exifr: gps');
      }
    }
  }
  return found;
}

async function refusal(promise: Promise<unknown>): Promise<PhotoRefusedError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(PhotoRefusedError);
  return error as PhotoRefusedError;
}

async function pixel(rendition: RenditionFile, x: number, y: number): Promise<[number, number, number]> {
  const { data, info } = await sharp(rendition.data).raw().toBuffer({ resolveWithObject: true });
  const at = (y * info.width + x) * info.channels;
  return [data[at]!, data[at + 1]!, data[at + 2]!];
}

describe('a phone photo with EXIF orientation and GPS', () => {
  it('really carries Orientation 6 and GPS before processing (or the rest proves nothing)', async () => {
    const jpeg = await phoneJpeg();
    const tags = await exifr.parse(jpeg, { translateValues: false, gps: true });
    expect(tags.Orientation).toBe(6);
    expect(tags.Make).toBe('Demold');
    const gps = await exifr.gps(jpeg);
    expect(gps.latitude).toBeCloseTo(53 + 16 / 60, 5);
    expect(gps.longitude).toBeCloseTo(-(6 + 15 / 60), 5);
    const meta = await sharp(jpeg).metadata();
    expect([meta.width, meta.height]).toEqual([1200, 800]);
  });

  it('is turned upright, written at every width up to its own, and keeps no metadata at all', async () => {
    const jpeg = await phoneJpeg();
    const photo = await processPhoto(jpeg, limits);

    // EXIF 2.3 / CIPA DC-008, tag 0x0112: orientation 6 means the picture must be rotated 90° clockwise
    // to be seen upright, so the stored 1200 × 800 is shown 800 × 1200.
    expect([photo.sourceWidth, photo.sourceHeight]).toEqual([800, 1200]);
    expect(photo.sourceType).toBe('image/jpeg');
    expect(photo.bytes).toBe(jpeg.length);
    expect(photo.hash).toBe(createHash('sha256').update(jpeg).digest('hex').slice(0, 32));

    const widths = [...new Set(photo.renditions.map((r) => r.width))];
    expect(widths).toEqual([320, 640, 800]);
    for (const width of widths) {
      expect(photo.renditions.filter((r) => r.width === width).map((r) => r.format)).toEqual(['webp', 'avif']);
    }
    for (const rendition of photo.renditions) {
      expect(rendition.height).toBe(Math.round(rendition.width * 1.5));
      const meta = await sharp(rendition.data).metadata();
      expect(meta.format).toBe(rendition.format === 'webp' ? 'webp' : 'heif');
      expect([meta.width, meta.height]).toEqual([rendition.width, rendition.height]);
      expect(await metadataFound(rendition), `${rendition.width}.${rendition.format}`).toEqual([]);
    }

    // Turned clockwise, not anticlockwise: the stored top-left corner is now the top-right one.
    const largest = photo.renditions.find((r) => r.width === 800 && r.format === 'webp')!;
    const [r1, g1, b1] = await pixel(largest, 780, 20);
    expect(r1).toBeGreaterThan(200);
    expect(g1 + b1).toBeLessThan(120);
    const [r2] = await pixel(largest, 20, 20);
    expect(r2).toBeLessThan(180);
    const [r3] = await pixel(largest, 20, 1180);
    expect(r3).toBeLessThan(180);

    expect(photo.blurDataUrl).toMatch(/^data:image\/webp;base64,[A-Za-z0-9+/=]+$/);
    const blur = await sharp(Buffer.from(photo.blurDataUrl.split(',')[1]!, 'base64')).metadata();
    expect(blur.width).toBe(16);
    expect(photo.blurDataUrl.length).toBeLessThan(1_000);
  });

  it('the metadata checks do find metadata when a file keeps it (so they can fail)', async () => {
    const jpeg = await phoneJpeg();
    const keptWebp = await sharp(jpeg).rotate().resize({ width: 320 }).keepExif().webp().toBuffer();
    const keptAvif = await sharp(jpeg).rotate().resize({ width: 320 }).keepExif().avif().toBuffer();
    expect(await metadataFound({ format: 'webp', data: keptWebp })).toEqual(expect.arrayContaining(['webp: EXIF chunk', 'exifr: gps']));
    expect((await metadataFound({ format: 'avif', data: keptAvif })).length).toBeGreaterThan(0);
  });
});

describe('what the pipeline refuses', () => {
  it('a decompression bomb: a PNG of a few kilobytes that declares 20000 × 20000 pixels', async () => {
    // A valid PNG (W3C PNG Specification, 2nd ed.: signature, IHDR, IDAT, IEND with CRC-32s): 1-bit grey,
    // every row filter 0 and black, which deflate squeezes to almost nothing. Decoded: 400 megapixels.
    const [width, height] = [20_000, 20_000];
    const chunk = (type: string, data: Buffer) => {
      const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
      const out = Buffer.alloc(12 + data.length);
      out.writeUInt32BE(data.length, 0);
      body.copy(out, 4);
      out.writeUInt32BE(zlib.crc32(body), 8 + data.length);
      return out;
    };
    const ihdr = Buffer.alloc(13);
    ihdr.writeUInt32BE(width, 0);
    ihdr.writeUInt32BE(height, 4);
    ihdr.set([1, 0, 0, 0, 0], 8); // bit depth 1, greyscale, deflate, adaptive filtering, no interlace
    const rows = Buffer.alloc(height * (1 + width / 8)); // all zero: filter byte 0, black pixels
    const bomb = Buffer.concat([
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
      chunk('IHDR', ihdr),
      chunk('IDAT', zlib.deflateSync(rows, { level: 9 })),
      chunk('IEND', Buffer.alloc(0)),
    ]);
    expect(bomb.length).toBeLessThan(200 * 1024);
    // Reading the header alone needs sharp's pixel limit lifted: sharp refuses even metadata() past it.
    expect(await sharp(bomb, { limitInputPixels: false }).metadata()).toMatchObject({ format: 'png', width, height });

    const error = await refusal(processPhoto(bomb, limits));
    expect(error.code).toBe('photo_too_many_pixels');
    expect(error.status).toBe(422);
    expect(error.message).toContain('20000 × 20000');
    // The second guard, had the header check been missed: sharp's limitInputPixels refuses to decode it
    // (sharp's documented constructor option).
    await expect(sharp(bomb, { limitInputPixels: limits.maxPixels }).resize(100).toBuffer()).rejects.toThrow(/pixel limit/i);
  });

  it('a text file named .jpg (only the bytes count, never the name)', async () => {
    const notes = Buffer.from('Pull list for Friday: Ibex ×3 in Old Bone, Hare ×2 in Verdigris.\n', 'utf8');
    const error = await refusal(processPhoto(notes, limits));
    expect(error.code).toBe('photo_unsupported_type');
    expect(error.message).toMatch(/JPEG, PNG, WebP or AVIF/);
  });

  it('an SVG with a script in it, though sharp itself would happily render it', async () => {
    const svg = Buffer.from(
      '<svg xmlns="http://www.w3.org/2000/svg" width="400" height="400"><script>fetch("/api/holds/mine")</script><rect width="400" height="400" fill="#a33b20"/></svg>',
    );
    expect((await sharp(svg).metadata()).format).toBe('svg');
    const error = await refusal(processPhoto(svg, limits));
    expect(error.code).toBe('photo_unsupported_type');
  });

  it('a GIF: a real image, but not one of the four types', async () => {
    const gif = await sharp({ create: { width: 40, height: 40, channels: 3, background: '#3f6b4f' } }).gif().toBuffer();
    const error = await refusal(processPhoto(gif, limits));
    expect(error.code).toBe('photo_unsupported_type');
    expect(error.message).toContain('GIF');
  });

  it('a file over the size limit (20 MB by default), before anything reads it', async () => {
    expect(photoConfig({}).maxBytes).toBe(20 * 1024 * 1024);
    const jpeg = await phoneJpeg();
    const padded = Buffer.concat([jpeg, Buffer.alloc(photoConfig({}).maxBytes + 1 - jpeg.length)]);
    const error = await refusal(processPhoto(padded, photoConfig({})));
    expect(error.code).toBe('photo_too_large');
    expect(error.message).toContain('20 MB');
    // One byte under the limit is not refused for its size.
    await expect(processPhoto(padded.subarray(0, photoConfig({}).maxBytes), photoConfig({}))).resolves.toMatchObject({ sourceWidth: 800 });
  });
});

describe('widths', () => {
  it('are never wider than the photo', async () => {
    const cases: [number, number, number[]][] = [
      [4000, 3000, [320, 640, 960, 1280, 1920]],
      [1500, 1000, [320, 640, 960, 1280, 1500]],
      [500, 300, [320, 500]],
      [200, 120, [200]],
    ];
    for (const [width, height, expected] of cases) {
      const png = await sharp({ create: { width, height, channels: 3, background: '#ede6da' } }).png().toBuffer();
      const photo = await processPhoto(png, limits);
      const written = [...new Set(photo.renditions.map((r) => r.width))];
      expect(written, `${width} × ${height}`).toEqual(expected);
      expect(Math.max(...written)).toBeLessThanOrEqual(width);
      expect(renditionWidthsFor(width)).toEqual(expected);
    }
  });

  it('keep transparency of a PNG with alpha', async () => {
    const png = await sharp({ create: { width: 400, height: 400, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } }).png().toBuffer();
    const photo = await processPhoto(png, limits);
    for (const rendition of photo.renditions) expect((await sharp(rendition.data).metadata()).hasAlpha, rendition.format).toBe(true);
  });
});

describe('fetching the uploaded file', () => {
  const servers: http.Server[] = [];
  afterAll(async () => {
    await Promise.all(servers.map((s) => new Promise((resolve) => s.close(resolve))));
  });
  async function serve(handler: http.RequestListener): Promise<string> {
    const server = http.createServer(handler);
    servers.push(server);
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    return `http://127.0.0.1:${(server.address() as AddressInfo).port}/f/key`;
  }

  it('stops reading once the bytes pass the limit, with no Content-Length to go by', async () => {
    let sent = 0;
    const url = await serve((_req, res) => {
      res.writeHead(200, { 'Content-Type': 'image/jpeg' }); // chunked: no length given
      const push = () => {
        if (sent > 10 * 1024 * 1024 || res.destroyed) return res.end();
        sent += 64 * 1024;
        res.write(Buffer.alloc(64 * 1024), push);
      };
      push();
    });
    const error = await refusal(fetchUploadedFile(url, { maxBytes: 256 * 1024, timeoutMs: 10_000 }));
    expect(error.code).toBe('photo_too_large');
    expect(sent).toBeLessThan(10 * 1024 * 1024);
  });

  it('refuses a declared Content-Length over the limit without reading the body', async () => {
    const url = await serve((_req, res) => {
      res.writeHead(200, { 'Content-Length': String(2 * 1024 * 1024) });
      res.end(Buffer.alloc(2 * 1024 * 1024));
    });
    const error = await refusal(fetchUploadedFile(url, { maxBytes: 1024 * 1024, timeoutMs: 10_000 }));
    expect(error.code).toBe('photo_too_large');
  });

  it('gives up after the deadline', async () => {
    const url = await serve(() => {
      /* never answers */
    });
    const started = Date.now();
    await expect(fetchUploadedFile(url, { maxBytes: 1024, timeoutMs: 1_000 })).rejects.toMatchObject({ code: 'photo_fetch_timeout', status: 504 });
    expect(Date.now() - started).toBeLessThan(5_000);
  });

  it('fetches plain http from loopback only', async () => {
    await expect(fetchUploadedFile('http://files.example.com/f/key', { maxBytes: 1024, timeoutMs: 1_000 })).rejects.toMatchObject({ code: 'photo_source_invalid' });
    const url = await serve((_req, res) => res.end('tiny'));
    expect((await fetchUploadedFile(url, { maxBytes: 1024, timeoutMs: 5_000 })).toString()).toBe('tiny');
  });
});

describe('serving and loading', () => {
  const hash = 'a'.repeat(32);

  it('the media path check takes generated names only', () => {
    const root = path.resolve('/srv/media');
    expect(resolveMediaFile(root, [hash, '640.webp'])).toEqual({ file: path.join(root, hash, '640.webp'), format: 'webp' });
    expect(resolveMediaFile(root, [hash, '1920.avif'])?.format).toBe('avif');
    for (const bad of [['..', '..', 'etc', 'passwd'], [hash, '..'], ['.staging', '640.webp'], [hash, '640.png'], [hash, '0640.webp'], [hash.toUpperCase(), '640.webp'], [`${hash}`, '640.webp', 'x'], ['demo', 'ibex.webp']]) {
      expect(resolveMediaFile(root, bad), bad.join('/')).toBeNull();
    }
  });

  it('the next/image loader picks the nearest written width at or above the one asked for', () => {
    const src = `/media/${hash}/1500.webp`;
    expect(photoLoader({ src, width: 100 })).toBe(`/media/${hash}/320.webp`);
    expect(photoLoader({ src, width: 640 })).toBe(`/media/${hash}/640.webp`);
    expect(photoLoader({ src, width: 700 })).toBe(`/media/${hash}/960.webp`);
    expect(photoLoader({ src, width: 1300 })).toBe(`/media/${hash}/1500.webp`);
    expect(photoLoader({ src, width: 3840 })).toBe(`/media/${hash}/1500.webp`);
    expect(photoLoader({ src: '/media/demo/ibex-old-bone-front.webp', width: 640 })).toBe('/media/demo/ibex-old-bone-front.webp?w=640');
    expect(photoSrcSet(src, 'avif')).toBe(
      [320, 640, 960, 1280, 1500].map((w) => `/media/${hash}/${w}.avif ${w}w`).join(', '),
    );
    expect(photoSrcSet('/media/demo/ibex-old-bone-front.webp', 'avif')).toBeNull();
  });
});

describe('settings', () => {
  it('default to .data/media under the project root, 20 MB and 40 megapixels', () => {
    expect(photoConfig({})).toEqual({ mediaDir: path.resolve(process.cwd(), '.data/media'), maxBytes: 20 * 1024 * 1024, maxPixels: 40_000_000, fetchTimeoutMs: 30_000 });
    expect(photoConfig({ MEDIA_DIR: '/tmp/m', PHOTO_MAX_BYTES: '1048576' })).toMatchObject({ mediaDir: '/tmp/m', maxBytes: 1_048_576 });
  });

  it('name a bad value, as a 503 for the upload route', () => {
    expect(() => photoConfig({ PHOTO_MAX_PIXELS: 'lots' })).toThrow(/PHOTO_MAX_PIXELS/);
    try {
      photoConfig({ PHOTO_MAX_BYTES: '10' });
    } catch (error) {
      expect(error).toMatchObject({ status: 503, code: 'uploads_misconfigured' });
    }
  });

  it('tell a missing token from a malformed one', () => {
    expect(uploadthingSetup({})).toMatchObject({ ok: false, message: expect.stringContaining('UPLOADTHING_TOKEN is not set') });
    expect(uploadthingSetup({ UPLOADTHING_TOKEN: 'not-a-token' })).toMatchObject({ ok: false, message: expect.stringContaining('not an uploadthing token') });
    const token = Buffer.from(JSON.stringify({ apiKey: 'sk_test_x', appId: 'app1', regions: ['fra1'] })).toString('base64');
    expect(uploadthingSetup({ UPLOADTHING_TOKEN: token })).toEqual({ ok: true, appId: 'app1' });
  });
});
