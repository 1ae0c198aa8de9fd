/**
 * The fake's sense of "now". Tests move it forward to reach a session's expires_at without waiting for
 * hours; it never moves back, because Stripe's objects only ever age.
 */
export class Clock {
  private offsetMs = 0;

  nowMs(): number {
    return Date.now() + this.offsetMs;
  }

  /** Stripe's timestamps are whole unix seconds. */
  nowSeconds(): number {
    return Math.floor(this.nowMs() / 1000);
  }

  get offsetSeconds(): number {
    return Math.round(this.offsetMs / 1000);
  }

  advance(seconds: number): void {
    if (!(seconds >= 0)) throw new RangeError('the clock only moves forward');
    this.offsetMs += seconds * 1000;
  }

  reset(): void {
    this.offsetMs = 0;
  }
}
