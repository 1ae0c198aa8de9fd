import { Button, Text } from '@react-email/components';
import { EmailLayout, button, paragraph } from './components/email-layout';
import { joinWithAnd, money } from './components/order-summary';

export type RefundIssuedEmailProps = {
  studioName: string;
  orderNumber: string;
  orderUrl: string;
  currency: string;
  amountMinor: number;
  /** Why, as the end of a sentence: "a casting failed". */
  reasonText: string;
  /** The lines this refund covers, e.g. ["Ibex in Old Bone"]; empty for an amount alone. */
  refundedLines: string[];
  totalRefundedMinor: number;
  totalPaidMinor: number;
};

export function RefundIssuedEmail({
  studioName,
  orderNumber,
  orderUrl,
  currency,
  amountMinor,
  reasonText,
  refundedLines,
  totalRefundedMinor,
  totalPaidMinor,
}: RefundIssuedEmailProps) {
  const amount = money(amountMinor, currency);
  const paid = money(totalPaidMinor, currency);
  const standing =
    totalRefundedMinor === totalPaidMinor
      ? `Order ${orderNumber} is now fully refunded: all ${paid} you paid.`
      : `So far ${money(totalRefundedMinor, currency)} of the ${paid} you paid for order ${orderNumber} has been refunded.`;
  return (
    <EmailLayout
      preview={`${studioName} refunded ${amount} on order ${orderNumber}`}
      footnote={`You get this e-mail because you placed order ${orderNumber} with ${studioName} on Demold.`}
    >
      <Text
        style={paragraph}
      >{`${studioName} has refunded ${amount} on order ${orderNumber} because ${reasonText}.`}</Text>
      {refundedLines.length > 0 ? (
        <Text style={paragraph}>{`The refund covers your ${joinWithAnd(refundedLines)}.`}</Text>
      ) : null}
      <Text style={paragraph}>{standing}</Text>
      <Text style={paragraph}>
        The money goes back to the card you paid with. Banks usually take 5–10 working days to show a refund.
      </Text>
      <Button href={orderUrl} style={button}>
        View your order
      </Button>
    </EmailLayout>
  );
}

RefundIssuedEmail.PreviewProps = {
  studioName: 'Marrowgate Studio',
  orderNumber: 'DM-1042',
  orderUrl: 'http://127.0.0.1:3000/account/orders/DM-1042',
  currency: 'EUR',
  amountMinor: 24000,
  reasonText: 'a casting failed',
  refundedLines: ['Ibex in Old Bone'],
  totalRefundedMinor: 24000,
  totalPaidMinor: 49700,
} satisfies RefundIssuedEmailProps;

export default RefundIssuedEmail;
