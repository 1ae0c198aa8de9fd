import { Button, Link, Text } from '@react-email/components';
import { EmailLayout, button, paragraph } from './components/email-layout';
import { smallPrint } from './components/order-summary';

export type WaitlistConfirmEmailProps = {
  studioName: string;
  /** Multi-line, as the studio gave it in its settings. */
  postalAddress: string;
  designName: string;
  /** The finishes asked for; empty means any finish. */
  finishNames: string[];
  confirmUrl: string;
  hoursValid: number;
};

function finishesWords(names: string[]): string {
  if (names.length === 0) return 'in any finish';
  if (names.length === 1) return `in ${names[0]}`;
  return `in ${names.slice(0, -1).join(', ')} or ${names[names.length - 1]}`;
}

// Plain on purpose: a confirmation says what was asked for and nothing else (no offers, no pictures of
// other masks), and it is the only message the address gets until the link is used.
export function WaitlistConfirmEmail({ studioName, postalAddress, designName, finishNames, confirmUrl, hoursValid }: WaitlistConfirmEmailProps) {
  const addressLines = postalAddress.split('\n').map((line) => line.trim()).filter(Boolean);
  return (
    <EmailLayout
      preview={`Confirm the waitlist for ${designName}`}
      footnote={`You get this e-mail because someone asked on Demold for ${studioName}'s ${designName} waitlist with this address. If it was not you, ignore it: nothing more will come.`}
    >
      <Text style={paragraph}>Hello,</Text>
      <Text style={paragraph}>
        {`You asked to hear from ${studioName} when the next batch of ${designName} ${finishesWords(finishNames)} opens.`}
      </Text>
      <Text style={paragraph}>
        {`Please confirm with the button below. Until you do, we send nothing else to this address. The link works for ${hoursValid} hours.`}
      </Text>
      <Button href={confirmUrl} style={button}>
        Confirm the waitlist
      </Button>
      <Text style={{ ...smallPrint, marginTop: '24px' }}>
        {'If the button does not work, copy this link into your browser: '}
        <Link href={confirmUrl}>{confirmUrl}</Link>
      </Text>
      <Text style={smallPrint}>Once you are on the list, every message about it has a link to leave it in one click.</Text>
      <Text style={smallPrint}>
        {[studioName, ...addressLines].map((line, index) => (
          <span key={index}>
            {index > 0 ? <br /> : null}
            {line}
          </span>
        ))}
      </Text>
    </EmailLayout>
  );
}

WaitlistConfirmEmail.PreviewProps = {
  studioName: 'Marrowgate Studio',
  postalAddress: '4 Tannery Lane\nMarrowgate',
  designName: 'Hare',
  finishNames: ['Old Bone', 'Verdigris'],
  confirmUrl: 'http://127.0.0.1:3000/waitlist/confirm?t=preview',
  hoursValid: 72,
} satisfies WaitlistConfirmEmailProps;

export default WaitlistConfirmEmail;
