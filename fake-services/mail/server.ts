import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { argValue, assertLoopback, closeServer, listen, runAsCli } from '../lib/serve';
import { FaultState } from './faults';
import { handleRequest, type MailContext } from './http';
import { createSmtpServer } from './smtp';
import { Inbox, type StoredEmail } from './store';

/*
 * A local stand-in for the mail provider: a real SMTP server that nodemailer talks to unchanged (so
 * production only changes SMTP_URL), keeping what it accepts in memory, with a web inbox, a REST API
 * for tests and faults a test can switch on. README.md says what it covers and what not.
 */

export const DEFAULT_SMTP_PORT = 1025;
export const DEFAULT_WEB_PORT = 1080;

export interface FakeMailOptions {
  /** 0 picks a free port. */
  smtpPort: number;
  webPort: number;
  /** Loopback only: anyone who can reach it can read every message. */
  host?: string;
  /** Print one line per accepted message. */
  logMessages?: boolean;
}

export interface FakeMail {
  smtpPort: number;
  webPort: number;
  smtpUrl: string;
  inboxUrl: string;
  context: MailContext;
  close(): Promise<void>;
}

function logLine(email: StoredEmail): void {
  const to = email.envelope.to.join(', ');
  console.log(`received ${email.id}: ${email.envelope.from || '<>'} → ${to}: ${JSON.stringify(email.subject)}`);
}

export async function startFakeMailServer(options: FakeMailOptions): Promise<FakeMail> {
  const host = options.host ?? '127.0.0.1';
  assertLoopback(host, 'mail server');
  const context: MailContext = { inbox: new Inbox(), faults: new FaultState() };

  const smtp = createSmtpServer(context.inbox, context.faults, options.logMessages ? logLine : () => {});
  let smtpListening = false;
  // Before listening, the error is the port's and rejects below; after, it is one connection's.
  smtp.on('error', (error: NodeJS.ErrnoException) => {
    if (smtpListening && error.code !== 'ECONNRESET' && error.code !== 'EPIPE') console.error(`[fake-mail] SMTP: ${error.message}`);
  });
  await new Promise<void>((resolve, reject) => {
    smtp.server.once('error', reject);
    smtp.listen(options.smtpPort, host, () => {
      smtp.server.off('error', reject);
      smtpListening = true;
      resolve();
    });
  });
  const smtpPort = (smtp.server.address() as AddressInfo).port;

  const web = http.createServer((req, res) => void handleRequest(context, req, res));
  let webStarted: { port: number; url: string };
  try {
    webStarted = await listen(web, options.webPort, host);
  } catch (error) {
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
    throw error;
  }

  return {
    smtpPort,
    webPort: webStarted.port,
    smtpUrl: `smtp://${host}:${smtpPort}`,
    inboxUrl: webStarted.url,
    context,
    async close() {
      await Promise.all([new Promise<void>((resolve) => smtp.close(() => resolve())), closeServer(web)]);
    },
  };
}

function portArg(args: string[], name: string, variable: string, fallback: number): number {
  const raw = argValue(args, name) ?? process.env[variable] ?? String(fallback);
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 0 || port > 65_535) throw new Error(`Not a port for ${name}: ${raw}`);
  return port;
}

// `node --import tsx fake-services/mail/server.ts [--smtp-port 1025] [--web-port 1080] [--host 127.0.0.1]`
runAsCli('mail', async (args) => {
  const fake = await startFakeMailServer({
    smtpPort: portArg(args, '--smtp-port', 'FAKE_SMTP_PORT', DEFAULT_SMTP_PORT),
    webPort: portArg(args, '--web-port', 'FAKE_INBOX_PORT', DEFAULT_WEB_PORT),
    host: argValue(args, '--host'),
    logMessages: true,
  });
  console.log(`fake mail: SMTP on ${fake.smtpUrl}, inbox on ${fake.inboxUrl}`);
  return fake;
});
