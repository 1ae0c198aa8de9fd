import { render } from '@react-email/render';
import type { ReactElement } from 'react';
import { describe, expect, it } from 'vitest';
import OrderConfirmationEmail, { type OrderConfirmationEmailProps } from '@/emails/order-confirmation';
import OrderInProductionEmail, { type OrderInProductionEmailProps } from '@/emails/order-in-production';
import OrderShippedEmail, { type OrderShippedEmailProps } from '@/emails/order-shipped';
import OversoldAlertEmail, { type OversoldAlertEmailProps } from '@/emails/oversold-alert';
import OversoldApologyEmail, { type OversoldApologyEmailProps } from '@/emails/oversold-apology';
import RefundIssuedEmail, { type RefundIssuedEmailProps } from '@/emails/refund-issued';
import { formatMoney } from '@/lib/money';

// Expected amounts are written out as CLDR's en-IE patterns render them in Node's ICU (the same source
// tests/unit/money.test.ts checks): "€240.00" for EUR and "JP¥32,000" for JPY, a zero-decimal currency
// whose minor unit is the whole yen.

type Rendered = { html: string; text: string };

async function renderBoth(element: ReactElement): Promise<Rendered> {
  const [html, text] = await Promise.all([render(element), render(element, { plainText: true })]);
  return { html, text };
}

function expectInBoth({ html, text }: Rendered, ...needles: string[]) {
  for (const needle of needles) {
    expect(html, `HTML shows ${needle}`).toContain(needle);
    expect(text, `plain text shows ${needle}`).toContain(needle);
  }
}

function expectInNeither({ html, text }: Rendered, ...needles: string[]) {
  for (const needle of needles) {
    expect(html, `HTML does not show ${needle}`).not.toContain(needle);
    expect(text, `plain text does not show ${needle}`).not.toContain(needle);
  }
}

/** Every link target in the HTML, with attribute escaping undone. */
function hrefs(html: string): string[] {
  return [...html.matchAll(/href="([^"]*)"/g)].map((match) => match[1]!.replaceAll('&amp;', '&'));
}

function escapeRegExp(value: string): string {
  return value.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/** A summary row in the plain text: the label, then its amount on the same line. */
function expectRow(text: string, label: string, amount: string) {
  expect(text).toMatch(new RegExp(`^${escapeRegExp(label)}\\s+${escapeRegExp(amount)}\\s*$`, 'm'));
}

const eur = (amountMinor: number) => formatMoney({ amountMinor, currency: 'EUR' });

const jpyOrder: OrderConfirmationEmailProps = {
  studioName: 'Marrowgate Studio',
  buyerName: 'Juno Pell',
  orderNumber: 'DM-2051',
  orderUrl: 'http://127.0.0.1:3000/account/orders/DM-2051?from=email&step=paid',
  currency: 'JPY',
  lines: [
    { designName: 'Boar', finishName: 'Soot & Gilt', unitPriceMinor: 32000, oversold: false },
    { designName: 'Hare', finishName: 'Bog Oak', unitPriceMinor: 28500, oversold: false },
  ],
  subtotalMinor: 60500,
  shippingLabel: 'Airmail, Japan',
  shippingMinor: 1800,
  totalMinor: 62300,
  taxLabel: 'consumption tax',
  taxRatePercent: '10',
  taxIncludedMinor: 5663,
  shipTo: { name: 'Juno Pell', lines: ['2-4 Kawabata', 'Marrow-cho 101-0001', 'Japan'] },
  shipBy: 'Monday 8 February 2027',
  oversold: false,
};

describe('order confirmation e-mail', () => {
  it('shows each line, the subtotal, shipping, total and included tax of the preview order in HTML and plain text', async () => {
    const props = OrderConfirmationEmail.PreviewProps;
    const out = await renderBoth(<OrderConfirmationEmail {...props} />);

    expectInBoth(out, props.orderNumber, props.shipBy, props.shipTo.name, ...props.shipTo.lines);
    for (const line of props.lines) {
      expectRow(out.text, `${line.designName} in ${line.finishName}`, eur(line.unitPriceMinor));
      expectInBoth(out, eur(line.unitPriceMinor));
    }
    expectRow(out.text, 'Subtotal', eur(props.subtotalMinor));
    expectRow(out.text, `Shipping: ${props.shippingLabel}`, eur(props.shippingMinor));
    expectRow(out.text, 'Total', eur(props.totalMinor));
    expectInBoth(out, eur(props.subtotalMinor), eur(props.shippingMinor), eur(props.totalMinor));
    expectInBoth(
      out,
      `Includes ${props.taxLabel} at ${props.taxRatePercent}%: ${eur(props.taxIncludedMinor)}`,
    );
  });

  it('formats a zero-decimal currency as whole yen', async () => {
    const out = await renderBoth(<OrderConfirmationEmail {...jpyOrder} />);

    expectRow(out.text, 'Boar in Soot & Gilt', 'JP¥32,000');
    expectRow(out.text, 'Hare in Bog Oak', 'JP¥28,500');
    expectRow(out.text, 'Subtotal', 'JP¥60,500');
    expectRow(out.text, 'Shipping: Airmail, Japan', 'JP¥1,800');
    expectRow(out.text, 'Total', 'JP¥62,300');
    expectInBoth(out, 'JP¥32,000', 'JP¥28,500', 'JP¥60,500', 'JP¥1,800', 'JP¥62,300');
    expectInBoth(out, 'Includes consumption tax at 10%: JP¥5,663');
    // Treating yen as cents would show ¥320 or ¥32,000.00.
    expectInNeither(out, 'JP¥320', '.00', '€');
  });

  it('shows the totals exactly as given instead of adding the lines up again', async () => {
    // The server computes totals; these deliberately differ from the sum of the lines (¥60,500).
    const props = {
      ...jpyOrder,
      subtotalMinor: 59000,
      shippingMinor: 0,
      totalMinor: 59000,
      taxIncludedMinor: 5363,
    };
    const out = await renderBoth(<OrderConfirmationEmail {...props} />);

    expectRow(out.text, 'Subtotal', 'JP¥59,000');
    expectRow(out.text, 'Shipping: Airmail, Japan', 'JP¥0');
    expectRow(out.text, 'Total', 'JP¥59,000');
    expectInBoth(out, 'Includes consumption tax at 10%: JP¥5,363');
    expectInNeither(out, 'JP¥60,500', 'JP¥62,300', 'JP¥5,663');
  });

  it('links the order page in HTML and gives its address in plain text', async () => {
    const out = await renderBoth(<OrderConfirmationEmail {...jpyOrder} />);

    expect(hrefs(out.html)).toContain(jpyOrder.orderUrl);
    expect(out.text).toContain(jpyOrder.orderUrl);
  });

  it('escapes HTML in names and addresses', async () => {
    const props = {
      ...jpyOrder,
      buyerName: '<b>Juno</b> Pell',
      shipTo: { name: '<b>Juno</b> Pell', lines: ['<img src=x onerror=alert(1)>', 'Japan'] },
    };
    const out = await renderBoth(<OrderConfirmationEmail {...props} />);

    expect(out.html).not.toContain('<b>');
    expect(out.html).not.toContain('<img');
    expect(out.html).toContain('&lt;b&gt;Juno&lt;/b&gt; Pell');
    expect(out.html).toContain('Soot &amp; Gilt');
    // Plain text is not HTML: the name reads as the buyer typed it.
    expect(out.text).toContain('Hello <b>Juno</b> Pell,');
  });

  it('greets without a name when the buyer gave none', async () => {
    const out = await renderBoth(<OrderConfirmationEmail {...jpyOrder} buyerName={null} />);

    expect(out.text).toMatch(/^Hello,$/m);
    expectInNeither(out, 'null');
  });

  it('says plainly what happens to a line paid after the stock had gone, and only then', async () => {
    const lines = [jpyOrder.lines[0]!, { ...jpyOrder.lines[1]!, oversold: true }];
    const oversold = await renderBoth(<OrderConfirmationEmail {...jpyOrder} lines={lines} oversold />);
    const plain = await renderBoth(<OrderConfirmationEmail {...jpyOrder} />);

    expectInBoth(
      oversold,
      'your Hare in Bog Oak was paid for after',
      'within two working days',
      'cast an extra',
      'refund it in full',
    );
    expectInBoth(oversold, 'There is nothing you need to do.', 'Paid after the stock had gone');
    // The oversold line keeps its price, and the totals stay as given.
    expectRow(oversold.text, 'Hare in Bog Oak', 'JP¥28,500');
    expectRow(oversold.text, 'Total', 'JP¥62,300');
    expectInNeither(plain, 'two working days', 'stock had gone', 'refund');
  });

  it('names every oversold line when there are several', async () => {
    const lines = jpyOrder.lines.map((line) => ({ ...line, oversold: true }));
    const out = await renderBoth(<OrderConfirmationEmail {...jpyOrder} lines={lines} oversold />);

    expect(out.text).toContain('your Boar in Soot & Gilt and Hare in Bog Oak were paid for after');
    expect(out.text).toContain('cast extras for you or refund them in full');
  });

  it('carries the usual mask caution', async () => {
    const { text } = await renderBoth(<OrderConfirmationEmail {...jpyOrder} />);

    for (const words of [
      'narrows your view',
      'breathing harder',
      'driving',
      'cycling',
      'sport',
      'not a toy',
      'protective equipment',
      'open flame',
    ]) {
      expect(text).toContain(words);
    }
  });
});

const jpyRefund: RefundIssuedEmailProps = {
  studioName: 'Marrowgate Studio',
  orderNumber: 'DM-2051',
  orderUrl: 'http://127.0.0.1:3000/account/orders/DM-2051?from=email&step=refund',
  currency: 'JPY',
  amountMinor: 32000,
  reasonText: 'a casting failed',
  refundedLines: ['Boar in Soot & Gilt'],
  totalRefundedMinor: 32000,
  totalPaidMinor: 62300,
};

describe('refund e-mail', () => {
  it('shows the preview refund, the reason and the order in HTML and plain text', async () => {
    const props = RefundIssuedEmail.PreviewProps;
    const out = await renderBoth(<RefundIssuedEmail {...props} />);

    expectInBoth(
      out,
      props.orderNumber,
      eur(props.amountMinor),
      eur(props.totalRefundedMinor),
      eur(props.totalPaidMinor),
    );
    expectInBoth(out, `because ${props.reasonText}.`, ...props.refundedLines);
    expect(hrefs(out.html)).toContain(props.orderUrl);
  });

  it('gives a part refund with what has been refunded so far, in whole yen', async () => {
    const out = await renderBoth(
      <RefundIssuedEmail {...jpyRefund} amountMinor={5000} totalRefundedMinor={37000} />,
    );

    expectInBoth(out, 'has refunded JP¥5,000 on order DM-2051 because a casting failed.');
    expectInBoth(out, 'So far JP¥37,000 of the JP¥62,300 you paid');
    expectInNeither(out, 'fully refunded', '.00');
  });

  it('says "fully refunded" when everything paid has come back', async () => {
    const out = await renderBoth(
      <RefundIssuedEmail {...jpyRefund} amountMinor={30300} totalRefundedMinor={62300} />,
    );

    expectInBoth(out, 'has refunded JP¥30,300', 'fully refunded', 'JP¥62,300');
    expectInNeither(out, 'So far');
  });

  it('links the order page and escapes HTML in the lines', async () => {
    const out = await renderBoth(
      <RefundIssuedEmail {...jpyRefund} refundedLines={['<b>Boar</b> in Soot & Gilt', 'Hare in Bog Oak']} />,
    );

    expect(hrefs(out.html)).toContain(jpyRefund.orderUrl);
    expect(out.text).toContain(jpyRefund.orderUrl);
    expect(out.html).not.toContain('<b>');
    expect(out.html).toContain('&lt;b&gt;Boar&lt;/b&gt; in Soot &amp; Gilt and Hare in Bog Oak');
  });
});

const jpyApology: OversoldApologyEmailProps = {
  studioName: 'Marrowgate Studio',
  orderNumber: 'DM-2051',
  orderUrl: 'http://127.0.0.1:3000/account/orders/DM-2051?from=email&step=oversold',
  currency: 'JPY',
  designName: 'Hare',
  finishName: 'Bog Oak',
  batchName: 'First light',
  amountMinor: 28500,
};

describe('oversold apology e-mail', () => {
  it('apologises and gives the full refund of the preview line in HTML and plain text', async () => {
    const props = OversoldApologyEmail.PreviewProps;
    const out = await renderBoth(<OversoldApologyEmail {...props} />);

    expectInBoth(out, props.orderNumber, `${props.designName} in ${props.finishName}`, props.batchName);
    expectInBoth(out, `refunded the full ${eur(props.amountMinor)} to the card`);
    expect(hrefs(out.html)).toContain(props.orderUrl);
  });

  it('says the usual bank timing is not a promise, and points to the waitlist', async () => {
    const out = await renderBoth(<OversoldApologyEmail {...jpyApology} />);

    expectInBoth(
      out,
      'sorry',
      'JP¥28,500',
      '5–10 working days',
      'not a promise',
      'waitlist for the next batch',
    );
    expectInNeither(out, '.00');
    expect(hrefs(out.html)).toContain(jpyApology.orderUrl);
    expect(out.text).toContain(jpyApology.orderUrl);
  });

  it('escapes HTML in names', async () => {
    const out = await renderBoth(
      <OversoldApologyEmail {...jpyApology} designName="<b>Hare</b>" finishName="Soot & Gilt" />,
    );

    expect(out.html).not.toContain('<b>');
    expect(out.html).toContain('&lt;b&gt;Hare&lt;/b&gt; in Soot &amp; Gilt');
  });
});

const jpyAlert: OversoldAlertEmailProps = {
  studioName: 'Marrowgate Studio',
  orderNumber: 'DM-2051',
  workshopOrderUrl: 'http://127.0.0.1:3000/workshop/orders/DM-2051?tab=lines&line=2',
  oversoldQueueUrl: 'http://127.0.0.1:3000/workshop/oversold?batch=first-light&open=1',
  designName: 'Hare',
  finishName: 'Bog Oak',
  batchName: 'First light',
  buyerEmail: 'juno@example.com',
  paidMinor: 28500,
  currency: 'JPY',
};

describe('oversold alert e-mail to the makers', () => {
  it('gives the preview line, the buyer and the amount paid in HTML and plain text', async () => {
    const props = OversoldAlertEmail.PreviewProps;
    const out = await renderBoth(<OversoldAlertEmail {...props} />);

    expectInBoth(out, props.orderNumber, props.buyerEmail, props.batchName, eur(props.paidMinor), 'oversold');
    expectRow(out.text, 'Paid', eur(props.paidMinor));
  });

  it('links the oversold queue and the order in the workshop, with the amount in whole yen', async () => {
    const out = await renderBoth(<OversoldAlertEmail {...jpyAlert} />);

    expectRow(out.text, 'Paid', 'JP¥28,500');
    expectRow(out.text, 'Order', 'DM-2051');
    expectRow(out.text, 'Buyer', 'juno@example.com');
    expectInBoth(out, 'refund the line in one step', 'cast an extra');
    expectInNeither(out, '.00');
    expect(hrefs(out.html)).toEqual(
      expect.arrayContaining([jpyAlert.oversoldQueueUrl, jpyAlert.workshopOrderUrl]),
    );
    expect(out.text).toContain(jpyAlert.oversoldQueueUrl);
    expect(out.text).toContain(jpyAlert.workshopOrderUrl);
  });

  it('escapes HTML in the buyer address and names', async () => {
    const out = await renderBoth(
      <OversoldAlertEmail {...jpyAlert} buyerEmail={'"><b>x</b>@example.com'} finishName="Soot & Gilt" />,
    );

    expect(out.html).not.toContain('<b>');
    expect(out.html).toContain('&lt;b&gt;x&lt;/b&gt;@example.com');
    expect(out.html).toContain('Soot &amp; Gilt');
  });
});

const shipped: OrderShippedEmailProps = {
  studioName: 'Marrowgate Studio',
  buyerName: 'Juno Pell',
  orderNumber: 'DM-2051',
  orderUrl: 'http://127.0.0.1:3000/orders/DM-2051?token=abc&from=email',
  shippedLines: ['Boar in Soot & Gilt', 'Hare in Bog Oak'],
  carrierName: 'Harbour Post',
  trackingNumber: 'HP 2207 1184 IE',
  // The space is percent-encoded, as encodeURIComponent does; "&" in the link must survive HTML escaping.
  trackingUrl: 'https://track.harbourpost.example/parcel?code=HP%202207%201184%20IE&lang=en',
  shippingLabel: 'Tracked post, 2–4 working days',
  shipTo: { name: 'Juno Pell', lines: ['2-4 Kawabata', 'Marrow-cho 101-0001', 'Japan'] },
  contactEmail: 'hello@marrowgate.example',
};

describe('shipped e-mail', () => {
  it('gives the carrier, the tracking number and a working tracking link in HTML and plain text', async () => {
    const out = await renderBoth(<OrderShippedEmail {...shipped} />);

    expectInBoth(out, 'DM-2051', 'Harbour Post', 'HP 2207 1184 IE', 'Tracked post, 2–4 working days');
    expect(out.text).toContain('your Boar in Soot & Gilt and Hare in Bog Oak');
    expect(out.html).toContain('your Boar in Soot &amp; Gilt and Hare in Bog Oak');
    expect(hrefs(out.html)).toEqual(expect.arrayContaining([shipped.trackingUrl, shipped.orderUrl]));
    expect(out.text).toContain(shipped.trackingUrl);
    // Read back with the WHATWG URL parser, the link carries the number itself.
    const link = new URL(hrefs(out.html).find((href) => href.startsWith('https://track.'))!);
    expect(link.searchParams.get('code')).toBe('HP 2207 1184 IE');
    expect(link.searchParams.get('lang')).toBe('en');
  });

  it('says where the parcel goes and how to reach the studio, or leaves the address out when there is none', async () => {
    const out = await renderBoth(<OrderShippedEmail {...shipped} />);
    expectInBoth(out, 'Juno Pell', ...shipped.shipTo.lines, 'hello@marrowgate.example');
    expect(hrefs(out.html)).toContain('mailto:hello@marrowgate.example');

    const without = await renderBoth(<OrderShippedEmail {...shipped} contactEmail={null} />);
    expectInBoth(without, 'Write to Marrowgate Studio and give your order number, DM-2051.');
    expectInNeither(without, 'mailto:', 'null', '@marrowgate.example');
  });

  it('escapes HTML in names and the tracking number', async () => {
    const out = await renderBoth(<OrderShippedEmail {...shipped} buyerName="<b>Juno</b>" carrierName="<i>Post</i>" />);
    expect(out.html).not.toContain('<b>');
    expect(out.html).not.toContain('<i>');
    expect(out.html).toContain('&lt;b&gt;Juno&lt;/b&gt;');
    expect(out.html).toContain('Soot &amp; Gilt');
  });
});

const making: OrderInProductionEmailProps = {
  studioName: 'Marrowgate Studio',
  buyerName: null,
  orderNumber: 'DM-2051',
  orderUrl: 'http://127.0.0.1:3000/orders/DM-2051?token=abc',
  lines: ['Ram in Verdigris'],
  shipBy: 'Monday 8 February 2027',
};

describe('masks-being-made e-mail', () => {
  it('says what is being made, when it should ship, and links the order', async () => {
    const out = await renderBoth(<OrderInProductionEmail {...making} />);
    expectInBoth(out, 'has started making your Ram in Verdigris', 'by Monday 8 February 2027', 'DM-2051', 'tracking link');
    expect(hrefs(out.html)).toContain(making.orderUrl);
    expect(out.text).toContain(making.orderUrl);
    expect(out.text).toMatch(/^Hello,$/m);
    expectInNeither(out, 'null');
  });

  it('names several masks together', async () => {
    const out = await renderBoth(<OrderInProductionEmail {...making} lines={['Ram in Verdigris', 'Moth in Old Bone', 'Ibex in Bog Oak']} />);
    expectInBoth(out, 'your Ram in Verdigris, Moth in Old Bone and Ibex in Bog Oak');
  });
});
