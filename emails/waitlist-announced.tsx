import { Text } from '@react-email/components';
import { EmailLayout, paragraph } from './components/email-layout';
import { joinWithAnd } from './components/order-summary';
import { EarlyAccessButton, WaitlistFooter } from './components/waitlist';

export type WaitlistAnnouncedEmailProps = {
  studioName: string;
  postalAddress: string;
  designName: string;
  batchName: string;
  /** The finishes this batch is cast in, e.g. ["Old Bone", "Verdigris"]. */
  finishes: string[];
  /** Already formatted in the reader's zone and labelled with it; null when the batch has no early access. */
  earlyAccessAt: string | null;
  opensAt: string;
  /** Which zone the times are in, said in words, e.g. "Times are in your time zone, Europe/Berlin." */
  zoneNote: string;
  earlyAccessUrl: string;
  unsubscribeUrl: string;
  /** The maker's own words about the batch. */
  announcement: string;
};

export function WaitlistAnnouncedEmail(props: WaitlistAnnouncedEmailProps) {
  const { studioName, designName, batchName, finishes, earlyAccessAt, opensAt, zoneNote, earlyAccessUrl, announcement } = props;
  return (
    <EmailLayout preview={`${designName}: ${batchName} is coming`} footnote={`Sent by ${studioName} through Demold.`}>
      <Text style={paragraph}>Hello,</Text>
      <Text style={paragraph}>
        {`${studioName} has planned a new batch of ${designName}: ${batchName}${finishes.length ? `, in ${joinWithAnd(finishes)}` : ''}.`}
      </Text>
      {announcement.trim() ? <Text style={{ ...paragraph, whiteSpace: 'pre-line' }}>{announcement}</Text> : null}
      {earlyAccessAt ? (
        <Text style={paragraph}>{`Early access for the waitlist starts ${earlyAccessAt}. The public opening is ${opensAt}.`}</Text>
      ) : (
        <Text style={paragraph}>{`The drop opens ${opensAt}.`}</Text>
      )}
      <Text style={paragraph}>{zoneNote}</Text>
      <Text style={paragraph}>
        {earlyAccessAt
          ? 'Your early-access link below is yours alone: it lets this address hold a mask before the public opening.'
          : 'Your link below takes you straight to the drop.'}
      </Text>
      <EarlyAccessButton href={earlyAccessUrl} />
      <WaitlistFooter {...props} />
    </EmailLayout>
  );
}

WaitlistAnnouncedEmail.PreviewProps = {
  studioName: 'Marrowgate Studio',
  postalAddress: '4 Tannery Lane\nMarrowgate',
  designName: 'Ibex',
  batchName: 'Winter batch',
  finishes: ['Old Bone', 'Bog Oak'],
  earlyAccessAt: 'Fri 15 Jan, 18:00 GMT',
  opensAt: 'Fri 15 Jan, 19:00 GMT',
  zoneNote: 'Times are in the studio’s time zone, Europe/Dublin.',
  earlyAccessUrl: 'http://127.0.0.1:3000/drops/preview/early-access?t=preview',
  unsubscribeUrl: 'http://127.0.0.1:3000/waitlist/unsubscribe?t=preview',
  announcement: 'Twelve masks, cast this week.',
} satisfies WaitlistAnnouncedEmailProps;

export default WaitlistAnnouncedEmail;
