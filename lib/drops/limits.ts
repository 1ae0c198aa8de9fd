import 'server-only';
import { consumeAllowance } from '@/lib/api/rate-limit';

// Generous enough for a buyer's taps at the opening second, tight enough to blunt a script.
export const HOLD_LIMITS = {
  perBuyer: { points: 20, duration: 10 },
  perIp: { points: 600, duration: 10 },
} as const;

export async function consumeHoldAllowance({ userId, ip }: { userId: string; ip: string }): Promise<void> {
  await consumeAllowance('hold-buyer', HOLD_LIMITS.perBuyer, userId, 'That is a lot of attempts in a few seconds.');
  await consumeAllowance('hold-ip', HOLD_LIMITS.perIp, ip, 'Too many hold attempts from your network.');
}
