// The synthetic generator (tests/support) against the engine: consistent reports stay silent, planted
// slips are caught. The generated figures use the engine's own distributions, so this checks the checks'
// logic and rounding rules end to end, not the distributions (see distributions.test.ts for those).
import { describe, expect, it } from "vitest";
import { recheck } from "@/lib/recheck";
import { generateComparisons, generateLabelledComparisons, PLANTED_ERRORS } from "@/tests/support/generate-comparisons";

describe("generateComparisons", () => {
  it("is deterministic in its seed", () => {
    expect(generateComparisons({ count: 50, seed: 4 })).toEqual(generateComparisons({ count: 50, seed: 4 }));
    expect(generateComparisons({ count: 50, seed: 4 })).not.toEqual(generateComparisons({ count: 50, seed: 5 }));
  });

  it("mixes methods, estimators, group counts and printed precision", () => {
    const inputs = generateComparisons({ count: 2000, seed: 1 });
    const methods = new Set(inputs.map((c) => c.method));
    const estimators = new Set(inputs.map((c) => c.restricted.estimator));
    const groups = new Set(inputs.map((c) => c.sample.groups));
    expect([...methods].sort()).toEqual(["ic", "invariance", "lrt", "scaled_lrt"]);
    for (const e of ["ML", "MLR", "MLM", "WLSMV"]) expect(estimators.has(e), e).toBe(true);
    expect([...groups].sort()).toEqual(["1", "2", "3"]);
  });
});

describe("the engine on generated comparisons", () => {
  const items = generateLabelledComparisons({ count: 6000, seed: 2024, errorShare: 0.4 });

  it("raises no error or warning on a consistent report", () => {
    const falseAlarms: string[] = [];
    for (const { input, planted } of items) {
      if (planted !== null) continue;
      const outcome = recheck(input);
      expect(outcome.ok).toBe(true);
      if (outcome.ok) for (const f of outcome.result.findings) if (f.severity !== "note") falseAlarms.push(`${input.label}: ${f.code}: ${f.message}`);
    }
    expect(falseAlarms).toEqual([]);
  });

  it("catches every planted error with the finding of its kind", () => {
    const missed: string[] = [];
    const seen = new Set<string>();
    for (const { input, planted } of items) {
      if (planted === null) continue;
      seen.add(planted);
      const outcome = recheck(input);
      const codes = outcome.ok ? outcome.result.findings.map((f) => f.code) : [];
      if (!codes.includes(planted)) missed.push(`${input.label}: planted ${planted}, found ${codes.join(", ") || "nothing"}`);
    }
    expect(missed).toEqual([]);
    expect([...seen].sort()).toEqual([...PLANTED_ERRORS].sort());
  });
});
