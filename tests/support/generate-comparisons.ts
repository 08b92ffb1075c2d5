// Deterministic generator of realistic synthetic comparisons for benchmarks and corpus seeding.
//
// Each comparison is simulated from a small "true" state (sample size, groups, observed variables, df,
// misfit), its figures are computed with the published formulas (χ² p, RMSEA and its CI, CFI/TLI, AIC/BIC,
// Satorra–Bentler 2001 scaled difference) and printed at 2 or 3 decimals, as papers do. Most are
// consistent; a share carries exactly one planted reporting error of a named kind. Same seed, same output.
//
// The figures are computed with the engine's own distribution functions, so the generator is no
// independent check of those (the lavaan reference tests are); it checks that consistent reports stay
// silent and planted slips are caught, and it feeds the benchmarks.
import { chisqUpperTail } from "@/lib/recheck/distributions/chisq";
import { noncentralityForCdf } from "@/lib/recheck/distributions/noncentral";
import type { ComparisonInput, Estimator, Method, ModelInput } from "@/lib/recheck/types";
import { mulberry32 as prng } from "./mulberry32";

/** The planted error kinds, named by the finding each should raise. */
export const PLANTED_ERRORS = [
  "df-difference-mismatch",
  "chisq-difference-mismatch",
  "difference-p-mismatch",
  "difference-conclusion-changed",
  "halved-p",
  "unscaled-robust-difference",
  "scaled-difference-mismatch",
  "negative-scaling-correction",
  "model-p-mismatch",
  "rmsea-mismatch",
  "rmsea-interval-mismatch",
  "cfi-mismatch",
  "tli-mismatch",
  "df-recount-mismatch",
  "information-criteria-inconsistent",
  "preferred-model-contradicts-criteria",
  "lrt-on-non-nested",
  "invariance-cutoff-exceeded",
  "delta-fit-mismatch",
  "p-printed-as-zero",
  "restricted-model-order",
  "just-identified-model",
  "negative-df",
  "zero-df-difference",
  "negative-chisq-difference",
] as const;

export type PlantedError = (typeof PLANTED_ERRORS)[number];

export interface GeneratedComparison {
  input: ComparisonInput;
  /** the planted error, or null for a consistent report */
  planted: PlantedError | null;
}

export interface GenerateOptions {
  count: number;
  seed: number;
  /** share of comparisons with one planted error (default 0.25) */
  errorShare?: number;
}

type Random = () => number;

const pick = <T>(random: Random, items: readonly T[]): T => items[Math.floor(random() * items.length)];
const uniform = (random: Random, lo: number, hi: number) => lo + (hi - lo) * random();
const integer = (random: Random, lo: number, hi: number) => Math.floor(uniform(random, lo, hi + 1));

/** Standard normal by Box–Muller. */
function normal(random: Random): number {
  const u = Math.max(random(), 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

function fixed(x: number, k: number): string {
  const text = x.toFixed(k);
  return /^-0\.?0*$/.test(text) ? text.slice(1) : text;
}

/** p as papers print it: "< .001", ".032", "= .032" or "p = .032". */
function printP(random: Random, p: number, k: number): string {
  if (p < 0.001) return "< .001";
  const text = p.toFixed(k).replace(/^0/, "");
  const style = random();
  return style < 0.6 ? text : style < 0.85 ? `= ${text}` : `p = ${text}`;
}

interface TrueModel {
  df: number;
  chisq: number;
  scaling: number;
  loglikScaling: number;
  npar: number;
  loglik: number;
}

interface Scenario {
  method: Method;
  estimator: Estimator;
  robust: boolean;
  sbApplies: boolean;
  n: number;
  groups: number;
  nObserved: number;
  meanStructure: boolean;
  moments: number;
  baselineChisq: number;
  baselineDf: number;
  baselineScaling: number;
  k: number;
  a: TrueModel;
  b: TrueModel;
}

function rmseaOf(stat: number, df: number, n: number, groups: number): number {
  return stat > df ? Math.sqrt((stat - df) / (df * n)) * Math.sqrt(groups) : 0;
}

function rmseaInterval(stat: number, df: number, n: number, groups: number): [number, number] {
  const k = (n * df) / groups;
  return [Math.sqrt(noncentralityForCdf(stat, df, 0.95) / k), Math.sqrt(noncentralityForCdf(stat, df, 0.05) / k)];
}

function cfiOf(stat: number, df: number, base: number, baseDf: number): number {
  const d = Math.max(stat - df, base - baseDf, 0);
  return d > 0 ? 1 - Math.max(stat - df, 0) / d : 1;
}

function tliOf(stat: number, df: number, base: number, baseDf: number): number {
  return (base / baseDf - stat / df) / (base / baseDf - 1);
}

function scenario(random: Random): Scenario {
  const method = pick(random, ["lrt", "lrt", "lrt", "scaled_lrt", "scaled_lrt", "ic", "invariance", "invariance"] as const);
  const estimator: Estimator =
    method === "scaled_lrt"
      ? pick(random, ["MLR", "MLR", "MLM", "WLSMV"] as const)
      : method === "invariance"
        ? pick(random, ["ML", "ML", "MLR", "WLSMV"] as const)
        : method === "ic"
          ? pick(random, ["ML", "ML", "MLR"] as const)
          : "ML";
  const robust = estimator !== "ML";
  const groups = method === "invariance" ? integer(random, 2, 3) : random() < 0.1 ? 2 : 1;
  const n = Math.round(Math.exp(uniform(random, Math.log(120), Math.log(3000))));
  const nObserved = integer(random, 6, 24);
  const meanStructure = groups > 1 || random() < 0.3;
  const moments = groups * ((nObserved * (nObserved + 1)) / 2 + (meanStructure ? nObserved : 0));
  // Leave at least 2p free parameters in the restricted model (loadings and residual variances).
  const dfB = integer(random, 2, Math.max(3, Math.min(250, moments - 2 * nObserved * groups - 12)));
  const dDf = integer(random, 1, 12);
  const dfA = dfB + dDf;
  const misfit = uniform(random, 0.0, 0.11);
  const lambdaB = (misfit * misfit * n * dfB) / groups;
  const chisqB = Math.max(0.5, dfB + lambdaB + normal(random) * Math.sqrt(2 * (dfB + 2 * lambdaB)));
  const lambdaD = random() < 0.4 ? 0 : uniform(random, 0, 40);
  const chisqD = Math.max(0.05, dDf + lambdaD + normal(random) * Math.sqrt(2 * (dDf + 2 * lambdaD)));
  const chisqA = chisqB + chisqD;
  const baselineDf = groups * ((nObserved * (nObserved - 1)) / 2);
  const baselineChisq = baselineDf * uniform(random, 3, 14);
  const saturatedLoglik = -n * nObserved * uniform(random, 1.1, 1.9);
  const scalingB = robust ? uniform(random, 0.95, 1.5) : 1;
  // Keep the SB 2001 correction comfortably positive for consistent reports.
  const scalingA = robust ? Math.max(scalingB * (dfB / dfA) + 0.3 * (dDf / dfA), scalingB + uniform(random, -0.05, 0.1)) : 1;
  const llsB = robust ? uniform(random, 0.95, 1.6) : 1;
  const k = random() < 0.5 ? 2 : 3;
  return {
    method,
    estimator,
    robust,
    sbApplies: estimator === "MLR" || estimator === "MLM",
    n,
    groups,
    nObserved,
    meanStructure,
    moments,
    baselineChisq,
    baselineDf,
    baselineScaling: robust ? uniform(random, 1.0, 1.6) : 1,
    k,
    a: { df: dfA, chisq: chisqA, scaling: scalingA, loglikScaling: robust ? llsB * uniform(random, 0.7, 1.0) : 1, npar: moments - dfA, loglik: saturatedLoglik - chisqA / 2 },
    b: { df: dfB, chisq: chisqB, scaling: scalingB, loglikScaling: llsB, npar: moments - dfB, loglik: saturatedLoglik - chisqB / 2 },
  };
}

/** Which optional figures a paper prints (drawn once per comparison, shared by both models). */
interface Reporting {
  ci: boolean;
  cfi: boolean;
  tli: boolean;
  baseline: boolean;
  criteria: boolean;
  loglik: boolean;
  counts: boolean;
  scaling: boolean;
  scaled: boolean;
}

/**
 * Every column present, in one fixed order, unreported ones undefined: a sheet row has every column,
 * and same-shaped objects are what the sheet reader hands the engine.
 */
function emptyModel(): ModelInput {
  return {
    label: undefined, estimator: undefined, chisq: undefined, df: undefined, p: undefined, chisqScaled: undefined, scaling: undefined,
    cfi: undefined, tli: undefined, rmsea: undefined, rmseaLo: undefined, rmseaHi: undefined, srmr: undefined, aic: undefined, bic: undefined,
    loglik: undefined, loglikScaling: undefined, npar: undefined, nObserved: undefined, nFixedX: undefined, meanStructure: undefined,
    baselineChisq: undefined, baselineDf: undefined,
  };
}

function modelFigures(s: Scenario, m: TrueModel, r: Reporting, random: Random, label: string): ModelInput {
  const k = s.k;
  const scaled = m.chisq / m.scaling;
  const stat = s.robust ? scaled : m.chisq;
  const baseline = s.robust ? s.baselineChisq / s.baselineScaling : s.baselineChisq;
  const input = emptyModel();
  input.label = label;
  input.estimator = s.estimator;
  input.chisq = fixed(m.chisq, k);
  input.df = String(m.df);
  input.p = !s.robust || r.scaled ? printP(random, chisqUpperTail(stat, m.df), 3) : undefined;
  input.rmsea = fixed(rmseaOf(stat, m.df, s.n, s.groups), 3);
  if (s.robust) {
    if (r.scaled) input.chisqScaled = fixed(scaled, k);
    if (r.scaling || !r.scaled) input.scaling = fixed(m.scaling, 3);
  }
  if (r.ci) {
    const [lo, hi] = rmseaInterval(stat, m.df, s.n, s.groups);
    input.rmseaLo = fixed(lo, 3);
    input.rmseaHi = fixed(hi, 3);
  }
  if (r.cfi) input.cfi = fixed(cfiOf(stat, m.df, baseline, s.baselineDf), 3);
  if (r.tli) input.tli = fixed(tliOf(stat, m.df, baseline, s.baselineDf), 3);
  if (r.baseline) {
    input.baselineChisq = fixed(baseline, k);
    input.baselineDf = String(s.baselineDf);
  }
  const ml = s.estimator !== "WLSMV";
  if (r.criteria && ml) {
    input.aic = fixed(-2 * m.loglik + 2 * m.npar, k);
    input.bic = fixed(-2 * m.loglik + m.npar * Math.log(s.n), k);
  }
  if (r.loglik && ml) {
    input.loglik = fixed(m.loglik, k);
    if (s.estimator === "MLR") input.loglikScaling = fixed(m.loglikScaling, 3);
  }
  if (r.counts) {
    input.npar = String(m.npar);
    input.nObserved = String(s.nObserved);
    input.meanStructure = s.meanStructure ? "yes" : "no";
  }
  return input;
}

function comparisonFigures(s: Scenario, random: Random, index: number): ComparisonInput {
  const reporting: Reporting = {
    ci: random() < 0.6,
    cfi: random() < 0.85,
    tli: random() < 0.6,
    baseline: random() < 0.2,
    criteria: s.method === "ic" || random() < 0.3,
    loglik: random() < 0.25,
    counts: random() < 0.4,
    scaling: random() < 0.5,
    scaled: random() < 0.9,
  };
  const k = s.k;
  const restricted = modelFigures(s, s.a, reporting, random, `M${index}a`);
  const free = modelFigures(s, s.b, reporting, random, `M${index}b`);
  const dDf = s.a.df - s.b.df;
  const input: ComparisonInput = {
    label: `C${index}`,
    method: s.method,
    nested: "yes",
    alpha: undefined,
    dChisq: undefined,
    dDf: undefined,
    dP: undefined,
    dCfi: undefined,
    dRmsea: undefined,
    dAic: undefined,
    dBic: undefined,
    preferred: undefined,
    invarianceClaimed: undefined,
    sample: { label: "Sample 1", n: String(s.n), groups: String(s.groups) },
    restricted,
    free,
  };
  if (s.method !== "ic") {
    let dChisq = s.a.chisq - s.b.chisq;
    if (s.robust && s.sbApplies) {
      const cd = (s.a.df * s.a.scaling - s.b.df * s.b.scaling) / dDf;
      dChisq /= cd;
    } else if (s.robust) {
      // WLSMV: a DIFFTEST-like value that is neither the plain nor the naive scaled difference.
      dChisq = ((s.a.chisq - s.b.chisq) / s.b.scaling) * pick(random, [0.8, 0.85, 1.15, 1.2]) + pick(random, [-0.5, 0.5]);
      const naive = s.a.chisq / s.a.scaling - s.b.chisq / s.b.scaling;
      if (Math.abs(dChisq - naive) < 0.5) dChisq = naive + 1;
      if (dChisq <= 0.1) dChisq = 0.1 + Math.abs(dChisq);
    }
    input.dChisq = fixed(dChisq, k);
    input.dDf = String(dDf);
    input.dP = printP(random, chisqUpperTail(dChisq, dDf), 3);
  }
  if (s.method === "invariance") {
    const dCfi = Number(restricted.cfi ?? "0") - Number(free.cfi ?? "0");
    if (restricted.cfi && free.cfi) input.dCfi = fixed(dCfi, 3);
    const dRmsea = Number(restricted.rmsea) - Number(free.rmsea);
    input.dRmsea = fixed(dRmsea, 3);
    const holds = (!(restricted.cfi && free.cfi) || dCfi > -0.0095) && dRmsea < 0.0145;
    input.invarianceClaimed = holds ? "yes" : "no";
  }
  if (s.method === "ic" && restricted.aic && free.aic) {
    const dAic = Number(restricted.aic) - Number(free.aic);
    input.preferred = dAic > 0 ? "b" : "a";
    if (random() < 0.5) input.dAic = fixed(dAic, k);
  }
  return input;
}

const retext = (text: string | undefined, f: (x: number) => number, k = 3): string | undefined =>
  text === undefined ? undefined : fixed(f(Number(text.replace(/^[<>=p ]+/, ""))), k);

/**
 * Plants one error of the given kind; returns false when this comparison cannot carry it (for example a
 * scaled-difference error in an ML comparison), so the caller draws another kind.
 */
function plant(kind: PlantedError, c: ComparisonInput, s: Scenario, random: Random): boolean {
  const a = c.restricted;
  const b = c.free;
  const k = s.k;
  switch (kind) {
    case "df-difference-mismatch":
      if (c.dDf === undefined) return false;
      c.dDf = String(Number(c.dDf) + pick(random, [1, 2, -1].filter((d) => Number(c.dDf) + d > 0)));
      return true;
    case "chisq-difference-mismatch":
      if (c.dChisq === undefined || s.robust) return false;
      c.dChisq = fixed(Number(c.dChisq) * uniform(random, 1.15, 1.5) + 1, k);
      c.dP = printP(random, chisqUpperTail(Number(c.dChisq), Number(c.dDf)), 3);
      return true;
    case "difference-p-mismatch": {
      if (c.dChisq === undefined) return false;
      const p = chisqUpperTail(Number(c.dChisq), Number(c.dDf));
      if (p < 0.002 || p > 0.9) return false;
      // the p of a neighbouring df, on the same side of alpha
      const wrong = chisqUpperTail(Number(c.dChisq), Number(c.dDf) + 2);
      const sameSide = wrong < 0.05 === p < 0.05;
      if (!sameSide || (wrong >= 0.04 && wrong <= 0.06) || (p >= 0.04 && p <= 0.06) || Math.abs(wrong - p / 2) < 0.002) return false;
      c.dP = wrong.toFixed(3).replace(/^0/, "");
      return true;
    }
    case "difference-conclusion-changed": {
      if (c.dChisq === undefined) return false;
      const p = chisqUpperTail(Number(c.dChisq), Number(c.dDf));
      // away from alpha, where the printed Δχ²'s rounding could leave the side undecided
      if (p > 0.04 && p < 0.06) return false;
      c.dP = p < 0.05 ? pick(random, ["ns", "> .05", ".12"]) : p > 0.1 ? "< .05" : "< .01";
      return true;
    }
    case "halved-p": {
      if (c.dChisq === undefined) return false;
      const p = chisqUpperTail(Number(c.dChisq), Number(c.dDf));
      if (p < 0.02 || p > 0.9) return false;
      c.dP = (p / 2).toFixed(3).replace(/^0/, "");
      return true;
    }
    case "unscaled-robust-difference": {
      if (!s.robust || c.dChisq === undefined || a.chisqScaled === undefined || b.chisqScaled === undefined) return false;
      const naive = Number(a.chisqScaled) - Number(b.chisqScaled);
      // Only where the naive difference is clearly not the scaled one (with similar c they coincide).
      const cd = (s.a.df * s.a.scaling - s.b.df * s.b.scaling) / (s.a.df - s.b.df);
      const sb = s.sbApplies ? (s.a.chisq - s.b.chisq) / cd : Number(c.dChisq);
      // the spread of the recomputed SB value from scaling factors printed at 3 decimals
      const spread = s.sbApplies ? (sb * (s.a.df + s.b.df) * 0.0005) / (s.a.df - s.b.df) / cd + 0.01 : 0.01;
      if (naive <= 0 || Math.abs(naive - sb) < Math.max(1 + 3 * spread, 0.15 * sb)) return false;
      c.dChisq = fixed(naive, k);
      c.dP = printP(random, chisqUpperTail(naive, Number(c.dDf)), 3);
      c.method = c.method === "ic" ? "lrt" : c.method;
      return true;
    }
    case "scaled-difference-mismatch": {
      if (!s.robust || !s.sbApplies || c.dChisq === undefined || (a.scaling === undefined && a.chisqScaled === undefined)) return false;
      if (b.scaling === undefined && b.chisqScaled === undefined) return false;
      // A small cd leaves T undetermined at printed precision: plant only where cd is well pinned.
      const cd = (s.a.df * s.a.scaling - s.b.df * s.b.scaling) / (s.a.df - s.b.df);
      if (cd < ((s.a.df + s.b.df) * 0.05) / (s.a.df - s.b.df)) return false;
      c.dChisq = fixed(Number(c.dChisq) * uniform(random, 1.4, 2) + 3, k);
      c.dP = printP(random, chisqUpperTail(Number(c.dChisq), Number(c.dDf)), 3);
      return true;
    }
    case "negative-scaling-correction": {
      if (!s.robust || !s.sbApplies || c.dChisq === undefined) return false;
      // c_A small enough that df_A·c_A < df_B·c_B
      const cB = 1.4;
      const cA = (s.b.df * cB) / s.a.df - 0.2;
      if (cA <= 0.3) return false;
      a.scaling = fixed(cA, 3);
      b.scaling = fixed(cB, 3);
      a.chisqScaled = fixed(s.a.chisq / cA, k);
      b.chisqScaled = fixed(s.b.chisq / cB, k);
      for (const m of [a, b]) {
        m.p = undefined;
        m.rmsea = undefined;
        m.rmseaLo = undefined;
        m.rmseaHi = undefined;
        m.cfi = undefined;
        m.tli = undefined;
      }
      c.dCfi = undefined;
      c.dRmsea = undefined;
      c.invarianceClaimed = undefined;
      a.loglikScaling = undefined;
      return true;
    }
    case "model-p-mismatch": {
      const stat = Number(s.robust ? a.chisqScaled : a.chisq);
      if (a.p === undefined || !Number.isFinite(stat)) return false;
      const p = chisqUpperTail(stat, s.a.df);
      const wrong = chisqUpperTail(stat * 0.8, s.a.df);
      if (p < 0.06 || wrong > 0.95 || Math.abs(wrong - p / 2) < 0.01) return false;
      a.p = wrong.toFixed(3).replace(/^0/, "");
      return true;
    }
    case "rmsea-mismatch": {
      // Beyond every convention the engine accepts (ML and scaled χ², with and without √G).
      const highest = Math.max(rmseaOf(s.b.chisq, s.b.df, s.n - 1, s.groups), rmseaOf(s.b.chisq / s.b.scaling, s.b.df, s.n - 1, s.groups));
      b.rmsea = fixed(highest + 0.05 + 0.5 * highest, 3);
      c.dRmsea = undefined;
      c.invarianceClaimed = undefined;
      return true;
    }
    case "rmsea-interval-mismatch":
      if (b.rmseaLo === undefined || b.rmseaHi === undefined) return false;
      b.rmseaHi = retext(b.rmseaHi, (x) => 2 * x + 0.05);
      return true;
    case "cfi-mismatch":
    case "tli-mismatch": {
      const key = kind === "cfi-mismatch" ? "cfi" : "tli";
      const index = kind === "cfi-mismatch" ? cfiOf : tliOf;
      if (a[key] === undefined || a.baselineChisq === undefined) return false;
      const readings = [index(s.a.chisq, s.a.df, Number(a.baselineChisq), s.baselineDf), index(s.a.chisq / s.a.scaling, s.a.df, Number(a.baselineChisq), s.baselineDf)];
      const lowest = Math.min(...readings);
      if (lowest < 0.3) return false;
      a[key] = fixed(lowest - 0.06, 3);
      c.dCfi = undefined;
      c.invarianceClaimed = undefined;
      return true;
    }
    case "df-recount-mismatch":
      if (a.npar === undefined) return false;
      a.npar = String(Number(a.npar) + 1);
      return true;
    case "information-criteria-inconsistent":
      if (a.aic === undefined || b.aic === undefined) return false;
      a.aic = fixed(Number(a.aic) + pick(random, [10, -10, 90, -90]), k);
      c.dAic = undefined;
      c.preferred = undefined;
      return true;
    case "preferred-model-contradicts-criteria": {
      if (c.method !== "ic" || a.aic === undefined || b.aic === undefined) return false;
      const dAic = Number(a.aic) - Number(b.aic);
      const dBic = a.bic !== undefined && b.bic !== undefined ? Number(a.bic) - Number(b.bic) : dAic;
      if (Math.abs(dAic) < 0.1 || dAic > 0 !== dBic > 0) return false;
      c.preferred = dAic > 0 ? "a" : "b";
      return true;
    }
    case "lrt-on-non-nested":
      if (c.method !== "lrt" && c.method !== "scaled_lrt") return false;
      c.nested = "no";
      return true;
    case "invariance-cutoff-exceeded":
      // only where the printed change clearly passes a cutoff (ΔCFI ≤ −.011 or ΔRMSEA ≥ .016)
      if (c.method !== "invariance" || c.invarianceClaimed === "yes") return false;
      if (!(Number(c.dCfi ?? "0") <= -0.011 || Number(c.dRmsea ?? "0") >= 0.016)) return false;
      c.invarianceClaimed = "yes";
      return true;
    case "delta-fit-mismatch":
      if (c.dRmsea === undefined) return false;
      c.dRmsea = fixed(-Number(c.dRmsea) + (Number(c.dRmsea) === 0 ? 0.01 : 0), 3);
      if (Number(c.dRmsea) === -Number(c.dRmsea)) return false;
      if (c.invarianceClaimed === "yes" && Number(c.dRmsea) >= 0.0145) c.invarianceClaimed = "no";
      return true;
    case "p-printed-as-zero":
      if (a.p !== "< .001") return false;
      a.p = pick(random, [".000", "0.000", "= .000"]);
      return true;
    case "restricted-model-order":
      c.restricted = b;
      c.free = a;
      return true;
    case "just-identified-model":
      if (s.robust) return false;
      b.df = "0";
      b.chisq = "0.00";
      for (const key of ["p", "rmsea", "rmseaLo", "rmseaHi", "cfi", "tli", "npar", "aic", "bic", "loglik"] as const) b[key] = undefined;
      c.dDf = undefined;
      c.dCfi = undefined;
      c.dRmsea = undefined;
      c.invarianceClaimed = undefined;
      if (c.dChisq !== undefined) {
        c.dChisq = a.chisq;
        c.dP = a.p;
      }
      return true;
    case "negative-df":
      a.df = String(-integer(random, 1, 5));
      for (const key of ["npar", "aic", "bic", "loglik", "p", "rmsea", "rmseaLo", "rmseaHi"] as const) a[key] = undefined;
      c.dDf = undefined;
      c.dP = undefined;
      c.dChisq = undefined;
      c.dRmsea = undefined;
      c.invarianceClaimed = undefined;
      return true;
    case "zero-df-difference":
      if (c.method === "ic") return false;
      c.dDf = "0";
      b.df = a.df;
      for (const key of ["p", "rmsea", "rmseaLo", "rmseaHi", "npar", "aic", "bic", "cfi", "tli"] as const) b[key] = undefined;
      c.dP = undefined;
      c.dCfi = undefined;
      c.dRmsea = undefined;
      c.invarianceClaimed = undefined;
      return true;
    case "negative-chisq-difference":
      if (s.robust || c.method === "ic") return false;
      [a.chisq, b.chisq] = [b.chisq, a.chisq];
      for (const m of [a, b]) for (const key of ["p", "rmsea", "rmseaLo", "rmseaHi", "cfi", "tli", "aic", "bic", "loglik"] as const) m[key] = undefined;
      c.dChisq = undefined;
      c.dP = undefined;
      c.dRmsea = undefined;
      c.dCfi = undefined;
      c.invarianceClaimed = undefined;
      return true;
  }
}

/** Comparisons with their planted error (null = consistent). */
export function generateLabelledComparisons({ count, seed, errorShare = 0.25 }: GenerateOptions): GeneratedComparison[] {
  const random = prng(seed);
  const out: GeneratedComparison[] = [];
  for (let i = 0; i < count; i++) {
    const s = scenario(random);
    const input = comparisonFigures(s, random, i + 1);
    let planted: PlantedError | null = null;
    if (random() < errorShare) {
      for (let attempt = 0; attempt < 8 && planted === null; attempt++) {
        const kind = pick(random, PLANTED_ERRORS);
        if (plant(kind, input, s, random)) planted = kind;
      }
    }
    out.push({ input, planted });
  }
  return out;
}

/** Realistic synthetic comparisons (a quarter with one planted reporting error), deterministic in `seed`. */
export function generateComparisons(options: GenerateOptions): ComparisonInput[] {
  return generateLabelledComparisons(options).map((g) => g.input);
}
