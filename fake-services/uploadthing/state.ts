import type { ServerResponse } from 'node:http';

/** What the app's handler registered for a batch of file keys (POST /route-metadata). */
export type Registration = {
  key: string;
  callbackUrl: string;
  callbackSlug: string;
  metadata: unknown;
  isDev: boolean;
  awaitServerData: boolean;
  registeredAt: number;
  /** Dev mode: the still-open answer to /route-metadata that the callbacks are streamed down. */
  stream: DevStream | null;
};

export type DevStream = { res: ServerResponse; pending: Set<string>; timer: NodeJS.Timeout };

export type StoredFile = {
  key: string;
  appId: string;
  name: string;
  size: number;
  type: string;
  customId: string | null;
  slug: string | null;
  contentDisposition: string;
  acl: string | null;
  fileHash: string;
  uploadedAt: number;
  bytes: Buffer;
};

export type CallbackRecord = {
  key: string;
  hook: 'callback' | 'error';
  /** Where it went; `stream` for dev mode, where the app forwards it to itself. */
  url: string;
  status: number | null;
  error: string | null;
  at: number;
};

export type CallbackResult = { callbackData?: unknown; error?: string };

/** Everything the fake knows, in memory only: gone when the process ends. */
export class FakeState {
  readonly registrations = new Map<string, Registration>();
  readonly files = new Map<string, StoredFile>();
  readonly callbacks: CallbackRecord[] = [];
  readonly results = new Map<string, CallbackResult>();
  private readonly resultWaiters = new Map<string, ((result: CallbackResult) => void)[]>();

  recordResult(key: string, result: CallbackResult): void {
    this.results.set(key, result);
    for (const wake of this.resultWaiters.get(key) ?? []) wake(result);
    this.resultWaiters.delete(key);
  }

  /** The app's /callback-result for a key, or null when none came within `timeoutMs`. */
  waitForResult(key: string, timeoutMs: number): Promise<CallbackResult | null> {
    const known = this.results.get(key);
    if (known) return Promise.resolve(known);
    return new Promise((resolve) => {
      const timer = setTimeout(() => {
        const waiting = this.resultWaiters.get(key)?.filter((w) => w !== wake) ?? [];
        if (waiting.length) this.resultWaiters.set(key, waiting);
        else this.resultWaiters.delete(key);
        resolve(null);
      }, timeoutMs);
      const wake = (result: CallbackResult) => {
        clearTimeout(timer);
        resolve(result);
      };
      this.resultWaiters.set(key, [...(this.resultWaiters.get(key) ?? []), wake]);
    });
  }

  /** The registration for a key; the app may register a moment after the browser starts (dev mode). */
  async waitForRegistration(key: string, timeoutMs: number): Promise<Registration | null> {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      const registration = this.registrations.get(key);
      if (registration || Date.now() >= deadline) return registration ?? null;
      await new Promise((resolve) => setTimeout(resolve, 25));
    }
  }

  reset(): void {
    for (const registration of this.registrations.values()) {
      if (registration.stream && !registration.stream.res.writableEnded) {
        clearTimeout(registration.stream.timer);
        registration.stream.res.end();
      }
    }
    this.registrations.clear();
    this.files.clear();
    this.callbacks.length = 0;
    this.results.clear();
  }

  snapshot() {
    return {
      files: [...this.files.values()].map((file) => ({ ...file, bytes: undefined })),
      registrations: [...this.registrations.values()].map((registration) => ({ ...registration, stream: undefined })),
      callbacks: [...this.callbacks],
      results: [...this.results.entries()].map(([key, result]) => ({ key, ...result })),
    };
  }
}
