import type Stripe from 'stripe';

/** What the fake keeps beside a Checkout Session that Stripe keeps but does not show on the object. */
export interface SessionRecord {
  session: Stripe.Checkout.Session;
  lineItems: Stripe.LineItem[];
  paymentIntentData: {
    metadata: Record<string, string>;
    description: string | null;
    receiptEmail: string | null;
    statementDescriptor: string | null;
    statementDescriptorSuffix: string | null;
  };
  /** Events about this session are rendered with the version the app created it with. */
  apiVersion: string;
}

/** One request the fake received, as `GET /_control/requests` shows it. */
export interface RequestLogEntry {
  id: string;
  at: string;
  method: string;
  path: string;
  idempotency_key: string | null;
  stripe_version: string | null;
  params: unknown;
  status: number;
  replayed: boolean;
  fault: 'fail_rate' | null;
}

const MAX_LOGGED_REQUESTS = 5000;

/** Everything the fake remembers; `reset()` forgets it all, as if freshly started. */
export class FakeState {
  sessions = new Map<string, SessionRecord>();
  paymentIntents = new Map<string, Stripe.PaymentIntent>();
  charges = new Map<string, Stripe.Charge>();
  refunds = new Map<string, Stripe.Refund>();
  events = new Map<string, Stripe.Event>();
  products = new Map<string, Stripe.Product>();
  prices = new Map<string, Stripe.Price>();
  shippingRates = new Map<string, Stripe.ShippingRate>();
  /** Which session a payment intent belongs to, for completing the session when the payment succeeds. */
  sessionByPaymentIntent = new Map<string, string>();
  requests: RequestLogEntry[] = [];

  logRequest(entry: RequestLogEntry): void {
    this.requests.push(entry);
    if (this.requests.length > MAX_LOGGED_REQUESTS)
      this.requests.splice(0, this.requests.length - MAX_LOGGED_REQUESTS);
  }

  /** Finds any object by id, for `expand[]`; the prefix says which kind it is. */
  lookup(id: string): { object: unknown } | undefined {
    const maps: Array<Map<string, unknown>> = [
      this.paymentIntents,
      this.charges,
      this.refunds,
      this.events,
      this.products,
      this.prices,
      this.shippingRates,
    ];
    const record = this.sessions.get(id);
    if (record) return { object: record.session };
    for (const map of maps) {
      const found = map.get(id);
      if (found !== undefined) return { object: found };
    }
    return undefined;
  }

  reset(): void {
    for (const map of [
      this.sessions,
      this.paymentIntents,
      this.charges,
      this.refunds,
      this.events,
      this.products,
      this.prices,
      this.shippingRates,
      this.sessionByPaymentIntent,
    ]) {
      map.clear();
    }
    this.requests = [];
  }
}
