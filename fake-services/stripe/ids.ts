import { randomBytes } from 'node:crypto';

const ALPHABET = 'abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789';

/** Random base62 text; ids only need to be unique and look like Stripe's, not to be secret. */
export function randomToken(length: number): string {
  const bytes = randomBytes(length);
  let out = '';
  for (const byte of bytes) out += ALPHABET[byte % ALPHABET.length];
  return out;
}

/**
 * Stripe's ids are a resource prefix, an underscore and an opaque tail; code that routes on the prefix
 * (pi_ vs ch_) must work against the fake, so the prefixes are Stripe's own.
 */
export function newId(prefix: string, length = 24): string {
  return `${prefix}_${randomToken(length)}`;
}

/** Checkout Session ids carry the mode in the prefix and are much longer than the others. */
export function newCheckoutSessionId(): string {
  return `cs_test_a1${randomToken(56)}`;
}

/**
 * mulberry32: a tiny seeded generator, so that a test which sets `failRate: 0.5` with a seed sees the same
 * requests fail on every run.
 */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
