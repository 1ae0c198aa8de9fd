import 'server-only';
import { sql } from '@/lib/db/sql';
import { getStripe } from '@/lib/payments/stripe';
import { expireSessionQuietly } from './checkout';
import { applySessionFromStripe } from './payments';
import { retryPendingRefunds } from './refunds';

// The background half of payments, run each minute by the job queue (and by tests directly). Webhooks
// are the fast path; these sweeps make sure nothing depends on a webhook arriving.

/**
 * A hold lasts minutes but a Checkout Session at least 30 (Stripe's limit), so when a hold ends the app
 * expires its session itself. A session that turns out to be paid already is applied as a late payment.
 */
export async function expireSessionsOfEndedHolds(limit = 100): Promise<number> {
  const due = await sql<{ id: string }>(
    `SELECT cs.id FROM checkout_sessions cs JOIN orders o ON o.id = cs.order_id LEFT JOIN holds h ON h.id = o.hold_id
      WHERE cs.status = 'open'
        AND (o.state <> 'awaiting_payment' OR cs.round < o.checkout_round OR h.id IS NULL OR h.state <> 'active' OR h.expires_at <= now())
      ORDER BY cs.created_at LIMIT $1`,
    [limit],
  );
  let applied = 0;
  for (const { id } of due) {
    const session = await expireSessionQuietly(id);
    if (session && session.status !== 'open') {
      await applySessionFromStripe(session);
      applied += 1;
    }
  }
  return applied;
}

/** Orders still awaiting payment whose session is open: read it back in case its webhook never came. */
export async function reconcileOpenSessions({ quietForSeconds = 120, limit = 100 } = {}): Promise<number> {
  const due = await sql<{ id: string }>(
    `UPDATE checkout_sessions SET updated_at = now()
      WHERE id IN (SELECT id FROM checkout_sessions WHERE status = 'open' AND updated_at < now() - make_interval(secs => $1)
                   ORDER BY updated_at LIMIT $2 FOR UPDATE SKIP LOCKED)
      RETURNING id`,
    [quietForSeconds, limit],
  );
  let applied = 0;
  for (const { id } of due) {
    try {
      const session = await getStripe().checkout.sessions.retrieve(id);
      if (session.status !== 'open') {
        await applySessionFromStripe(session);
        applied += 1;
      }
    } catch (error) {
      console.error('Reading a checkout session back failed; trying again next minute', { id, error: (error as Error).message });
    }
  }
  return applied;
}

/** One pass of every payments sweep; each part goes on even if another fails. */
export async function sweepPayments(): Promise<{ expired: number; reconciled: number; refunds: number }> {
  const run = async (work: () => Promise<number>, name: string) => {
    try {
      return await work();
    } catch (error) {
      console.error(`Payments sweep (${name}) failed`, (error as Error).message);
      return 0;
    }
  };
  return {
    expired: await run(() => expireSessionsOfEndedHolds(), 'expire sessions'),
    reconciled: await run(() => reconcileOpenSessions(), 'reconcile'),
    refunds: await run(() => retryPendingRefunds(), 'refunds'),
  };
}

/**
 * The buyer is back from the payment page before the webhook: read that session back from Stripe and
 * apply it, so their order page shows the payment at once. Harmless if the webhook got there first.
 */
export async function syncReturningBuyer(orderId: string, sessionId: string): Promise<void> {
  if (!/^cs_[A-Za-z0-9_]{10,200}$/.test(sessionId)) return;
  const [known] = await sql<{ id: string }>(`SELECT id FROM checkout_sessions WHERE id = $1 AND order_id = $2`, [sessionId, orderId]);
  if (!known) return;
  try {
    const session = await getStripe().checkout.sessions.retrieve(sessionId);
    if (session.status === 'complete') await applySessionFromStripe(session);
  } catch (error) {
    console.error('Reading the returning buyer’s session failed; the webhook or sweep will apply it', (error as Error).message);
  }
}
