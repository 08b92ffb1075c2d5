// The engine against lavaan 0.6-14 on the Holzinger & Swineford (1939) data (tests/fixtures/README.md).
// Every expected value below is read from that file; the source of each is named beside its check.
import { describe, expect, it } from "vitest";
import { recheck, recheckModel, type Finding } from "@/lib/recheck";
import { chisqUpperTail } from "@/lib/recheck/distributions/chisq";
import { cfiOf, tliOf } from "@/lib/recheck/checks/fit-indices";
import { primaryConvention, recomputeRmseaInterval, rmseaConventions, type RmseaInputs } from "@/lib/recheck/checks/rmsea";
import { chisqForm, loglikForm } from "@/lib/recheck/checks/scaled";
import { parseModel } from "@/lib/recheck/parse";
import { comparison, comparisonInput, model, modelInput, printed, reference, sampleInput, type RobustPrint } from "./reference";

const relative = (got: number, want: number) => Math.abs(got - want) / Math.abs(want);
const num = (x: unknown): number => {
  if (typeof x !== "number") throw new Error(`expected a number, got ${String(x)}`);
  return x;
};

/** Errors and warnings only: notes (e.g. poor-fit-both, which these misfitting models earn) are allowed. */
const problems = (findings: Finding[]) => findings.filter((f) => f.severity !== "note").map((f) => `${f.code}: ${f.message}`);

function rmseaInputs(id: string, statistic: "ML" | "scaled"): RmseaInputs {
  const m = model(id);
  const f = m.fit_measures;
  const chisq = num(f.chisq);
  const scaled = statistic === "scaled" ? num(f["chisq.scaled"]) : null;
  const c = statistic === "scaled" ? num(f["chisq.scaling.factor"]) : null;
  return {
    n: m.N,
    groups: m.ngroups,
    df: num(f.df),
    chisq: { lo: chisq, hi: chisq },
    scaled: scaled === null ? null : { lo: scaled, hi: scaled },
    scaling: c === null ? null : { lo: c, hi: c },
    robust: statistic === "scaled",
    chisqValue: chisq,
    scaledValue: scaled,
    scalingValue: c,
  };
}

const ML_MODELS = reference.models.filter((m) => m.estimator === "ML").map((m) => m.id);
const MLR_MODELS = reference.models.filter((m) => m.estimator === "MLR").map((m) => m.id);

describe("each model's own figures recomputed (lavaan fitMeasures)", () => {
  it.each(reference.models.map((m) => m.id))("%s: χ² p equals R's exact upper tail", (id) => {
    const m = model(id);
    // Source: exact_upper_tail_pvalues.pvalue = R pchisq(chisq, df, lower.tail = FALSE).
    expect(relative(chisqUpperTail(num(m.fit_measures.chisq), num(m.fit_measures.df)), num(m.exact_upper_tail_pvalues.pvalue))).toBeLessThan(1e-10);
  });

  it.each(ML_MODELS)("%s: RMSEA (N, ×√G for groups) and its 90-percent CI match lavaan", (id) => {
    const f = model(id).fit_measures;
    const convention = primaryConvention(rmseaInputs(id, "ML"));
    expect(convention).not.toBeNull();
    if (!convention) return;
    // Source: fitMeasures rmsea (Steiger & Lind 1980; Steiger 1998 √G); CI bounds with lavaan's uniroot
    // tolerance, hence the 1e-6 absolute tolerance the file's rmsea_ci_precision note recommends.
    expect(convention.point.lo).toBeCloseTo(num(f.rmsea), 12);
    const ci = recomputeRmseaInterval(convention);
    expect(Math.abs(ci.lo - num(f["rmsea.ci.lower"]))).toBeLessThan(1e-6);
    expect(Math.abs(ci.hi - num(f["rmsea.ci.upper"]))).toBeLessThan(1e-6);
  });

  it.each(reference.rmsea_ci.map((r) => [r.label, r] as const))("rmsea_ci %s: inverting the noncentral χ² gives R's exact bounds", (_label, r) => {
    const convention = primaryConvention({
      n: r.N,
      groups: r.G,
      df: r.df,
      chisq: { lo: r.chisq, hi: r.chisq },
      scaled: null,
      scaling: null,
      robust: false,
      chisqValue: r.chisq,
      scaledValue: null,
      scalingValue: null,
    });
    if (!convention) throw new Error("no convention");
    const ci = recomputeRmseaInterval(convention);
    // Source: rmsea_ci[].hand_tight_tol (R uniroot at tolerance 1e-13 on pchisq(chisq, df, ncp)).
    expect(Math.abs(ci.lo - r.hand_tight_tol.ci_lower)).toBeLessThan(1e-9);
    expect(Math.abs(ci.hi - r.hand_tight_tol.ci_upper)).toBeLessThan(1e-9);
  });

  it.each(MLR_MODELS)("%s: scaled and robust RMSEA and their intervals match lavaan", (id) => {
    const f = model(id).fit_measures;
    const conventions = rmseaConventions(rmseaInputs(id, "scaled"));
    const byName = (prefix: string) => conventions.find((c) => c.name.startsWith(prefix) && c.name.includes("N, ×√G"));
    const naive = byName("scaled χ²");
    const lavaanScaled = byName("ML χ² with c·df");
    const robust = byName("robust");
    expect(naive && lavaanScaled && robust).toBeTruthy();
    if (!naive || !lavaanScaled || !robust) return;
    // Source: fitMeasures rmsea.scaled (naive formula on the scaled χ²) and rmsea.robust
    // (Brosseau-Liard, Savalei & Li 2012), as restated in the file's notes.robust_indices.
    expect(naive.point.lo).toBeCloseTo(num(f["rmsea.scaled"]), 12);
    expect(robust.point.lo).toBeCloseTo(num(f["rmsea.robust"]), 12);
    // Source: rmsea.ci.lower/upper.scaled (ML χ² against df·c) and .robust (scaled χ², scaled back by c).
    const scaledCi = recomputeRmseaInterval(lavaanScaled);
    expect(Math.abs(scaledCi.lo - num(f["rmsea.ci.lower.scaled"]))).toBeLessThan(1e-6);
    expect(Math.abs(scaledCi.hi - num(f["rmsea.ci.upper.scaled"]))).toBeLessThan(1e-6);
    const robustCi = recomputeRmseaInterval(robust);
    expect(Math.abs(robustCi.lo - num(f["rmsea.ci.lower.robust"]))).toBeLessThan(1e-6);
    expect(Math.abs(robustCi.hi - num(f["rmsea.ci.upper.robust"]))).toBeLessThan(1e-6);
  });

  it.each(reference.models.map((m) => m.id))("%s: CFI (Bentler 1990) and TLI (Tucker & Lewis 1973) match lavaan", (id) => {
    const f = model(id).fit_measures;
    const args = [num(f.chisq), num(f.df), num(f["baseline.chisq"]), num(f["baseline.df"])] as const;
    expect(cfiOf(...args)).toBeCloseTo(num(f.cfi), 12);
    expect(tliOf(...args)).toBeCloseTo(num(f.tli), 12);
  });

  it.each(reference.models.map((m) => m.id))("%s: AIC = −2LL + 2q, BIC = −2LL + q ln N, df = moments − q", (id) => {
    const m = model(id);
    const f = m.fit_measures;
    // Source: fitMeasures aic, bic, npar, df and the file's n_sample_moments_total.
    expect(-2 * num(f.logl) + 2 * num(f.npar)).toBeCloseTo(num(f.aic), 8);
    expect(-2 * num(f.logl) + num(f.npar) * Math.log(m.N)).toBeCloseTo(num(f.bic), 8);
    expect(m.n_sample_moments_total - m.npar).toBe(f.df);
    const outcome = recheckModel(modelInput(id, 6), sampleInput(id));
    expect(outcome.ok && outcome.result.recomputed["a.dfRecount"]).toBe(f.df);
  });
});

describe("each comparison's difference test recomputed (lavTestLRT)", () => {
  it.each(reference.comparisons.map((c) => c.id))("%s: Δχ² = χ²_A − χ²_B and its p match lavaan", (id) => {
    const c = comparison(id);
    const standard = c.hand.standard;
    // Source: hand.standard (and lavTestLRT default for ML comparisons).
    expect(standard.T0 - standard.T1).toBeCloseTo(standard.chisq_diff, 10);
    expect(relative(chisqUpperTail(standard.chisq_diff, standard.df_diff), standard.p_value)).toBeLessThan(1e-10);
  });

  const robustComparisons = reference.comparisons.filter((c) => c.estimator === "MLR").map((c) => c.id);

  it.each(robustComparisons)("%s: the Satorra–Bentler (2001) chi-square form reproduces lavaan's cd, T and p", (id) => {
    const c = comparison(id);
    const sb = c.hand.satorra_bentler_2001;
    if (!sb) throw new Error("no SB 2001 hand computation");
    const a = parseModel(modelInput(c.restricted, 14), "a_", 0.05, []);
    const b = parseModel(modelInput(c.free, 14), "b_", 0.05, []);
    const outcome = chisqForm(a, b);
    expect(outcome.kind).toBe("form");
    if (outcome.kind !== "form") return;
    const form = outcome.form;
    expect(relative(form.cdValue, sb.cd)).toBeLessThan(1e-9);
    expect(relative(form.statisticValue, sb.T)).toBeLessThan(1e-9);
    // Source: lavTestLRT(method = "satorra.bentler.2001") p-value.
    expect(relative(chisqUpperTail(form.statisticValue, c.lavTestLRT["satorra.bentler.2001"]?.df_diff ?? 0), num(c.lavTestLRT["satorra.bentler.2001"]?.p_value))).toBeLessThan(1e-8);
  });

  it.each(robustComparisons)("%s: the log-likelihood form reproduces the file's hand computation (Mplus MLR convention)", (id) => {
    const c = comparison(id);
    const ll = c.hand.mplus_loglik_difference;
    if (!ll) throw new Error("no log-likelihood hand computation");
    const a = parseModel(modelInput(c.restricted, 14), "a_", 0.05, []);
    const b = parseModel(modelInput(c.free, 14), "b_", 0.05, []);
    const outcome = loglikForm(a, b);
    expect(outcome.kind).toBe("form");
    if (outcome.kind !== "form") return;
    const form = outcome.form;
    expect(relative(form.cdValue, ll.cd)).toBeLessThan(1e-9);
    expect(relative(form.statisticValue, ll.T)).toBeLessThan(1e-9);
    expect(relative(chisqUpperTail(form.statisticValue, ll.df), ll.p_value)).toBeLessThan(1e-8);
  });
});

describe("the reference figures printed as a paper prints them raise no error or warning", () => {
  const cases: Array<[string, number, RobustPrint]> = [];
  for (const c of reference.comparisons) for (const k of [2, 3]) for (const print of ["scaled", "robust"] as const) if (print === "scaled" || c.estimator === "MLR") cases.push([c.id, k, print]);

  it.each(cases)("%s at %s decimals (%s indices)", (id, k, print) => {
    const outcome = recheck(comparisonInput(id, k, print));
    expect(outcome.ok).toBe(true);
    if (!outcome.ok) return;
    expect(problems(outcome.result.findings)).toEqual([]);
  });

  const modelCases: Array<[string, number, RobustPrint]> = [];
  for (const m of reference.models) for (const k of [2, 3]) for (const print of ["scaled", "robust"] as const) if (print === "scaled" || m.estimator === "MLR") modelCases.push([m.id, k, print]);

  it.each(modelCases)("model %s on its own at %s decimals (%s indices)", (id, k, print) => {
    const outcome = recheckModel(modelInput(id, k, print), sampleInput(id));
    expect(outcome.ok).toBe(true);
    if (!outcome.ok) return;
    expect(problems(outcome.result.findings)).toEqual([]);
  });

  it("the log-likelihood form's statistic, printed as the Δχ², is accepted too (Mplus MLR output)", () => {
    const c = comparison("mi_scalar_vs_metric_MLR");
    const ll = c.hand.mplus_loglik_difference;
    if (!ll) throw new Error("no log-likelihood hand computation");
    const input = comparisonInput(c.id, 3);
    input.dChisq = printed(ll.T, 3);
    input.dP = printed(ll.p_value, 3);
    const outcome = recheck(input);
    expect(outcome.ok && problems(outcome.result.findings)).toEqual([]);
    expect(outcome.ok && outcome.result.recomputed.scaledFormMatched).toBe("log-likelihood form");
  });

  it("the plain difference of the scaled χ² instead is flagged as unscaled-robust-difference (Satorra & Bentler 2001)", () => {
    const c = comparison("mi_metric_vs_configural_MLR");
    const input = comparisonInput(c.id, 3);
    // Source: deltas["chisq.scaled"] = 125.997 − 121.741 = 4.257, the naive difference; SB gives 6.567.
    input.dChisq = printed(num((c.deltas as Record<string, number>)["chisq.scaled"]), 3);
    input.dP = printed(chisqUpperTail(Number(input.dChisq), 6), 3);
    const outcome = recheck(input);
    expect(outcome.ok && outcome.result.findings.map((f) => f.code)).toContain("unscaled-robust-difference");
  });
});

describe("hand-computable examples of the file's provenance notes", () => {
  const notes = reference.provenance.notes;

  it("Satorra–Bentler 2001 worked numbers: cd = 1.2474, T = 6.5672, p = .3627", () => {
    const ex = notes.satorra_bentler_2001.example;
    // cd = (54·c0 − 48·c1)/6 with c0 = .98449…, c1 = .95162… (metric vs configural, MLR)
    const cd = (54 * ex.c0 - 48 * ex.c1) / 6;
    expect(cd).toBeCloseTo(ex.cd, 12);
    const t = (124.04354417999318 - 115.85134387555911) / cd; // unscaled χ² of mi_metric_MLR and mi_configural_MLR
    expect(t).toBeCloseTo(ex.T, 10);
    expect(chisqUpperTail(t, 6)).toBeCloseTo(ex.p_value, 12);
  });

  it("the same example printed at 3 decimals gives a scaled difference whose interval holds 6.567", () => {
    const outcome = recheck(comparisonInput("mi_metric_vs_configural_MLR", 3));
    if (!outcome.ok) throw new Error("unexpected field errors");
    const t = outcome.result.recomputed["sb2001.statistic"] as { lo: number; hi: number };
    expect(t.lo).toBeLessThanOrEqual(6.567201740275955);
    expect(t.hi).toBeGreaterThanOrEqual(6.567201740275955);
  });

  it("RMSEA with √G (Steiger 1998): .0969 for two groups, .0685 without the factor", () => {
    const r = notes.rmsea_multigroup;
    const plain = Math.sqrt(Math.max(0, (r.chisq - r.df) / (r.N * r.df)));
    expect(plain).toBeCloseTo(r.rmsea_without_sqrtG, 12);
    expect(plain * Math.sqrt(r.G)).toBeCloseTo(r.rmsea_by_hand, 12);
  });

  it("a multi-group RMSEA printed without √G is still read as consistent, and the convention is named", () => {
    const input = modelInput("mi_configural_ML", 3);
    input.rmsea = printed(notes.rmsea_multigroup.rmsea_without_sqrtG, 3);
    input.rmseaLo = undefined;
    input.rmseaHi = undefined;
    const outcome = recheckModel(input, sampleInput("mi_configural_ML"));
    if (!outcome.ok) throw new Error("unexpected field errors");
    expect(problems(outcome.result.findings)).toEqual([]);
    expect(outcome.result.recomputed["a.rmseaConvention"]).toBe("ML χ², N, without √G");
  });

  it("AIC and BIC from the log-likelihood: 7517.49 and 7595.34 for the three-factor model", () => {
    const r = notes.aic_bic;
    expect(-2 * r.logl + 2 * r.npar).toBeCloseTo(r.aic_lavaan, 9);
    expect(-2 * r.logl + r.npar * Math.log(r.N)).toBeCloseTo(r.bic_lavaan, 9);
  });

  it("χ² = 2 (LL_saturated − LL) ties the χ² form of ΔAIC to the log-likelihood form", () => {
    const r = notes.chisq_vs_likelihood;
    expect(2 * (r["unrestricted.logl"] - r.logl)).toBeCloseTo(r.chisq_lavaan, 9);
  });

  it("RMSEA uses N, not N − 1, under lavaan's default likelihood; N − 1 is also accepted as a convention", () => {
    const r = notes.N_vs_N_minus_1;
    const input = modelInput("hs3_ML", 4);
    input.rmsea = printed(r.rmsea_wishart_by_hand_with_Nm1, 4);
    input.chisq = printed(r.chisq_wishart, 4);
    input.p = undefined;
    input.rmseaLo = undefined;
    input.rmseaHi = undefined;
    input.cfi = undefined;
    input.tli = undefined;
    const outcome = recheckModel(input, sampleInput("hs3_ML"));
    if (!outcome.ok) throw new Error("unexpected field errors");
    expect(outcome.result.recomputed["a.rmseaConvention"]).toBe("ML χ², N − 1");
  });
});
