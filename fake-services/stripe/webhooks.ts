import { createHmac } from 'node:crypto';
import http from 'node:http';
import https from 'node:https';
import type Stripe from 'stripe';
import { newId } from './ids';

/** Stripe's scheme: `t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<payload>" keyed with the endpoint secret>`. */
export function signPayload(payload: string, secret: string, timestamp: number): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${v1}`;
}

export interface WebhookFaults {
  /** Never send: the app must cope with an event it is not told about (and find out by polling). */
  drop: boolean;
  /** Send each event this many times: Stripe may deliver an event more than once. */
  repeat: number;
  /** Send the events of one moment in another order: Stripe does not promise any order. */
  shuffle: boolean;
}

export const NO_WEBHOOK_FAULTS: WebhookFaults = { drop: false, repeat: 1, shuffle: false };

export interface DeliveryAttempt {
  at: string;
  status_code: number | null;
  error: string | null;
  duration_ms: number;
}

export interface Delivery {
  id: string;
  event_id: string;
  event_type: string;
  url: string;
  /** 1 for the first copy; higher when the `repeat` fault sends an event again. */
  copy: number;
  status: 'pending' | 'succeeded' | 'failed' | 'dropped';
  attempts: DeliveryAttempt[];
  next_attempt_at: string | null;
}

export interface WebhookOptions {
  url?: string;
  secret?: string;
  /** Milliseconds to wait before each retry; its length caps the retries. */
  retrySchedule: number[];
  timeoutMs: number;
  /** Seeded, so a shuffled order is the same on every run. */
  random: () => number;
  onDelivered: (eventId: string) => void;
}

/** How long the `shuffle` fault gathers events before sending them out of order. */
const SHUFFLE_WINDOW_MS = 100;

function postOnce(
  url: URL,
  headers: Record<string, string>,
  body: string,
  timeoutMs: number,
  inFlight: Set<http.ClientRequest>,
): Promise<number> {
  const client = url.protocol === 'https:' ? https : http;
  return new Promise<number>((resolve, reject) => {
    const request = client.request(url, { method: 'POST', headers, timeout: timeoutMs }, (response) => {
      // The answer's body means nothing to Stripe; only the status does.
      response.resume();
      response.on('end', () => resolve(response.statusCode ?? 0));
      response.on('error', reject);
    });
    request.on('timeout', () => request.destroy(new Error(`no answer within ${timeoutMs} ms`)));
    request.on('error', reject);
    request.on('close', () => inFlight.delete(request));
    inFlight.add(request);
    request.end(body);
  });
}

/** Deliveries kept for `GET /_control/webhooks`; the oldest go first. */
const MAX_KEPT_DELIVERIES = 5000;

export class WebhookDispatcher {
  private endpoint: { url: string; secret: string } | null = null;
  private readonly initialEndpoint: { url: string; secret: string } | null;
  private timers = new Set<NodeJS.Timeout>();
  private running = new Set<Promise<void>>();
  private requests = new Set<http.ClientRequest>();
  private shuffleBatch: Array<() => void> = [];
  private closed = false;
  /** Bumped by reset(), so that an attempt already on the wire does not schedule retries for a forgotten delivery. */
  private generation = 0;
  deliveries: Delivery[] = [];
  faults: WebhookFaults = { ...NO_WEBHOOK_FAULTS };

  constructor(private readonly options: WebhookOptions) {
    this.initialEndpoint =
      options.url && options.secret ? { url: options.url, secret: options.secret } : null;
    this.endpoint = this.initialEndpoint;
  }

  setEndpoint(endpoint: { url: string; secret: string } | null): void {
    this.endpoint = endpoint;
  }

  get endpointUrl(): string | null {
    return this.endpoint?.url ?? null;
  }

  get hasEndpoint(): boolean {
    return this.endpoint !== null;
  }

  /** Queues an event for the configured endpoint; without one, the event is only kept for `GET /v1/events`. */
  dispatch(event: Stripe.Event): void {
    const endpoint = this.endpoint;
    if (!endpoint || this.closed) return;
    // Stripe sends the event as it was when it happened, pretty-printed; the signature covers these bytes.
    const payload = JSON.stringify(event, null, 2);
    const copies = Math.max(1, this.faults.repeat);
    for (let copy = 1; copy <= copies; copy += 1) {
      const delivery: Delivery = {
        id: newId('whd'),
        event_id: event.id,
        event_type: event.type,
        url: endpoint.url,
        copy,
        status: this.faults.drop ? 'dropped' : 'pending',
        attempts: [],
        next_attempt_at: null,
      };
      this.deliveries.push(delivery);
      if (this.deliveries.length > MAX_KEPT_DELIVERIES) this.deliveries.shift();
      if (this.faults.drop) continue;
      const start = () => this.scheduleAttempt(delivery, endpoint, payload, 0, 0);
      if (this.faults.shuffle) this.addToShuffle(start);
      else start();
    }
  }

  private addToShuffle(start: () => void): void {
    this.shuffleBatch.push(start);
    if (this.shuffleBatch.length > 1) return;
    this.later(SHUFFLE_WINDOW_MS, () => {
      const batch = this.shuffleBatch;
      this.shuffleBatch = [];
      const order = batch.map((_, i) => i);
      for (let i = order.length - 1; i > 0; i -= 1) {
        const j = Math.floor(this.options.random() * (i + 1));
        [order[i], order[j]] = [order[j] as number, order[i] as number];
      }
      // A shuffle that leaves everything in place would hide the very problem the fault is for.
      if (order.length > 1 && order.every((v, i) => v === i)) order.push(order.shift() as number);
      for (const i of order) batch[i]?.();
    });
  }

  private later(delayMs: number, fn: () => void): void {
    const generation = this.generation;
    const timer = setTimeout(() => {
      this.timers.delete(timer);
      if (!this.closed && generation === this.generation) fn();
    }, delayMs);
    this.timers.add(timer);
  }

  private scheduleAttempt(
    delivery: Delivery,
    endpoint: { url: string; secret: string },
    payload: string,
    index: number,
    delayMs: number,
  ): void {
    delivery.next_attempt_at = new Date(Date.now() + delayMs).toISOString();
    this.later(delayMs, () => {
      const run = this.attempt(delivery, endpoint, payload, index);
      this.running.add(run);
      void run.finally(() => this.running.delete(run));
    });
  }

  private async attempt(
    delivery: Delivery,
    endpoint: { url: string; secret: string },
    payload: string,
    index: number,
  ): Promise<void> {
    const generation = this.generation;
    const started = Date.now();
    // A fresh timestamp per attempt, as Stripe does, so a late retry still passes the receiver's tolerance.
    const signature = signPayload(payload, endpoint.secret, Math.floor(started / 1000));
    let statusCode: number | null = null;
    let error: string | null = null;
    try {
      statusCode = await postOnce(
        new URL(endpoint.url),
        {
          'Content-Type': 'application/json; charset=utf-8',
          'Content-Length': String(Buffer.byteLength(payload)),
          'User-Agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks) fake-stripe',
          'Stripe-Signature': signature,
        },
        payload,
        this.options.timeoutMs,
        this.requests,
      );
    } catch (e) {
      error = e instanceof Error ? e.message : String(e);
    }
    if (generation !== this.generation) return;
    delivery.attempts.push({
      at: new Date(started).toISOString(),
      status_code: statusCode,
      error,
      duration_ms: Date.now() - started,
    });
    if (statusCode !== null && statusCode >= 200 && statusCode < 300) {
      delivery.status = 'succeeded';
      delivery.next_attempt_at = null;
      this.options.onDelivered(delivery.event_id);
      return;
    }
    const wait = this.options.retrySchedule[index];
    if (wait === undefined || this.closed) {
      delivery.status = 'failed';
      delivery.next_attempt_at = null;
      return;
    }
    this.scheduleAttempt(delivery, endpoint, payload, index + 1, wait);
  }

  /** Forgets all deliveries and pending retries, and goes back to the endpoint it was started with. */
  reset(): void {
    this.generation += 1;
    for (const timer of this.timers) clearTimeout(timer);
    this.timers.clear();
    this.shuffleBatch = [];
    this.deliveries = [];
    this.faults = { ...NO_WEBHOOK_FAULTS };
    this.endpoint = this.initialEndpoint;
  }

  async close(): Promise<void> {
    this.closed = true;
    for (const timer of this.timers) clearTimeout(timer);
    this.timers.clear();
    // A receiver that never answers must not hold up the fake's shutdown.
    for (const request of this.requests) request.destroy(new Error('the fake Stripe is shutting down'));
    await Promise.allSettled([...this.running]);
  }
}
