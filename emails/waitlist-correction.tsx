import { Text } from '@react-email/components';
import { EmailLayout, paragraph } from './components/email-layout';
import { EarlyAccessButton, WaitlistFooter } from './components/waitlist';

export type WaitlistCorrectionEmailProps = {
  studioName: string;
  postalAddress: string;
  designName: string;
  batchName: string;
  /** Moved: the new times (formatted, labelled); cancelled: none. */
  change: { kind: 'moved'; earlyAccessAt: string | null; opensAt: string; zoneNote: string; earlyAccessUrl: string } | { kind: 'cancelled' };
  unsubscribeUrl: string;
};

export function WaitlistCorrectionEmail(props: WaitlistCorrectionEmailProps) {
  const { studioName, designName, batchName, change } = props;
  return (
    <EmailLayout
      preview={change.kind === 'cancelled' ? `${batchName} of ${designName} is cancelled` : `${batchName} of ${designName} has new times`}
      footnote={`Sent by ${studioName} through Demold.`}
    >
      <Text style={paragraph}>Hello,</Text>
      {change.kind === 'cancelled' ? (
        <>
          <Text style={paragraph}>{`${studioName} has cancelled ${batchName} of ${designName}, which we wrote to you about. It will not open, and your early-access link no longer holds anything.`}</Text>
          <Text style={paragraph}>{`You stay on the ${designName} waitlist and hear about the next batch.`}</Text>
        </>
      ) : (
        <>
          <Text style={paragraph}>{`${batchName} of ${designName} has moved. These times replace the ones in our earlier e-mail:`}</Text>
          <Text style={paragraph}>
            {change.earlyAccessAt ? `Early access starts ${change.earlyAccessAt}; the public opening is ${change.opensAt}.` : `The drop opens ${change.opensAt}.`}
          </Text>
          <Text style={paragraph}>{change.zoneNote}</Text>
          <EarlyAccessButton href={change.earlyAccessUrl} />
        </>
      )}
      <WaitlistFooter {...props} />
    </EmailLayout>
  );
}

WaitlistCorrectionEmail.PreviewProps = {
  studioName: 'Marrowgate Studio',
  postalAddress: '4 Tannery Lane\nMarrowgate',
  designName: 'Moth',
  batchName: 'Autumn batch',
  change: {
    kind: 'moved',
    earlyAccessAt: 'Sat 16 Jan, 18:00 GMT',
    opensAt: 'Sat 16 Jan, 19:00 GMT',
    zoneNote: 'Times are in the studio’s time zone, Europe/Dublin.',
    earlyAccessUrl: 'http://127.0.0.1:3000/drops/preview/early-access?t=preview',
  },
  unsubscribeUrl: 'http://127.0.0.1:3000/waitlist/unsubscribe?t=preview',
} satisfies WaitlistCorrectionEmailProps;

export default WaitlistCorrectionEmail;
