// Central chi-square distribution through the regularised incomplete gamma functions:
// P(X > x) = Q(df/2, x/2), P(X ≤ x) = P(df/2, x/2) (e.g. Johnson, Kotz & Balakrishnan 1994, ch. 18).
import type { Interval } from "../types";
import {
  gammaPrefactor as gammaPrefactorImport,
  regularizedGammaP as regularizedGammaPImport,
  regularizedGammaQ as regularizedGammaQImport,
  regularizedGammaQInterval as regularizedGammaQIntervalImport,
} from "./gamma";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const gammaPrefactor = gammaPrefactorImport;
const regularizedGammaP = regularizedGammaPImport;
const regularizedGammaQ = regularizedGammaQImport;
const regularizedGammaQInterval = regularizedGammaQIntervalImport;

/**
 * Upper tail P(X > x) for X ~ χ²(df), the same quantity as R's pchisq(x, df, lower.tail = FALSE).
 * Computed directly as Q(df/2, x/2), never as 1 − CDF (DESIGN §4.2). df = 0 is the point mass at 0.
 * Returns NaN only for df < 0 or NaN arguments, which callers never pass.
 */
export function chisqUpperTail(x: number, df: number): number {
  if (df === 0) return 0;
  return regularizedGammaQ(df / 2, x / 2);
}

/**
 * The upper tails at both ends of a statistic's interval [lo, hi] (0 ≤ lo ≤ hi): the p interval
 * [P(X > hi), P(X > lo)]. P(X > hi) agrees with chisqUpperTail(hi, df) within ~1e-14 relative (the same
 * quantity by cheaper evaluations, see regularizedGammaQInterval); P(X > lo) comes from it by the short
 * Taylor integral of regularizedGammaQInterval, about a third of the cost of a second evaluation.
 */
export function chisqUpperTailInterval(lo: number, hi: number, df: number): Interval {
  if (df === 0) return { lo: 0, hi: 0 };
  return regularizedGammaQInterval(df / 2, lo / 2, hi / 2);
}

/** Lower tail P(X ≤ x) for X ~ χ²(df). */
export function chisqCdf(x: number, df: number): number {
  if (df === 0) return x >= 0 ? 1 : 0;
  return regularizedGammaP(df / 2, x / 2);
}

/** Density of χ²(df) at x > 0: (x/2)^(df/2) e^(−x/2) / Γ(df/2) / x. */
export function chisqDensity(x: number, df: number): number {
  if (x <= 0) return 0;
  return gammaPrefactor(df / 2, x / 2) / x;
}

/**
 * The x with P(X > x) = p for X ~ χ²(df) (R's qchisq(p, df, lower.tail = FALSE)). Starts from the
 * Wilson & Hilferty (1931) cube-root approximation and refines by safeguarded Newton steps on the log of the
 * upper tail, keeping a bracket so a poor start can never diverge.
 */
export function chisqUpperQuantile(p: number, df: number): number {
  if (!(p > 0 && p <= 1) || !(df > 0)) return p === 0 ? Infinity : Number.NaN;
  if (p === 1) return 0;
  // Wilson–Hilferty: (X/df)^(1/3) ≈ N(1 − 2/(9df), 2/(9df)).
  const z = standardNormalUpperQuantile(p);
  const h = 2 / (9 * df);
  let x = df * Math.pow(Math.max(1 - h + z * Math.sqrt(h), 1e-3), 3);
  let lo = 0;
  let hi = Infinity;
  for (let i = 0; i < 200; i++) {
    const q = chisqUpperTail(x, df);
    if (q > p) lo = x;
    else hi = x;
    const density = chisqDensity(x, df);
    // Newton on ln Q (d ln Q/dx = −f/Q): in the far tail Q falls like e^(−x/2), where a step on Q
    // itself would only move x by about 2.
    let next = density > 0 && q > 0 ? x + ((Math.log(q) - Math.log(p)) * q) / density : Number.NaN;
    if (!(next > lo && next < hi)) next = hi === Infinity ? Math.max(2 * x, x + 1) : (lo + hi) / 2;
    if (Math.abs(next - x) <= 1e-15 * Math.max(1, x)) return next;
    x = next;
  }
  return x;
}

/**
 * Upper quantile of the standard normal by Acklam's (2003) rational approximation (relative error
 * ~1e-9), used only as a starting value (here and by noncentralityForCdf).
 */
export function standardNormalUpperQuantile(p: number): number {
  const a = [-39.69683028665376, 220.9460984245205, -275.9285104469687, 138.357751867269, -30.66479806614716, 2.506628277459239];
  const b = [-54.47609879822406, 161.5858368580409, -155.6989798598866, 66.80131188771972, -13.28068155288572];
  const c = [-0.007784894002430293, -0.3223964580411365, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783];
  const d = [0.007784695709041462, 0.3224671290700398, 2.445134137142996, 3.754408661907416];
  const lower = 1 - p; // the lower-tail probability whose quantile equals the upper-p quantile
  const pLow = 0.02425;
  if (lower < pLow) {
    const q = Math.sqrt(-2 * Math.log(lower));
    return (((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
  }
  if (lower > 1 - pLow) {
    const q = Math.sqrt(-2 * Math.log(p));
    return -(((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) / ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
  }
  const q = lower - 0.5;
  const r = q * q;
  return ((((((a[0] * r + a[1]) * r + a[2]) * r + a[3]) * r + a[4]) * r + a[5]) * q) / (((((b[0] * r + b[1]) * r + b[2]) * r + b[3]) * r + b[4]) * r + 1);
}
