import type { FakeState } from './state';

export type FakeSettings = {
  apiKey: string;
  appId: string;
  /** When set, callbacks go here instead of the callbackUrl the app registered. */
  callbackUrl: string | null;
  registrationWaitMs: number;
  callbackTimeoutMs: number;
  serverDataTimeoutMs: number;
  devStreamTimeoutMs: number;
  maxFileBytes: number;
};

export type FakeContext = { state: FakeState; settings: FakeSettings; baseUrl: string };
