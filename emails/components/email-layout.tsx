import { Body, Container, Head, Hr, Html, Preview, Section, Text } from '@react-email/components';
import type { ReactNode } from 'react';

// Inline styles: mail clients ignore style sheets. Colours are the shop's paper and ink.
const body = { backgroundColor: '#f7f3ec', color: '#1f1c1a', fontFamily: 'Georgia, serif', margin: 0, padding: '24px 0' };
const container = { backgroundColor: '#ffffff', border: '1px solid #d9cfbf', borderRadius: '4px', margin: '0 auto', maxWidth: '520px', padding: '32px' };
const footer = { color: '#6b635a', fontFamily: 'Helvetica, Arial, sans-serif', fontSize: '12px', lineHeight: '18px' };

export function EmailLayout({ preview, children, footnote }: { preview: string; children: ReactNode; footnote?: string }) {
  return (
    <Html lang="en">
      <Head />
      <Preview>{preview}</Preview>
      <Body style={body}>
        <Container style={container}>
          <Text style={{ fontSize: '22px', fontWeight: 600, margin: '0 0 24px' }}>Demold</Text>
          <Section>{children}</Section>
          <Hr style={{ borderColor: '#d9cfbf', margin: '32px 0 16px' }} />
          <Text style={footer}>{footnote ?? 'You get this e-mail because someone asked for it on Demold with this address.'}</Text>
        </Container>
      </Body>
    </Html>
  );
}

export const paragraph = { fontFamily: 'Helvetica, Arial, sans-serif', fontSize: '15px', lineHeight: '24px', margin: '0 0 16px' };
export const button = {
  backgroundColor: '#1f1c1a',
  borderRadius: '999px',
  color: '#f7f3ec',
  display: 'inline-block',
  fontFamily: 'Helvetica, Arial, sans-serif',
  fontSize: '15px',
  fontWeight: 600,
  padding: '12px 24px',
  textDecoration: 'none',
};
