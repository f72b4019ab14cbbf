/**
 * Counts failures (or any events) per key inside a sliding window and locks a key that reaches
 * the limit until its oldest event leaves the window. Kept in memory: one server process holds
 * the counts. Sign-in counts failed attempts; expensive routes count every request ({@link take}).
 */
export class FailureLimiter {
  private readonly failures = new Map<string, number[]>();

  constructor(
    private readonly maxFailures: number,
    private readonly windowMs: number,
    private readonly now: () => number = Date.now,
  ) {}

  /** Seconds until `key` may try again, or 0 when it is not locked. */
  retryAfterS(key: string): number {
    const recent = this.recent(key);
    if (recent.length < this.maxFailures) return 0;
    return (recent[recent.length - this.maxFailures]! + this.windowMs - this.now()) / 1000;
  }

  recordFailure(key: string): void {
    const recent = this.recent(key);
    recent.push(this.now());
    this.failures.set(key, recent);
  }

  /**
   * Counts one event for `key` when it is not locked.
   * @returns 0 when the event was counted, otherwise the seconds until `key` may try again
   */
  take(key: string): number {
    const waitS = this.retryAfterS(key);
    if (waitS === 0) this.recordFailure(key);
    return waitS;
  }

  reset(key: string): void {
    this.failures.delete(key);
  }

  private recent(key: string): number[] {
    const since = this.now() - this.windowMs;
    const kept = (this.failures.get(key) ?? []).filter((time) => time > since);
    if (kept.length === 0) this.failures.delete(key);
    else this.failures.set(key, kept);
    return kept;
  }
}
