// Log-gamma and the regularised incomplete gamma functions P(a, x) and Q(a, x) = 1 − P(a, x).
//
// Method (Press, Teukolsky, Vetterling & Flannery, Numerical Recipes, 3rd ed., §6.2): the power series
// for P when x < a + 1, and the continued fraction for Q when x ≥ a + 1, evaluated by the forward
// recurrences of its convergents (the fundamental recurrence formulas; Jones & Thron 1980, Continued
// Fractions: Analytic Theory and Applications, §2.1) with rescaling against overflow. Q is thus
// computed directly in the upper tail and never as 1 − P there, so it keeps full relative precision
// down to the smallest doubles (DESIGN §4.2); 1 − P is only used where P < ~0.6, i.e. where Q is not
// small.
//
// The prefactor x^a e^−x / Γ(a) is the delicate part for large a (its logarithm is a difference of
// numbers near a·ln a). It is computed as in Loader (2000), "Fast and accurate computation of binomial
// probabilities": sqrt(a / 2π) · exp(−[x − a − a·ln(x/a)] − δ(a)), with the bracket written through
// log1p and δ(a) the Stirling-series remainder of ln Γ(a) — the same construction R's pgamma uses.

import type { Interval } from "../types";

const LN_SQRT_2PI = 0.9189385332046727; // ln √(2π)
// The loops' constants (relative tolerance 1e-16, at most 100 000 terms) are declared inside each
// function on purpose: V8 reloads a module-level binding on every iteration, and assigning one inside
// a loop made it box the loop's numbers (a heap allocation per iteration).

/**
 * δ(a) = ln Γ(a) − [(a − ½) ln a − a + ln √(2π)], the remainder of Stirling's series, for a ≥ 10:
 * 1/(12a) − 1/(360a³) + 1/(1260a⁵) − 1/(1680a⁷) + 1/(1188a⁹) − 691/(360360a¹¹) + 1/(156a¹³)
 * (Abramowitz & Stegun 6.1.40; the truncation error at a = 10 is below 1e-17).
 */
function stirlingRemainder(a: number): number {
  const r = 1 / a;
  const r2 = r * r;
  return r * (1 / 12 - r2 * (1 / 360 - r2 * (1 / 1260 - r2 * (1 / 1680 - r2 * (1 / 1188 - r2 * (691 / 360360 - r2 / 156))))));
}

/**
 * ln Γ(x) for x > 0: Stirling's series for x ≥ 10 (Abramowitz & Stegun 6.1.40), and below that the
 * recurrence Γ(x) = Γ(x + n) / [x (x + 1) … (x + n − 1)] up to x + n ≥ 10. Relative error ~1e-15.
 */
export function logGamma(x: number): number {
  if (!(x > 0)) return Number.NaN;
  if (x >= 10) return (x - 0.5) * Math.log(x) - x + LN_SQRT_2PI + stirlingRemainder(x);
  let product = 1;
  let y = x;
  while (y < 10) {
    product *= y;
    y += 1;
  }
  return (y - 0.5) * Math.log(y) - y + LN_SQRT_2PI + stirlingRemainder(y) - Math.log(product);
}

/**
 * 1/Γ(n/2) for n = 1 … 19 (entry 0 unused): 1/(n/2 − 1)! for even n, and for odd n = 2m + 1
 * 1/Γ(m + ½) = 2^m / [(2m − 1)!! √π] (Abramowitz & Stegun 6.1.12), whose rational part is exact in
 * doubles, so each entry is within two roundings of the true value.
 */
const INVERSE_GAMMA_OF_HALVES = ((): Float64Array => {
  const table = new Float64Array(20);
  const inverseSqrtPi = 0.5641895835477563; // 1/√π
  let factorial = 1; // (m − 1)! for n = 2m
  let doubleFactorial = 1; // (2m − 1)!! for n = 2m + 1
  let powerOfTwo = 1; // 2^m
  for (let m = 0; 2 * m + 1 < 20; m++) {
    if (m > 0) {
      doubleFactorial *= 2 * m - 1;
      powerOfTwo *= 2;
      table[2 * m] = 1 / factorial;
      factorial *= m;
    }
    table[2 * m + 1] = (powerOfTwo / doubleFactorial) * inverseSqrtPi;
  }
  return table;
})();

/**
 * x^a e^−x / Γ(a), without overflow or cancellation (Loader 2000; see the file comment).
 * Returns 0 when the result underflows. Tried and dropped for a < 10: shifting to a + n ≥ 10 through
 * Γ(a + n) = Γ(a)·a(a + 1)…(a + n − 1), one logarithm and one exp instead of three logarithms, measured
 * only 1.7 % faster on the engine's calls and no faster inside regularizedGammaQ. Tried and dropped for
 * a ≥ 10: δ(a) and √(a/2π) from tables for half-integer a (bit-identical), 0.3 % of the engine, no more.
 */
export function gammaPrefactor(a: number, x: number): number {
  if (x <= 0) return 0;
  if (a < 10) {
    const logValue = a * Math.log(x) - x - logGamma(a);
    return logValue < -745 ? 0 : Math.exp(logValue);
  }
  // x − a − a·ln(x/a) = a·[u − ln(1 + u)] with u = (x − a)/a: written with log1p it keeps its
  // precision when x is near a, which is exactly where chi-square tests of large df live.
  const u = (x - a) / a;
  const deviance = x - a - a * Math.log1p(u);
  const logValue = -deviance - stirlingRemainder(a);
  if (logValue < -745) return 0;
  return Math.sqrt(a / (2 * Math.PI)) * Math.exp(logValue);
}

/**
 * gammaPrefactor for 0 < a < 10, x > 0, as regularizedGammaQInterval uses it. gammaPrefactor itself keeps
 * the logarithmic form: the noncentral root searches (RMSEA bounds near 0) turn its last-bit changes
 * into changes of ~1e-11 in their roots, so its results are left exactly as they were.
 */
function smallPrefactor(a: number, x: number): number {
  // a = n/2 with n < 20 and e^−x not underflowing: x^a e^−x / Γ(a) = e^−x · x^⌊a⌋ · (√x when a is a
  // half-integer) · [1/Γ(a)] from the table — one exp and at most ten multiplications, where the
  // logarithmic form below takes three logarithms (ln x and ln Γ's two) and an exp.
  const twice = 2 * a;
  if (x <= 700 && twice === Math.floor(twice)) {
    let power = twice & 1 ? Math.sqrt(x) : 1;
    for (let k = twice >> 1; k > 0; k--) power *= x;
    return Math.exp(-x) * power * INVERSE_GAMMA_OF_HALVES[twice];
  }
  return gammaPrefactor(a, x);
}

/** Power series of P(a, x) without the prefactor: Σ x^n / [a (a+1) … (a+n)] (Numerical Recipes gser). */
function lowerSeries(a: number, x: number): number {
  const EPSILON = 1e-16;
  const MAX_ITERATIONS = 100_000;
  let term = 1 / a;
  let sum = term;
  let ap = a;
  for (let n = 0; n < MAX_ITERATIONS; n++) {
    ap += 1;
    term *= x / ap;
    sum += term;
    if (term < sum * EPSILON) break;
  }
  return sum;
}

/**
 * Continued fraction of Q(a, x) without the prefactor (the fraction of Numerical Recipes' gcf),
 * 1/(b_0 + a_1/(b_1 + a_2/(b_2 + …))) with b_i = x + 1 − a + 2i and a_i = −i(i − a), for x ≥ a + 1.
 * Its convergents N_k/D_k follow N_(k+1) = b_k N_k + a_k N_(k−1) (and the same for D), which needs no
 * division per step; the modified Lentz algorithm used before has two, on its recurrence's critical
 * path, and took 1.45 times as long on the noncentral engine's calls, for the same accuracy (relative
 * errors below 6e-15 against mpmath over a ≤ 20 000 and x up to a + 100√a). Stops when two successive
 * convergents agree to EPSILON, tested cross-multiplied: |N_k D_(k−1) − N_(k−1) D_k| < ε |N_k D_(k−1)|;
 * the four values are scaled down together when they grow large, which leaves the ratios unchanged.
 */
function upperContinuedFraction(a: number, x: number): number {
  const EPSILON = 1e-16;
  const MAX_ITERATIONS = 100_000;
  let b = x + 1 - a;
  let numeratorPrevious = 0;
  let numerator = 1;
  let denominatorPrevious = 1;
  let denominator = b;
  for (let i = 1; i < MAX_ITERATIONS; i++) {
    const an = -i * (i - a);
    b += 2;
    const numeratorNext = b * numerator + an * numeratorPrevious;
    const denominatorNext = b * denominator + an * denominatorPrevious;
    numeratorPrevious = numerator;
    numerator = numeratorNext;
    denominatorPrevious = denominator;
    denominator = denominatorNext;
    const cross = numerator * denominatorPrevious;
    if (Math.abs(cross - numeratorPrevious * denominator) < EPSILON * Math.abs(cross)) break;
    if (Math.abs(denominator) > 1e200) {
      numeratorPrevious *= 1e-200;
      numerator *= 1e-200;
      denominatorPrevious *= 1e-200;
      denominator *= 1e-200;
    }
  }
  return numerator / denominator;
}

/** Integer a up to this bound take the finite sum in regularizedGammaQInterval. */
const FINITE_SUM_LIMIT = 30;

/**
 * The continued fraction of upperContinuedFraction evaluated two steps per pass, for the p intervals
 * only (the noncentral series keeps upperContinuedFraction, for the reason given at smallPrefactor).
 * At most one step more than the single-step loop; 0.8 times its instructions on the engine's calls.
 */
function pairedContinuedFraction(a: number, x: number): number {
  const EPSILON = 1e-16;
  const MAX_ITERATIONS = 50_000; // pairs of steps
  let b = x + 1 - a;
  // Two steps per pass, the newer convergent alternating between the two pairs of variables (no
  // copying), and the convergence and overflow tests once per pass. a_i = i(a − i) is carried by its
  // differences a_(i+1) − a_i = a − 2i − 1 (exact: every value is an integer or half-integer product).
  let numeratorPrevious = 0;
  let numerator = 1;
  let denominatorPrevious = 1;
  let denominator = b;
  let an = a - 1;
  let difference = a - 3;
  for (let i = 0; i < MAX_ITERATIONS; i++) {
    b += 2;
    numeratorPrevious = b * numerator + an * numeratorPrevious;
    denominatorPrevious = b * denominator + an * denominatorPrevious;
    an += difference;
    difference -= 2;
    b += 2;
    numerator = b * numeratorPrevious + an * numerator;
    denominator = b * denominatorPrevious + an * denominator;
    an += difference;
    difference -= 2;
    const cross = numerator * denominatorPrevious;
    if (Math.abs(cross - numeratorPrevious * denominator) < EPSILON * Math.abs(cross)) break;
    if (Math.abs(denominator) > 1e200) {
      numeratorPrevious *= 1e-200;
      numerator *= 1e-200;
      denominatorPrevious *= 1e-200;
      denominator *= 1e-200;
    }
  }
  return numerator / denominator;
}

/** lowerSeries two terms per pass, for the p intervals only (see pairedContinuedFraction). */
function pairedLowerSeries(a: number, x: number): number {
  const EPSILON = 1e-16;
  const MAX_ITERATIONS = 100_000;
  // two terms per pass and the stopping test once per pass
  let term = 1 / a;
  let sum = term;
  let ap = a;
  for (let n = 0; n < MAX_ITERATIONS; n += 2) {
    term *= x / (ap + 1);
    sum += term;
    ap += 2;
    term *= x / ap;
    sum += term;
    if (term < sum * EPSILON) break;
  }
  return sum;
}

/** Regularised upper incomplete gamma Q(a, x) = Γ(a, x) / Γ(a), a > 0. */
export function regularizedGammaQ(a: number, x: number): number {
  if (!(a > 0) || Number.isNaN(x)) return Number.NaN;
  if (x <= 0) return 1;
  if (x === Infinity) return 0;
  if (x < a + 1) {
    const p = gammaPrefactor(a, x) * lowerSeries(a, x);
    return p >= 1 ? 0 : 1 - p;
  }
  return gammaPrefactor(a, x) * upperContinuedFraction(a, x);
}

/**
 * [Q(a, xHi), Q(a, xLo)] for 0 < xLo ≤ xHi: the upper tails at both ends of a printed statistic's
 * interval. Q(a, xHi) by the same method as regularizedGammaQ, with three cheaper evaluations for the
 * engine's calls (a is always df/2): the finite Poisson sum for integer a ≤ FINITE_SUM_LIMIT (and
 * x ≤ 700), smallPrefactor's product form of the prefactor for other a < 10, and the two-steps-per-pass
 * series and continued fraction; the two functions agree within ~1e-14 relative. Then, when the
 * interval is narrow, Q(a, xLo) = Q(a, xHi) + [x^(a−1) e^−x / Γ(a)]_(x = xHi) · ∫_0^h G(u) du, h = xHi − xLo, with
 * G(u) = (1 − u/xHi)^(a−1) e^u the density's ratio to its value at xHi, integrated term by term from its
 * Taylor series. Both terms are positive, so nothing cancels, and the second evaluation's prefactor and
 * continued fraction (or series) are saved: printed χ² intervals are one unit of the last decimal wide.
 *
 * The coefficients follow from (xHi − u) G' = (xHi − u − a + 1) G, which gives for e_n = c_n h^n
 * e_(n+1) = h [(n + xHi − a + 1) e_n − h e_(n−1)] / (xHi (n + 1)), e_0 = 1. Truncation bound (Cauchy's
 * estimate): with ρ = max(|e_1|, √max(|a − 1|, 1) · h/xHi) ≤ 0.05, G is analytic in |u| < xHi and at most
 * e^(0.5 + 0.25·0.773) < 2 in modulus on |u| = h/(2ρ) ≤ xHi/2, so |e_n| ≤ 2 (2ρ)^n, while ∫_0^h G/h ≥ 0.9;
 * stopping once (2ρ)^(N+1) ≤ 4e-18 leaves a relative error below 1e-17. Wider intervals (ρ > 0.05) and
 * the edge cases take the direct evaluation at xLo as before.
 */
export function regularizedGammaQInterval(a: number, xLo: number, xHi: number): Interval {
  const h = xHi - xLo;
  if (!(a > 0) || !(xLo > 0) || !(h >= 0) || !(xHi < Infinity)) return { lo: regularizedGammaQ(a, xHi), hi: regularizedGammaQ(a, xLo) };
  let prefactor: number;
  let upper: number;
  if (a <= FINITE_SUM_LIMIT && xHi <= 700 && a === Math.floor(a)) {
    // Integer a and e^−x in the normal range: Q(a, x) = e^−x Σ_(k < a) x^k / k!, the Poisson lower tail
    // (Abramowitz & Stegun 6.5.13). a positive terms, so the relative error stays within ~a units of the
    // last place on both sides of x = a + 1 (no 1 − P), and one exp replaces the prefactor's logarithms
    // and the continued fraction or series; the last term gives the prefactor, x^a e^−x / (a − 1)!.
    const decay = Math.exp(-xHi);
    let term = 1;
    let sum = 1;
    for (let k = 1; k < a; k++) {
      term *= xHi / k;
      sum += term;
    }
    upper = decay * sum;
    prefactor = decay * term * xHi;
  } else {
    prefactor = a < 10 ? smallPrefactor(a, xHi) : gammaPrefactor(a, xHi);
    if (xHi < a + 1) {
      const p = prefactor * pairedLowerSeries(a, xHi);
      upper = p >= 1 ? 0 : 1 - p;
    } else {
      upper = prefactor * pairedContinuedFraction(a, xHi);
    }
  }
  const ratio = h / xHi;
  const first = h - (a - 1) * ratio;
  const rho = Math.max(Math.abs(first), Math.sqrt(Math.max(Math.abs(a - 1), 1)) * ratio);
  // (a prefactor near underflow would lose the precision the sum needs)
  if (!(rho <= 0.05) || prefactor < 1e-290) return { lo: upper, hi: regularizedGammaQ(a, xLo) };
  const shift = xHi - a + 1;
  let previous = 0;
  let term = 1;
  let sum = 1;
  let bound = 2 * rho;
  for (let n = 0; bound > 4e-18; n++) {
    const next = (ratio * ((n + shift) * term - h * previous)) / (n + 1);
    previous = term;
    term = next;
    sum += term / (n + 2);
    bound *= 2 * rho;
  }
  return { lo: upper, hi: upper + (prefactor / xHi) * h * sum };
}

/** Regularised lower incomplete gamma P(a, x) = γ(a, x) / Γ(a), a > 0. */
export function regularizedGammaP(a: number, x: number): number {
  if (!(a > 0) || Number.isNaN(x)) return Number.NaN;
  if (x <= 0) return 0;
  if (x === Infinity) return 1;
  return lowerWithPrefactor(a, x, gammaPrefactor(a, x));
}

/**
 * P(a, x) for 0 < x < a + 1 from the power series, stopped as soon as the terms left add up to at most
 * `tolerance`: returns P̃ with P̃ ≤ P(a, x) ≤ P̃ + tolerance (up to rounding). The term ratios
 * x/(a + n + 1) fall as n grows and are below 1 from the first on (x < a + 1), so the terms after one
 * of size T, whose successor ratio is r, add up to at most T·(r + r² + …) = T·r/(1 − r).
 * For the noncentral sign test, which needs P far less precisely than a full evaluation when its
 * answer is not close.
 */
export function lowerSeriesWithin(a: number, x: number, prefactor: number, tolerance: number): number {
  const MAX_ITERATIONS = 100_000;
  // Remainder after `term` (whose denominator ends in ap): term·x/(ap + 1 − x), to be ≤ tolerance/prefactor.
  const limit = tolerance / prefactor;
  let term = 1 / a;
  let sum = term;
  let ap = a;
  for (let n = 0; n < MAX_ITERATIONS; n++) {
    ap += 1;
    term *= x / ap;
    sum += term;
    if (term * x <= limit * (ap + 1 - x)) break;
  }
  return Math.min(1, prefactor * sum);
}

/** P(a, x) for x > 0 when the caller already holds gammaPrefactor(a, x) (the noncentral series does). */
export function lowerWithPrefactor(a: number, x: number, prefactor: number): number {
  if (x < a + 1) return Math.min(1, prefactor * lowerSeries(a, x));
  const q = prefactor * upperContinuedFraction(a, x);
  return q >= 1 ? 0 : 1 - q;
}
