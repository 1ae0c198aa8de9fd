import { idempotencyError } from './stripe-errors';

/*
 * Stripe's idempotency for API v1 (https://docs.stripe.com/api/idempotent_requests): the status and body
 * of the first request with a key are saved once the endpoint starts executing and replayed for any
 * retry with the same key and the same parameters; other parameters, or another endpoint, are an
 * idempotency_error. Keys are up to 255 characters, belong to one API key, and are kept at least 24 hours.
 */

export const KEY_LIFETIME_SECONDS = 24 * 60 * 60;
const MAX_KEY_LENGTH = 255;

interface Saved {
  endpoint: string;
  fingerprint: string;
  createdAt: number;
  /** null while the first request is still running. */
  response: { status: number; body: string; requestId: string } | null;
}

export type Reservation =
  | { kind: 'new'; complete: (status: number, body: string, requestId: string) => void; release: () => void }
  | { kind: 'replay'; status: number; body: string; originalRequestId: string };

/** Parameters compared in a stable form, whatever order the client sent the keys in. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.keys(value)
      .sort()
      .map((key) => `${JSON.stringify(key)}:${canonical((value as Record<string, unknown>)[key])}`);
    return `{${entries.join(',')}}`;
  }
  return JSON.stringify(value);
}

export class IdempotencyStore {
  private saved = new Map<string, Saved>();

  constructor(private readonly nowSeconds: () => number) {}

  get size(): number {
    return this.saved.size;
  }

  private prune(): void {
    const cutoff = this.nowSeconds() - KEY_LIFETIME_SECONDS;
    for (const [key, entry] of this.saved) {
      if (entry.response && entry.createdAt < cutoff) this.saved.delete(key);
    }
  }

  /**
   * Claims a key for a request, or answers with the saved response. Throws Stripe's idempotency_error
   * when the key was used with other parameters or endpoint, and a 409 while the first use is running.
   */
  reserve(apiKey: string, key: string, endpoint: string, params: unknown): Reservation {
    if (key.length > MAX_KEY_LENGTH) {
      throw idempotencyError(`Idempotency keys can be at most ${MAX_KEY_LENGTH} characters long.`);
    }
    this.prune();
    const scoped = `${apiKey}\u0000${key}`;
    const fingerprint = canonical(params);
    const existing = this.saved.get(scoped);
    if (existing) {
      if (existing.endpoint !== endpoint) {
        throw idempotencyError(
          `Keys for idempotent requests can only be used for the same endpoint they were first used for ('${existing.endpoint}' vs '${endpoint}'). Try using a key other than '${key}' if you meant to execute a different request.`,
        );
      }
      if (existing.fingerprint !== fingerprint) {
        throw idempotencyError(
          `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`,
        );
      }
      if (!existing.response) {
        throw idempotencyError(
          `There is currently another in-progress request using this idempotency key (that probably means you submitted twice, and the other request is still going through): ${key}. Please try again later.`,
          409,
        );
      }
      return {
        kind: 'replay',
        status: existing.response.status,
        body: existing.response.body,
        originalRequestId: existing.response.requestId,
      };
    }
    const entry: Saved = { endpoint, fingerprint, createdAt: this.nowSeconds(), response: null };
    this.saved.set(scoped, entry);
    return {
      kind: 'new',
      complete: (status, body, requestId) => {
        entry.response = { status, body, requestId };
      },
      release: () => {
        if (this.saved.get(scoped) === entry) this.saved.delete(scoped);
      },
    };
  }

  reset(): void {
    this.saved.clear();
  }
}
