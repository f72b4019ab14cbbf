import { describe, expect, it } from 'vitest';
import { FailureLimiter } from '../../../src/lib/server/rate-limit';

describe('FailureLimiter', () => {
  it('locks a key at the limit until its oldest failure leaves the window', () => {
    let now = 0;
    const limiter = new FailureLimiter(3, 60_000, () => now);
    for (const at of [0, 10_000, 20_000]) {
      now = at;
      expect(limiter.retryAfterS('a')).toBe(0);
      limiter.recordFailure('a');
    }
    now = 30_000;
    expect(limiter.retryAfterS('a')).toBe(30); // the failure at 0 s leaves the window at 60 s
    expect(limiter.retryAfterS('b')).toBe(0);
    now = 60_001;
    expect(limiter.retryAfterS('a')).toBe(0);
  });

  it('forgets a key on reset', () => {
    const limiter = new FailureLimiter(1, 60_000, () => 0);
    limiter.recordFailure('a');
    expect(limiter.retryAfterS('a')).toBeGreaterThan(0);
    limiter.reset('a');
    expect(limiter.retryAfterS('a')).toBe(0);
  });
});

describe('FailureLimiter.take (requests per minute)', () => {
  it('lets through the limit, then gives the wait until the oldest request leaves the minute', () => {
    let now = 0;
    const limiter = new FailureLimiter(3, 60_000, () => now);
    expect([limiter.take('user:1'), limiter.take('user:1'), limiter.take('user:1')]).toEqual([0, 0, 0]);
    now = 15_000;
    expect(limiter.take('user:1')).toBe(45);
    expect(limiter.take('user:2')).toBe(0);
    now = 60_001;
    expect(limiter.take('user:1')).toBe(0);
    // A refused request does not count: only the three earlier ones and this one are in the window.
    expect(limiter.take('user:1')).toBe(0);
  });
});
