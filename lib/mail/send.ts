import 'server-only';
import { render } from '@react-email/render';
import type { ReactElement } from 'react';
import { AppError } from '@/lib/api/errors';
import { getEnv } from '@/lib/env';
import { getMailTransport } from './transport';

export type OutgoingEmail = {
  to: string;
  subject: string;
  body: ReactElement;
  headers?: Record<string, string>;
};

/** Renders a react-email message to HTML and plain text and sends it; a failure becomes a 503 to retry. */
export async function sendEmail({ to, subject, body, headers }: OutgoingEmail): Promise<{ messageId: string }> {
  const [html, text] = await Promise.all([render(body), render(body, { plainText: true })]);
  try {
    const info = await getMailTransport().sendMail({ from: getEnv().MAIL_FROM, to, subject, html, text, headers });
    return { messageId: info.messageId };
  } catch (error) {
    console.error('Sending e-mail failed', { to, subject, error: error instanceof Error ? error.message : error });
    throw new AppError(
      'email_unavailable',
      'We could not send the e-mail just now. Please try again in a minute.',
      503,
      undefined,
      60,
    );
  }
}
