// Bad input gives a FieldError naming the DESIGN §5 sheet column; nothing ever throws, and no output
// holds NaN or Infinity (DESIGN §4, "never a NaN").
import { describe, expect, it } from "vitest";
import { recheck, recheckModel, validateComparison, validateModel, type ComparisonInput } from "@/lib/recheck";
import { parseComparison, parseModel } from "@/lib/recheck/parse";
import { generateComparisons } from "@/tests/support/generate-comparisons";
import { comparisonInput } from "./reference";

const base = (): ComparisonInput => comparisonInput("hs3eq_vs_hs3_ML", 3);

function errorsOf(input: ComparisonInput) {
  const outcome = recheck(input);
  expect(outcome.ok).toBe(false);
  return outcome.ok ? [] : outcome.errors;
}

describe("each kind of unreadable cell names its column", () => {
  const cases: Array<[string, (c: ComparisonInput) => void, string]> = [
    ["a non-numeric χ²", (c) => (c.restricted.chisq = "n/a"), "a_chisq"],
    ["a thousands separator", (c) => (c.free.aic = "7,517.49"), "b_aic"],
    ["a negative χ²", (c) => (c.free.chisq = "-3.2"), "b_chisq"],
    ["a fractional df", (c) => (c.free.df = "23.5"), "b_df"],
    ["a p above 1", (c) => (c.restricted.p = "1.20"), "a_p"],
    ["a p below 0", (c) => (c.dP = "-.01"), "d_p"],
    ["'p < 0'", (c) => (c.dP = "< 0"), "d_p"],
    ["a zero N", (c) => (c.sample.n = "0"), "n"],
    ["a negative N", (c) => (c.sample.n = "-301"), "n"],
    ["a fractional N", (c) => (c.sample.n = "301.5"), "n"],
    ["zero groups", (c) => (c.sample.groups = "0"), "n_groups"],
    ["more groups than cases", (c) => ((c.sample.n = "3"), (c.sample.groups = "4")), "n_groups"],
    ["alpha of 0", (c) => (c.alpha = "0"), "alpha"],
    ["alpha of 1", (c) => (c.alpha = "1"), "alpha"],
    ["alpha as a word", (c) => (c.alpha = "five percent"), "alpha"],
    ["an unknown method", (c) => (c.method = "anova"), "method"],
    ["a missing method", (c) => (c.method = undefined), "method"],
    ["an unknown estimator", (c) => (c.restricted.estimator = "MLX"), "a_estimator"],
    ["an unknown nested value", (c) => (c.nested = "maybe"), "nested"],
    ["an unknown preferred value", (c) => (c.preferred = "c"), "preferred"],
    ["an unknown invariance claim", (c) => (c.invarianceClaimed = "partly"), "invariance_claimed"],
    ["a CFI above 1", (c) => (c.free.cfi = "1.20"), "b_cfi"],
    ["a zero scaling factor", (c) => (c.free.scaling = "0"), "b_scaling"],
    ["a fractional Δdf", (c) => (c.dDf = "5.5"), "d_df"],
    ["a non-numeric ΔCFI", (c) => (c.dCfi = "small"), "d_cfi"],
    ["zero free parameters", (c) => (c.free.npar = "0"), "b_npar"],
    ["more fixed-x than observed variables", (c) => ((c.free.nObserved = "3"), (c.free.nFixedX = "4")), "b_n_fixed_x"],
    ["an unreadable mean structure", (c) => (c.free.meanStructure = "sometimes"), "b_mean_structure"],
  ];

  it.each(cases)("%s → %s", (_what, change, column) => {
    const input = base();
    change(input);
    const errors = errorsOf(input);
    expect(errors.map((e) => e.column)).toContain(column);
    for (const e of errors) expect(e.message.length).toBeGreaterThan(5);
  });

  it("validateComparison reports the same errors recheck would, for forms to show field by field", () => {
    const input = base();
    input.restricted.chisq = "n/a";
    input.alpha = "2";
    expect(validateComparison(input).map((e) => e.column).sort()).toEqual(["a_chisq", "alpha"]);
    expect(validateComparison(base())).toEqual([]);
  });

  it("a lone model's cells are named without the a_/b_ prefix", () => {
    expect(validateModel({ chisq: "x" }, { n: "10" }).map((e) => e.column)).toEqual(["chisq"]);
    const outcome = recheckModel({ df: "2.5" }, { n: "-1" });
    expect(outcome.ok ? [] : outcome.errors.map((e) => e.column).sort()).toEqual(["df", "n"]);
  });
});

describe("what is not a field error", () => {
  it("a negative df is the negative-df finding, not a field error", () => {
    const outcome = recheck({ method: "lrt", sample: { n: "100" }, restricted: { df: "-2" }, free: { df: "1" } });
    expect(outcome.ok && outcome.result.findings.map((f) => f.code)).toContain("negative-df");
  });

  it("empty and missing cells are 'not reported', and the checks that need them are skipped with a reason", () => {
    const outcome = recheck({ method: "lrt", dP: "  ", sample: {}, restricted: { chisq: "" }, free: {} });
    expect(outcome.ok).toBe(true);
    if (!outcome.ok) return;
    expect(outcome.result.findings).toEqual([]);
    expect(outcome.result.skipped.length).toBeGreaterThan(0);
    for (const s of outcome.result.skipped) expect(s.reason.length).toBeGreaterThan(3);
  });

  it("case and spacing of choice cells do not matter", () => {
    const input = { ...base(), method: " LRT ", nested: "Yes" };
    input.restricted.estimator = "ml";
    expect(recheck(input).ok).toBe(true);
  });

  it("reads every spelling of a choice the same way: codebook, other case, spaces around it", () => {
    const read = (estimator: string) => {
      const errors: { column: string; message: string }[] = [];
      const model = parseModel({ estimator }, "a_", 0.05, errors);
      return { estimator: model.estimator, robust: model.robust, errors };
    };
    expect(read("MLR")).toEqual({ estimator: "MLR", robust: true, errors: [] });
    expect(read(" mlr ")).toEqual({ estimator: "MLR", robust: true, errors: [] });
    expect(read("ML")).toEqual({ estimator: "ML", robust: false, errors: [] });
    expect(read("Ml\t")).toEqual({ estimator: "ML", robust: false, errors: [] });
    expect(read("WLSMV").robust).toBe(true);
    expect(read("DWLS").robust).toBe(false);
    expect(read("  ")).toEqual({ estimator: null, robust: false, errors: [] });
    expect(read("MLX").errors.map((e) => e.column)).toEqual(["a_estimator"]);
  });

  it("a robust model is recognised by a printed scaled statistic when no estimator is named", () => {
    expect(parseModel({ chisqScaled: "12.30" }, "b_", 0.05, []).robust).toBe(true);
    expect(parseModel({ chisq: "12.30" }, "b_", 0.05, []).robust).toBe(false);
  });

  it("trims labels, also of Unicode spaces, and keeps the spaces inside them", () => {
    const errors: { column: string; message: string }[] = [];
    const parsed = parseComparison({ label: " C1\u00a0", sample: {}, restricted: { label: "Metric model" }, free: { label: "\u2003Configural\n" } }, 0.05, errors);
    expect([parsed.label, parsed.restricted.label, parsed.free.label]).toEqual(["C1", "Metric model", "Configural"]);
    expect(parseModel({ label: "" }, "a_", 0.05, errors).label).toBe("");
    expect(parseModel({}, "a_", 0.05, errors).label).toBe("");
  });

  it("blank number, count, p and choice cells (spaces, tabs) are not reported, never errors", () => {
    for (const blankText of [" ", "\t", "  \t ", " \u00a0", "\u00a0", "\u00a0 \u00a0"]) {
      const errors: { column: string; message: string }[] = [];
      const model = parseModel({ chisq: blankText, df: blankText, p: blankText, meanStructure: blankText }, "a_", 0.05, errors);
      expect([model.chisq, model.df, model.p, model.meanStructure, errors], JSON.stringify(blankText)).toEqual([null, null, null, null, []]);
    }
  });

  it("recomputed lists, in its JSON form, exactly the figures that were computed", () => {
    const outcome = recheck({ method: "lrt", dDf: "3", sample: { n: "200" }, restricted: { chisq: "30.10", df: "12" }, free: { chisq: "21.00", df: "9" } });
    expect(outcome.ok).toBe(true);
    if (!outcome.ok) return;
    // Figures the checks did not need stay undefined, and JSON leaves them out.
    const json = JSON.parse(JSON.stringify(outcome.result.recomputed)) as Record<string, unknown>;
    expect(Object.keys(json)).toEqual(["a.p", "b.p", "dDf", "dChisq"]);
    expect(json.dDf).toBe(3);
    // 30.10 − 21.00 with each printed at 2 decimals: [30.095 − 21.005, 30.105 − 20.995]
    const d = json.dChisq as { lo: number; hi: number };
    expect(d.lo).toBeCloseTo(9.09, 12);
    expect(d.hi).toBeCloseTo(9.11, 12);
    const lone = recheckModel({ chisq: "9.20", df: "5" }, { n: "100" });
    expect(lone.ok && Object.keys(JSON.parse(JSON.stringify(lone.result.recomputed)))).toEqual(["a.p"]);
  });

  it("never throws, even on a malformed object", () => {
    expect(() => recheck({} as ComparisonInput)).not.toThrow();
    expect(() => recheck(null as unknown as ComparisonInput)).not.toThrow();
  });
});

/** Walks a JSON value; every number must be finite (JSON.stringify would turn NaN/Infinity into null). */
function assertFinite(value: unknown, path: string): void {
  if (typeof value === "number") expect(Number.isFinite(value), path).toBe(true);
  else if (Array.isArray(value)) value.forEach((v, i) => assertFinite(v, `${path}[${i}]`));
  else if (value !== null && typeof value === "object") for (const [k, v] of Object.entries(value)) assertFinite(v, `${path}.${k}`);
}

describe("no NaN or Infinity anywhere in the output", () => {
  it("holds for 3 000 generated comparisons, consistent and with planted errors (JSON round trip has no stray null)", () => {
    for (const input of generateComparisons({ count: 3000, seed: 99, errorShare: 0.5 })) {
      const outcome = recheck(input);
      assertFinite(outcome, "outcome");
      if (!outcome.ok) continue;
      // JSON.stringify writes NaN/Infinity as null; the engine only uses null for "printed bound absent".
      const json = JSON.stringify(outcome.result);
      for (const match of json.matchAll(/"([A-Za-z.]+)":null/g)) expect(["reportedLower", "reportedUpper"], match[1]).toContain(match[1]);
    }
  });

  it("holds for extreme printed values (huge χ², tiny df, cd near 0, p at the bounds)", () => {
    const extreme: ComparisonInput = {
      method: "scaled_lrt",
      dChisq: "1e6",
      dP: "0",
      sample: { n: "2", groups: "2" },
      restricted: { estimator: "MLR", chisq: "99999999.99", df: "1", scaling: "1.00", rmsea: "9.9", rmseaLo: "0", rmseaHi: "1e3", cfi: "0", tli: "-50", baselineChisq: "0.001", baselineDf: "1" },
      free: { estimator: "MLR", chisq: "0.00", df: "0", chisqScaled: "0.00" },
    };
    const outcome = recheck(extreme);
    assertFinite(outcome, "outcome");
    expect(outcome.ok).toBe(true);
  });
});
