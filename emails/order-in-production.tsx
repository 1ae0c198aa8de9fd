import { Button, Text } from '@react-email/components';
import { EmailLayout, button, paragraph } from './components/email-layout';
import { joinWithAnd } from './components/order-summary';

export type OrderInProductionEmailProps = {
  studioName: string;
  buyerName: string | null;
  orderNumber: string;
  orderUrl: string;
  /** What is being made, e.g. ["Ibex in Old Bone"]. */
  lines: string[];
  /** Already formatted for the buyer, e.g. "Friday 22 January 2027". */
  shipBy: string;
};

export function OrderInProductionEmail({ studioName, buyerName, orderNumber, orderUrl, lines, shipBy }: OrderInProductionEmailProps) {
  const several = lines.length > 1;
  const what = lines.length > 0 ? `your ${joinWithAnd(lines)}` : 'your order';
  return (
    <EmailLayout
      preview={`Your ${several ? 'masks are' : 'mask is'} being made: order ${orderNumber}`}
      footnote={`You get this e-mail because you placed order ${orderNumber} with ${studioName} on Demold.`}
    >
      <Text style={paragraph}>{buyerName ? `Hello ${buyerName},` : 'Hello,'}</Text>
      <Text style={paragraph}>
        {`${studioName} has started making ${what}. Each mask is cast by hand, then trimmed, painted and packed, so it takes a while; you can follow every step on your order page.`}
      </Text>
      <Text style={paragraph}>{`The studio plans to ship order ${orderNumber} by ${shipBy}. When it leaves, you get one more e-mail with the tracking link.`}</Text>
      <Button href={orderUrl} style={button}>
        Follow your order
      </Button>
    </EmailLayout>
  );
}

OrderInProductionEmail.PreviewProps = {
  studioName: 'Marrowgate Studio',
  buyerName: 'Juno Pell',
  orderNumber: 'DM-1042',
  orderUrl: 'http://127.0.0.1:3000/orders/DM-1042?token=preview',
  lines: ['Ibex in Old Bone'],
  shipBy: 'Friday 22 January 2027',
} satisfies OrderInProductionEmailProps;

export default OrderInProductionEmail;
