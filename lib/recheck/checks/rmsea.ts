// RMSEA and its 90 % confidence interval under every common convention.
//
// Point estimate: √(max(0, (χ² − df) / (df · N))) (Steiger & Lind 1980), with N or N − 1 (the Wishart
// likelihood of LISREL/EQS; N − G per group in lavaan), times √G for several groups (Steiger 1998) or
// not. For robust estimators also from the scaled χ² ("naive" scaled RMSEA), and the robust RMSEA of
// Brosseau-Liard, Savalei & Li (2012): √(max(0, (χ² − c·df)/(N·df))).
// Interval: invert the noncentral χ² (Browne & Cudeck 1993): the lower bound's λ solves F(χ²; df, λ) =
// .95 (0 if F(χ²; df, 0) < .95), the upper bound's F = .05, and a bound is √(λ / (N·df)) (·√G).
//
// Checking a printed bound needs no root finding: F falls in λ and rises in χ², so the printed bound's
// interval meets the recomputed one iff the CDF condition changes sign across it (two CDF evaluations).
// Roots are only found, lazily, to report the recomputed interval when nothing matched.
import {
  noncentralCdfTests as noncentralCdfTestsImport,
  noncentralityForCdf as noncentralityForCdfImport,
} from "../distributions/noncentral";
import { meets as meetsImport, show as showImport, showInterval as showIntervalImport } from "../interval";
import type { PrintedNumber } from "../printed";
import type { Interval } from "../types";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const meets = meetsImport;
const noncentralCdfTests = noncentralCdfTestsImport;
const noncentralityForCdf = noncentralityForCdfImport;
const show = showImport;
const showInterval = showIntervalImport;

/** One corner of the outer enclosure for the CI check: statistic x, its df, and λ = bound² · k. */
interface Corner {
  x: number;
  df: number;
  k: number;
}

export interface RmseaConvention {
  name: string;
  point: Interval;
  /** corner giving the largest bound (largest χ², its df and scale) */
  high: Corner;
  /** corner giving the smallest bound */
  low: Corner;
  /** the central value, for reporting a recomputed interval */
  mid: Corner;
}

export interface RmseaInputs {
  n: number;
  groups: number;
  df: number;
  chisq: Interval | null;
  /** scaled χ², printed or χ²/c */
  scaled: Interval | null;
  /** χ² scaling correction factor, printed or χ²/χ²_scaled */
  scaling: Interval | null;
  robust: boolean;
  chisqValue: number | null;
  scaledValue: number | null;
  scalingValue: number | null;
}

function rmseaOf(stat: number, df: number, n: number, gFactor: number): number {
  const excess = stat - df;
  return excess > 0 ? Math.sqrt(excess / (df * n)) * gFactor : 0;
}

/** Robust RMSEA point estimate (Brosseau-Liard, Savalei & Li 2012): √(max(0, (χ² − c·df)/(N·df))) · g. */
function robustRmseaOf(chisq: number, c: number, df: number, n: number, gFactor: number): number {
  const excess = chisq - c * df;
  return excess > 0 ? Math.sqrt(excess / (df * n)) * gFactor : 0;
}

/**
 * The sample sizes and group factors every family of conventions is tried with, and the list being
 * built. The families are module-level functions rather than closures in rmseaConventions: under tsx
 * (the engine benchmark) every closure created at run time is also named (esbuild's keepNames).
 */
interface ConventionGrid {
  sizes: Array<[number, string]>;
  gFactors: Array<[number, string]>;
  df: number;
  conventions: RmseaConvention[];
}

function addPlain(grid: ConventionGrid, stat: Interval, mid: number, statName: string): void {
  const { df } = grid;
  for (const [size, sizeName] of grid.sizes) {
    if (!(size > 0)) continue;
    for (const [g, gName] of grid.gFactors) {
      const k = (size * df) / (g * g);
      grid.conventions.push({
        name: `${statName}, ${sizeName}${gName}`,
        point: { lo: rmseaOf(stat.lo, df, size, g), hi: rmseaOf(stat.hi, df, size, g) },
        high: { x: stat.hi, df, k },
        low: { x: stat.lo, df, k },
        mid: { x: mid, df, k },
      });
    }
  }
}

function addRobustVariants(grid: ConventionGrid, inputs: RmseaInputs): void {
  const { chisq, scaled, scaling } = inputs;
  const { df } = grid;
  if (scaled !== null) addPlain(grid, scaled, inputs.scaledValue ?? (scaled.lo + scaled.hi) / 2, "scaled χ²");
  if (chisq !== null && scaling !== null) {
    // lavaan's scaled interval: ML χ² against a noncentral χ² with c·df degrees of freedom, bound
    // √(λ/(N·c·df)); its point estimate equals the naive scaled one.
    const cMid = inputs.scalingValue ?? (scaling.lo + scaling.hi) / 2;
    for (const [size, sizeName] of grid.sizes) {
      if (!(size > 0)) continue;
      for (const [g, gName] of grid.gFactors) {
        grid.conventions.push({
          name: `ML χ² with c·df, ${sizeName}${gName}`,
          point: { lo: rmseaOf(chisq.lo / scaling.hi, df, size, g), hi: rmseaOf(chisq.hi / scaling.lo, df, size, g) },
          high: { x: chisq.hi, df: scaling.lo * df, k: (size * scaling.lo * df) / (g * g) },
          low: { x: chisq.lo, df: scaling.hi * df, k: (size * scaling.hi * df) / (g * g) },
          mid: { x: inputs.chisqValue ?? chisq.lo, df: cMid * df, k: (size * cMid * df) / (g * g) },
        });
      }
    }
  }
  if (scaled !== null && scaling !== null && chisq !== null) {
    // Robust RMSEA (Brosseau-Liard, Savalei & Li 2012); its interval comes from the scaled χ² and is
    // scaled back by c: bound = √(c·λ/(N·df)), so λ = bound² · N·df / c. Each input is taken at the
    // end that widens the result: an outer enclosure, since c and the scaled χ² are not independent.
    const cMid = inputs.scalingValue ?? (scaling.lo + scaling.hi) / 2;
    for (const [size, sizeName] of grid.sizes) {
      if (!(size > 0)) continue;
      for (const [g, gName] of grid.gFactors) {
        grid.conventions.push({
          name: `robust (Brosseau-Liard et al. 2012), ${sizeName}${gName}`,
          point: { lo: robustRmseaOf(chisq.lo, scaling.hi, df, size, g), hi: robustRmseaOf(chisq.hi, scaling.lo, df, size, g) },
          high: { x: scaled.hi, df, k: (size * df) / (g * g * scaling.hi) },
          low: { x: scaled.lo, df, k: (size * df) / (g * g * scaling.lo) },
          mid: { x: inputs.scaledValue ?? scaled.lo, df, k: (size * df) / (g * g * cMid) },
        });
      }
    }
  }
}

/** The conventions to try, most likely first (scaled ones first for robust estimators). */
export function rmseaConventions(inputs: RmseaInputs): RmseaConvention[] {
  const { n, groups, df, chisq, scaled, scaling } = inputs;
  const sizes: Array<[number, string]> = [[n, "N"]];
  if (groups > 1) sizes.push([n - groups, "N − G"]);
  if (n - 1 > 0) sizes.push([n - 1, "N − 1"]);
  const gFactors: Array<[number, string]> = groups > 1 ? [[Math.sqrt(groups), ", ×√G"], [1, ", without √G"]] : [[1, ""]];
  const grid: ConventionGrid = { sizes, gFactors, df, conventions: [] };
  if (inputs.robust && (scaled !== null || scaling !== null)) {
    addRobustVariants(grid, inputs);
    if (chisq !== null) addPlain(grid, chisq, inputs.chisqValue ?? chisq.lo, "ML χ²");
  } else if (chisq !== null) {
    addPlain(grid, chisq, inputs.chisqValue ?? chisq.lo, "ML χ²");
    if (inputs.robust) addRobustVariants(grid, inputs);
  }
  return grid.conventions;
}

/**
 * The most likely convention (scaled χ² for robust estimators when available, else ML χ²; N; ×√G for
 * several groups). The consistent case needs no objects for it: primaryPointMeets and
 * primaryIntervalMeets test it from the statistic's interval directly; primaryConvention builds it as
 * an RmseaConvention for the rarer cases that need one (a mismatch to report).
 */
function primaryGroupFactor(groups: number): number {
  return groups > 1 ? Math.sqrt(groups) : 1;
}

export function primaryConventionName(useScaled: boolean, groups: number): string {
  return useScaled ? (groups > 1 ? "scaled χ², N, ×√G" : "scaled χ², N") : groups > 1 ? "ML χ², N, ×√G" : "ML χ², N";
}

/** The primary convention's point interval meets the printed RMSEA. */
export function primaryPointMeets(printed: PrintedNumber, stat: Interval, df: number, n: number, groups: number): boolean {
  const g = primaryGroupFactor(groups);
  return meets(printed.lo, printed.hi, rmseaOf(stat.lo, df, n, g), rmseaOf(stat.hi, df, n, g));
}

/** The primary convention's point interval. */
export function primaryPoint(stat: Interval, df: number, n: number, groups: number): Interval {
  const g = primaryGroupFactor(groups);
  return { lo: rmseaOf(stat.lo, df, n, g), hi: rmseaOf(stat.hi, df, n, g) };
}

/** Both printed bounds (where printed) are reproduced under the primary convention (see intervalMeets). */
export function primaryIntervalMeets(lower: PrintedNumber | null, upper: PrintedNumber | null, stat: Interval, df: number, n: number, groups: number): boolean {
  const k = (n * df) / groups;
  return cornersMeet(lower, upper, stat.hi, df, k, stat.lo, df, k);
}

export function primaryConvention(inputs: RmseaInputs): RmseaConvention | null {
  const { n, groups, df } = inputs;
  const useScaled = inputs.robust && inputs.scaled !== null;
  const stat = useScaled ? inputs.scaled : inputs.chisq;
  if (stat === null) return null;
  const k = (n * df) / groups;
  const mid = useScaled ? (inputs.scaledValue ?? stat.lo) : (inputs.chisqValue ?? stat.lo);
  return {
    name: primaryConventionName(useScaled, groups),
    point: primaryPoint(stat, df, n, groups),
    high: { x: stat.hi, df, k },
    low: { x: stat.lo, df, k },
    mid: { x: mid, df, k },
  };
}

/** Index of the first convention whose point interval meets the printed RMSEA, or −1. */
export function matchRmseaPoint(printed: PrintedNumber, conventions: RmseaConvention[]): number {
  for (let i = 0; i < conventions.length; i++) {
    const point = conventions[i].point;
    if (meets(printed.lo, printed.hi, point.lo, point.hi)) return i;
  }
  return -1;
}

const SLACK = 1e-12;

/** First convention (trying `first` before the rest) under which every printed bound is reproduced. */
export function matchRmseaInterval(
  lower: PrintedNumber | null,
  upper: PrintedNumber | null,
  conventions: RmseaConvention[],
  first: number,
): number {
  if (first >= 0 && intervalMeets(lower, upper, conventions[first])) return first;
  for (let i = 0; i < conventions.length; i++) if (i !== first && intervalMeets(lower, upper, conventions[i])) return i;
  return -1;
}

/**
 * Both printed bounds (where printed) are reproduced under this convention: each printed bound's
 * interval [lo, hi] (in RMSEA units) meets the bound recomputed at level .95 (lower) or .05 (upper).
 * Sign tests at the two corners (see file comment):
 *   printed.lo ≤ recomputed maximum  ⇔  F(x_high; df, λ(printed.lo)) ≥ level (or λ = 0),
 *   printed.hi ≥ recomputed minimum  ⇔  F(x_low; df, λ(printed.hi)) < level (or x_low ≤ 0: the χ²
 *   interval reaches 0, so the recomputed bound can be 0).
 * The tests at one corner are made in one call, so that each can start from where the previous one left
 * the series (noncentralCdfTests).
 */
export function intervalMeets(lower: PrintedNumber | null, upper: PrintedNumber | null, convention: RmseaConvention): boolean {
  const { high, low } = convention;
  return cornersMeet(lower, upper, high.x, high.df, high.k, low.x, low.df, low.k);
}

/**
 * intervalMeets for the corners (x, df, k) given as numbers. Where both corners have the same df (all
 * but the c·df conventions) the upper-end tests are first tried at x_high, in the same call as the
 * lower-end ones, so that all four share one start of the series (noncentralCdfTests): F rises in x, so
 * F(x_high; λ) < level implies F(x_low; λ) < level. Only an upper-end test that fails there (F within
 * the two corners' difference of the level) is decided at x_low.
 */
function cornersMeet(
  lower: PrintedNumber | null,
  upper: PrintedNumber | null,
  highX: number,
  highDf: number,
  highK: number,
  lowX: number,
  lowDf: number,
  lowK: number,
): boolean {
  // λ of each printed end (NaN: no test; a printed lower end of 0 needs none)
  const lowerLo = lower !== null && lower.lo > 0 ? lower.lo * lower.lo * highK : 0;
  const upperLo = upper !== null && upper.lo > 0 ? upper.lo * upper.lo * highK : 0;
  const lambdaLowerLo = lowerLo > 0 ? lowerLo : Number.NaN;
  const lambdaUpperLo = upperLo > 0 ? upperLo : Number.NaN;
  const highTests = lowerLo > 0 || upperLo > 0;
  if (highTests && !(highX > 0)) return false;
  if (lowX <= 0) {
    return !highTests || noncentralCdfTests(highX, highDf, lambdaLowerLo, 0.95 - SLACK, Number.NaN, 0, lambdaUpperLo, 0.05 - SLACK, Number.NaN, 0) === 0;
  }
  const lambdaLowerHi = lower !== null ? lower.hi * lower.hi * lowK : Number.NaN;
  const lambdaUpperHi = upper !== null ? upper.hi * upper.hi * lowK : Number.NaN;
  // the upper-end tests still to decide at x_low, as noncentralCdfTests' bits
  let open = 2 | 8;
  if (highDf === lowDf && highX >= lowX) {
    const failed = noncentralCdfTests(highX, highDf, lambdaLowerLo, 0.95 - SLACK, lambdaLowerHi, 0.95 + SLACK, lambdaUpperLo, 0.05 - SLACK, lambdaUpperHi, 0.05 + SLACK);
    if (failed <= 0) return failed === 0;
    open = failed;
  } else if (highTests && noncentralCdfTests(highX, highDf, lambdaLowerLo, 0.95 - SLACK, Number.NaN, 0, lambdaUpperLo, 0.05 - SLACK, Number.NaN, 0) !== 0) {
    return false;
  }
  const lowerHi = (open & 2) !== 0 ? lambdaLowerHi : Number.NaN;
  const upperHi = (open & 8) !== 0 ? lambdaUpperHi : Number.NaN;
  return noncentralCdfTests(lowX, lowDf, Number.NaN, 0, lowerHi, 0.95 + SLACK, Number.NaN, 0, upperHi, 0.05 + SLACK) === 0;
}

/** The recomputed 90 % interval at the convention's central values (root finding: only on mismatch). */
export function recomputeRmseaInterval(convention: RmseaConvention): Interval {
  const { x, df, k } = convention.mid;
  const lower = noncentralityForCdf(x, df, 0.95);
  const upper = noncentralityForCdf(x, df, 0.05);
  return { lo: Math.sqrt(lower / k), hi: Math.sqrt(upper / k) };
}

export function describePoint(convention: RmseaConvention): string {
  return `${showInterval(convention.point.lo, convention.point.hi, 4)} (${convention.name})`;
}

export function describeInterval(bounds: Interval, convention: RmseaConvention): string {
  return `[${show(bounds.lo, 4)}, ${show(bounds.hi, 4)}] (${convention.name})`;
}
