import { describe, expect, it } from "vitest";
import { createRateLimiter } from "@/lib/rate-limit";

function clock(start = 1_000_000) {
  let now = start;
  return { now: () => now, advance: (ms: number) => (now += ms) };
}

describe("the sliding-window rate limiter", () => {
  it("allows `limit` attempts in a window and refuses the next one", () => {
    const time = clock();
    const limiter = createRateLimiter({ limit: 3, windowMs: 60_000 }, time.now);
    expect([1, 2, 3].map(() => limiter.consume("a").allowed)).toEqual([true, true, true]);
    expect(limiter.consume("a")).toEqual({ allowed: false, remaining: 0, retryAfterSeconds: 60 });
  });

  it("says when the oldest attempt leaves the window, and allows again from then", () => {
    const time = clock();
    const limiter = createRateLimiter({ limit: 2, windowMs: 60_000 }, time.now);
    limiter.consume("a");
    time.advance(20_000);
    limiter.consume("a");
    time.advance(10_000);
    // the first attempt (30 s ago) leaves the window in 30 s
    expect(limiter.consume("a").retryAfterSeconds).toBe(30);
    time.advance(30_000);
    expect(limiter.consume("a").allowed).toBe(true);
    expect(limiter.peek("a").allowed).toBe(false);
  });

  it("counts each key on its own", () => {
    const limiter = createRateLimiter({ limit: 1, windowMs: 60_000 }, clock().now);
    expect(limiter.consume("a").allowed).toBe(true);
    expect(limiter.consume("b").allowed).toBe(true);
    expect(limiter.consume("a").allowed).toBe(false);
  });

  it("peek never counts an attempt, and a refused attempt is not counted either", () => {
    const time = clock();
    const limiter = createRateLimiter({ limit: 1, windowMs: 10_000 }, time.now);
    for (let index = 0; index < 5; index += 1) expect(limiter.peek("a").allowed).toBe(true);
    limiter.consume("a");
    time.advance(5_000);
    limiter.consume("a"); // refused: must not extend the wait
    time.advance(5_000);
    expect(limiter.consume("a").allowed).toBe(true);
  });

  it("reset forgets a key", () => {
    const limiter = createRateLimiter({ limit: 1, windowMs: 60_000 }, clock().now);
    limiter.consume("a");
    limiter.reset("a");
    expect(limiter.consume("a").allowed).toBe(true);
  });

  it("a refusal always asks for at least one second", () => {
    const time = clock();
    const limiter = createRateLimiter({ limit: 1, windowMs: 1_000 }, time.now);
    limiter.consume("a");
    time.advance(999);
    expect(limiter.consume("a").retryAfterSeconds).toBe(1);
  });
});
