import { Button, Link, Text } from '@react-email/components';
import { EmailLayout, button, paragraph } from './components/email-layout';
import { SummaryRow, SummaryTable, heading, joinWithAnd, smallPrint } from './components/order-summary';

export type OrderShippedEmailProps = {
  studioName: string;
  buyerName: string | null;
  orderNumber: string;
  orderUrl: string;
  /** What is in the parcel, e.g. ["Ibex in Old Bone"]. */
  shippedLines: string[];
  carrierName: string;
  trackingNumber: string;
  /** The carrier's tracking link for this parcel, as it was made when the order shipped. */
  trackingUrl: string;
  /** e.g. "Tracked post, 2–4 working days". */
  shippingLabel: string;
  shipTo: { name: string; lines: string[] };
  /** Where the buyer writes with a question; null when the studio has not given one. */
  contactEmail: string | null;
};

export function OrderShippedEmail({
  studioName,
  buyerName,
  orderNumber,
  orderUrl,
  shippedLines,
  carrierName,
  trackingNumber,
  trackingUrl,
  shippingLabel,
  shipTo,
  contactEmail,
}: OrderShippedEmailProps) {
  const what = shippedLines.length > 0 ? `your ${joinWithAnd(shippedLines)}` : 'your order';
  return (
    <EmailLayout
      preview={`Order ${orderNumber} from ${studioName} is on its way`}
      footnote={`You get this e-mail because you placed order ${orderNumber} with ${studioName} on Demold.`}
    >
      <Text style={paragraph}>{buyerName ? `Hello ${buyerName},` : 'Hello,'}</Text>
      <Text style={paragraph}>{`Good news: ${studioName} has sent ${what}. Order ${orderNumber} is on its way to you.`}</Text>
      <SummaryTable>
        <SummaryRow label="Carrier" value={carrierName} />
        <SummaryRow label="Tracking number" value={trackingNumber} />
        <SummaryRow label="Service" value={shippingLabel} />
      </SummaryTable>
      <Button href={trackingUrl} style={button}>
        Track your parcel
      </Button>
      <Text style={smallPrint}>
        {'If the button does not work, copy this link into your browser: '}
        <Link href={trackingUrl}>{trackingUrl}</Link>
      </Text>
      <Text style={heading}>Going to</Text>
      <Text style={paragraph}>
        {[shipTo.name, ...shipTo.lines].filter(Boolean).map((line, index) => (
          <span key={index}>
            {index > 0 ? <br /> : null}
            {line}
          </span>
        ))}
      </Text>
      <Text style={paragraph}>
        {contactEmail ? (
          <>
            {`A question about the parcel? Write to ${studioName} at `}
            <Link href={`mailto:${contactEmail}`}>{contactEmail}</Link>
            {` and give your order number, ${orderNumber}.`}
          </>
        ) : (
          `A question about the parcel? Write to ${studioName} and give your order number, ${orderNumber}.`
        )}
      </Text>
      <Button href={orderUrl} style={{ ...button, backgroundColor: '#6b635a' }}>
        View your order
      </Button>
    </EmailLayout>
  );
}

OrderShippedEmail.PreviewProps = {
  studioName: 'Marrowgate Studio',
  buyerName: 'Juno Pell',
  orderNumber: 'DM-1042',
  orderUrl: 'http://127.0.0.1:3000/orders/DM-1042?token=preview',
  shippedLines: ['Ibex in Old Bone', 'Moth in Verdigris'],
  carrierName: 'Harbour Post',
  trackingNumber: 'HP 2207 1184 IE',
  trackingUrl: 'https://track.harbourpost.example/parcel?code=HP%202207%201184%20IE',
  shippingLabel: 'Tracked post, 2–4 working days',
  shipTo: { name: 'Juno Pell', lines: ['4 Tanner Row', 'Kilmarrow', 'Co. Galway H91 XK20', 'Ireland'] },
  contactEmail: 'hello@marrowgate.example',
} satisfies OrderShippedEmailProps;

export default OrderShippedEmail;
