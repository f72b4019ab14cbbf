/**
 * Counts failures per key inside a sliding window and locks a key that reaches the limit until
 * its oldest failure leaves the window. Kept in memory: one server process holds the counts.
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
