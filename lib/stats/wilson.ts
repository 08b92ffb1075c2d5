// The Wilson score interval for a binomial proportion (Wilson, E. B. 1927, "Probable inference, the law
// of succession, and statistical inference", JASA 22:209–212). Unlike the textbook p ± z·√(p(1−p)/n) it
// stays inside [0, 1] and keeps its coverage near 95 % for small n and for shares near 0 or 1 — which is
// where reporting-error prevalences live (Newcombe 1998, method 3; Agresti & Coull 1998).

/** the 97.5 % point of the standard normal distribution, for a two-sided 95 % interval */
export const Z_95 = 1.959963984540054;

export interface Proportion {
  /** comparisons (or papers) with the property */
  k: number;
  /** comparisons (or papers) counted */
  n: number;
  /** k / n, or null when n = 0 */
  share: number | null;
  /** Wilson 95 % interval, or null when n = 0 */
  low: number | null;
  high: number | null;
}

/** Wilson (1927) score interval for k successes out of n, without continuity correction. */
export function wilsonInterval(k: number, n: number, z = Z_95): { low: number; high: number } {
  if (!Number.isInteger(k) || !Number.isInteger(n) || n <= 0 || k < 0 || k > n) throw new RangeError(`Wilson interval needs whole 0 ≤ k ≤ n, n > 0 (got k = ${k}, n = ${n})`);
  const p = k / n;
  const z2 = z * z;
  const denominator = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denominator;
  const half = (z / denominator) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  // at k = 0 or k = n one bound is exactly 0 or 1; floating point can leave a few ulps either side
  return { low: k === 0 ? 0 : Math.max(0, centre - half), high: k === n ? 1 : Math.min(1, centre + half) };
}

export function proportion(k: number, n: number): Proportion {
  if (n === 0) return { k, n, share: null, low: null, high: null };
  const { low, high } = wilsonInterval(k, n);
  return { k, n, share: k / n, low, high };
}
