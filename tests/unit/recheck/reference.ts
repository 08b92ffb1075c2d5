// Builds recheck inputs from the lavaan reference file (tests/fixtures/README.md), printed the way a
// paper prints them: every figure rounded to k decimals, small p-values as "< .001".
import reference from "@/tests/fixtures/lavaan-holzinger-swineford.json";
import type { ComparisonInput, ModelInput, SampleInput } from "@/lib/recheck";

export { reference };

export type ReferenceModel = (typeof reference.models)[number];
export type ReferenceComparison = (typeof reference.comparisons)[number];

export function model(id: string): ReferenceModel {
  const found = reference.models.find((m) => m.id === id);
  if (!found) throw new Error(`no model ${id} in the reference file`);
  return found;
}

export function comparison(id: string): ReferenceComparison {
  const found = reference.comparisons.find((c) => c.id === id);
  if (!found) throw new Error(`no comparison ${id} in the reference file`);
  return found;
}

/** x rounded to k decimals as text, without a negative zero. */
export function printed(x: number, k: number): string {
  const text = x.toFixed(k);
  return /^-0\.?0*$/.test(text) ? text.slice(1) : text;
}

/** p as papers print it: "< .001" (or "< .01" at 2 decimals) below the last printed digit. */
export function printedP(p: number, k: number): string {
  const floor = Math.pow(10, -k);
  if (p < floor) return `< ${floor.toFixed(k).slice(1)}`;
  return p.toFixed(k);
}

function num(x: number | string | null | undefined): number {
  if (typeof x !== "number") throw new Error(`expected a number, got ${String(x)}`);
  return x;
}

/** How a robust model's indices are printed. */
export type RobustPrint = "scaled" | "robust";

/**
 * The model's figures printed at k decimals. ML models: the standard statistics. MLR models: the ML χ²
 * plus scaled χ², scaling factor, the scaled p, and either the "scaled" indices (CFI/TLI from scaled χ²
 * and scaled baseline, scaled RMSEA and CI) or the "robust" RMSEA and CI (Brosseau-Liard et al. 2012).
 */
export function modelInput(id: string, k: number, robustPrint: RobustPrint = "scaled"): ModelInput {
  const m = model(id);
  const f = m.fit_measures;
  const exact = m.exact_upper_tail_pvalues;
  const base: ModelInput = {
    label: id,
    estimator: m.estimator,
    chisq: printed(num(f.chisq), k),
    df: String(f.df),
    aic: printed(num(f.aic), k),
    bic: printed(num(f.bic), k),
    loglik: printed(num(f.logl), k),
    npar: String(f.npar),
    nObserved: String(m.n_observed_variables),
    meanStructure: m.meanstructure ? "yes" : "no",
    srmr: printed(num(f.srmr), k),
  };
  if (m.estimator === "ML") {
    return {
      ...base,
      p: printedP(num(exact.pvalue), k),
      cfi: printed(num(f.cfi), k),
      tli: printed(num(f.tli), k),
      rmsea: printed(num(f.rmsea), k),
      rmseaLo: printed(num(f["rmsea.ci.lower"]), k),
      rmseaHi: printed(num(f["rmsea.ci.upper"]), k),
      baselineChisq: printed(num(f["baseline.chisq"]), k),
      baselineDf: String(f["baseline.df"]),
    };
  }
  const robust: ModelInput = {
    ...base,
    chisqScaled: printed(num(f["chisq.scaled"]), k),
    scaling: printed(num(f["chisq.scaling.factor"]), k),
    loglikScaling: printed(num(f["scaling.factor.h0"]), k),
    p: printedP(num(exact["pvalue.scaled"]), k),
  };
  if (robustPrint === "scaled") {
    return {
      ...robust,
      cfi: printed(num(f["cfi.scaled"]), k),
      tli: printed(num(f["tli.scaled"]), k),
      rmsea: printed(num(f["rmsea.scaled"]), k),
      rmseaLo: printed(num(f["rmsea.ci.lower.scaled"]), k),
      rmseaHi: printed(num(f["rmsea.ci.upper.scaled"]), k),
      baselineChisq: printed(num(f["baseline.chisq.scaled"]), k),
      baselineDf: String(f["baseline.df.scaled"]),
    };
  }
  return {
    ...robust,
    rmsea: printed(num(f["rmsea.robust"]), k),
    rmseaLo: printed(num(f["rmsea.ci.lower.robust"]), k),
    rmseaHi: printed(num(f["rmsea.ci.upper.robust"]), k),
  };
}

export function sampleInput(id: string): SampleInput {
  const m = model(id);
  return { label: "HS1939", n: String(m.N), groups: String(m.ngroups) };
}

function deltaOf(c: ReferenceComparison, key: string): number | undefined {
  return (c.deltas as Record<string, number | undefined>)[key];
}

/** ΔCFI ≤ −.01 (Cheung & Rensvold 2002) or ΔRMSEA ≥ .015 (Chen 2007) would contradict a claim. */
function invarianceHolds(c: ReferenceComparison): boolean {
  return c.deltas.cfi > -0.01 && c.deltas.rmsea < 0.015;
}

/**
 * A comparison printed at k decimals. ML comparisons are entered as `lrt` (one-group CFA set) or
 * `invariance` (the multi-group steps, with the invariance claim the cutoffs allow); MLR ones as
 * `scaled_lrt` with lavaan's Satorra–Bentler 2001 difference as the printed Δχ².
 */
export function comparisonInput(id: string, k: number, robustPrint: RobustPrint = "scaled"): ComparisonInput {
  const c = comparison(id);
  const test = c.lavTestLRT.default;
  const multiGroup = model(c.restricted).ngroups > 1;
  const robust = c.estimator !== "ML";
  const method = robust ? "scaled_lrt" : multiGroup ? "invariance" : "lrt";
  return {
    label: id,
    method,
    nested: "yes",
    dChisq: printed(num(test.chisq_diff), k),
    dDf: String(test.df_diff),
    dP: printedP(num(test.p_value), k),
    // Deltas of the indices the models print: scaled ones for MLR (robust RMSEA in the "robust" print,
    // which prints no CFI).
    dCfi: !robust ? printed(c.deltas.cfi, k) : robustPrint === "scaled" ? printed(num(deltaOf(c, "cfi.scaled")), k) : undefined,
    dRmsea: printed(num(!robust ? c.deltas.rmsea : deltaOf(c, robustPrint === "scaled" ? "rmsea.scaled" : "rmsea.robust")), k),
    dAic: printed(c.deltas.aic, k),
    dBic: printed(c.deltas.bic, k),
    invarianceClaimed: multiGroup ? (invarianceHolds(c) ? "yes" : "no") : undefined,
    sample: sampleInput(c.restricted),
    restricted: modelInput(c.restricted, k, robustPrint),
    free: modelInput(c.free, k, robustPrint),
  };
}
