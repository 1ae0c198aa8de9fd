'use client';

import { useSyncExternalStore } from 'react';

// One ticking clock for every countdown on the page, as an external store: no state set in effects,
// and no time at all during the server render (so the HTML never disagrees with the first paint).
const listeners = new Set<() => void>();
let timer: ReturnType<typeof setInterval> | undefined;

function subscribe(listener: () => void) {
  listeners.add(listener);
  timer ??= setInterval(() => listeners.forEach((l) => l()), 1000);
  return () => {
    listeners.delete(listener);
    if (listeners.size === 0 && timer) {
      clearInterval(timer);
      timer = undefined;
    }
  };
}

const nowToTheSecond = () => Math.floor(Date.now() / 1000) * 1000;

/** This device's time, ticking each second; null while rendering on the server. */
export function useClock(): number | null {
  return useSyncExternalStore(subscribe, nowToTheSecond, () => null);
}

const noSubscription = () => () => {};

/** The visitor's own IANA time zone; null while rendering on the server. */
export function useOwnTimeZone(): string | null {
  return useSyncExternalStore(noSubscription, () => Intl.DateTimeFormat().resolvedOptions().timeZone, () => null);
}
