import { Button, Link, Section, Text } from '@react-email/components';
import { button } from './email-layout';

const small = { color: '#6b635a', fontFamily: 'Helvetica, Arial, sans-serif', fontSize: '12px', lineHeight: '18px', margin: '0 0 8px' };

/** The personal early-access link of a waitlist message, with room below it before the foot. */
export function EarlyAccessButton({ href }: { href: string }) {
  return (
    <Section style={{ margin: '0 0 32px' }}>
      <Button href={href} style={button}>
        Your early-access link
      </Button>
    </Section>
  );
}

/** The foot every waitlist message carries: why it came, a visible way out, and the studio's postal address. */
export function WaitlistFooter({ studioName, designName, postalAddress, unsubscribeUrl }: { studioName: string; designName: string; postalAddress: string; unsubscribeUrl: string }) {
  return (
    <>
      <Text style={small}>{`You get this e-mail because you joined the waitlist for ${designName} at ${studioName} and confirmed your address.`}</Text>
      <Text style={small}>
        <Link href={unsubscribeUrl} style={{ color: '#1f1c1a', textDecoration: 'underline' }}>
          Leave the {designName} waitlist
        </Link>
      </Text>
      <Text style={{ ...small, whiteSpace: 'pre-line' }}>{`${studioName}\n${postalAddress}`}</Text>
    </>
  );
}
