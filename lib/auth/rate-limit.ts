import 'server-only';
import { consumeAllowance } from '@/lib/api/rate-limit';

// Our own choice: enough for a person who mistypes or loses an e-mail, too few to flood someone's inbox.
export const SIGN_IN_LIMITS = {
  perAddress: { points: 3, duration: 15 * 60 },
  perIp: { points: 10, duration: 60 * 60 },
} as const;

/** Counts one sign-in e-mail against the address and the IP; throws a 429 AppError past either limit. */
export async function consumeSignInAllowance({ email, ip }: { email: string; ip: string }): Promise<void> {
  await consumeAllowance('sign-in-ip', SIGN_IN_LIMITS.perIp, ip, 'Too many sign-in e-mails were asked for from your network.');
  await consumeAllowance(
    'sign-in-address',
    SIGN_IN_LIMITS.perAddress,
    email,
    'We have already sent several sign-in e-mails to this address. Check your inbox and spam folder.',
  );
}
