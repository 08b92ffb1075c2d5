import { describe, expect, it } from "vitest";
import { show, showP, showPInterval } from "@/lib/recheck/interval";

describe("showP", () => {
  it("prints p of at least .001 with at most four decimals and no trailing zeros", () => {
    expect(showP(0.05)).toBe("0.05");
    expect(showP(0.0500001)).toBe("0.05");
    expect(showP(0.001)).toBe("0.001");
    expect(showP(0.25)).toBe("0.25");
    expect(showP(0.99996)).toBe("1");
    expect(showP(1)).toBe("1");
    expect(showP(0.3)).toBe("0.3");
  });

  it("prints small p in scientific notation and 0 as 0", () => {
    expect(showP(0)).toBe("0");
    expect(showP(0.000123)).toBe("1.23e−4");
  });

  it("matches the shortest decimal of the four-decimal rounding on a grid of p", () => {
    // the rule the text follows: Number(p.toFixed(4)) printed in its shortest form
    for (let i = 10; i <= 10000; i++) {
      for (const p of [i / 10000, i / 10000 + 4e-5, i / 10000 - 4e-5]) {
        if (p < 1e-3) continue;
        expect(showP(p)).toBe(String(Number(p.toFixed(4))));
      }
    }
  });

  it("collapses an interval whose ends print alike", () => {
    expect(showPInterval(0.04999, 0.05001)).toBe("0.05");
    expect(showPInterval(0.04, 0.06)).toBe("[0.04, 0.06]");
  });
});

describe("show", () => {
  it("writes every minus sign of a message number as U+2212, the exponent's too", () => {
    expect(show(-0.0001)).toBe("−1.00e−4");
    expect(show(0.0001)).toBe("1.00e−4");
    expect(show(-3.5)).toBe("−3.5");
    expect(show(-2.5e9)).toBe("−2.50e+9");
  });
});
