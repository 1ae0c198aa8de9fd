import { Button, Text } from '@react-email/components';
import { EmailLayout, button, paragraph } from './components/email-layout';
import {
  SummaryRow,
  SummaryTable,
  heading,
  joinWithAnd,
  lineName,
  money,
  smallPrint,
} from './components/order-summary';

export type OrderEmailLine = {
  designName: string;
  finishName: string;
  unitPriceMinor: number;
  oversold: boolean;
};

export type OrderConfirmationEmailProps = {
  studioName: string;
  buyerName: string | null;
  orderNumber: string;
  orderUrl: string;
  currency: string;
  lines: OrderEmailLine[];
  subtotalMinor: number;
  shippingLabel: string;
  shippingMinor: number;
  totalMinor: number;
  taxLabel: string;
  taxRatePercent: string;
  taxIncludedMinor: number;
  shipTo: { name: string; lines: string[] };
  /** Already formatted for the buyer, e.g. "Friday 22 January 2027". */
  shipBy: string;
  /** True when a line was paid for after the batch's stock had gone. */
  oversold: boolean;
};

// The house wording of components/mask-safety-note.tsx, in one sentence.
const maskCaution =
  'A mask narrows your view and makes breathing harder, so do not wear it while driving, cycling or playing sport; it is a display and costume piece, not a toy or protective equipment; keep it away from heat, candles and open flame.';

function oversoldNote(studioName: string, lines: OrderEmailLine[]): string {
  const names = lines
    .filter((line) => line.oversold)
    .map((line) => lineName(line.designName, line.finishName));
  const several = names.length > 1;
  const what = names.length > 0 ? `your ${joinWithAnd(names)}` : 'part of your order';
  return (
    `One thing to know: ${what} ${several ? 'were' : 'was'} paid for after the batch's stock had gone. ` +
    `${studioName} will write to you within two working days and will either cast ${several ? 'extras' : 'an extra'} ` +
    `for you or refund ${several ? 'them' : 'it'} in full. There is nothing you need to do.`
  );
}

export function OrderConfirmationEmail({
  studioName,
  buyerName,
  orderNumber,
  orderUrl,
  currency,
  lines,
  subtotalMinor,
  shippingLabel,
  shippingMinor,
  totalMinor,
  taxLabel,
  taxRatePercent,
  taxIncludedMinor,
  shipTo,
  shipBy,
  oversold,
}: OrderConfirmationEmailProps) {
  const taxLine = `Includes ${taxLabel} at ${taxRatePercent}%: ${money(taxIncludedMinor, currency)}`;
  return (
    <EmailLayout
      preview={`Thank you: order ${orderNumber} from ${studioName} is paid`}
      footnote={`You get this e-mail because you placed order ${orderNumber} with ${studioName} on Demold.`}
    >
      <Text style={paragraph}>{buyerName ? `Hello ${buyerName},` : 'Hello,'}</Text>
      <Text style={paragraph}>
        {`Thank you for your order from ${studioName}. Your payment went through, and order ${orderNumber} is now with the studio.`}
      </Text>
      <SummaryTable>
        {lines.map((line, index) => (
          <SummaryRow
            key={index}
            label={lineName(line.designName, line.finishName)}
            note={line.oversold ? 'Paid after the stock had gone: see below' : undefined}
            value={money(line.unitPriceMinor, currency)}
          />
        ))}
        <SummaryRow label="Subtotal" value={money(subtotalMinor, currency)} />
        <SummaryRow label={`Shipping: ${shippingLabel}`} value={money(shippingMinor, currency)} />
        <SummaryRow label="Total" value={money(totalMinor, currency)} strong />
      </SummaryTable>
      <Text style={smallPrint}>{taxLine}</Text>
      {oversold ? <Text style={paragraph}>{oversoldNote(studioName, lines)}</Text> : null}
      <Text style={heading}>Ship to</Text>
      <Text style={paragraph}>
        {[shipTo.name, ...shipTo.lines].filter(Boolean).map((line, index) => (
          <span key={index}>
            {index > 0 ? <br /> : null}
            {line}
          </span>
        ))}
      </Text>
      <Text style={paragraph}>{`${studioName} will ship your order by ${shipBy}.`}</Text>
      <Button href={orderUrl} style={button}>
        View your order
      </Button>
      <Text style={{ ...smallPrint, marginTop: '24px' }}>{maskCaution}</Text>
    </EmailLayout>
  );
}

OrderConfirmationEmail.PreviewProps = {
  studioName: 'Marrowgate Studio',
  buyerName: 'Juno Pell',
  orderNumber: 'DM-1042',
  orderUrl: 'http://127.0.0.1:3000/account/orders/DM-1042',
  currency: 'EUR',
  lines: [
    { designName: 'Ibex', finishName: 'Old Bone', unitPriceMinor: 24000, oversold: false },
    { designName: 'Moth', finishName: 'Verdigris', unitPriceMinor: 24500, oversold: true },
  ],
  subtotalMinor: 48500,
  shippingLabel: 'Tracked post, Ireland',
  shippingMinor: 1200,
  totalMinor: 49700,
  taxLabel: 'VAT',
  taxRatePercent: '23',
  taxIncludedMinor: 9293,
  shipTo: { name: 'Juno Pell', lines: ['4 Tanner Row', 'Kilmarrow', 'Co. Galway H91 XK20', 'Ireland'] },
  shipBy: 'Friday 22 January 2027',
  oversold: true,
} satisfies OrderConfirmationEmailProps;

export default OrderConfirmationEmail;
