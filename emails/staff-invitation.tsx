import { Button, Text } from '@react-email/components';
import { EmailLayout, button, paragraph } from './components/email-layout';

export type StaffInvitationEmailProps = { studioName: string; inviterName: string; roleLabel: string; signInUrl: string };

export function StaffInvitationEmail({ studioName, inviterName, roleLabel, signInUrl }: StaffInvitationEmailProps) {
  return (
    <EmailLayout
      preview={`${inviterName} added you to ${studioName}'s workshop`}
      footnote="If you do not work with this studio, ignore this e-mail; the studio can remove you at any time."
    >
      <Text style={paragraph}>
        {inviterName} added you to the workshop of {studioName} as {roleLabel.toLowerCase()}. Sign in with this e-mail
        address to see orders and move them through production.
      </Text>
      <Button href={signInUrl} style={button}>
        Open the workshop
      </Button>
    </EmailLayout>
  );
}

StaffInvitationEmail.PreviewProps = {
  studioName: 'Marrowgate Studio',
  inviterName: 'Ines Marrow',
  roleLabel: 'Studio hand',
  signInUrl: 'http://127.0.0.1:3000/sign-in?callbackUrl=%2Fworkshop',
} satisfies StaffInvitationEmailProps;

export default StaffInvitationEmail;
