import nodemailer, { type SendMailOptions, type Transporter } from 'nodemailer';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startFakeMail } from '@/fake-services/mail/index.mjs';
import { stopService } from '@/scripts/lib/bench-app.mjs';
import { isPortOpen } from '@/scripts/lib/run.mjs';

// The fake mail server as the demo and `npm test` start it (its own process, through startFakeMail),
// driven by nodemailer as the app's lib/mail/transport.ts drives a provider: by SMTP URL only.

const SMTP_PORT = 1525;
const WEB_PORT = 1580;

type Listed = {
  id: string;
  messageId: string | null;
  subject: string;
  text: string;
  html: string | null;
  date: string;
  from: { address: string; name: string }[];
  to: { address: string; name: string }[];
  envelope: { from: string; to: string[] };
  headers: Record<string, string>;
  duplicate: boolean;
};
type Stats = { received: number; refused: number; bounced: number; distinctMessageIds: number; duplicates: number };
type SmtpError = Error & { responseCode?: number; response?: string; rejected?: string[] };

let mail: Awaited<ReturnType<typeof startFakeMail>>;
let transport: Transporter;

async function api<T>(path: string, init?: RequestInit): Promise<{ status: number; body: T }> {
  const response = await fetch(`${mail.inboxUrl}${path}`, init);
  return { status: response.status, body: (await response.json()) as T };
}

const inbox = async (query = '') => (await api<Listed[]>(`/api/email${query}`)).body;
const stats = async () => (await api<Stats>('/api/stats')).body;

function setFaults(body: unknown) {
  return api<Record<string, unknown>>('/_control/faults', {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: typeof body === 'string' ? body : JSON.stringify(body),
  });
}

function studioMail(overrides: SendMailOptions = {}): SendMailOptions {
  return {
    from: 'Marrowgate Studio <studio@marrowgate.example>',
    to: 'Juno Pell <juno@example.com>',
    subject: 'Your Ibex in Old Bone is cast',
    text: 'Your mask is out of the mold and on its way to trimming.',
    ...overrides,
  };
}

async function refusal(promise: Promise<unknown>): Promise<SmtpError> {
  const outcome = await promise.then(
    () => null,
    (error: unknown) => error as SmtpError,
  );
  if (!outcome) throw new Error('the send was expected to be refused, and it was accepted');
  return outcome;
}

beforeAll(async () => {
  for (const port of [SMTP_PORT, WEB_PORT]) {
    if (await isPortOpen(port)) throw new Error(`Port ${port} on 127.0.0.1 is taken; this test needs it for the fake mail server.`);
  }
  mail = await startFakeMail({ smtpPort: SMTP_PORT, webPort: WEB_PORT, quiet: true });
  transport = nodemailer.createTransport(mail.smtpUrl, { connectionTimeout: 5_000, greetingTimeout: 5_000, socketTimeout: 10_000 });
});

afterAll(async () => {
  transport?.close();
  if (mail) await stopService(mail.service);
});

beforeEach(async () => {
  const reset = await api<{ ok: boolean }>('/_control/reset', { method: 'POST' });
  expect(reset.status).toBe(200);
});

describe('receiving', () => {
  it('lists a sent message with its addresses, non-ASCII subject, bodies, date and custom header', async () => {
    const subject = 'Ihr Hirsch — „Soot & Gilt“ ist bemalt ✓';
    const before = Date.now();
    const info = await transport.sendMail(
      studioMail({
        subject,
        text: 'Bemalt und getrocknet. Grüße aus der Werkstatt.',
        html: '<p>Bemalt &amp; getrocknet.</p><script>alert(1)</script>',
        headers: { 'X-Demold-Order': 'MG-1001' },
      }),
    );
    expect(info.accepted).toEqual(['juno@example.com']);

    const list = await inbox();
    expect(list).toHaveLength(1);
    const [message] = list;
    expect(message).toMatchObject({
      subject,
      messageId: info.messageId,
      from: [{ address: 'studio@marrowgate.example', name: 'Marrowgate Studio' }],
      to: [{ address: 'juno@example.com', name: 'Juno Pell' }],
      envelope: { from: 'studio@marrowgate.example', to: ['juno@example.com'] },
      duplicate: false,
    });
    expect(message!.text.trim()).toBe('Bemalt und getrocknet. Grüße aus der Werkstatt.');
    expect(message!.html).toContain('<p>Bemalt &amp; getrocknet.</p>');
    expect(message!.headers['x-demold-order']).toBe('MG-1001');
    expect(message!.headers.subject).toBe(subject);
    // nodemailer writes a Date header at send time; the fake reports it as ISO 8601 (second precision).
    const sent = Date.parse(message!.date);
    expect(message!.date).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);
    expect(sent).toBeGreaterThanOrEqual(Math.floor(before / 1000) * 1000);
    expect(sent).toBeLessThanOrEqual(Date.now());

    const one = await api<Listed>(`/api/email/${message!.id}`);
    expect(one.status).toBe(200);
    expect(one.body).toEqual(message);
    const missing = await api<{ error: { code: string } }>('/api/email/nosuchmessage');
    expect(missing.status).toBe(404);
    expect(missing.body.error.code).toBe('not_found');
  });

  it('filters the list by recipient and keeps arrival order', async () => {
    await transport.sendMail(studioMail({ to: 'juno@example.com', subject: 'first' }));
    await transport.sendMail(studioMail({ to: 'rafe@example.net', subject: 'second' }));
    await transport.sendMail(studioMail({ to: 'Juno@Example.com', subject: 'third' }));
    expect((await inbox()).map((m) => m.subject)).toEqual(['first', 'second', 'third']);
    expect((await inbox('?to=juno@example.com')).map((m) => m.subject)).toEqual(['first', 'third']);
    expect((await inbox('?to=rafe%40example.net')).map((m) => m.subject)).toEqual(['second']);
  });

  it('accepts a client that authenticates, without checking the password', async () => {
    const url = new URL(mail.smtpUrl);
    url.username = 'studio';
    url.password = 'any-password';
    const withAuth = nodemailer.createTransport(url.toString());
    try {
      await withAuth.sendMail(studioMail({ subject: 'signed in' }));
    } finally {
      withAuth.close();
    }
    expect((await inbox()).map((m) => m.subject)).toEqual(['signed in']);
  });

  it('shows the inbox page newest first and a message page with its HTML escaped in a sandboxed frame', async () => {
    await transport.sendMail(studioMail({ subject: 'older <b>one</b>' }));
    await transport.sendMail(
      studioMail({ subject: 'Moth & Hare', html: '<p onclick="x()">Painted</p><script>steal()</script>' }),
    );
    const page = await fetch(`${mail.inboxUrl}/`);
    expect(page.headers.get('content-type')).toContain('text/html');
    const html = await page.text();
    expect(html.indexOf('Moth &amp; Hare')).toBeGreaterThan(-1);
    expect(html.indexOf('Moth &amp; Hare')).toBeLessThan(html.indexOf('older &lt;b&gt;one&lt;/b&gt;'));
    expect(html).not.toContain('<b>one</b>');

    const [, newest] = await inbox();
    const detail = await (await fetch(`${mail.inboxUrl}/email/${newest!.id}`)).text();
    expect(detail).toContain('sandbox=""');
    expect(detail).toContain('srcdoc="&lt;p onclick=&quot;x()&quot;&gt;Painted&lt;/p&gt;&lt;script&gt;steal()&lt;/script&gt;"');
    expect(detail).not.toContain('<script>steal()');
    expect((await fetch(`${mail.inboxUrl}/email/nosuchmessage`)).status).toBe(404);
  });

  it('empties the inbox and its counts on DELETE /api/email/all', async () => {
    await transport.sendMail(studioMail());
    await transport.sendMail(studioMail());
    const deleted = await api<{ deleted: number }>('/api/email/all', { method: 'DELETE' });
    expect(deleted).toEqual({ status: 200, body: { deleted: 2 } });
    expect(await inbox()).toEqual([]);
    expect(await stats()).toMatchObject({ received: 0, distinctMessageIds: 0 });
  });

  it('counts a message sent again under the same Message-ID as a duplicate, and keeps both', async () => {
    const messageId = '<order-MG-1001-cast@marrowgate.example>';
    await transport.sendMail(studioMail({ messageId }));
    await transport.sendMail(studioMail({ messageId }));
    await transport.sendMail(studioMail({ messageId: '<order-MG-1002-cast@marrowgate.example>' }));
    expect(await stats()).toEqual({ received: 3, refused: 0, bounced: 0, distinctMessageIds: 2, duplicates: 1 });
    expect((await inbox()).map((m) => [m.messageId, m.duplicate])).toEqual([
      [messageId, false],
      [messageId, true],
      ['<order-MG-1002-cast@marrowgate.example>', false],
    ]);
  });
});

describe('faults', () => {
  it('refuses every message with the chosen code while set, and stores none', async () => {
    expect((await setFaults({ refuse: { code: 451 } })).status).toBe(200);
    const error = await refusal(transport.sendMail(studioMail()));
    expect(error.responseCode).toBe(451);
    const custom = await setFaults({ refuse: { code: 554, message: 'Sending paused for this account' } });
    expect(custom.body).toMatchObject({ refuse: { code: 554, message: 'Sending paused for this account' } });
    const paused = await refusal(transport.sendMail(studioMail()));
    expect(paused.responseCode).toBe(554);
    expect(paused.response).toBe('554 Sending paused for this account');
    expect(await inbox()).toEqual([]);
    expect(await stats()).toMatchObject({ received: 0, refused: 2 });

    await setFaults({});
    await transport.sendMail(studioMail());
    expect(await inbox()).toHaveLength(1);
  });

  it('bounces listed recipients at RCPT TO with 550 5.1.1 and delivers to the others', async () => {
    await setFaults({ bounce: ['Gone@Example.com'] });
    const error = await refusal(transport.sendMail(studioMail({ to: 'gone@example.com' })));
    expect(error.responseCode).toBe(550);
    expect(error.response).toBe('550 5.1.1 mailbox unavailable');
    expect(error.rejected).toEqual(['gone@example.com']);

    const info = await transport.sendMail(studioMail({ to: ['gone@example.com', 'juno@example.com'] }));
    expect(info.accepted).toEqual(['juno@example.com']);
    expect(info.rejected).toEqual(['gone@example.com']);
    const list = await inbox();
    expect(list).toHaveLength(1);
    expect(list[0]!.envelope.to).toEqual(['juno@example.com']);
    expect(await stats()).toMatchObject({ received: 1, bounced: 2 });
  });

  it('refuses a seeded share of messages with 451 under refuseRate, the same ones on every run', async () => {
    async function sendForty(): Promise<number[]> {
      const refused: number[] = [];
      for (let i = 0; i < 40; i += 1) {
        try {
          await transport.sendMail(studioMail({ subject: `pull ${i}` }));
        } catch (error) {
          expect((error as SmtpError).responseCode).toBe(451);
          refused.push(i);
        }
      }
      return refused;
    }
    await setFaults({ refuseRate: 0.5, seed: 7 });
    const refused = await sendForty();
    // A fair coin over 40 draws falls outside 9..31 about twice in 10,000 runs (binomial tail); the seed fixes it anyway.
    expect(refused.length).toBeGreaterThan(8);
    expect(refused.length).toBeLessThan(32);
    const stored = await inbox();
    expect(stored).toHaveLength(40 - refused.length);
    expect(stored.some((m) => refused.includes(Number(m.subject.slice(5))))).toBe(false);
    expect(await stats()).toMatchObject({ received: 40 - refused.length, refused: refused.length });

    await api('/_control/reset', { method: 'POST' });
    await setFaults({ refuseRate: 0.5, seed: 7 });
    expect(await sendForty()).toEqual(refused);
  });

  it('waits latencyMs before answering DATA', async () => {
    await setFaults({ latencyMs: 2_000 });
    const started = performance.now();
    await transport.sendMail(studioMail());
    const slow = performance.now() - started;
    expect(slow).toBeGreaterThanOrEqual(1_950);
    await setFaults({});
    const quick = performance.now();
    await transport.sendMail(studioMail());
    // A wide margin: on a busy two-core machine an ordinary send can take a few hundred milliseconds.
    expect(performance.now() - quick).toBeLessThan(slow - 1_000);
    expect(await inbox()).toHaveLength(2);
  });

  it('answers a bad fault body with 400 and a message naming the field, and keeps the faults it had', async () => {
    await setFaults({ latencyMs: 300 });
    const badCode = await setFaults({ refuse: { code: 299 } });
    expect(badCode.status).toBe(400);
    expect(badCode.body).toMatchObject({ error: { code: 'invalid_faults' } });
    expect((badCode.body as { error: { message: string } }).error.message).toContain('refuse.code');

    const badRate = await setFaults({ refuseRate: 2 });
    expect(badRate.status).toBe(400);
    expect((badRate.body as { error: { message: string } }).error.message).toContain('refuseRate');

    const unknown = await setFaults({ refuse_rate: 0.5 });
    expect(unknown.status).toBe(400);

    const notJson = await setFaults('{refuse');
    expect(notJson.status).toBe(400);
    expect(notJson.body).toMatchObject({ error: { code: 'invalid_json' } });

    const current = await api<{ latencyMs: number; refuse: unknown }>('/_control/faults');
    expect(current.body).toMatchObject({ latencyMs: 300, refuse: null });
  });
});
