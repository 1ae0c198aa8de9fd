import { Button, Text } from '@react-email/components';
import { EmailLayout, button, paragraph } from './components/email-layout';
import { lineName, money } from './components/order-summary';

export type OversoldApologyEmailProps = {
  studioName: string;
  orderNumber: string;
  orderUrl: string;
  currency: string;
  designName: string;
  finishName: string;
  batchName: string;
  amountMinor: number;
};

/** Sent when the maker refunds a line that was paid for after the batch's stock had gone. */
export function OversoldApologyEmail({
  studioName,
  orderNumber,
  orderUrl,
  currency,
  designName,
  finishName,
  batchName,
  amountMinor,
}: OversoldApologyEmailProps) {
  const mask = lineName(designName, finishName);
  const amount = money(amountMinor, currency);
  return (
    <EmailLayout
      preview={`We are sorry: your ${mask} on order ${orderNumber} is refunded in full`}
      footnote={`You get this e-mail because you placed order ${orderNumber} with ${studioName} on Demold.`}
    >
      <Text style={paragraph}>
        {`We are sorry. Your ${mask} on order ${orderNumber} was paid for after the stock of ${batchName} had gone, and we cannot make it for you this time.`}
      </Text>
      <Text style={paragraph}>{`We have refunded the full ${amount} to the card you paid with.`}</Text>
      <Text style={paragraph}>
        Banks usually take 5–10 working days to show a refund. That is the common practice, not a promise: the
        timing is up to your bank.
      </Text>
      <Text style={paragraph}>
        {`If you would still like a ${designName}, you can join the waitlist for the next batch, and we will tell you when it opens.`}
      </Text>
      <Text style={paragraph}>{studioName}</Text>
      <Button href={orderUrl} style={button}>
        View your order
      </Button>
    </EmailLayout>
  );
}

OversoldApologyEmail.PreviewProps = {
  studioName: 'Marrowgate Studio',
  orderNumber: 'DM-1042',
  orderUrl: 'http://127.0.0.1:3000/account/orders/DM-1042',
  currency: 'EUR',
  designName: 'Moth',
  finishName: 'Verdigris',
  batchName: 'Winter batch',
  amountMinor: 24500,
} satisfies OversoldApologyEmailProps;

export default OversoldApologyEmail;
