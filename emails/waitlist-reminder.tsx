import { Text } from '@react-email/components';
import { EmailLayout, paragraph } from './components/email-layout';
import { EarlyAccessButton, WaitlistFooter } from './components/waitlist';

export type WaitlistReminderEmailProps = {
  studioName: string;
  postalAddress: string;
  designName: string;
  batchName: string;
  /** Formatted in the reader's zone, labelled. */
  earlyAccessAt: string;
  opensAt: string;
  zoneNote: string;
  earlyAccessUrl: string;
  unsubscribeUrl: string;
};

export function WaitlistReminderEmail(props: WaitlistReminderEmailProps) {
  const { studioName, designName, batchName, earlyAccessAt, opensAt, zoneNote, earlyAccessUrl } = props;
  return (
    <EmailLayout preview={`Early access to ${designName} is open`} footnote={`Sent by ${studioName} through Demold.`}>
      <Text style={paragraph}>Hello,</Text>
      <Text style={paragraph}>{`Early access to ${batchName} of ${designName} started ${earlyAccessAt}. The public opening is ${opensAt}.`}</Text>
      <Text style={paragraph}>{zoneNote}</Text>
      <EarlyAccessButton href={earlyAccessUrl} />
      <WaitlistFooter {...props} />
    </EmailLayout>
  );
}

WaitlistReminderEmail.PreviewProps = {
  studioName: 'Marrowgate Studio',
  postalAddress: '4 Tannery Lane\nMarrowgate',
  designName: 'Hare',
  batchName: 'Spring batch',
  earlyAccessAt: 'Fri 15 Jan, 18:00 GMT',
  opensAt: 'Fri 15 Jan, 19:00 GMT',
  zoneNote: 'Times are in the studio’s time zone, Europe/Dublin.',
  earlyAccessUrl: 'http://127.0.0.1:3000/drops/preview/early-access?t=preview',
  unsubscribeUrl: 'http://127.0.0.1:3000/waitlist/unsubscribe?t=preview',
} satisfies WaitlistReminderEmailProps;

export default WaitlistReminderEmail;
