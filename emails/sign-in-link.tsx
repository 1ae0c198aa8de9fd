import { Button, Link, Text } from '@react-email/components';
import { EmailLayout, button, paragraph } from './components/email-layout';

export type SignInLinkEmailProps = { url: string; host: string; minutesValid: number };

export function SignInLinkEmail({ url, host, minutesValid }: SignInLinkEmailProps) {
  return (
    <EmailLayout
      preview={`Your sign-in link for ${host}`}
      footnote="If you did not ask to sign in, ignore this e-mail: nobody can sign in without the link."
    >
      <Text style={paragraph}>Here is your link to sign in to {host}. It works once, for the next {minutesValid} minutes.</Text>
      <Button href={url} style={button}>
        Sign in
      </Button>
      <Text style={{ ...paragraph, marginTop: '24px', fontSize: '13px' }}>
        Or paste this address into your browser: <Link href={url}>{url}</Link>
      </Text>
    </EmailLayout>
  );
}

SignInLinkEmail.PreviewProps = {
  url: 'http://127.0.0.1:3000/api/auth/callback/email?token=preview&email=juno%40example.com',
  host: '127.0.0.1:3000',
  minutesValid: 15,
} satisfies SignInLinkEmailProps;

export default SignInLinkEmail;
