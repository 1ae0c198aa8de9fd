import type { IncomingMessage, ServerResponse } from 'node:http';
import type Stripe from 'stripe';
import { z } from 'zod';
import { type FieldErrors, type PaymentAttempt, payCheckoutSession, sweepExpired } from './checkout-flow';
import type { FakeContext } from './context';
import { redirect, sendHtml } from './http-io';
import type { SessionRecord } from './state';

/*
 * The hosted payment page a Checkout Session's `url` points at. Plain HTML that works without script,
 * with labels, fieldsets and an error summary, in the fake's own neutral look: it stands in for a
 * payment page in tests and demos and imitates no one's design.
 */

const FIELDS = [
  'email',
  'name',
  'line1',
  'line2',
  'city',
  'postal_code',
  'state',
  'country',
  'shipping_rate',
  'card_number',
  'card_expiry',
  'card_cvc',
] as const;
type Field = (typeof FIELDS)[number];
type Values = Partial<Record<Field, string>>;

const formSchema = z.object(
  Object.fromEntries(FIELDS.map((f) => [f, z.string().max(500).optional()])) as Record<
    Field,
    z.ZodOptional<z.ZodString>
  >,
);

const escape = (value: string): string =>
  value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');

export function formatMoney(amount: number, currency: string): string {
  const format = new Intl.NumberFormat('en-IE', { style: 'currency', currency: currency.toUpperCase() });
  const digits = format.resolvedOptions().maximumFractionDigits ?? 2;
  return format.format(amount / 10 ** digits);
}

function countryName(code: string): string {
  try {
    return new Intl.DisplayNames(['en'], { type: 'region' }).of(code) ?? code;
  } catch {
    return code;
  }
}

function estimate(rate: Stripe.ShippingRate | undefined): string {
  const e = rate?.delivery_estimate;
  if (!e || (!e.minimum && !e.maximum)) return '';
  const unit = (e.maximum ?? e.minimum)?.unit.replace('_', ' ') ?? '';
  const range =
    e.minimum && e.maximum
      ? `${e.minimum.value}–${e.maximum.value}`
      : String((e.minimum ?? e.maximum)?.value ?? '');
  return ` (${range} ${unit}s)`;
}

const STYLE = `
  :root { color-scheme: light; --ink: #1f1d1a; --muted: #5c5750; --line: #c9c2b8; --bad: #a1261b; }
  * { box-sizing: border-box; }
  body { margin: 0; font: 16px/1.5 system-ui, sans-serif; color: var(--ink); background: #f6f4f0; }
  .test-banner { background: #ece6da; border-bottom: 2px dashed var(--muted); padding: .75rem 1rem; text-align: center; }
  main { max-width: 38rem; margin: 0 auto; padding: 1.5rem 1rem 3rem; }
  h1 { font-size: 1.5rem; margin: 0 0 1rem; } h2 { font-size: 1.1rem; margin: 0 0 .5rem; }
  table { width: 100%; border-collapse: collapse; margin-bottom: 1.5rem; background: #fff; }
  th, td { text-align: left; padding: .4rem .6rem; border-bottom: 1px solid var(--line); vertical-align: top; }
  td.num, th.num { text-align: right; white-space: nowrap; }
  tfoot th, tfoot td { font-weight: 600; }
  fieldset { border: 1px solid var(--line); background: #fff; margin: 0 0 1rem; padding: .75rem 1rem 1rem; }
  legend { font-weight: 600; padding: 0 .25rem; }
  label { display: block; margin-top: .6rem; font-weight: 500; }
  input[type=text], input[type=email], select { width: 100%; font: inherit; padding: .45rem .5rem; border: 1px solid var(--muted); border-radius: 2px; background: #fff; }
  .row { display: flex; gap: .75rem; } .row > div { flex: 1; }
  .choice { display: flex; gap: .5rem; align-items: baseline; margin-top: .4rem; font-weight: 400; }
  .hint { color: var(--muted); font-size: .9rem; margin: .15rem 0 0; }
  .field-error { color: var(--bad); font-weight: 600; margin: .15rem 0 0; }
  [aria-invalid=true] { border: 2px solid var(--bad); }
  .problems { border: 3px solid var(--bad); background: #fff; padding: .75rem 1rem; margin-bottom: 1rem; }
  .problems a { color: var(--bad); }
  button { font: inherit; font-weight: 600; padding: .7rem 1.4rem; border: 0; border-radius: 2px; background: var(--ink); color: #fff; cursor: pointer; }
  :focus-visible { outline: 3px solid #c77d1a; outline-offset: 2px; }
  .thumb { width: 2.5rem; height: 2.5rem; object-fit: cover; vertical-align: middle; margin-right: .5rem; }
`;

function page(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escape(title)} · Test payment page</title>
<style>${STYLE}</style>
</head>
<body>
<p class="test-banner" role="note"><strong>Test payment page — no real money moves.</strong> Served by the local fake Stripe; try the test card 4242 4242 4242 4242.</p>
<main>
${body}
</main>
</body>
</html>`;
}

function input(
  field: Field,
  label: string,
  values: Values,
  errors: FieldErrors,
  attrs: string,
  hint = '',
): string {
  const error = (errors as Record<string, string | undefined>)[field];
  const describedBy = [hint ? `${field}-hint` : '', error ? `${field}-error` : ''].filter(Boolean).join(' ');
  return `<label for="${field}">${escape(label)}</label>
${hint ? `<p class="hint" id="${field}-hint">${escape(hint)}</p>` : ''}${error ? `<p class="field-error" id="${field}-error">${escape(error)}</p>` : ''}
<input id="${field}" name="${field}" value="${escape(values[field] ?? '')}" ${attrs}${describedBy ? ` aria-describedby="${describedBy}"` : ''}${error ? ' aria-invalid="true"' : ''}>`;
}

function summary(ctx: FakeContext, record: SessionRecord): string {
  const s = record.session;
  const cur = s.currency ?? 'eur';
  const rows = record.lineItems
    .map((item) => {
      const product =
        typeof item.price?.product === 'string' ? ctx.state.products.get(item.price.product) : undefined;
      const image = product?.images[0];
      return `<tr><td>${image ? `<img class="thumb" src="${escape(image)}" alt="">` : ''}${escape(item.description ?? '')}</td><td class="num">${item.quantity ?? 1}</td><td class="num">${formatMoney(item.amount_total, cur)}</td></tr>`;
    })
    .join('\n');
  return `<table>
<caption class="hint" style="caption-side: top; text-align: left">Your order</caption>
<thead><tr><th scope="col">Item</th><th scope="col" class="num">Qty</th><th scope="col" class="num">Amount</th></tr></thead>
<tbody>${rows}</tbody>
<tfoot><tr><th scope="row" colspan="2">Subtotal</th><td class="num">${formatMoney(s.amount_subtotal ?? 0, cur)}</td></tr></tfoot>
</table>`;
}

function form(
  ctx: FakeContext,
  record: SessionRecord,
  values: Values,
  errors: FieldErrors,
  problem: string | null,
): string {
  const s = record.session;
  const cur = s.currency ?? 'eur';
  const problems = Object.entries(errors).map(
    ([field, message]) => `<li><a href="#${field}">${escape(message ?? '')}</a></li>`,
  );
  const alert =
    problem || problems.length
      ? `<div class="problems" role="alert" tabindex="-1" id="problems"><h2>${escape(problem ?? 'Please check the form')}</h2>${problems.length ? `<ul>${problems.join('')}</ul>` : ''}</div>`
      : '';
  const allowed = (s.shipping_address_collection?.allowed_countries ?? []) as string[];
  const chosenCountry = values.country ?? (allowed.length === 1 ? allowed[0] : '');
  const shipping = allowed.length
    ? `<fieldset><legend>Shipping address</legend>
${input('line1', 'Address line 1', values, errors, 'type="text" autocomplete="address-line1" required')}
${input('line2', 'Address line 2 (optional)', values, errors, 'type="text" autocomplete="address-line2"')}
<div class="row"><div>${input('postal_code', 'Postal code', values, errors, 'type="text" autocomplete="postal-code" required')}</div>
<div>${input('city', 'Town or city', values, errors, 'type="text" autocomplete="address-level2" required')}</div></div>
${input('state', 'County, state or region (optional)', values, errors, 'type="text" autocomplete="address-level1"')}
<label for="country">Country</label>${errors.country ? `<p class="field-error" id="country-error">${escape(errors.country)}</p>` : ''}
<select id="country" name="country" autocomplete="country" required${errors.country ? ' aria-invalid="true" aria-describedby="country-error"' : ''}>
${allowed.length > 1 ? `<option value=""${chosenCountry ? '' : ' selected'}>Choose a country</option>` : ''}${allowed
        .map(
          (c) =>
            `<option value="${escape(c)}"${c === chosenCountry ? ' selected' : ''}>${escape(countryName(c))}</option>`,
        )
        .join('')}
</select>
</fieldset>`
    : '';
  const chosenRate = values.shipping_rate ?? (s.shipping_options[0]?.shipping_rate as string | undefined);
  const options = s.shipping_options.length
    ? `<fieldset><legend>Shipping method</legend>${errors.shipping_rate ? `<p class="field-error" id="shipping_rate">${escape(errors.shipping_rate)}</p>` : ''}
${s.shipping_options
  .map((o, i) => {
    const rateId = o.shipping_rate as string;
    const rate = ctx.state.shippingRates.get(rateId);
    const total = (s.amount_subtotal ?? 0) + o.shipping_amount;
    return `<label class="choice" for="rate-${i}"><input type="radio" id="rate-${i}" name="shipping_rate" value="${escape(rateId)}"${rateId === chosenRate ? ' checked' : ''}>
<span>${escape(rate?.display_name ?? 'Shipping')}${escape(estimate(rate))}: ${formatMoney(o.shipping_amount, cur)}. Total to pay ${formatMoney(total, cur)}</span></label>`;
  })
  .join('\n')}
</fieldset>`
    : '';
  return `<h1>Pay ${escape(s.shipping_options.length ? 'for your order' : formatMoney(s.amount_total ?? 0, cur))}</h1>
${summary(ctx, record)}
${alert}
<form method="post" action="/pay/${escape(s.id)}" novalidate>
<fieldset><legend>Contact</legend>
${input('email', 'E-mail', values, errors, 'type="email" autocomplete="email" required')}
${input('name', 'Full name', values, errors, 'type="text" autocomplete="name" required', 'As it appears on the card; the parcel is addressed to this name.')}
</fieldset>
${shipping}
${options}
<fieldset><legend>Card</legend>
${input('card_number', 'Card number', values, errors, 'type="text" inputmode="numeric" autocomplete="cc-number" required')}
<div class="row"><div>${input('card_expiry', 'Expiry (MM / YY)', values, errors, 'type="text" inputmode="numeric" autocomplete="cc-exp" placeholder="MM / YY" required')}</div>
<div>${input('card_cvc', 'Security code (CVC)', values, errors, 'type="text" inputmode="numeric" autocomplete="cc-csc" required')}</div></div>
</fieldset>
<button type="submit">Pay now</button>
</form>
${s.cancel_url ? `<p><a href="${escape(s.cancel_url)}">Cancel and go back to the shop</a></p>` : ''}`;
}

function parseExpiry(value: string): { month: number | null; year: number | null } {
  const m = /^\s*(\d{1,2})\s*\/?\s*(\d{2}|\d{4})\s*$/.exec(value);
  if (!m) return { month: null, year: null };
  return { month: Number(m[1]), year: Number(m[2]) };
}

function toAttempt(values: Values): PaymentAttempt {
  const expiry = parseExpiry(values.card_expiry ?? '');
  return {
    email: values.email ?? '',
    cardNumber: values.card_number ?? '',
    expMonth: expiry.month,
    expYear: expiry.year,
    cvc: values.card_cvc ?? '',
    name: values.name ?? '',
    shipping:
      values.country !== undefined || values.line1 !== undefined
        ? {
            line1: values.line1 ?? '',
            line2: values.line2 ?? '',
            city: values.city ?? '',
            postal_code: values.postal_code ?? '',
            state: values.state ?? '',
            country: values.country ?? '',
          }
        : null,
    shippingRate: values.shipping_rate || null,
  };
}

export function successLocation(session: Stripe.Checkout.Session): string | null {
  return session.success_url ? session.success_url.split('{CHECKOUT_SESSION_ID}').join(session.id) : null;
}

function closedPage(record: SessionRecord): { status: number; html: string } {
  const s = record.session;
  if (s.status === 'complete') {
    const next = successLocation(s);
    return {
      status: 200,
      html: page(
        'Paid',
        `<h1>This order is paid</h1><p>Thank you. Nothing more to do here.</p>${next ? `<p><a href="${escape(next)}">Back to the shop</a></p>` : ''}`,
      ),
    };
  }
  return {
    status: 410,
    html: page(
      'Expired',
      `<h1>This checkout has expired</h1><p>The time to pay for this order ran out, so nothing was charged.</p>${s.cancel_url ? `<p><a href="${escape(s.cancel_url)}">Back to the shop</a></p>` : ''}`,
    ),
  };
}

/** GET and POST /pay/:session_id. */
export function handlePaymentPage(
  ctx: FakeContext,
  req: IncomingMessage,
  res: ServerResponse,
  sessionId: string,
  body: string,
): void {
  sweepExpired(ctx);
  const record = ctx.state.sessions.get(sessionId);
  if (!record) {
    sendHtml(
      res,
      404,
      page('Not found', '<h1>No such checkout</h1><p>This payment link does not lead to any order.</p>'),
    );
    return;
  }
  if (record.session.status !== 'open') {
    const closed = closedPage(record);
    sendHtml(res, closed.status, closed.html);
    return;
  }
  const returnUrl = record.session.success_url;
  if (req.method !== 'POST') {
    sendHtml(
      res,
      200,
      page('Pay', form(ctx, record, { email: record.session.customer_email ?? '' }, {}, null)),
      returnUrl,
    );
    return;
  }
  const parsed = formSchema.safeParse(Object.fromEntries(new URLSearchParams(body)));
  if (!parsed.success) {
    sendHtml(
      res,
      400,
      page('Pay', form(ctx, record, {}, {}, 'The form could not be read; please fill it in again.')),
      returnUrl,
    );
    return;
  }
  const values = parsed.data as Values;
  const result = payCheckoutSession(ctx, record, toAttempt(values));
  if (result.kind === 'paid') {
    const next = successLocation(result.session);
    if (next) redirect(res, next);
    else
      sendHtml(res, 200, page('Paid', '<h1>Payment complete</h1><p>Thank you. You may close this page.</p>'));
    return;
  }
  if (result.kind === 'not_open') {
    const closed = closedPage(record);
    sendHtml(res, closed.status, closed.html);
    return;
  }
  if (result.kind === 'invalid') {
    sendHtml(res, 400, page('Pay', form(ctx, record, values, result.errors, 'Please check the form')), returnUrl);
    return;
  }
  sendHtml(
    res,
    402,
    page('Pay', form(ctx, record, values, {}, `${result.message} No money was taken; try another card.`)),
    returnUrl,
  );
}

/** GET /receipts/:charge_id: the page a charge's receipt_url points at. */
export function handleReceipt(ctx: FakeContext, res: ServerResponse, chargeId: string): void {
  const charge = ctx.state.charges.get(chargeId);
  if (!charge || charge.status !== 'succeeded') {
    sendHtml(res, 404, page('Not found', '<h1>No such receipt</h1>'));
    return;
  }
  const refunded = charge.amount_refunded
    ? `<p>Refunded: ${formatMoney(charge.amount_refunded, charge.currency)}</p>`
    : '';
  sendHtml(
    res,
    200,
    page(
      'Receipt',
      `<h1>Receipt</h1><p>Paid ${formatMoney(charge.amount, charge.currency)} on ${new Date(charge.created * 1000).toUTCString()} with a test card ending ${escape(charge.payment_method_details?.card?.last4 ?? '')}.</p>${refunded}`,
    ),
  );
}
