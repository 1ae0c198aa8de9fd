import fs from 'node:fs/promises';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { genUploader } from 'uploadthing/client';
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import type { PhotoFileRouter, PhotoUploadResult } from '@/app/api/uploadthing/core';
import type { CurrentUser } from '@/lib/auth/session';
import { startFakeUploadthing, type FakeUploadthing } from '../../fake-services/uploadthing/server';
import { withAppDatabase } from './support/app-database';
import { query } from './support/database';

// The whole upload as in production, over real HTTP: uploadthing's own browser client (genUploader)
// → the app's /api/uploadthing route (uploadthing's handler and our file router) → the fake UploadThing
// (route metadata, presigned PUT, signed callback back to the app, callback result) → the photo
// pipeline → the photos row and the files under MEDIA_DIR, served by the app's /media route.

let currentUser: CurrentUser | null = null;
vi.mock('@/lib/auth/session', () => ({ getCurrentUser: async () => currentUser }));
// The data cache exists only inside a running Next.js server: here reads go straight to the database and
// the route's expiries are recorded, to check which shop pages an upload drops.
const cache = vi.hoisted(() => ({ expired: [] as { tag: string; profile: unknown }[] }));
vi.mock('next/cache', async (importOriginal) => ({
  ...(await importOriginal<typeof import('next/cache')>()),
  revalidateTag: (tag: string, profile: unknown) => void cache.expired.push({ tag, profile }),
  unstable_cache: <T>(fn: T) => fn,
}));

const db = withAppDatabase('uploads', { seed: true });
const API_KEY = 'sk_test_marrowgate_uploads_0000000001';
const APP_ID = 'marrowgateuploads';

let fake: FakeUploadthing;
let app: http.Server;
let appUrl: string;
let mediaDir: string;
let people: { owner: CurrentUser; customer: CurrentUser };
let ibex: { designId: string; oldBone: string; verdigrisOfHare: string };

/**
 * uploadthing's browser client PUTs with XMLHttpRequest (for upload progress), which Node lacks. This
 * stands in with fetch and only what uploadWithProgress uses: open, setRequestHeader, responseType
 * "json", upload progress, load and error events, send(FormData), abort.
 */
class FetchXMLHttpRequest {
  status = 0;
  statusText = '';
  response: unknown = null;
  responseType = '';
  private method = 'GET';
  private url = '';
  private readonly headers = new Headers();
  private readonly events = new Map<string, (() => void)[]>();
  private readonly progress: ((event: { loaded: number }) => void)[] = [];
  private readonly controller = new AbortController();
  readonly upload = { addEventListener: (_type: string, listener: (event: { loaded: number }) => void) => this.progress.push(listener) };
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(name: string, value: string) {
    this.headers.set(name, value);
  }
  addEventListener(type: string, listener: () => void) {
    this.events.set(type, [...(this.events.get(type) ?? []), listener]);
  }
  abort() {
    this.controller.abort();
  }
  send(body: FormData) {
    void (async () => {
      try {
        const response = await fetch(this.url, { method: this.method, headers: this.headers, body, signal: this.controller.signal });
        const text = await response.text();
        const file = body.get('file');
        for (const listener of this.progress) listener({ loaded: file instanceof Blob ? file.size : 0 });
        this.status = response.status;
        this.statusText = response.statusText;
        try {
          this.response = JSON.parse(text);
        } catch {
          this.response = null;
        }
        for (const listener of this.events.get('load') ?? []) listener();
      } catch {
        for (const listener of this.events.get('error') ?? []) listener();
      }
    })();
  }
}

async function rows<T extends object>(text: string, params: unknown[] = []) {
  return query<T & Record<string, unknown>>(db.current().url, text, params);
}

function uploader() {
  return genUploader<PhotoFileRouter>({ url: `${appUrl}/api/uploadthing`, package: 'uploadthing/client', fetch: globalThis.fetch });
}

/** Every file under MEDIA_DIR, relative, the dot folders (staging, trash) included. */
async function mediaFiles(): Promise<string[]> {
  const entries = await fs.readdir(mediaDir, { recursive: true, withFileTypes: true });
  return entries.filter((e) => e.isFile()).map((e) => path.relative(mediaDir, path.join(e.parentPath, e.name))).sort();
}

async function phoneJpeg(): Promise<Buffer> {
  return sharp({ create: { width: 1200, height: 800, channels: 3, background: '#8a8178' } })
    .jpeg()
    .withExif({ IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '53/1 16/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '6/1 15/1 0/1' } })
    .withMetadata({ orientation: 6 })
    .toBuffer();
}

async function failure(promise: Promise<unknown>): Promise<Error & { code?: string; cause?: unknown }> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(Error);
  return error as Error & { code?: string; cause?: unknown };
}

beforeAll(async () => {
  mediaDir = await fs.mkdtemp(path.join(os.tmpdir(), 'demold-media-'));
  process.env.MEDIA_DIR = mediaDir;
  (globalThis as { XMLHttpRequest?: unknown }).XMLHttpRequest = FetchXMLHttpRequest;

  app = http.createServer(async (req, res) => {
    const chunks: Buffer[] = [];
    for await (const chunk of req) chunks.push(chunk as Buffer);
    const url = new URL(req.url ?? '/', appUrl);
    const headers = new Headers();
    for (const [key, value] of Object.entries(req.headers)) if (value !== undefined) headers.set(key, Array.isArray(value) ? value.join(',') : value);
    const method = req.method ?? 'GET';
    const request = new Request(url, { method, headers, body: method === 'GET' || method === 'HEAD' ? undefined : Buffer.concat(chunks) });
    let response: Response;
    if (url.pathname === '/api/uploadthing') {
      const route = await import('@/app/api/uploadthing/route');
      response = await (method === 'GET' ? route.GET : route.POST)(request, undefined);
    } else if (url.pathname.startsWith('/media/') && method === 'GET') {
      const route = await import('@/app/media/[...path]/route');
      response = await route.GET(request, { params: Promise.resolve({ path: url.pathname.slice('/media/'.length).split('/') }) });
    } else {
      response = Response.json({ error: { code: 'not_found', message: 'not here' } }, { status: 404 });
    }
    res.writeHead(response.status, Object.fromEntries(response.headers));
    res.end(Buffer.from(await response.arrayBuffer()));
  });
  await new Promise<void>((resolve) => app.listen(0, '127.0.0.1', resolve));
  appUrl = `http://127.0.0.1:${(app.address() as AddressInfo).port}`;

  fake = await startFakeUploadthing({ port: 0, apiKey: API_KEY, appId: APP_ID, serverDataTimeoutMs: 20_000 });
  Object.assign(process.env, {
    UPLOADTHING_TOKEN: fake.token,
    UPLOADTHING_INGEST_URL: fake.url,
    UPLOADTHING_API_URL: fake.url,
    UPLOADTHING_CALLBACK_URL: `${appUrl}/api/uploadthing`,
    UPLOADTHING_IS_DEV: 'false',
    UPLOADTHING_LOG_LEVEL: 'Error',
  });

  const [owner] = await rows<{ id: string; email: string }>(`SELECT id, email FROM users WHERE role = 'owner' ORDER BY email LIMIT 1`);
  const [customer] = await rows<{ id: string }>(`INSERT INTO users (email, name, role) VALUES ('buyer@uploads.example', 'Buyer', 'customer') RETURNING id`);
  people = {
    owner: { id: owner!.id, email: owner!.email, name: 'Owner', role: 'owner' },
    customer: { id: customer!.id, email: 'buyer@uploads.example', name: 'Buyer', role: 'customer' },
  };
  const [design] = await rows<{ id: string; old_bone: string }>(
    `SELECT d.id, f.id AS old_bone FROM designs d JOIN finishes f ON f.design_id = d.id WHERE d.slug = 'ibex' AND f.slug = 'old-bone'`,
  );
  const [hareFinish] = await rows<{ id: string }>(`SELECT f.id FROM finishes f JOIN designs d ON d.id = f.design_id WHERE d.slug = 'hare' LIMIT 1`);
  ibex = { designId: design!.id, oldBone: design!.old_bone, verdigrisOfHare: hareFinish!.id };
});

beforeEach(() => {
  currentUser = null;
  cache.expired = [];
  process.env.UPLOADTHING_IS_DEV = 'false';
});

afterAll(async () => {
  await fake?.close();
  if (app) await new Promise<void>((resolve) => app.close(() => resolve()));
  if (mediaDir) await fs.rm(mediaDir, { recursive: true, force: true });
});

describe('a maker uploads photos from the workshop', () => {
  it('stores the photo upright, in every width and both formats, with its row, as the browser client drives it', async () => {
    currentUser = people.owner;
    const jpeg = await phoneJpeg();
    const progress: number[] = [];
    const [uploaded] = await uploader().uploadFiles('designPhoto', {
      files: [new File([new Uint8Array(jpeg)], 'ibex front.jpg', { type: 'image/jpeg' })],
      input: { designId: ibex.designId, finishId: ibex.oldBone },
      onUploadProgress: ({ progress: p }) => progress.push(p),
    });
    expect(progress.at(-1)).toBe(100);
    const result = uploaded!.serverData as PhotoUploadResult;
    expect(result).toMatchObject({ ok: true, width: 800, height: 1200 });
    if (!result.ok) throw new Error(result.message);

    const [row] = await rows<{ design_id: string; finish_id: string; src: string; alt: string; width: number; height: number; renditions: { width: number; height: number; format: string; path: string }[]; blur_data_url: string; bytes: number; source_key: string }>(
      `SELECT * FROM photos WHERE id = $1`,
      [result.photoId],
    );
    expect(row).toMatchObject({ design_id: ibex.designId, finish_id: ibex.oldBone, src: result.src, width: 800, height: 1200, bytes: jpeg.length, source_key: uploaded!.key });
    expect(row!.alt).toBe('Ibex mask in the Old Bone finish, studio photo.');
    expect(row!.src).toMatch(/^\/media\/[a-f0-9]{32}\/800\.webp$/);
    expect(row!.blur_data_url).toMatch(/^data:image\/webp;base64,/);
    expect(row!.renditions.map((r) => `${r.width}.${r.format}`)).toEqual(['320.webp', '320.avif', '640.webp', '640.avif', '800.webp', '800.avif']);
    const files = await mediaFiles();
    expect(files).toEqual(row!.renditions.map((r) => r.path).sort());
    expect(files.some((f) => f.startsWith('.'))).toBe(false);

    // Served by the app with the right type and a year's cache; the bytes are the stored file's.
    const served = await fetch(`${appUrl}${row!.src}`);
    expect(served.status).toBe(200);
    expect(served.headers.get('content-type')).toBe('image/webp');
    expect(served.headers.get('cache-control')).toBe('public, max-age=31536000, immutable');
    expect(Buffer.from(await served.arrayBuffer()).equals(await fs.readFile(path.join(mediaDir, row!.renditions[4]!.path)))).toBe(true);
    expect((await fetch(`${appUrl}/media/${row!.src.split('/')[2]}/801.webp`)).status).toBe(404);
    expect((await fetch(`${appUrl}/media/..%2F..%2Fetc/passwd`)).status).toBe(404);

    // The upload service kept the original, and its file URL serves it back.
    expect(Buffer.from(await (await fetch(uploaded!.ufsUrl)).arrayBuffer()).equals(jpeg)).toBe(true);
    const callbacks = fake.state().callbacks.filter((c) => c.key === uploaded!.key);
    expect(callbacks).toEqual([expect.objectContaining({ hook: 'callback', status: 200 })]);

    // The shop shows it at once: the catalogue, the design's page and the drops are expired, not left stale.
    expect(cache.expired).toEqual(['catalogue', 'design:ibex', 'drops'].map((tag) => ({ tag, profile: { expire: 0 } })));
  });

  it('takes several photos at once, one row each, and the same upload processed again stores no second photo', async () => {
    currentUser = people.owner;
    const png = await sharp({ create: { width: 700, height: 500, channels: 4, background: { r: 63, g: 107, b: 79, alpha: 0.5 } } }).png().toBuffer();
    const webp = await sharp({ create: { width: 1000, height: 1000, channels: 3, background: '#a33b20' } }).webp().toBuffer();
    const results = await uploader().uploadFiles('designPhoto', {
      files: [new File([new Uint8Array(png)], 'hare.png', { type: 'image/png' }), new File([new Uint8Array(webp)], 'moth.webp', { type: 'image/webp' })],
      input: { designId: ibex.designId },
    });
    const data = results.map((r) => r.serverData as PhotoUploadResult);
    expect(data.map((d) => d.ok)).toEqual([true, true]);
    const stored = await rows<{ finish_id: string | null; width: number; alt: string }>(`SELECT finish_id, width, alt FROM photos WHERE source_key = ANY($1) ORDER BY width`, [results.map((r) => r.key)]);
    expect(stored).toEqual([
      { finish_id: null, width: 700, alt: 'Ibex mask, studio photo.' },
      { finish_id: null, width: 1000, alt: 'Ibex mask, studio photo.' },
    ]);

    // Delivered again (the service retries): the pipeline finds the key's photo and stores nothing new.
    const { processUpload } = await import('@/lib/photos/pipeline');
    const again = await processUpload({ url: results[0]!.ufsUrl, designId: ibex.designId, sourceKey: results[0]!.key });
    expect(again.id).toBe((data[0] as { photoId: string }).photoId);
    const [{ n }] = (await rows<{ n: number }>(`SELECT count(*)::int AS n FROM photos WHERE source_key = $1`, [results[0]!.key])) as [{ n: number }];
    expect(n).toBe(1);
  });

  it('works the same in uploadthing’s dev mode, where the callback comes down a stream', async () => {
    currentUser = people.owner;
    process.env.UPLOADTHING_IS_DEV = 'true';
    const png = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#ede6da' } }).png().toBuffer();
    const [uploaded] = await uploader().uploadFiles('designPhoto', {
      files: [new File([new Uint8Array(png)], 'boar.png', { type: 'image/png' })],
      input: { designId: ibex.designId, finishId: ibex.oldBone },
    });
    expect(uploaded!.serverData).toMatchObject({ ok: true, width: 640 });
    expect(fake.state().callbacks.filter((c) => c.key === uploaded!.key)).toEqual([expect.objectContaining({ url: 'stream', error: null })]);
  });

  it('deletes a photo with its files', async () => {
    const [photo] = await rows<{ id: string; src: string; renditions: { path: string }[] }>(`SELECT id, src, renditions FROM photos WHERE width = 1000 AND source_key IS NOT NULL`);
    const before = await mediaFiles();
    const { deletePhoto } = await import('@/lib/photos/pipeline');
    expect(await deletePhoto(photo!.id)).toEqual({ deleted: true });
    expect(await rows(`SELECT 1 FROM photos WHERE id = $1`, [photo!.id])).toEqual([]);
    const after = await mediaFiles();
    expect(before.filter((f) => !after.includes(f)).sort()).toEqual(photo!.renditions.map((r) => r.path).sort());
    expect(after.some((f) => f.startsWith('.'))).toBe(false);
    expect((await fetch(`${appUrl}${photo!.src}`)).status).toBe(404);
    expect(await deletePhoto(photo!.id)).toEqual({ deleted: false });
  });
});

describe('what is refused', () => {
  const count = async () => ((await rows<{ n: number }>(`SELECT count(*)::int AS n FROM photos`))[0] as { n: number }).n;

  it('a buyer gets no upload URL: the route’s middleware says why, and nothing reaches the upload service', async () => {
    currentUser = people.customer;
    const [rowsBefore, registrationsBefore, filesBefore] = [await count(), fake.state().registrations.length, await mediaFiles()];
    const error = await failure(
      uploader().uploadFiles('designPhoto', { files: [new File([new Uint8Array(await phoneJpeg())], 'x.jpg', { type: 'image/jpeg' })], input: { designId: ibex.designId } }),
    );
    expect(error.message).toBe('Only the studio’s maker (an owner) can add photos of designs.');
    expect(error.code).toBe('FORBIDDEN');
    expect([await count(), fake.state().registrations.length, await mediaFiles()]).toEqual([rowsBefore, registrationsBefore, filesBefore]);
  });

  it('someone not signed in is told to sign in (401, in the app’s error shape)', async () => {
    const response = await fetch(`${appUrl}/api/uploadthing?actionType=upload&slug=designPhoto`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ files: [{ name: 'x.jpg', size: 10, type: 'image/jpeg' }], input: { designId: ibex.designId } }),
    });
    expect(response.status).toBe(401);
    expect(await response.json()).toEqual({ error: { code: 'unauthenticated', message: 'Sign in as the studio’s maker to add photos.' } });
  });

  it('a text file named .jpg is uploaded, then refused by its bytes: a message, no row, no files, and the upload removed', async () => {
    currentUser = people.owner;
    const [rowsBefore, filesBefore] = [await count(), await mediaFiles()];
    const [uploaded] = await uploader().uploadFiles('designPhoto', {
      files: [new File(['Pull list: Ibex ×3 in Old Bone.\n'], 'pull-list.jpg', { type: 'image/jpeg' })],
      input: { designId: ibex.designId },
    });
    expect(uploaded!.serverData).toEqual({
      ok: false,
      code: 'photo_unsupported_type',
      message: expect.stringContaining('only JPEG, PNG, WebP or AVIF photos can be added'),
    });
    expect(await count()).toBe(rowsBefore);
    expect(await mediaFiles()).toEqual(filesBefore);
    expect(fake.state().files.map((f) => f.key)).not.toContain(uploaded!.key);
  });

  it('a file that does not even claim to be a photo is refused before any upload, in words', async () => {
    currentUser = people.owner;
    const registrationsBefore = fake.state().registrations.length;
    const error = await failure(uploader().uploadFiles('designPhoto', { files: [new File(['hello'], 'notes.txt', { type: 'text/plain' })], input: { designId: ibex.designId } }));
    expect(error.message).toBe('“notes.txt” is not a JPEG, PNG, WebP or AVIF photo, so nothing was uploaded.');
    expect(fake.state().registrations.length).toBe(registrationsBefore);
  });

  it('a photo over 20 MB, and more than 10 at once, with the limits in the message', async () => {
    currentUser = people.owner;
    const big = new File([new Uint8Array(20 * 1024 * 1024 + 1)], 'huge.jpg', { type: 'image/jpeg' });
    expect((await failure(uploader().uploadFiles('designPhoto', { files: [big], input: { designId: ibex.designId } }))).message).toBe(
      'A photo is over the 20 MB limit: export it smaller and try again.',
    );
    const many = Array.from({ length: 11 }, (_, i) => new File([new Uint8Array(10)], `p${i}.jpg`, { type: 'image/jpeg' }));
    expect((await failure(uploader().uploadFiles('designPhoto', { files: many, input: { designId: ibex.designId } }))).message).toBe('Choose at most 10 photos at a time.');
  });

  it('a finish of another design, or no design at all', async () => {
    currentUser = people.owner;
    const file = () => new File([new Uint8Array(10)], 'p.jpg', { type: 'image/jpeg' });
    expect((await failure(uploader().uploadFiles('designPhoto', { files: [file()], input: { designId: ibex.designId, finishId: ibex.verdigrisOfHare } }))).message).toBe(
      'That finish belongs to another design, not the Ibex.',
    );
    expect((await failure(uploader().uploadFiles('designPhoto', { files: [file()], input: { designId: 'not-a-uuid' } }))).message).toContain('The upload request was not understood');
  });

  it('a callback that is not signed with the API key', async () => {
    const before = await count();
    const body = JSON.stringify({ status: 'uploaded', metadata: { designId: ibex.designId, finishId: null, uploadedBy: people.owner.id }, origin: fake.url, file: { name: 'x.jpg', size: 1, type: 'image/jpeg', customId: null, key: 'forged', url: 'http://127.0.0.1:9/x', appUrl: 'http://127.0.0.1:9/x', ufsUrl: 'http://127.0.0.1:9/x', fileHash: 'x' } });
    const response = await fetch(`${appUrl}/api/uploadthing?slug=designPhoto`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'uploadthing-hook': 'callback', 'x-uploadthing-signature': `hmac-sha256=${'0'.repeat(64)}` },
      body,
    });
    expect(response.status).toBe(400);
    expect(await response.json()).toMatchObject({ error: { code: 'signature_invalid' } });
    expect(await count()).toBe(before);
  });

  it('a presigned URL changed after signing is refused by the ingest', async () => {
    currentUser = people.owner;
    const response = await fetch(`${appUrl}/api/uploadthing?actionType=upload&slug=designPhoto`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ files: [{ name: 'x.jpg', size: 10, type: 'image/jpeg' }], input: { designId: ibex.designId } }),
    });
    const [presigned] = (await response.json()) as { url: string }[];
    const tampered = presigned!.url.replace('x-ut-file-size=10', 'x-ut-file-size=99999');
    const form = new FormData();
    form.append('file', new File([new Uint8Array(99_999)], 'x.jpg'));
    const put = await fetch(tampered, { method: 'PUT', body: form });
    expect(put.status).toBe(403);
    expect(((await put.json()) as { error: string }).error).toMatch(/Invalid signature/);
  });

  it('a request that is no upload at all gets a 400 in words, as the access probes expect', async () => {
    const response = await fetch(`${appUrl}/api/uploadthing`, { method: 'POST' });
    expect(response.status).toBe(400);
    const body = (await response.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toMatch(/^[a-z_]+$/);
    expect(body.error.message).toMatch(/^The upload request was not understood/);
    const missing = await fetch(`${appUrl}/media/${'0'.repeat(32)}/320.webp`);
    expect(missing.status).toBe(404);
    expect(await missing.json()).toEqual({ error: { code: 'not_found', message: 'There is no such photo file: it may have been deleted.' } });
  });

  it('without a token the route answers 503 with what is missing, rather than failing', async () => {
    const token = process.env.UPLOADTHING_TOKEN;
    delete process.env.UPLOADTHING_TOKEN;
    try {
      const response = await fetch(`${appUrl}/api/uploadthing`);
      expect(response.status).toBe(503);
      expect(await response.json()).toEqual({
        error: { code: 'uploads_not_configured', message: 'Photo uploads are not set up on this server yet: UPLOADTHING_TOKEN is not set.' },
      });
    } finally {
      process.env.UPLOADTHING_TOKEN = token;
    }
    const config = await fetch(`${appUrl}/api/uploadthing`);
    expect(config.status).toBe(200);
    expect(await config.json()).toEqual([{ slug: 'designPhoto', config: expect.objectContaining({ image: expect.objectContaining({ maxFileSize: `${20 * 1024 * 1024}B`, maxFileCount: 10 }) }) }]);
  });
});

describe('photos of one batch', () => {
  let batches: { ibexWinter: string; hareFirstLight: string };
  beforeAll(async () => {
    const found = await rows<{ id: string; slug: string }>(
      `SELECT b.id, d.slug FROM batches b JOIN designs d ON d.id = b.design_id WHERE b.name IN ('Winter batch', 'First light')`,
    );
    batches = { ibexWinter: found.find((b) => b.slug === 'ibex')!.id, hareFirstLight: found.find((b) => b.slug === 'hare')!.id };
  });
  const photoCount = async () => ((await rows<{ n: number }>(`SELECT count(*)::int AS n FROM photos`))[0] as { n: number }).n;
  const png = (width: number, height: number, background: string) => sharp({ create: { width, height, channels: 3, background } }).png().toBuffer();

  it('stores a batch photo with its batch, shows it on the drop and not in the design’s gallery, and drops the cached pages', async () => {
    currentUser = people.owner;
    const [whole] = await uploader().uploadFiles('designPhoto', {
      files: [new File([new Uint8Array(await png(900, 1200, '#5b4a3a'))], 'winter bench.png', { type: 'image/png' })],
      input: { designId: ibex.designId, batchId: batches.ibexWinter },
    });
    const [ofFinish] = await uploader().uploadFiles('designPhoto', {
      files: [new File([new Uint8Array(await png(960, 1200, '#d8cfbf'))], 'winter old bone.png', { type: 'image/png' })],
      input: { designId: ibex.designId, finishId: ibex.oldBone, batchId: batches.ibexWinter },
    });
    const [a, b] = [whole!.serverData, ofFinish!.serverData] as PhotoUploadResult[];
    if (!a?.ok || !b?.ok) throw new Error(`not stored: ${JSON.stringify([a, b])}`);

    const stored = await rows<{ id: string; design_id: string; finish_id: string | null; batch_id: string | null; alt: string }>(
      `SELECT id, design_id, finish_id, batch_id, alt FROM photos WHERE id = ANY($1) ORDER BY width`,
      [[a.photoId, b.photoId]],
    );
    expect(stored).toEqual([
      { id: a.photoId, design_id: ibex.designId, finish_id: null, batch_id: batches.ibexWinter, alt: 'Ibex mask from the batch “Winter batch”, studio photo.' },
      { id: b.photoId, design_id: ibex.designId, finish_id: ibex.oldBone, batch_id: batches.ibexWinter, alt: 'Ibex mask in the Old Bone finish from the batch “Winter batch”, studio photo.' },
    ]);
    const expected = ['catalogue', 'design:ibex', 'drops', `batch:${batches.ibexWinter}`].map((tag) => ({ tag, profile: { expire: 0 } }));
    expect(cache.expired).toEqual([...expected, ...expected]);

    // The same callback again (the service retries) stores nothing new.
    const { processUpload } = await import('@/lib/photos/pipeline');
    expect((await processUpload({ url: whole!.ufsUrl, designId: ibex.designId, batchId: batches.ibexWinter, sourceKey: whole!.key })).id).toBe(a.photoId);
    expect(await rows(`SELECT 1 FROM photos WHERE source_key = $1`, [whole!.key])).toHaveLength(1);

    // The drop shows its own photos, and prefers them (though last in the design's order): the batch's
    // first photo is its cover, its Old Bone photo is on that finish.
    const drops = await import('@/lib/drops/catalogue');
    const drop = await drops.getDrop(batches.ibexWinter);
    expect(drop!.photos.map((p) => p.src)).toEqual([a.src, b.src]);
    expect(drop!.photos[0]).toEqual({ src: a.src, alt: stored[0]!.alt, width: 900, height: 1200 });
    expect(drop!.finishes.find((f) => f.slug === 'old-bone')!.photo?.src).toBe(b.src);
    expect((await drops.listDrops()).find((s) => s.id === batches.ibexWinter)?.cover).toEqual({ src: a.src, alt: stored[0]!.alt });

    // Even moved first in the design's order, the batch photo is not the design's cover, nor in Old Bone's gallery.
    await rows(`UPDATE photos SET position = -1 WHERE id = $1 RETURNING id`, [a.photoId]);
    const designs = await import('@/lib/catalogue/designs');
    const card = (await designs.listDesignsForHome()).designs.find((d) => d.slug === 'ibex');
    expect(card?.cover?.src).toBeDefined();
    expect([a.src, b.src]).not.toContain(card!.cover!.src);
    const detail = await designs.getPublishedDesignBySlug('ibex');
    const oldBone = detail!.finishes.find((f) => f.slug === 'old-bone')!;
    expect(oldBone.photos.length).toBeGreaterThan(0);
    expect(oldBone.photos.map((p) => p.src)).not.toContain(b.src);

    // Nor is it on another drop of the same design: that one keeps the design's own photos.
    const [spring] = await rows<{ id: string }>(
      `INSERT INTO batches (design_id, name, status, opens_at, closes_at, ship_by)
       VALUES ($1, 'Spring batch', 'scheduled', now() + interval '10 days', now() + interval '12 days', current_date + 60) RETURNING id`,
      [ibex.designId],
    );
    const springCover = (await drops.listDrops()).find((s) => s.id === spring!.id)?.cover;
    expect(springCover?.src).toBeDefined();
    expect([a.src, b.src]).not.toContain(springCover!.src);
  });

  it('refuses a batch of another design (422 in the pipeline) and leaves no row, no files and no upload', async () => {
    currentUser = people.owner;
    const [rowsBefore, filesBefore, registrationsBefore] = [await photoCount(), await mediaFiles(), fake.state().registrations.length];
    const error = await failure(
      uploader().uploadFiles('designPhoto', {
        files: [new File([new Uint8Array(await png(800, 1000, '#3f6b4f'))], 'hare.png', { type: 'image/png' })],
        input: { designId: ibex.designId, batchId: batches.hareFirstLight },
      }),
    );
    expect(error.message).toBe('That batch is of another design, not the Ibex: add its photos from the batch’s own page.');

    // The same refusal where the bytes are already here (the callback's path): a 422, before anything is written.
    const { savePhoto } = await import('@/lib/photos/pipeline');
    const refused = await failure(savePhoto(await png(800, 1000, '#3f6b4f'), { designId: ibex.designId, batchId: batches.hareFirstLight, sourceKey: 'refused-batch' }));
    expect(refused).toMatchObject({ code: 'batch_of_other_design', status: 422 });
    expect([await photoCount(), await mediaFiles(), fake.state().registrations.length]).toEqual([rowsBefore, filesBefore, registrationsBefore]);
    expect(cache.expired).toEqual([]);
  });

  it('an unknown batch is a 404, and a batch id that is no id is refused in words', async () => {
    currentUser = people.owner;
    const rowsBefore = await photoCount();
    const file = () => new File([new Uint8Array(10)], 'p.jpg', { type: 'image/jpeg' });
    const missing = await failure(uploader().uploadFiles('designPhoto', { files: [file()], input: { designId: ibex.designId, batchId: '00000000-0000-4000-8000-000000000000' } }));
    expect([missing.code, missing.message]).toEqual(['NOT_FOUND', 'There is no such batch: reload the page and try again.']);
    const { findPhotoTarget } = await import('@/lib/photos/pipeline');
    expect(await failure(findPhotoTarget(ibex.designId, null, '00000000-0000-4000-8000-000000000000'))).toMatchObject({ code: 'batch_not_found', status: 404 });
    const malformed = await failure(uploader().uploadFiles('designPhoto', { files: [file()], input: { designId: ibex.designId, batchId: 'winter' } }));
    expect(malformed.message).toBe('The upload request was not understood: The batch’s id is missing or wrong: reload the batch’s page and try again.');
    expect(await photoCount()).toBe(rowsBefore);
  });
});
