// Starts the fake mail provider (fake-services/mail/server.ts) as its own process for the demo and the
// test run, on loopback only, and waits until its API answers. The app sends through nodemailer to
// SMTP_URL exactly as it would to a real provider.
import { isPortOpen, startService, waitForHttp } from '../../scripts/lib/run.mjs';

// Keep in step with server.ts.
export const DEFAULT_SMTP_PORT = 1025;
export const DEFAULT_WEB_PORT = 1080;

/** Starts the fake mail server and waits until its API answers; returns the service handle and its addresses. */
export async function startFakeMail({ smtpPort = DEFAULT_SMTP_PORT, webPort = DEFAULT_WEB_PORT, quiet = false } = {}) {
  for (const port of [smtpPort, webPort]) {
    if (await isPortOpen(port)) {
      throw new Error(
        `Port ${port} on 127.0.0.1 is taken, so the fake inbox cannot start. Stop what uses it ` +
          `(perhaps another demo), or pick other ports with FAKE_SMTP_PORT / FAKE_INBOX_PORT.`,
      );
    }
  }
  const service = startService(
    'mail',
    process.execPath,
    ['--import', 'tsx', 'fake-services/mail/server.ts', '--smtp-port', String(smtpPort), '--web-port', String(webPort), '--host', '127.0.0.1'],
    { quiet },
  );
  const inboxUrl = `http://127.0.0.1:${webPort}`;
  await waitForHttp(`${inboxUrl}/api/email`, { timeoutMs: 30_000, process: service.child });
  return { service, smtpUrl: `smtp://127.0.0.1:${smtpPort}`, inboxUrl };
}
