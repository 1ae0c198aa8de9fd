import { Button, Link, Text } from '@react-email/components';
import { EmailLayout, button, paragraph } from './components/email-layout';
import { SummaryRow, SummaryTable, lineName, money, smallPrint } from './components/order-summary';

export type OversoldAlertEmailProps = {
  studioName: string;
  orderNumber: string;
  workshopOrderUrl: string;
  oversoldQueueUrl: string;
  designName: string;
  finishName: string;
  batchName: string;
  buyerEmail: string;
  paidMinor: number;
  currency: string;
};

/** To the studio's makers: a late payment found the stock gone, and the line waits in the oversold queue. */
export function OversoldAlertEmail({
  studioName,
  orderNumber,
  workshopOrderUrl,
  oversoldQueueUrl,
  designName,
  finishName,
  batchName,
  buyerEmail,
  paidMinor,
  currency,
}: OversoldAlertEmailProps) {
  const mask = lineName(designName, finishName);
  return (
    <EmailLayout
      preview={`Order ${orderNumber}: ${mask} was paid for after the stock had gone`}
      footnote={`You get this e-mail because you are a maker at ${studioName} on Demold.`}
    >
      <Text style={paragraph}>
        {`A late payment on order ${orderNumber} came in after its hold had run out, and ${batchName} had no ${mask} left. The line is marked oversold.`}
      </Text>
      <SummaryTable>
        <SummaryRow label="Order" value={orderNumber} />
        <SummaryRow label="Design" value={designName} />
        <SummaryRow label="Finish" value={finishName} />
        <SummaryRow label="Batch" value={batchName} />
        <SummaryRow label="Buyer" value={buyerEmail} />
        <SummaryRow label="Paid" value={money(paidMinor, currency)} strong />
      </SummaryTable>
      <Text style={paragraph}>
        From the oversold queue you can refund the line in one step, or confirm that you will cast an extra.
        The buyer has been told you will write within two working days.
      </Text>
      <Button href={oversoldQueueUrl} style={button}>
        Open the oversold queue
      </Button>
      <Text style={{ ...smallPrint, marginTop: '24px' }}>
        Or see the order in the workshop: <Link href={workshopOrderUrl}>{`order ${orderNumber}`}</Link>
      </Text>
    </EmailLayout>
  );
}

OversoldAlertEmail.PreviewProps = {
  studioName: 'Marrowgate Studio',
  orderNumber: 'DM-1042',
  workshopOrderUrl: 'http://127.0.0.1:3000/workshop/orders/DM-1042',
  oversoldQueueUrl: 'http://127.0.0.1:3000/workshop/oversold',
  designName: 'Moth',
  finishName: 'Verdigris',
  batchName: 'Winter batch',
  buyerEmail: 'juno@example.com',
  paidMinor: 24500,
  currency: 'EUR',
} satisfies OversoldAlertEmailProps;

export default OversoldAlertEmail;
