// Starts the fake UploadThing as its own process for the demo and the test run, and waits until it answers.
import { isPortOpen, startService, waitForHttp } from '../../scripts/lib/run.mjs';

export const DEFAULT_UPLOADTHING_PORT = 12311;

/** Made up, and only the fake accepts them (keep the key in step with DEFAULT_FAKE_API_KEY in server.ts). */
export const fakeUploadthingKeys = {
  apiKey: 'sk_test_demold_fake_uploadthing_000000',
  appId: 'demoldfake',
};

/** UPLOADTHING_TOKEN: base64 of { apiKey, appId, regions }, the shape uploadthing's server reads. */
export function fakeUploadthingToken({ apiKey, appId } = fakeUploadthingKeys) {
  return Buffer.from(JSON.stringify({ apiKey, appId, regions: ['fake-local'] })).toString('base64');
}

/**
 * The variables that point the app's uploadthing route handler at the fake. `callbackUrl` is the app's
 * own /api/uploadthing as the fake can reach it; the non-dev mode is the one the fake is built for.
 */
export function uploadthingEnvFor(url, { callbackUrl, apiKey = fakeUploadthingKeys.apiKey, appId = fakeUploadthingKeys.appId } = {}) {
  const env = {
    UPLOADTHING_TOKEN: fakeUploadthingToken({ apiKey, appId }),
    UPLOADTHING_INGEST_URL: url,
    UPLOADTHING_API_URL: url,
    UPLOADTHING_IS_DEV: 'false',
  };
  if (callbackUrl) env.UPLOADTHING_CALLBACK_URL = callbackUrl;
  return env;
}

export async function startFakeUploadthingService({ port = DEFAULT_UPLOADTHING_PORT, callbackUrl, apiKey = fakeUploadthingKeys.apiKey, appId = fakeUploadthingKeys.appId, quiet = false } = {}) {
  if (await isPortOpen(port)) {
    throw new Error(`Port ${port} on 127.0.0.1 is taken, so the fake UploadThing cannot start. Stop what uses it, or pick another port.`);
  }
  const env = {
    ...process.env,
    FAKE_UPLOADTHING_API_KEY: apiKey,
    FAKE_UPLOADTHING_APP_ID: appId,
    FAKE_UPLOADTHING_CALLBACK_URL: callbackUrl ?? '',
  };
  const service = startService('uploadthing', process.execPath, ['--import', 'tsx', 'fake-services/uploadthing/server.ts', '--port', String(port)], { env, quiet });
  const url = `http://127.0.0.1:${port}`;
  await waitForHttp(`${url}/_control/state`, { timeoutMs: 30_000, process: service.child });
  return { service, url, apiKey, appId, token: fakeUploadthingToken({ apiKey, appId }), env: uploadthingEnvFor(url, { callbackUrl, apiKey, appId }) };
}
