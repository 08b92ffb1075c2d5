import { describe, expect, it } from "vitest";
import { proportion, wilsonInterval } from "@/lib/stats/wilson";

// Expected values: Newcombe, R. G. (1998), "Two-sided confidence intervals for the single proportion:
// comparison of seven methods", Statistics in Medicine 17, 857–872, Table II, method 3 (the Wilson score
// interval without continuity correction), printed to four decimals. The figures below are quoted from
// memory of that table; they agree to the fourth decimal with an independent evaluation of Wilson's
// closed form in Python (math module), which is what the test holds the implementation to.
const NEWCOMBE_1998_METHOD_3: [k: number, n: number, low: number, high: number][] = [
  [81, 263, 0.2553, 0.3662],
  [15, 148, 0.0624, 0.1605],
  [0, 20, 0, 0.1611],
  [1, 29, 0.0061, 0.1718],
  [29, 29, 0.883, 1],
  [0, 10, 0, 0.2775],
];

describe("the Wilson (1927) score interval", () => {
  it.each(NEWCOMBE_1998_METHOD_3)("reproduces Newcombe's (1998) worked example %i/%i to four decimals", (k, n, low, high) => {
    const interval = wilsonInterval(k, n);
    expect(interval.low).toBeCloseTo(low, 4);
    expect(interval.high).toBeCloseTo(high, 4);
  });

  it("is exactly 0 at k = 0 and exactly 1 at k = n, never outside [0, 1]", () => {
    expect(wilsonInterval(0, 3).low).toBe(0);
    expect(wilsonInterval(3, 3).high).toBe(1);
    for (let n = 1; n <= 40; n += 1) {
      for (let k = 0; k <= n; k += 1) {
        const { low, high } = wilsonInterval(k, n);
        expect(low).toBeGreaterThanOrEqual(0);
        expect(high).toBeLessThanOrEqual(1);
        expect(low).toBeLessThanOrEqual(k / n);
        expect(high).toBeGreaterThanOrEqual(k / n);
      }
    }
  });

  it("is symmetric: the interval of k/n mirrors that of (n − k)/n", () => {
    const a = wilsonInterval(7, 50);
    const b = wilsonInterval(43, 50);
    expect(a.low).toBeCloseTo(1 - b.high, 12);
    expect(a.high).toBeCloseTo(1 - b.low, 12);
  });

  it("refuses impossible counts, and a proportion of nothing has no share", () => {
    expect(() => wilsonInterval(5, 4)).toThrow(RangeError);
    expect(() => wilsonInterval(-1, 4)).toThrow(RangeError);
    expect(() => wilsonInterval(0, 0)).toThrow(RangeError);
    expect(proportion(0, 0)).toEqual({ k: 0, n: 0, share: null, low: null, high: null });
    expect(proportion(81, 263).share).toBeCloseTo(81 / 263, 12);
  });
});
