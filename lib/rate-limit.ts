// A sliding-window rate limiter held in memory.
//
// It is per process: each app instance counts on its own, and a restart forgets every count. That is
// enough for the single-machine SQLite deployment. Several instances behind a load balancer would keep
// the counters in a store they share — e.g. Redis (INCR + EXPIRE per key and window, or a sorted set
// for a true sliding window) or a small table in the shared PostgreSQL database — behind this same
// interface, so callers do not change.

export interface RateLimitRule {
  /** attempts allowed inside one window */
  limit: number;
  windowMs: number;
}

export interface RateLimitDecision {
  allowed: boolean;
  remaining: number;
  /** whole seconds until one more attempt would be allowed; 0 when allowed */
  retryAfterSeconds: number;
}

export interface RateLimiter {
  /** counts one attempt for `key` (only when it is allowed) and says whether it was */
  consume(key: string): RateLimitDecision;
  /** says whether an attempt would be allowed, without counting one */
  peek(key: string): RateLimitDecision;
  reset(key: string): void;
}

/** Past this many keys, windows that have fully expired are swept, so memory stays bounded. */
const SWEEP_AT_KEYS = 10_000;

export function createRateLimiter(rule: RateLimitRule, now: () => number = Date.now): RateLimiter {
  // key → timestamps (ms) of the attempts still inside the window, oldest first
  const attempts = new Map<string, number[]>();

  function live(key: string, at: number): number[] {
    const list = attempts.get(key);
    if (!list) return [];
    const cutoff = at - rule.windowMs;
    while (list.length > 0 && list[0] <= cutoff) list.shift();
    if (list.length === 0) attempts.delete(key);
    return list;
  }

  function decide(list: number[], at: number): RateLimitDecision {
    if (list.length < rule.limit) return { allowed: true, remaining: rule.limit - list.length, retryAfterSeconds: 0 };
    // the oldest attempt that must leave the window before one more fits
    const frees = list[list.length - rule.limit] + rule.windowMs;
    return { allowed: false, remaining: 0, retryAfterSeconds: Math.max(1, Math.ceil((frees - at) / 1000)) };
  }

  function sweep(at: number) {
    for (const key of [...attempts.keys()]) live(key, at);
  }

  return {
    consume(key) {
      const at = now();
      const list = live(key, at);
      const decision = decide(list, at);
      if (!decision.allowed) return decision;
      list.push(at);
      attempts.set(key, list);
      if (attempts.size > SWEEP_AT_KEYS) sweep(at);
      return { ...decision, remaining: decision.remaining - 1 };
    },
    peek(key) {
      const at = now();
      return decide(live(key, at), at);
    },
    reset(key) {
      attempts.delete(key);
    },
  };
}
