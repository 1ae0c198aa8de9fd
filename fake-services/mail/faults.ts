import { z } from 'zod';
import { seededRandom } from '../stripe/ids';

/*
 * What a test can make the SMTP side do, the ways a hosted provider misbehaves: refuse everything for a
 * while, refuse some messages, answer slowly, or not know a recipient. `POST /_control/faults` takes the
 * whole set; the body replaces the current faults and `{}` clears them.
 */

/**
 * The reply codes a provider gives when it will not take a message now (4xx, the client should retry)
 * or at all (5xx); RFC 5321 section 4.2.3 lists them (section recalled from memory).
 */
export const REFUSE_CODES = [421, 450, 451, 452, 550, 552, 554] as const;
export type RefuseCode = (typeof REFUSE_CODES)[number];

/**
 * Reply texts used when a test names only the code. The enhanced status codes (RFC 3463; which code
 * means what recalled from memory) are written into the text because the server does not add them:
 * smtp-server leaves its ENHANCEDSTATUSCODES extension off unless asked.
 */
const DEFAULT_REFUSE_TEXT: Record<RefuseCode, string> = {
  421: '4.3.2 Service not available, closing the connection; try again later',
  450: '4.2.0 Mailbox busy or unavailable; try again later',
  451: '4.3.0 Local error in processing; try again later',
  452: '4.3.1 Insufficient system storage; try again later',
  550: '5.7.1 Message refused',
  552: '5.3.4 Message exceeds the storage allocation',
  554: '5.0.0 Transaction failed',
};

export const RATE_REFUSE_TEXT = '4.3.0 Temporary failure, message not accepted; try again later';
export const BOUNCE_TEXT = '5.1.1 mailbox unavailable';

export const faultsSchema = z.strictObject({
  refuse: z
    .strictObject({
      code: z.literal(REFUSE_CODES, { error: `must be one of ${REFUSE_CODES.join(', ')}` }),
      message: z.string().trim().min(1).max(200).optional(),
    })
    .optional(),
  refuseRate: z.number().min(0).max(1).optional(),
  /** Which messages `refuseRate` refuses is drawn from a generator with this seed, so runs repeat. */
  seed: z.number().int().optional(),
  latencyMs: z.number().int().min(0).max(60_000).optional(),
  bounce: z.array(z.email({ error: 'bounce: each entry must be an e-mail address' })).max(1_000).optional(),
});

export type FaultsInput = z.infer<typeof faultsSchema>;

export interface MailFaults {
  refuse: { code: RefuseCode; message: string } | null;
  refuseRate: number;
  seed: number;
  latencyMs: number;
  bounce: string[];
}

export const DEFAULT_SEED = 20240611;

export class FaultState {
  current: MailFaults = FaultState.from({});
  private random = seededRandom(DEFAULT_SEED);
  private bounced = new Set<string>();

  static from(input: FaultsInput): MailFaults {
    return {
      refuse: input.refuse
        ? { code: input.refuse.code, message: input.refuse.message ?? DEFAULT_REFUSE_TEXT[input.refuse.code] }
        : null,
      refuseRate: input.refuseRate ?? 0,
      seed: input.seed ?? DEFAULT_SEED,
      latencyMs: input.latencyMs ?? 0,
      bounce: [...new Set((input.bounce ?? []).map((a) => a.toLowerCase()))],
    };
  }

  apply(input: FaultsInput): MailFaults {
    this.current = FaultState.from(input);
    this.random = seededRandom(this.current.seed);
    this.bounced = new Set(this.current.bounce);
    return this.current;
  }

  /** Addresses are compared without regard to case, as providers do for the domain and nearly all for the local part. */
  bounces(address: string): boolean {
    return this.bounced.has(address.toLowerCase());
  }

  /** Draws once per message even at rate 0 or 1, so a given seed refuses the same messages whatever came before. */
  shouldRefuseByRate(): boolean {
    return this.random() < this.current.refuseRate;
  }

  reset(): void {
    this.apply({});
  }
}
