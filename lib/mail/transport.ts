import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { getEnv } from '@/lib/env';

const globalForMail = globalThis as typeof globalThis & { __demoldMail?: Transporter };

/** One SMTP transport per process, to the fake inbox in the demo and tests, any provider in production. */
export function getMailTransport(): Transporter {
  globalForMail.__demoldMail ??= nodemailer.createTransport(getEnv().SMTP_URL, {
    // A provider that hangs must not hold a request for long: fail fast and say so.
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
    socketTimeout: 10_000,
  });
  return globalForMail.__demoldMail;
}
