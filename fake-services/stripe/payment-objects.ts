import { createHash } from 'node:crypto';
import type Stripe from 'stripe';
import { newId, randomToken } from './ids';
import type { SessionRecord } from './state';
import { cardBrand } from './test-cards';

export interface CardInput {
  number: string;
  expMonth: number;
  expYear: number;
  cvc: string;
}

export interface AddressInput {
  line1: string;
  line2: string | null;
  city: string;
  postal_code: string;
  state: string | null;
  country: string;
}

export function address(input: AddressInput | null): Stripe.Address {
  return {
    city: input?.city ?? null,
    country: input?.country ?? null,
    line1: input?.line1 ?? null,
    line2: input?.line2 ?? null,
    postal_code: input?.postal_code ?? null,
    state: input?.state ?? null,
  };
}

/** Stripe's fingerprint names a card number without revealing it; the same number gives the same one. */
function fingerprint(number: string): string {
  return createHash('sha256').update(number).digest('base64url').slice(0, 16);
}

export function newPaymentIntent(
  record: SessionRecord,
  created: number,
  amount: number,
): Stripe.PaymentIntent {
  const id = newId('pi');
  const data = record.paymentIntentData;
  return {
    id,
    object: 'payment_intent',
    allowed_payment_method_types: null,
    amount,
    amount_capturable: 0,
    amount_details: { tip: {} },
    amount_received: 0,
    application: null,
    application_fee_amount: null,
    automatic_payment_methods: null,
    canceled_at: null,
    cancellation_reason: null,
    capture_method: 'automatic_async',
    client_secret: `${id}_secret_${randomToken(25)}`,
    confirmation_method: 'automatic',
    created,
    currency: record.session.currency ?? 'eur',
    customer: null,
    customer_account: null,
    description: data.description,
    excluded_payment_method_types: null,
    last_payment_error: null,
    latest_charge: null,
    livemode: false,
    managed_payments: { enabled: false },
    metadata: { ...data.metadata },
    next_action: null,
    on_behalf_of: null,
    payment_method: null,
    // A session's payment intent uses the payment method configuration the session was shown with.
    payment_method_configuration_details: record.session.payment_method_configuration_details,
    payment_method_options: {
      card: { installments: null, mandate_options: null, network: null, request_three_d_secure: 'automatic' },
    },
    payment_method_types: ['card'],
    payment_record: null,
    processing: null,
    receipt_email: data.receiptEmail,
    review: null,
    setup_future_usage: null,
    shipping: null,
    source: null,
    statement_descriptor: data.statementDescriptor,
    statement_descriptor_suffix: data.statementDescriptorSuffix,
    status: 'requires_payment_method',
    transfer_data: null,
    transfer_group: null,
  };
}

export interface ChargeInput {
  paymentIntent: Stripe.PaymentIntent;
  paymentMethodId: string;
  card: CardInput;
  name: string;
  email: string;
  billing: AddressInput | null;
  shipping: Stripe.PaymentIntent.Shipping | null;
  created: number;
  baseUrl: string;
  decline: { code: string; declineCode: string | null; message: string } | null;
}

export function newCharge(input: ChargeInput): Stripe.Charge {
  const pi = input.paymentIntent;
  const id = newId('ch');
  const ok = input.decline === null;
  const brand = cardBrand(input.card.number);
  return {
    id,
    object: 'charge',
    amount: pi.amount,
    amount_captured: ok ? pi.amount : 0,
    amount_refunded: 0,
    application: null,
    application_fee: null,
    application_fee_amount: null,
    balance_transaction: ok ? newId('txn') : null,
    billing_details: {
      address: address(input.billing),
      email: input.email,
      name: input.name,
      phone: null,
      tax_id: null,
    },
    calculated_statement_descriptor: 'FAKE STRIPE TEST',
    captured: ok,
    created: input.created,
    currency: pi.currency,
    customer: null,
    description: pi.description,
    disputed: false,
    failure_balance_transaction: null,
    failure_code: input.decline?.code ?? null,
    failure_message: input.decline?.message ?? null,
    fraud_details: {},
    livemode: false,
    metadata: { ...pi.metadata },
    on_behalf_of: null,
    outcome: ok
      ? {
          advice_code: null,
          network_advice_code: null,
          network_decline_code: null,
          network_status: 'approved_by_network',
          reason: null,
          risk_level: 'normal',
          risk_score: 20,
          seller_message: 'Payment complete.',
          type: 'authorized',
        }
      : {
          advice_code: null,
          network_advice_code: null,
          network_decline_code: null,
          network_status: 'declined_by_network',
          reason: input.decline?.declineCode ?? input.decline?.code ?? null,
          risk_level: 'normal',
          risk_score: 20,
          seller_message: 'The bank did not return any further details with this decline.',
          type: 'issuer_declined',
        },
    paid: ok,
    payment_intent: pi.id,
    payment_method: input.paymentMethodId,
    payment_method_details: {
      card: {
        amount_authorized: ok ? pi.amount : null,
        authorization_code: ok ? randomToken(6).toUpperCase() : null,
        brand,
        checks: {
          address_line1_check: null,
          address_postal_code_check: null,
          cvc_check: ok ? 'pass' : 'unavailable',
        },
        country: 'US',
        electronic_commerce_indicator: null,
        exp_month: input.card.expMonth,
        exp_year: input.card.expYear,
        extended_authorization: { status: 'disabled' },
        fingerprint: fingerprint(input.card.number),
        funding: 'credit',
        incremental_authorization: { status: 'unavailable' },
        installments: null,
        last4: input.card.number.slice(-4),
        mandate: null,
        multicapture: { status: 'unavailable' },
        network: brand,
        network_token: { used: false },
        network_transaction_id: ok ? randomToken(15) : null,
        overcapture: { maximum_amount_capturable: pi.amount, status: 'unavailable' },
        regulated_status: 'unregulated',
        transaction_link_id: null,
        ...{ three_d_secure: null, wallet: null },
      },
      type: 'card',
    },
    receipt_email: pi.receipt_email,
    receipt_number: null,
    receipt_url: ok ? `${input.baseUrl}/receipts/${id}` : null,
    refunded: false,
    refunds: { object: 'list', data: [], has_more: false, url: `/v1/charges/${id}/refunds` },
    review: null,
    shipping: input.shipping,
    source: null,
    source_transfer: null,
    statement_descriptor: pi.statement_descriptor,
    statement_descriptor_suffix: pi.statement_descriptor_suffix,
    status: ok ? 'succeeded' : 'failed',
    transfer_data: null,
    transfer_group: null,
  };
}

export function newRefund(
  charge: Stripe.Charge,
  amount: number,
  reason: Stripe.Refund.Reason | null,
  metadata: Record<string, string>,
  created: number,
): Stripe.Refund {
  return {
    id: newId('re'),
    object: 'refund',
    amount,
    balance_transaction: newId('txn'),
    charge: charge.id,
    created,
    currency: charge.currency,
    customer: null,
    customer_account: null,
    destination_details: {
      card: {
        reference: randomToken(12),
        reference_status: 'pending',
        reference_type: 'acquirer_reference_number',
        type: 'refund',
      },
      type: 'card',
    },
    metadata,
    payment_intent:
      typeof charge.payment_intent === 'string' ? charge.payment_intent : (charge.payment_intent?.id ?? null),
    payment_method: charge.payment_method,
    reason,
    receipt_number: null,
    source_transfer_reversal: null,
    status: 'succeeded',
    transfer_reversal: null,
  };
}
