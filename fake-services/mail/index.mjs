// The fake mail provider: maildev, an SMTP server with a web inbox and a REST API, on loopback only.
// The app sends through nodemailer to SMTP_URL exactly as it would to a real provider.
import path from 'node:path';
import { isPortOpen, root, startService, waitForHttp } from '../../scripts/lib/run.mjs';

export const DEFAULT_SMTP_PORT = 1025;
export const DEFAULT_WEB_PORT = 1080;

/** Starts maildev and waits until its API answers; returns the service handle and its addresses. */
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
    [
      path.join(root, 'node_modules/maildev/dist/bin/maildev.js'),
      '--smtp', String(smtpPort),
      '--web', String(webPort),
      '--ip', '127.0.0.1',
      '--web-ip', '127.0.0.1',
      '--max-emails', '2000',
    ],
    { quiet },
  );
  const inboxUrl = `http://127.0.0.1:${webPort}`;
  await waitForHttp(`${inboxUrl}/api/email`, { timeoutMs: 30_000, process: service.child });
  return { service, smtpUrl: `smtp://127.0.0.1:${smtpPort}`, inboxUrl };
}
