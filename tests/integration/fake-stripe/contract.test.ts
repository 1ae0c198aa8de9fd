import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type Stripe from 'stripe';
import type { FakeStripe } from '../../../fake-services/stripe/server';
import { maskOrder, payByControl, sdk, startFake } from './helpers';

/*
 * Contract against Stripe's own published example objects.
 * Source: tests/fixtures/stripe/fixtures.json, an unchanged copy of the examples from Stripe's public
 * OpenAPI repository (openapi/fixtures3.json, MIT licence); see the README beside it. Where the shared
 * reference folder sits beside the checkout, the copy is checked against it too. Every field of Stripe's example must be on the fake's object with the same JSON
 * type; where the example has null, any value will do.
 */

const repoRoot = path.resolve(__dirname, '../../..');
const fixturesFile = path.join(repoRoot, 'tests/fixtures/stripe/fixtures.json');
const sharedReference = path.resolve(repoRoot, '../shared/reference/stripe/fixtures.json');
const fixtures = JSON.parse(fs.readFileSync(fixturesFile, 'utf8')) as {
  resources: Record<string, Record<string, unknown>>;
};

/*
 * Where the example fills a field that the fake answers with null. Each is null on Stripe too for a
 * card payment through hosted Checkout without Connect, tax, consent collection, custom text, wallets or
 * recurring prices, so filling them would teach the app to expect what Stripe will not send.
 */
const NULL_ALLOWED: Record<string, string[]> = {
  'checkout.session': [
    'after_expiration', // only with after_expiration.recovery set
    'automatic_tax.liability', // only with automatic tax on
    'consent', // only with consent_collection
    'consent_collection',
    'custom_text.*', // only with custom_text set
    'currency_conversion', // only with adaptive pricing
    'invoice_creation.invoice_data.issuer', // only with invoice creation on
    'invoice_creation.invoice_data.rendering_options',
    'permissions', // only when set
    'saved_payment_method_options', // only for a session with a customer
    'url', // Stripe clears it once the session is complete or expired
    'wallet_options', // only when set
  ],
  item: ['adjustable_quantity', 'price.custom_unit_amount', 'price.recurring', 'price.transform_quantity'],
  payment_intent: [
    'automatic_payment_methods',
    'canceled_at',
    'last_payment_error',
    'next_action',
    'processing',
    'transfer_data',
  ],
  charge: [
    'payment_method_details.card.installments',
    'payment_method_details.card.three_d_secure',
    'payment_method_details.card.wallet',
    'source',
    'transfer_data',
  ],
  refund: [],
  // The example event is a plan.created; its data.object is compared only as "an object".
  event: [],
};

/** Fields whose inside is not compared, because the example describes a different object there. */
const NOT_DESCENDED: Record<string, string[]> = { event: ['data.object'] };

function jsonType(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'array';
  return typeof value;
}

function allowedNull(resource: string, field: string): boolean {
  return (NULL_ALLOWED[resource] ?? []).some(
    (p) => p === field || (p.endsWith('.*') && field.startsWith(p.slice(0, -1))),
  );
}

/** Lists every field of `example` missing from `actual` or of another JSON type there. */
function differences(resource: string, example: unknown, actual: unknown, at = ''): string[] {
  const problems: string[] = [];
  if (jsonType(example) === 'array') {
    const sample = (example as unknown[])[0];
    if (sample === undefined) return problems;
    (actual as unknown[]).forEach((item, i) => {
      if (jsonType(item) !== jsonType(sample))
        problems.push(`${at}[${i}]: ${jsonType(item)} where Stripe has ${jsonType(sample)}`);
      else if (jsonType(sample) === 'object' || jsonType(sample) === 'array')
        problems.push(...differences(resource, sample, item, at));
    });
    return problems;
  }
  for (const [key, expected] of Object.entries(example as Record<string, unknown>)) {
    const field = at ? `${at}.${key}` : key;
    const record = actual as Record<string, unknown>;
    if (!(key in record)) {
      problems.push(`${field}: missing`);
      continue;
    }
    const value = record[key];
    if (expected === null) continue;
    if (value === null) {
      if (!allowedNull(resource, field))
        problems.push(`${field}: null where Stripe has ${jsonType(expected)}`);
      continue;
    }
    if (jsonType(value) !== jsonType(expected)) {
      problems.push(`${field}: ${jsonType(value)} where Stripe has ${jsonType(expected)}`);
      continue;
    }
    if ((NOT_DESCENDED[resource] ?? []).includes(field)) continue;
    if (typeof expected === 'object') problems.push(...differences(resource, expected, value, field));
  }
  return problems;
}

/** What the app sees: the SDK's object as JSON (its Decimal values become decimal strings again). */
const asJson = (value: unknown): Record<string, unknown> =>
  JSON.parse(JSON.stringify(value)) as Record<string, unknown>;

let fake: FakeStripe;
const objects: Record<string, Record<string, unknown>> = {};

beforeAll(async () => {
  fake = await startFake();
  const stripe = sdk(fake);
  // With a description, as the shop sends one; Stripe leaves a charge's description null without it.
  const created = await stripe.checkout.sessions.create(
    maskOrder({
      payment_intent_data: {
        description: 'Marrowgate Studio, order 1001',
        metadata: { hold_id: 'hold_ibex_42' },
      },
    }),
  );
  const paid = await payByControl(fake, created.id);
  expect(paid.body.outcome).toBe('paid');
  const session = await stripe.checkout.sessions.retrieve(created.id);
  const lineItems = await stripe.checkout.sessions.listLineItems(created.id);
  const pi = await stripe.paymentIntents.retrieve(session.payment_intent as string);
  const charge = await stripe.charges.retrieve(pi.latest_charge as string);
  const refund = await stripe.refunds.create({
    payment_intent: pi.id,
    amount: 1_000,
    reason: 'requested_by_customer',
  });
  const events = await stripe.events.list({ type: 'checkout.session.completed' });
  const event = await stripe.events.retrieve((events.data[0] as Stripe.Event).id);
  objects['checkout.session'] = asJson(session);
  objects.item = asJson(lineItems.data[0]);
  objects.payment_intent = asJson(pi);
  objects.charge = asJson(charge);
  objects.refund = asJson(refund);
  objects.event = asJson(event);
});

afterAll(async () => {
  await fake.close();
});

describe("the fake's objects against Stripe's published examples", () => {
  it('reads the reference examples (and the copy still matches the shared reference, where it is beside the checkout)', () => {
    expect(Object.keys(fixtures.resources)).toEqual(
      expect.arrayContaining(['checkout.session', 'item', 'payment_intent', 'charge', 'refund', 'event']),
    );
    if (fs.existsSync(sharedReference)) {
      expect(fs.readFileSync(fixturesFile, 'utf8')).toBe(fs.readFileSync(sharedReference, 'utf8'));
    }
  });

  for (const resource of ['checkout.session', 'item', 'payment_intent', 'charge', 'refund', 'event']) {
    it(`${resource}: every field of Stripe's example, with the same JSON type`, () => {
      const example = fixtures.resources[resource];
      const actual = objects[resource];
      expect(example).toBeDefined();
      expect(actual).toBeDefined();
      expect(actual?.object).toBe(example?.object);
      if (example && 'livemode' in example) expect(actual?.livemode).toBe(false);
      expect(differences(resource, example, actual)).toEqual([]);
    });
  }

  it('allows null only where the fake really answers null and the example does not', () => {
    const at = (root: unknown, field: string) =>
      field.split('.').reduce<unknown>((node, key) => (node as Record<string, unknown> | null)?.[key], root);
    for (const [resource, fields] of Object.entries(NULL_ALLOWED)) {
      for (const field of fields) {
        const exact = field.replace(/\.\*$/, '');
        const example = at(fixtures.resources[resource], exact);
        const actual = at(objects[resource], exact);
        const pairs = field.endsWith('.*')
          ? Object.keys(example as object).map((k) => [
              (example as Record<string, unknown>)[k],
              (actual as Record<string, unknown>)[k],
            ])
          : [[example, actual]];
        for (const [e, a] of pairs) {
          expect(e, `${resource}.${field} in the example`).not.toBeNull();
          expect(a, `${resource}.${field} on the fake`).toBeNull();
        }
      }
    }
  });

  it('the comparison itself catches a missing field, a wrong type and an unexpected null', () => {
    const example = { a: 1, b: 'x', c: { d: true }, e: null };
    expect(differences('refund', example, { a: 1, b: 'x', c: { d: true }, e: 5 })).toEqual([]);
    expect(differences('refund', example, { a: '1', c: { d: null }, e: null })).toEqual([
      'a: string where Stripe has number',
      'b: missing',
      'c.d: null where Stripe has boolean',
    ]);
  });

  it('uses the prefixes, units and types Stripe uses', () => {
    const session = objects['checkout.session'] as Record<string, unknown>;
    expect(session.id).toMatch(/^cs_test_/);
    expect(session.payment_intent).toMatch(/^pi_/);
    expect(objects.charge?.id).toMatch(/^ch_/);
    expect(objects.refund?.id).toMatch(/^re_/);
    expect(objects.event?.id).toMatch(/^evt_/);
    expect(objects.item?.id).toMatch(/^li_/);
    expect(session.currency).toBe('eur');
    expect(Number.isInteger(session.amount_total)).toBe(true);
    expect(Number.isInteger(session.created)).toBe(true);
    expect(Math.abs((session.created as number) - Date.now() / 1000)).toBeLessThan(60);
  });
});
