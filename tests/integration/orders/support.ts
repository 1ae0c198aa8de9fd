import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, beforeEach } from 'vitest';
import type { FakeStripe } from '../../../fake-services/stripe/server';
import type { CurrentUser } from '@/lib/auth/session';
import { withAppDatabase } from '../support/app-database';
import { query } from '../support/database';
import { control, FAST_RETRIES, SECRET_KEY, startFake, WEBHOOK_SECRET } from '../fake-stripe/helpers';

export { control };

/**
 * One seeded database, the fake Stripe in this process, and the app's real webhook route behind a real
 * HTTP server, so every call goes app → stripe SDK → fake → signed webhook → app, as in production.
 */
export function withCheckoutWorld(label: string) {
  const db = withAppDatabase(label, { seed: true });
  let fake: FakeStripe;
  let server: http.Server;
  let webhookCalls = 0;

  beforeAll(async () => {
    server = http.createServer(async (req, res) => {
      const chunks: Buffer[] = [];
      for await (const chunk of req) chunks.push(chunk as Buffer);
      webhookCalls += 1;
      const { POST } = await import('@/app/api/webhooks/stripe/route');
      const headers = new Headers();
      for (const [key, value] of Object.entries(req.headers)) if (typeof value === 'string') headers.set(key, value);
      const response = await POST(new Request('http://127.0.0.1/api/webhooks/stripe', { method: 'POST', headers, body: Buffer.concat(chunks) }), undefined);
      res.writeHead(response.status, { 'Content-Type': 'application/json' });
      res.end(await response.text());
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const webhookUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}/`;
    fake = await startFake({ webhookUrl, webhookSecret: WEBHOOK_SECRET, retrySchedule: FAST_RETRIES });
    process.env.STRIPE_SECRET_KEY = SECRET_KEY;
    process.env.STRIPE_WEBHOOK_SECRET = WEBHOOK_SECRET;
    process.env.STRIPE_API_URL = fake.url;
    process.env.APP_URL = 'http://127.0.0.1:3999';
    process.env.JOBS_ENABLED = 'false';
  });
  beforeEach(async () => {
    await control(fake, 'faults', {});
  });
  afterAll(async () => {
    await fake?.close();
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  });

  const sqlRows = <T extends object>(text: string, params: unknown[] = []) => query<T & Record<string, unknown>>(db.current().url, text, params);

  return {
    db,
    fake: () => fake,
    webhookCalls: () => webhookCalls,
    rows: sqlRows,
    async buyer(email: string): Promise<CurrentUser> {
      const [user] = await sqlRows<{ id: string }>(`INSERT INTO users (email, name, role) VALUES ($1, $2, 'customer') RETURNING id`, [email, 'Test Buyer']);
      return { id: user!.id, email, name: 'Test Buyer', role: 'customer' };
    },
    async owner(): Promise<CurrentUser> {
      const [user] = await sqlRows<{ id: string; email: string }>(`SELECT id, email FROM users WHERE role = 'owner' ORDER BY email LIMIT 1`);
      return { id: user!.id, email: user!.email, name: 'Owner', role: 'owner' };
    },
    /** A fresh open batch of the Ibex in one finish, so each test starts from known stock. */
    async freshBatch(quantity: number, { perBuyerLimit = 1, holdMinutes = 10 } = {}) {
      const [batch] = await sqlRows<{ id: string }>(
        `INSERT INTO batches (design_id, name, status, per_buyer_limit, hold_minutes, opens_at, closes_at, ship_by)
         SELECT id, 'Test batch', 'scheduled', $1, $2, now() - interval '1 minute', now() + interval '1 day', current_date + 30
           FROM designs WHERE slug = 'ibex' RETURNING id`,
        [perBuyerLimit, holdMinutes],
      );
      const [stock] = await sqlRows<{ id: string; finish_id: string }>(
        `INSERT INTO batch_stock (batch_id, finish_id, quantity)
         SELECT $1, f.id, $2 FROM finishes f JOIN designs d ON d.id = f.design_id WHERE d.slug = 'ibex' AND f.slug = 'old-bone' RETURNING id, finish_id`,
        [batch!.id, quantity],
      );
      return { batchId: batch!.id, finishId: stock!.finish_id, stockId: stock!.id };
    },
    async stock(stockId: string) {
      const [row] = await sqlRows<{ quantity: number; held: number; sold: number; available: number }>(`SELECT quantity, held, sold, available FROM batch_stock WHERE id = $1`, [stockId]);
      return row!;
    },
    async order(orderNumberOrHold: string) {
      const [row] = await sqlRows<{ id: string; number: string; state: string; paid_minor: number; refunded_minor: number; total_minor: number; payment_intent_id: string | null; buyer_note: string | null }>(
        `SELECT * FROM orders WHERE number = $1 OR hold_id::text = $1`,
        [orderNumberOrHold],
      );
      return row;
    },
    async outbox(orderNumber: string) {
      return sqlRows<{ dedupe_key: string; subject: string; to_address: string; text: string }>(
        `SELECT dedupe_key, subject, to_address, text FROM mail_outbox WHERE subject LIKE '%' || $1 || '%' ORDER BY created_at`,
        [orderNumber],
      );
    },
    /** The first shipping option offered for Ireland. */
    async irishRate(buyer: CurrentUser, holdId: string): Promise<string> {
      const { getCheckoutOptions } = await import('@/lib/orders/checkout');
      const options = await getCheckoutOptions(buyer, { holdId, country: 'IE' });
      return options.options[0]!.rateId;
    },
  };
}

export async function waitUntil<T>(read: () => Promise<T>, done: (value: T) => boolean, timeoutMs = 15_000): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (done(value)) return value;
    if (Date.now() > until) throw new Error(`timed out waiting; last value: ${JSON.stringify(value)}`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

export const IRISH_ADDRESS = { name: 'Juno Pell', line1: '12 Quarry Row', city: 'Galway', postal_code: 'H91 A0B1', country: 'IE' };

export async function pay(fake: FakeStripe, sessionUrl: string, card = '4242424242424242') {
  const sessionId = sessionUrl.split('/').pop()!;
  return control<{ outcome: string }>(fake, `sessions/${sessionId}/pay`, { card, email: 'juno@example.com', shipping: IRISH_ADDRESS });
}
