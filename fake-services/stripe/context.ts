import type Stripe from 'stripe';
import type { Clock } from './clock';
import type { FaultState } from './faults';
import { newId } from './ids';
import type { IdempotencyStore } from './idempotency';
import type { FakeState } from './state';
import type { WebhookDispatcher } from './webhooks';

/** The version stripe@23.1.0 pins; used when a request names none (the payment page, the control API). */
export const DEFAULT_API_VERSION = '2026-10-28.endive';

export interface FakeContext {
  state: FakeState;
  clock: Clock;
  webhooks: WebhookDispatcher;
  idempotency: IdempotencyStore;
  faults: FaultState;
  /** Where the fake is reached, for the payment page URLs it hands out. */
  baseUrl: string;
}

/** What caused an event: an API request (with its id and idempotency key) or a customer on the payment page. */
export interface Origin {
  requestId: string | null;
  idempotencyKey: string | null;
  apiVersion: string;
}

export const customerOrigin = (apiVersion: string): Origin => ({
  requestId: null,
  idempotencyKey: null,
  apiVersion,
});

/** A deep copy: objects handed out or put into events must not change when the fake's own copy does. */
export function snapshot<T>(value: T): T {
  return structuredClone(value);
}

/** Records an event (for `GET /v1/events`) and hands it to the webhook dispatcher. */
export function emitEvent(
  ctx: FakeContext,
  type: string,
  object: unknown,
  origin: Origin,
  previousAttributes?: Record<string, unknown>,
): Stripe.Event {
  const data: Record<string, unknown> = { object: snapshot(object) };
  if (previousAttributes) data.previous_attributes = snapshot(previousAttributes);
  const event = {
    id: newId('evt'),
    object: 'event',
    api_version: origin.apiVersion,
    created: ctx.clock.nowSeconds(),
    data,
    livemode: false,
    pending_webhooks: ctx.webhooks.hasEndpoint ? 1 : 0,
    request: { id: origin.requestId, idempotency_key: origin.idempotencyKey },
    type,
  } as unknown as Stripe.Event;
  ctx.state.events.set(event.id, event);
  ctx.webhooks.dispatch(event);
  return event;
}
