import 'server-only';
import type { AuthOptions } from 'next-auth';
import EmailProvider from 'next-auth/providers/email';
import { createElement } from 'react';
import { SignInLinkEmail } from '@/emails/sign-in-link';
import { getEnv } from '@/lib/env';
import { sendEmail } from '@/lib/mail/send';
import { demoldAdapter, type DemoldAdapterUser } from './adapter';
import { checkEmailAddress } from './email-address';

export const SESSION_MAX_AGE_SECONDS = 30 * 24 * 60 * 60;

/** The session cookie's name, as next-auth derives it (secure prefix when the app is served over https). */
export function sessionCookieName(): string {
  return getEnv().APP_URL.startsWith('https://') ? '__Secure-next-auth.session-token' : 'next-auth.session-token';
}

let cached: AuthOptions | undefined;

export function getAuthOptions(): AuthOptions {
  if (cached) return cached;
  const env = getEnv();
  // next-auth builds its links from NEXTAUTH_URL; we keep one setting, APP_URL, for every link we send.
  process.env.NEXTAUTH_URL ??= env.APP_URL;

  cached = {
    secret: env.AUTH_SECRET,
    adapter: demoldAdapter(),
    session: { strategy: 'database', maxAge: SESSION_MAX_AGE_SECONDS, updateAge: 24 * 60 * 60 },
    useSecureCookies: env.APP_URL.startsWith('https://'),
    providers: [
      EmailProvider({
        maxAge: env.SIGN_IN_LINK_MINUTES * 60,
        // The route handler has checked and rate-limited the address already; this keeps the same form.
        normalizeIdentifier(identifier) {
          const result = checkEmailAddress(identifier);
          if (!result.ok) throw new Error(result.problem.message);
          return result.email;
        },
        async sendVerificationRequest({ identifier, url }) {
          await sendEmail({
            to: identifier,
            subject: 'Your sign-in link',
            body: createElement(SignInLinkEmail, {
              url,
              host: new URL(env.APP_URL).host,
              minutesValid: env.SIGN_IN_LINK_MINUTES,
            }),
          });
        },
      }),
    ],
    pages: { signIn: '/sign-in', verifyRequest: '/sign-in/check-inbox', error: '/sign-in' },
    callbacks: {
      session({ session, user }) {
        const { id, role } = user as DemoldAdapterUser;
        return { ...session, user: { ...session.user, id, role } };
      },
      redirect({ url, baseUrl }) {
        // Only ever back into this site.
        if (url.startsWith('/')) return `${baseUrl}${url}`;
        return new URL(url).origin === baseUrl ? url : baseUrl;
      },
    },
  };
  return cached;
}
