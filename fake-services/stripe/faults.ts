import { z } from 'zod';
import { seededRandom } from './ids';
import { NO_WEBHOOK_FAULTS, type WebhookFaults } from './webhooks';

/** What `POST /_control/faults` accepts. The body replaces the current faults; `{}` clears them. */
export const faultsSchema = z.strictObject({
  latencyMs: z.number().int().min(0).max(60_000).optional(),
  failRate: z.number().min(0).max(1).optional(),
  seed: z.number().int().optional(),
  webhook: z
    .strictObject({
      drop: z.boolean().optional(),
      repeat: z.number().int().min(1).max(20).optional(),
      shuffle: z.boolean().optional(),
    })
    .optional(),
});

export type FaultsInput = z.infer<typeof faultsSchema>;

export interface ApiFaults {
  latencyMs: number;
  failRate: number;
  seed: number;
}

export const DEFAULT_SEED = 20240611;

/** Latency and failures for `/v1` requests; a seeded generator decides which requests fail. */
export class FaultState {
  api: ApiFaults = { latencyMs: 0, failRate: 0, seed: DEFAULT_SEED };
  private random = seededRandom(DEFAULT_SEED);

  apply(input: FaultsInput): { api: ApiFaults; webhook: WebhookFaults } {
    this.api = {
      latencyMs: input.latencyMs ?? 0,
      failRate: input.failRate ?? 0,
      seed: input.seed ?? DEFAULT_SEED,
    };
    this.random = seededRandom(this.api.seed);
    const webhook: WebhookFaults = {
      drop: input.webhook?.drop ?? NO_WEBHOOK_FAULTS.drop,
      repeat: input.webhook?.repeat ?? NO_WEBHOOK_FAULTS.repeat,
      shuffle: input.webhook?.shuffle ?? NO_WEBHOOK_FAULTS.shuffle,
    };
    return { api: this.api, webhook };
  }

  /** Draws for every request even at rate 0 or 1, so a given seed fails the same requests whatever came before. */
  shouldFail(): boolean {
    const draw = this.random();
    return draw < this.api.failRate;
  }

  reset(): void {
    this.apply({});
  }
}
