import http from 'node:http';
import { BodyTooLarge, readBody, sendJson } from '../lib/http-io';
import { argValue, assertLoopback, closeServer, listen, portFrom, runAsCli } from '../lib/serve';
import { handleCallbackResult, handleDeleteFiles, handleRouteMetadata } from './api';
import type { FakeContext, FakeSettings } from './context';
import { handleHead, handleOptions, handlePut, KEY_PATH, serveFile } from './ingest';
import { makeToken } from './protocol';
import { FakeState } from './state';

/*
 * A local stand-in for UploadThing that uploadthing's own packages talk to unchanged: the app's
 * `uploadthing/next` route handler (route metadata, callback results, UTApi.deleteFiles) and the
 * browser's `uploadthing/client` / `@uploadthing/react` (HEAD + PUT to the presigned URL), with the
 * signed callback to the app and a file host for the uploaded bytes. Point the app at it with
 *   UPLOADTHING_TOKEN=<token for this fake's apiKey/appId>  UPLOADTHING_INGEST_URL=<url>
 *   UPLOADTHING_API_URL=<url>
 * State lives in memory and is gone when the process ends. README.md says what it covers and what not.
 */

export interface FakeUploadthingOptions {
  /** 0 picks a free port. */
  port: number;
  /** Loopback only: anyone who can reach the fake can upload to it. */
  host?: string;
  /** The app's secret key (sk_…): signs presigned URLs and callbacks, and authenticates API calls. */
  apiKey: string;
  appId?: string;
  /** Deliver callbacks here instead of the URL the app registers (its own request URL, or UPLOADTHING_CALLBACK_URL). */
  callbackUrl?: string;
  /** How long a PUT waits for the app's route metadata to arrive (dev mode registers concurrently). */
  registrationWaitMs?: number;
  callbackTimeoutMs?: number;
  /** How long a PUT waits for the app's /callback-result when the route awaits server data. */
  serverDataTimeoutMs?: number;
  devStreamTimeoutMs?: number;
  maxFileBytes?: number;
}

export interface FakeUploadthing {
  url: string;
  port: number;
  apiKey: string;
  appId: string;
  /** UPLOADTHING_TOKEN for this fake. */
  token: string;
  state(): ReturnType<FakeState['snapshot']>;
  close(): Promise<void>;
}

export const DEFAULT_FAKE_APP_ID = 'demoldfake';
/** Made up; only the fake accepts it. Keep in step with index.mjs. */
export const DEFAULT_FAKE_API_KEY = 'sk_test_demold_fake_uploadthing_000000';

export async function startFakeUploadthing(options: FakeUploadthingOptions): Promise<FakeUploadthing> {
  const host = options.host ?? '127.0.0.1';
  assertLoopback(host, 'UploadThing');
  if (!options.apiKey?.startsWith('sk_')) throw new Error('The fake UploadThing needs the app’s API key (sk_…), as in UPLOADTHING_TOKEN.');
  if (options.callbackUrl) {
    const protocol = new URL(options.callbackUrl).protocol;
    if (protocol !== 'http:' && protocol !== 'https:') throw new Error(`The callback URL must be http(s): ${options.callbackUrl}`);
  }
  const settings: FakeSettings = {
    apiKey: options.apiKey,
    appId: options.appId ?? DEFAULT_FAKE_APP_ID,
    callbackUrl: options.callbackUrl ?? null,
    registrationWaitMs: options.registrationWaitMs ?? 5_000,
    callbackTimeoutMs: options.callbackTimeoutMs ?? 60_000,
    serverDataTimeoutMs: options.serverDataTimeoutMs ?? 60_000,
    devStreamTimeoutMs: options.devStreamTimeoutMs ?? 10 * 60_000,
    maxFileBytes: options.maxFileBytes ?? 64 * 1024 * 1024,
  };
  const state = new FakeState();
  const ctx: FakeContext = { state, settings, baseUrl: '' };

  const server = http.createServer((req, res) => {
    void (async () => {
      const method = req.method ?? 'GET';
      const url = new URL(req.url ?? '/', 'http://fake-uploadthing.invalid');
      const pathname = url.pathname;
      try {
        if (method === 'OPTIONS') return handleOptions(req, res);
        if (method === 'POST' && pathname === '/route-metadata') return handleRouteMetadata(ctx, req, res, await readBody(req));
        if (method === 'POST' && pathname === '/callback-result') return handleCallbackResult(ctx, req, res, await readBody(req));
        if (method === 'POST' && pathname === '/v6/deleteFiles') return handleDeleteFiles(ctx, req, res, await readBody(req));
        if (pathname.startsWith('/_control/')) return await handleControl(ctx, method, pathname, req, res);
        const key = KEY_PATH.exec(pathname)?.[1];
        if (key && method === 'PUT') return await handlePut(ctx, req, res);
        if (key && method === 'HEAD') return handleHead(ctx, req, res);
        const served = /^\/f\/([A-Za-z0-9]+)$/.exec(pathname) ?? /^\/a\/[^/]+\/([A-Za-z0-9]+)$/.exec(pathname);
        if (served && (method === 'GET' || method === 'HEAD')) return serveFile(ctx, req, res, served[1]!);
        if (method === 'GET' && pathname === '/') {
          return sendJson(res, 200, { service: 'fake UploadThing (Demold)', appId: settings.appId, files: state.files.size });
        }
        req.resume();
        sendJson(res, 404, { error: `The fake UploadThing has nothing at ${method} ${pathname}.` });
      } catch (error) {
        if (error instanceof BodyTooLarge) return sendJson(res, 413, { error: 'The request body is too large.' });
        console.error('[fake-uploadthing] unexpected failure', error);
        sendJson(res, 500, { error: 'The fake UploadThing failed unexpectedly.' });
      }
    })();
  });

  const { port, url } = await listen(server, options.port, host);
  ctx.baseUrl = url;

  return {
    url,
    port,
    apiKey: settings.apiKey,
    appId: settings.appId,
    token: makeToken(settings.apiKey, settings.appId),
    state: () => state.snapshot(),
    async close() {
      state.reset();
      await closeServer(server);
    },
  };
}

async function handleControl(ctx: FakeContext, method: string, pathname: string, req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
  if (method === 'GET' && pathname === '/_control/state') return sendJson(res, 200, ctx.state.snapshot());
  if (method === 'POST' && pathname === '/_control/reset') {
    await readBody(req, 1024);
    ctx.state.reset();
    return sendJson(res, 200, { ok: true });
  }
  req.resume();
  sendJson(res, 404, { error: `No control endpoint ${method} ${pathname}.` });
}

// `node --import tsx fake-services/uploadthing/server.ts [--port 12311] [--host 127.0.0.1]`
runAsCli('uploadthing', async (args) => {
  const fake = await startFakeUploadthing({
    port: portFrom(args, 'FAKE_UPLOADTHING_PORT', 12311),
    host: argValue(args, '--host'),
    apiKey: process.env.FAKE_UPLOADTHING_API_KEY || DEFAULT_FAKE_API_KEY,
    appId: process.env.FAKE_UPLOADTHING_APP_ID || DEFAULT_FAKE_APP_ID,
    callbackUrl: process.env.FAKE_UPLOADTHING_CALLBACK_URL || undefined,
  });
  console.log(`fake UploadThing listening on ${fake.url} (app ${fake.appId}; callbacks: ${process.env.FAKE_UPLOADTHING_CALLBACK_URL || 'to the URL the app registers'})`);
  return fake;
});
