import type Stripe from 'stripe';
import { newCheckoutSessionId, newId } from './ids';
import type { SessionRecord } from './state';

/** The parts of a create request the fake models, already parsed and checked (see api-checkout.ts). */
export interface SessionInput {
  lineItems: Array<{
    currency: string;
    unitAmount: number;
    quantity: number;
    product: { name: string; description?: string; images: string[]; metadata: Record<string, string> };
  }>;
  metadata: Record<string, string>;
  customerEmail: string | null;
  clientReferenceId: string | null;
  allowedCountries: string[] | null;
  shippingOptions: Array<{
    displayName: string;
    amount: number;
    currency: string;
    deliveryEstimate: Stripe.ShippingRate.DeliveryEstimate | null;
    metadata: Record<string, string>;
  }>;
  successUrl: string | null;
  cancelUrl: string | null;
  expiresAt: number;
  locale: string | null;
  billingAddressCollection: 'auto' | 'required' | null;
  submitType: Stripe.Checkout.Session.SubmitType | null;
  phoneNumberCollection: boolean;
  paymentIntentData: SessionRecord['paymentIntentData'];
}

export interface BuiltSession {
  record: SessionRecord;
  products: Stripe.Product[];
  prices: Stripe.Price[];
  shippingRates: Stripe.ShippingRate[];
}

function product(input: SessionInput['lineItems'][number]['product'], created: number): Stripe.Product {
  return {
    id: newId('prod', 14),
    object: 'product',
    active: true,
    created,
    default_price: null,
    description: input.description ?? null,
    images: input.images,
    livemode: false,
    marketing_features: [],
    metadata: input.metadata,
    name: input.name,
    package_dimensions: null,
    shippable: null,
    statement_descriptor: null,
    tax_code: null,
    tax_details: null,
    type: 'service',
    unit_label: null,
    updated: created,
    url: null,
  };
}

/** Inline price_data makes an inactive one-off price, as Stripe does. */
function price(productId: string, currency: string, unitAmount: number, created: number): Stripe.Price {
  return {
    id: newId('price'),
    object: 'price',
    active: false,
    billing_scheme: 'per_unit',
    created,
    currency,
    custom_unit_amount: null,
    livemode: false,
    lookup_key: null,
    metadata: {},
    nickname: null,
    product: productId,
    recurring: null,
    tax_behavior: 'unspecified',
    tiers_mode: null,
    transform_quantity: null,
    type: 'one_time',
    unit_amount: unitAmount,
    // The SDK turns this decimal string into its Decimal type on the way in.
    unit_amount_decimal: String(unitAmount) as unknown as Stripe.Price['unit_amount_decimal'],
  };
}

function shippingRate(option: SessionInput['shippingOptions'][number], created: number): Stripe.ShippingRate {
  return {
    id: newId('shr'),
    object: 'shipping_rate',
    active: true,
    created,
    delivery_estimate: option.deliveryEstimate,
    display_name: option.displayName,
    fixed_amount: { amount: option.amount, currency: option.currency },
    livemode: false,
    metadata: option.metadata,
    tax_behavior: 'unspecified',
    tax_code: null,
    type: 'fixed_amount',
  };
}

/** Sums and the shipping cost for a chosen rate; Stripe preselects the first option. */
export function applyShippingChoice(session: Stripe.Checkout.Session, rateId: string | null): void {
  const subtotal = session.amount_subtotal ?? 0;
  const option = session.shipping_options.find((o) => o.shipping_rate === rateId) ?? null;
  const shipping = option?.shipping_amount ?? 0;
  session.shipping_cost = option
    ? {
        amount_subtotal: shipping,
        amount_tax: 0,
        amount_total: shipping,
        shipping_rate: option.shipping_rate,
      }
    : null;
  session.total_details = { amount_discount: 0, amount_shipping: shipping, amount_tax: 0 };
  session.amount_total = subtotal + shipping;
}

export function buildSession(
  input: SessionInput,
  created: number,
  baseUrl: string,
  apiVersion: string,
): BuiltSession {
  const id = newCheckoutSessionId();
  const products: Stripe.Product[] = [];
  const prices: Stripe.Price[] = [];
  const lineItems: Stripe.LineItem[] = input.lineItems.map((item) => {
    const prod = product(item.product, created);
    const pr = price(prod.id, item.currency, item.unitAmount, created);
    products.push(prod);
    prices.push(pr);
    const total = item.unitAmount * item.quantity;
    return {
      id: newId('li'),
      object: 'item',
      adjustable_quantity: null,
      amount_discount: 0,
      amount_subtotal: total,
      amount_tax: 0,
      amount_total: total,
      currency: item.currency,
      description: item.product.name,
      metadata: {},
      price: pr,
      quantity: item.quantity,
    };
  });
  const shippingRates = input.shippingOptions.map((option) => shippingRate(option, created));
  const currency = input.lineItems[0]?.currency ?? 'eur';
  const subtotal = lineItems.reduce((sum, item) => sum + item.amount_subtotal, 0);
  const session: Stripe.Checkout.Session = {
    id,
    object: 'checkout.session',
    adaptive_pricing: { enabled: false },
    after_expiration: null,
    allow_promotion_codes: null,
    allowed_payment_method_types: null,
    amount_subtotal: subtotal,
    amount_total: subtotal,
    automatic_tax: { enabled: false, liability: null, provider: null, status: null },
    billing_address_collection: input.billingAddressCollection,
    cancel_url: input.cancelUrl,
    client_reference_id: input.clientReferenceId,
    client_secret: null,
    collected_information: null,
    consent: null,
    consent_collection: null,
    created,
    currency,
    currency_conversion: null,
    custom_fields: [],
    custom_text: {
      after_submit: null,
      shipping_address: null,
      submit: null,
      terms_of_service_acceptance: null,
    },
    customer: null,
    customer_account: null,
    customer_creation: 'if_required',
    customer_details: null,
    customer_email: input.customerEmail,
    discounts: [],
    expires_at: input.expiresAt,
    integration_identifier: null,
    invoice: null,
    invoice_creation: {
      enabled: false,
      invoice_data: {
        account_tax_ids: null,
        custom_fields: null,
        description: null,
        footer: null,
        issuer: null,
        metadata: {},
        rendering_options: null,
      },
    },
    livemode: false,
    locale: (input.locale as Stripe.Checkout.Session.Locale | null) ?? null,
    managed_payments: { enabled: false },
    metadata: input.metadata,
    mode: 'payment',
    origin_context: null,
    payment_intent: null,
    payment_link: null,
    payment_method_collection: 'if_required',
    payment_method_configuration_details: { id: newId('pmc'), parent: null },
    payment_method_options: { card: { request_three_d_secure: 'automatic' } },
    payment_method_types: ['card'],
    payment_status: 'unpaid',
    permissions: null,
    phone_number_collection: { enabled: input.phoneNumberCollection },
    recovered_from: null,
    saved_payment_method_options: null,
    setup_intent: null,
    shipping_address_collection: input.allowedCountries
      ? {
          allowed_countries:
            input.allowedCountries as Stripe.Checkout.Session.ShippingAddressCollection.AllowedCountry[],
        }
      : null,
    shipping_cost: null,
    shipping_options: shippingRates.map((rate) => ({
      shipping_amount: rate.fixed_amount?.amount ?? 0,
      shipping_rate: rate.id,
    })),
    status: 'open',
    submit_type: input.submitType,
    subscription: null,
    success_url: input.successUrl,
    total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
    ui_mode: 'hosted_page',
    url: `${baseUrl}/pay/${id}`,
    wallet_options: null,
  };
  applyShippingChoice(session, shippingRates[0]?.id ?? null);
  return {
    record: { session, lineItems, paymentIntentData: input.paymentIntentData, apiVersion },
    products,
    prices,
    shippingRates,
  };
}
