import { simpleParser } from 'mailparser';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerError, type SMTPServerSession } from 'smtp-server';
import { BOUNCE_TEXT, type FaultState, RATE_REFUSE_TEXT } from './faults';
import type { Inbox, StoredEmail } from './store';

/** Larger messages are refused with 552; the app's e-mails are a few kilobytes. */
export const MAX_MESSAGE_BYTES = 10 * 1024 * 1024;

function smtpError(code: number, message: string): SMTPServerError {
  const error: SMTPServerError = new Error(message);
  error.responseCode = code;
  return error;
}

/** Reads the DATA stream to the end (it must be drained even when refused), keeping at most the cap. */
function readMessage(stream: SMTPServerDataStream): Promise<{ raw: Buffer; tooLarge: boolean }> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    stream.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size <= MAX_MESSAGE_BYTES) chunks.push(chunk);
    });
    stream.once('end', () => resolve({ raw: Buffer.concat(chunks), tooLarge: stream.sizeExceeded || size > MAX_MESSAGE_BYTES }));
    stream.once('error', reject);
  });
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

export function createSmtpServer(
  inbox: Inbox,
  faults: FaultState,
  log: (email: StoredEmail) => void,
): SMTPServer {
  const refusal = () => {
    const refuse = faults.current.refuse;
    return refuse ? smtpError(refuse.code, refuse.message) : null;
  };

  async function receive(stream: SMTPServerDataStream, session: SMTPServerSession): Promise<StoredEmail> {
    const { raw, tooLarge } = await readMessage(stream);
    const { latencyMs } = faults.current;
    if (latencyMs > 0) await sleep(latencyMs);
    if (tooLarge) {
      inbox.countRefused();
      throw smtpError(552, `5.3.4 Message larger than ${MAX_MESSAGE_BYTES} bytes`);
    }
    // Read after the delay: a fault set while the client waits applies to its answer.
    const refused = refusal();
    const byRate = faults.shouldRefuseByRate();
    if (refused || byRate) {
      inbox.countRefused();
      throw refused ?? smtpError(451, RATE_REFUSE_TEXT);
    }
    const parsed = await simpleParser(raw);
    const envelope = {
      from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
      to: session.envelope.rcptTo.map((r) => r.address),
    };
    const email = inbox.add(parsed, envelope, raw.length);
    log(email);
    return email;
  }

  return new SMTPServer({
    name: 'fake-mail.demold.invalid',
    banner: 'Demold fake mail, for tests and the demo only',
    // Plain SMTP only: nodemailer then never tries STARTTLS, and no certificate is needed.
    secure: false,
    disabledCommands: ['STARTTLS'],
    // No account to check, but a client configured with a user and password must still get through.
    authOptional: true,
    allowInsecureAuth: true,
    authMethods: ['PLAIN', 'LOGIN'],
    size: MAX_MESSAGE_BYTES,
    disableReverseLookup: true,
    // A test may hold DATA for up to a minute; the server must not drop the client meanwhile.
    socketTimeout: 120_000,
    closeTimeout: 1_000,
    logger: false,
    onAuth(auth, _session, callback) {
      callback(null, { user: auth.username ?? 'anonymous' });
    },
    onMailFrom(_address, _session, callback) {
      const refused = refusal();
      if (refused) inbox.countRefused();
      callback(refused);
    },
    onRcptTo(address, _session, callback) {
      if (faults.bounces(address.address)) {
        inbox.countBounced();
        return callback(smtpError(550, BOUNCE_TEXT));
      }
      callback();
    },
    onData(stream, session, callback) {
      receive(stream, session).then(
        (email) => callback(null, `OK: queued as ${email.id}`),
        (error: unknown) => {
          if (error instanceof Error && 'responseCode' in error) return callback(error);
          console.error('[fake-mail] could not read a message', error);
          callback(smtpError(451, '4.3.0 The fake could not read the message'));
        },
      );
    },
  });
}
