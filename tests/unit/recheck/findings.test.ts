// Every finding code of DESIGN §4.3: one case that raises it and one close case that must not. Cases
// start from lavaan reference comparisons printed at 3 decimals (clean, see reference.test.ts) and
// change one figure. The rule each case rests on is named beside it.
import { describe, expect, it } from "vitest";
import { FINDING_CODES, recheck, recheckModel, type ComparisonInput, type Finding, type ModelInput } from "@/lib/recheck";
import { comparisonInput, modelInput, sampleInput } from "./reference";

function findings(input: ComparisonInput): Finding[] {
  const outcome = recheck(input);
  if (!outcome.ok) throw new Error(`unexpected field errors: ${JSON.stringify(outcome.errors)}`);
  return outcome.result.findings;
}

const codes = (input: ComparisonInput) => findings(input).map((f) => f.code);
const finding = (input: ComparisonInput, code: string) => findings(input).find((f) => f.code === code);

/** hs3eq (restricted, df 30) vs hs3 (free, df 24), ML, N = 301: Δχ² = 22.105, Δdf = 6, p = .00116. */
const base = (): ComparisonInput => comparisonInput("hs3eq_vs_hs3_ML", 3);
/** MLR metric vs configural invariance, 2 groups: SB 2001 Δχ² = 6.567, Δdf = 6, p = .363. */
const robust = (): ComparisonInput => comparisonInput("mi_metric_vs_configural_MLR", 3);

/** A bare comparison of two models with only χ² and df (no fit indices to add noise). */
function bare(a: ModelInput, b: ModelInput, extra: Partial<ComparisonInput> = {}): ComparisonInput {
  return { method: "lrt", nested: "yes", sample: { n: "301" }, restricted: a, free: b, ...extra };
}

describe("model order and identification", () => {
  it("restricted-model-order: the free model entered in the a_ columns is swapped back (Fitledger coding rule)", () => {
    const input = base();
    [input.restricted, input.free] = [input.free, input.restricted];
    const found = finding(input, "restricted-model-order");
    expect(found?.severity).toBe("warning");
    expect(found?.message).toContain("df = 24");
    // after the swap the comparison itself checks out: Δdf 6 and Δχ² 22.105 read as restricted − free
    expect(codes(input)).not.toContain("df-difference-mismatch");
    expect(codes(input)).not.toContain("chisq-difference-mismatch");
  });

  it("restricted-model-order: correct order raises nothing; with df missing, npar decides", () => {
    expect(codes(base())).not.toContain("restricted-model-order");
    const byNpar = bare({ npar: "21" }, { npar: "15" });
    expect(codes(byNpar)).toContain("restricted-model-order");
    expect(codes(bare({ npar: "15" }, { npar: "21" }))).not.toContain("restricted-model-order");
  });

  it("just-identified-model: a compared model with df = 0 is an error (common practice); df = 1 is not", () => {
    const input = bare({ chisq: "12.40", df: "3" }, { chisq: "0.00", df: "0" });
    expect(finding(input, "just-identified-model")?.severity).toBe("error");
    expect(codes(bare({ chisq: "12.40", df: "3" }, { chisq: "1.00", df: "1" }))).not.toContain("just-identified-model");
  });

  it("just-identified-model: a lone model with df = 0 gets a note, since nothing is compared", () => {
    const outcome = recheckModel({ chisq: "0.000", df: "0" }, { n: "200" });
    expect(outcome.ok && outcome.result.findings.map((f) => [f.code, f.severity])).toEqual([["just-identified-model", "note"]]);
  });

  it("negative-df: df < 0 is not identified (error) and leaves the model out of df checks; df = 0 is not negative", () => {
    const input = bare({ chisq: "12.40", df: "-2", p: ".002" }, { chisq: "5.00", df: "1" });
    expect(finding(input, "negative-df")?.severity).toBe("error");
    expect(codes(input)).not.toContain("model-p-mismatch");
    expect(codes(bare({ chisq: "12.40", df: "3" }, { chisq: "0.00", df: "0" }))).not.toContain("negative-df");
  });
});

describe("degrees of freedom and chi-square of the difference (Steiger, Shapiro & Browne 1985)", () => {
  it("df-difference-mismatch: reported Δdf = 5, but 30 − 24 = 6 (error); Δdf = 6 is fine", () => {
    const input = { ...base(), dDf: "5" };
    const found = finding(input, "df-difference-mismatch");
    expect(found?.severity).toBe("error");
    expect(found?.message).toBe("reported Δdf = 5, but 30 − 24 = 6");
    expect(codes(base())).not.toContain("df-difference-mismatch");
  });

  it("df-difference-mismatch: a negative printed Δdf is itself a finding, not a sign to flip", () => {
    expect(codes(bare({ chisq: "30.00" }, { chisq: "20.00" }, { dDf: "-3" }))).toContain("df-difference-mismatch");
  });

  it("zero-df-difference: equal df in an lrt comparison (error); df one apart is fine", () => {
    expect(finding(bare({ chisq: "30.00", df: "24" }, { chisq: "25.00", df: "24" }), "zero-df-difference")?.severity).toBe("error");
    expect(codes(bare({ chisq: "30.00", df: "25" }, { chisq: "25.00", df: "24" }))).not.toContain("zero-df-difference");
    // an information-criteria comparison of equal-df (non-nested) models is no difference test
    expect(codes(bare({ chisq: "30.00", df: "24" }, { chisq: "25.00", df: "24" }, { method: "ic", nested: "no" }))).not.toContain("zero-df-difference");
  });

  it("chisq-difference-mismatch: Δχ² = 22.2 lies outside 107.411 − 85.306 = [22.104, 22.106] (warning)", () => {
    expect(finding({ ...base(), dChisq: "22.2" }, "chisq-difference-mismatch")?.severity).toBe("warning");
  });

  it("chisq-difference-mismatch: a one-decimal Δχ² = 22.1 stands for [22.05, 22.15] and is within rounding", () => {
    expect(codes({ ...base(), dChisq: "22.1", dP: ".001" })).not.toContain("chisq-difference-mismatch");
  });

  it("negative-chisq-difference: the restricted model's χ² below the free one's beyond rounding (error)", () => {
    expect(finding(bare({ chisq: "85.302", df: "30" }, { chisq: "85.306", df: "24" }), "negative-chisq-difference")?.severity).toBe("error");
    // 85.31 stands for [85.305, 85.315], which reaches 85.306: equal within rounding
    expect(codes(bare({ chisq: "85.31", df: "30" }, { chisq: "85.306", df: "24" }))).not.toContain("negative-chisq-difference");
    // models recorded as not nested may fit either way
    expect(codes(bare({ chisq: "85.302", df: "30" }, { chisq: "85.306", df: "24" }, { method: "ic", nested: "no" }))).not.toContain("negative-chisq-difference");
  });

  it("negative-chisq-difference: a negative printed Δχ² is a finding, not a sign to flip", () => {
    expect(codes({ ...base(), dChisq: "-22.105" })).toContain("negative-chisq-difference");
  });
});

describe("the difference test's p (chi-square distribution; Nuijten et al. 2016 style checks)", () => {
  it("difference-p-mismatch: p = .010 for Δχ² = 22.105 on 6 df (p = .00116), same side of .05 (warning)", () => {
    const found = finding({ ...base(), dP: ".010" }, "difference-p-mismatch");
    expect(found?.severity).toBe("warning");
    expect(codes({ ...base(), dP: ".010" })).not.toContain("difference-conclusion-changed");
  });

  it("difference-p-mismatch: p = .001 stands for [.0005, .0015] and holds .00116", () => {
    expect(codes({ ...base(), dP: ".001" })).not.toContain("difference-p-mismatch");
  });

  it("difference-conclusion-changed: 'ns' although p = .00116 < .05 (error)", () => {
    expect(finding({ ...base(), dP: "ns" }, "difference-conclusion-changed")?.severity).toBe("error");
  });

  it("difference-conclusion-changed: not when the recomputed p straddles alpha at the printed precision", () => {
    // Δχ² = 12.59 on 6 df: p ∈ [.04996, .05012] for [12.585, 12.595]; printed p = .06 is a mismatch only.
    const input = bare({ chisq: "50.00", df: "30" }, { chisq: "37.41", df: "24" }, { dChisq: "12.59", dDf: "6", dP: ".06" });
    expect(codes(input)).toContain("difference-p-mismatch");
    expect(codes(input)).not.toContain("difference-conclusion-changed");
  });

  it("the difference p is checked against the printed Δχ², not the models' difference (the paper's p came from it)", () => {
    // printed Δχ² 30.00 is wrong (chisq-difference-mismatch) but its p is right for 30.00
    const input = { ...base(), dChisq: "30.00", dP: "< .001" };
    expect(codes(input)).toContain("chisq-difference-mismatch");
    expect(codes(input)).not.toContain("difference-p-mismatch");
  });

  it("halved-p: p = .112 is half of the p = .224 of Δχ² = 8.192 on 6 df (Bakker & Wicherts 2011)", () => {
    const input = comparisonInput("mi_metric_vs_configural_ML", 3);
    expect(finding({ ...input, dP: ".112" }, "halved-p")?.severity).toBe("warning");
    expect(codes({ ...input, dP: ".224" })).not.toContain("halved-p");
    // an inequality says nothing about halving
    expect(codes({ ...input, dP: "< .15" })).not.toContain("halved-p");
  });

  it("p-printed-as-zero: p = .000 gets a note (a p-value is never zero); p < .001 does not", () => {
    expect(finding({ ...comparisonInput("hs2_vs_hs3_ML", 3), dP: ".000" }, "p-printed-as-zero")?.severity).toBe("note");
    expect(codes(comparisonInput("hs2_vs_hs3_ML", 3))).not.toContain("p-printed-as-zero");
    const model = { ...modelInput("hs2_ML", 3), p: "0.000" };
    const outcome = recheckModel(model, sampleInput("hs2_ML"));
    expect(outcome.ok && outcome.result.findings.map((f) => f.code)).toContain("p-printed-as-zero");
  });

  it("lrt-on-non-nested: an lrt of models recorded as not nested (error); 'unknown' or an ic comparison is fine", () => {
    expect(finding({ ...base(), nested: "no" }, "lrt-on-non-nested")?.severity).toBe("error");
    expect(codes({ ...base(), nested: "unknown" })).not.toContain("lrt-on-non-nested");
    expect(codes({ ...base(), method: "ic", nested: "no" })).not.toContain("lrt-on-non-nested");
  });
});

describe("scaled (robust) differences (Satorra & Bentler 2001)", () => {
  it("unscaled-robust-difference: covered with the lavaan numbers in reference.test.ts; the SB value itself is fine", () => {
    expect(codes(robust())).not.toContain("unscaled-robust-difference");
    const naive = { ...robust(), dChisq: "4.257", dP: ".642" };
    expect(finding(naive, "unscaled-robust-difference")?.severity).toBe("error");
  });

  it("scaled-difference-mismatch: Δχ² = 9.00 against the SB 6.567 (warning); 6.57 is within rounding", () => {
    const found = finding({ ...robust(), dChisq: "9.00", dP: ".174" }, "scaled-difference-mismatch");
    expect(found?.severity).toBe("warning");
    expect(codes({ ...robust(), dChisq: "6.57" })).not.toContain("scaled-difference-mismatch");
  });

  it("scaled-difference-mismatch: an error when the conclusion changes (p < .01 against SB p = .363)", () => {
    const found = finding({ ...robust(), dChisq: "20.00", dP: "< .01" }, "scaled-difference-mismatch");
    expect(found?.severity).toBe("error");
  });

  it("scaled-difference-mismatch: without a printed Δχ² the printed p is checked against the SB p", () => {
    expect(codes({ ...robust(), dChisq: undefined, dP: ".020" })).toContain("scaled-difference-mismatch");
    expect(codes({ ...robust(), dChisq: undefined, dP: ".36" })).not.toContain("scaled-difference-mismatch");
  });

  it("scaled-difference-mismatch: scaling factors printed at 2 decimals widen cd, so T's interval still holds 6.567", () => {
    const input = comparisonInput("mi_metric_vs_configural_MLR", 2);
    expect(codes(input)).not.toContain("scaled-difference-mismatch");
  });

  it("negative-scaling-correction: cd = (54·0.8 − 48·1.1)/6 < 0 (warning); cd > 0 is not flagged", () => {
    const negative = robust();
    negative.restricted = { ...negative.restricted, scaling: "0.800", chisqScaled: "155.054", loglikScaling: undefined };
    negative.free = { ...negative.free, scaling: "1.100", chisqScaled: "105.319" };
    expect(finding(negative, "negative-scaling-correction")?.severity).toBe("warning");
    expect(codes(robust())).not.toContain("negative-scaling-correction");
  });
});

describe("a model's own figures", () => {
  const alone = (changes: Partial<ModelInput>, id = "hs3eq_ML") => {
    const outcome = recheckModel({ ...modelInput(id, 3), ...changes }, sampleInput(id));
    if (!outcome.ok) throw new Error("unexpected field errors");
    return outcome.result.findings;
  };
  const aloneCodes = (changes: Partial<ModelInput>, id?: string) => alone(changes, id).map((f) => f.code);

  it("model-p-mismatch: p = .030 for χ² = 107.411 on 30 df (p = 1.2e-10), same side of .05 (warning)", () => {
    expect(alone({ p: ".030" }).find((f) => f.code === "model-p-mismatch")?.severity).toBe("warning");
    expect(aloneCodes({ p: "< .001" })).not.toContain("model-p-mismatch");
  });

  it("model-conclusion-changed: p = .20 although p = 1.2e-10 (error)", () => {
    expect(alone({ p: ".20" }).find((f) => f.code === "model-conclusion-changed")?.severity).toBe("error");
  });

  it("rmsea-mismatch: RMSEA = .120 where χ² = 107.411, df = 30, N = 301 give .0926 (warning); .093 is fine", () => {
    const found = alone({ rmsea: ".120" }).find((f) => f.code === "rmsea-mismatch");
    expect(found?.severity).toBe("warning");
    expect(found?.message).toContain("tried");
    expect(aloneCodes({ rmsea: ".093" })).not.toContain("rmsea-mismatch");
  });

  it("rmsea-interval-mismatch: upper bound .130 instead of .112 (Browne & Cudeck 1993); .112 is fine", () => {
    expect(alone({ rmseaHi: ".130" }).find((f) => f.code === "rmsea-interval-mismatch")?.severity).toBe("warning");
    expect(aloneCodes({ rmseaHi: ".112" })).not.toContain("rmsea-interval-mismatch");
  });

  it("rmsea-interval-mismatch: the lower bound is 0 when the χ² is too small to bound it away from zero", () => {
    // χ² = 20.00 on 24 df: F(20; 24, 0) < .95, so the lower bound is 0 (Browne & Cudeck 1993); the
    // upper bound's λ = 9.86 solves F(20; 24, λ) = .05, i.e. √(9.86/(301·24)) = .037.
    const model = { chisq: "20.00", df: "24", rmsea: ".000", rmseaLo: ".000", rmseaHi: ".037" };
    const ok = recheckModel(model, { n: "301" });
    expect(ok.ok && ok.result.findings.map((f) => f.code)).not.toContain("rmsea-interval-mismatch");
    const wrong = recheckModel({ ...model, rmseaLo: ".010" }, { n: "301" });
    expect(wrong.ok && wrong.result.findings.map((f) => f.code)).toContain("rmsea-interval-mismatch");
  });

  it("cfi-mismatch: CFI = .950 where the baseline gives .912 (Bentler 1990); .912 is fine", () => {
    expect(alone({ cfi: ".950" }).find((f) => f.code === "cfi-mismatch")?.severity).toBe("warning");
    expect(aloneCodes({ cfi: ".912" })).not.toContain("cfi-mismatch");
  });

  it("tli-mismatch: TLI = .950 where the baseline gives .895 (Tucker & Lewis 1973); .895 is fine", () => {
    expect(alone({ tli: ".950" }).find((f) => f.code === "tli-mismatch")?.severity).toBe("warning");
    expect(aloneCodes({ tli: ".895" })).not.toContain("tli-mismatch");
  });

  it("df-recount-mismatch: 45 moments − 16 parameters = 29, not the reported 30 (warning); 15 parameters fit", () => {
    expect(alone({ npar: "16" }).find((f) => f.code === "df-recount-mismatch")?.message).toContain("= 29");
    expect(aloneCodes({ npar: "15" })).not.toContain("df-recount-mismatch");
  });

  it("df-recount-mismatch: fixed-x covariates' moments are neither moments nor parameters", () => {
    // 5 observed, 2 of them fixed-x exogenous: 15 − 3 = 12 moments; 10 free parameters → df = 2.
    const path = { chisq: "3.10", df: "2", npar: "10", nObserved: "5", meanStructure: "no" };
    const withFixed = recheckModel({ ...path, nFixedX: "2" }, { n: "301" });
    expect(withFixed.ok && withFixed.result.findings.map((f) => f.code)).not.toContain("df-recount-mismatch");
    const without = recheckModel(path, { n: "301" });
    expect(without.ok && without.result.findings.map((f) => f.code)).toContain("df-recount-mismatch");
  });

  it("information-criteria-inconsistent: AIC ≠ −2LL + 2q for the model (Akaike 1974); the printed AIC is fine", () => {
    expect(alone({ aic: "7537.595" }).find((f) => f.code === "information-criteria-inconsistent")?.subject).toBe("a");
    expect(aloneCodes({})).not.toContain("information-criteria-inconsistent");
  });
});

describe("information criteria of the comparison (Akaike 1974; Schwarz 1978; Burnham & Anderson 2002)", () => {
  it("information-criteria-inconsistent: AIC_A − AIC_B must equal Δχ² − 2Δdf (= 10.105)", () => {
    const input = base();
    input.restricted = { ...input.restricted, aic: "7537.595", loglik: undefined };
    expect(codes(input)).toContain("information-criteria-inconsistent");
    expect(codes(base())).not.toContain("information-criteria-inconsistent");
  });

  it("information-criteria-inconsistent: a printed ΔBIC against Δχ² − Δdf·ln N (= −12.138)", () => {
    expect(codes({ ...base(), dBic: "12.138" })).toContain("information-criteria-inconsistent");
    expect(codes({ ...base(), dBic: "-12.138" })).not.toContain("information-criteria-inconsistent");
  });

  it("preferred-model-contradicts-criteria: model A preferred though AIC and BIC both favour B (warning)", () => {
    const input = { ...comparisonInput("hs2_vs_hs3_ML", 3), method: "ic", preferred: "a" };
    expect(finding(input, "preferred-model-contradicts-criteria")?.severity).toBe("warning");
    expect(codes({ ...input, preferred: "b" })).not.toContain("preferred-model-contradicts-criteria");
  });

  it("when AIC and BIC disagree, the preference contradicts the criteria only if it contradicts both", () => {
    // hs3eq vs hs3: ΔAIC = +10.1 favours B, ΔBIC = −12.1 favours A
    const input = { ...base(), method: "ic", preferred: "a" };
    expect(codes(input)).not.toContain("preferred-model-contradicts-criteria");
    expect(finding(input, "criteria-disagree")?.severity).toBe("note");
    expect(codes({ ...comparisonInput("hs2_vs_hs3_ML", 3), method: "ic" })).not.toContain("criteria-disagree");
  });

  it("criteria-near-tie: |ΔAIC| = 0.59 < 2 is a note; ΔAIC printed as 2.00 may be 2 and is not", () => {
    const tie = { ...comparisonInput("mi_strict_vs_scalar_ML", 3), method: "ic" };
    expect(finding(tie, "criteria-near-tie")?.severity).toBe("note");
    const input = { ...base(), method: "ic", dAic: "2.00" };
    input.restricted = { ...input.restricted, aic: undefined };
    expect(codes(input)).not.toContain("criteria-near-tie");
  });
});

describe("fit rules", () => {
  it("poor-fit-both: neither model meets RMSEA ≤ .08 / CFI ≥ .90 (common practice) — a note", () => {
    expect(finding(comparisonInput("hs1_vs_hs3_ML", 3), "poor-fit-both")?.severity).toBe("note");
    // hs3x78: RMSEA .066, CFI .966 meets the cutoffs
    expect(codes(comparisonInput("hs3_vs_hs3x78_ML", 3))).not.toContain("poor-fit-both");
  });

  it("poor-fit-both: RMSEA printed as .080 may be .0795 and does not fail the cutoff", () => {
    const a = { rmsea: ".081" };
    expect(codes(bare(a, { rmsea: ".090" }))).toContain("poor-fit-both");
    expect(codes(bare(a, { rmsea: ".080" }))).not.toContain("poor-fit-both");
  });

  it("invariance-cutoff-exceeded: invariance claimed despite ΔCFI = −.038 (Cheung & Rensvold 2002)", () => {
    const input = { ...comparisonInput("mi_scalar_vs_metric_ML", 3), invarianceClaimed: "yes" };
    expect(finding(input, "invariance-cutoff-exceeded")?.message).toContain("Cheung & Rensvold");
    expect(codes({ ...input, invarianceClaimed: "no" })).not.toContain("invariance-cutoff-exceeded");
  });

  it("invariance-cutoff-exceeded: ΔRMSEA ≥ .015 (Chen 2007); a printed ΔCFI of −.010 straddles the cutoff", () => {
    const input = { ...comparisonInput("mi_metric_vs_configural_ML", 3), invarianceClaimed: "yes" };
    expect(codes({ ...input, dCfi: undefined, dRmsea: ".016" })).toContain("invariance-cutoff-exceeded");
    expect(codes({ ...input, dCfi: "-0.010", dRmsea: undefined })).not.toContain("invariance-cutoff-exceeded");
    expect(codes({ ...input, dCfi: "-0.011", dRmsea: undefined })).toContain("invariance-cutoff-exceeded");
  });

  it("delta-fit-mismatch: ΔCFI printed as +.018 (free − restricted) is read as restricted − free (warning)", () => {
    expect(finding({ ...base(), dCfi: "0.018" }, "delta-fit-mismatch")?.severity).toBe("warning");
    expect(codes({ ...base(), dCfi: "-0.018" })).not.toContain("delta-fit-mismatch");
  });
});

describe("coverage of the catalogue", () => {
  it("every catalogued code is exercised by a case in this file", async () => {
    const source = await import("node:fs").then((fs) => fs.readFileSync(new URL(import.meta.url), "utf8"));
    for (const code of FINDING_CODES) expect(source.includes(`"${code}"`), code).toBe(true);
  });
});
