import { describe, expect, it } from "vitest";
import { noncentralCdfAtLeast, noncentralCdfTests, noncentralChisqCdf } from "@/lib/recheck/distributions/noncentral";
import { mulberry32 } from "@/tests/support/mulberry32";

// noncentralCdfTests sums the two tests of a pair (first and second, third and fourth) in one joint
// pass when their Poisson modes m, m_B are close ((m_B − m)² ≤ μ + 1), and takes the Poisson weight at
// the mode from Stirling's series. The reference here is the full series (noncentralChisqCdf), an
// independent evaluation: it takes its weights from gammaPrefactor and sums to convergence.

const none = Number.NaN; // leaves a test out

/** What noncentralCdfTests must return for these CDF values and targets ("≥" tests first and third). */
function expected(f: number[], targets: number[]): number {
  let bits = 0;
  for (let j = 0; j < 4; j++) {
    if (Number.isNaN(f[j])) continue;
    const atLeast = f[j] >= targets[j];
    if (j % 2 === 0 && !atLeast) return -1;
    if (j % 2 === 1 && atLeast) bits |= 1 << j;
  }
  return bits;
}

/** Whether the tests at these noncentralities take the joint pass (the condition in noncentralCdfTests). */
function joint(lambdaA: number, lambdaB: number): boolean {
  const mu = lambdaA / 2;
  const d = Math.floor(lambdaB / 2) - Math.floor(mu);
  return lambdaA > 0 && lambdaB > 0 && d * d <= mu + 1;
}

describe("noncentralCdfTests: pairs of nearby noncentralities in one pass", () => {
  it("decides as the full series does on 4 000 seeded random points, each pair in both orders and either slot", () => {
    const random = mulberry32(20261202);
    const offset = () => (random() < 0.5 ? -1 : 1) * 10 ** (-10 + 7 * random()); // ±1e-10 … ±1e-3
    let jointPairs = 0;
    let allFour = 0;
    for (let i = 0; i < 4_000; i++) {
      const df = random() < 0.8 ? 1 + Math.floor(random() * 300) : 0.5 + random() * 400; // c·df is not whole
      const muA = 0.05 * 10 ** (5 * random()); // 0.05 … 5 000
      const lambdaA = 2 * muA;
      const lambdaB = lambdaA * (1 + (random() < 0.5 ? -1 : 1) * (0.002 + 0.05 * random()));
      const lambdaC = lambdaA * (1.2 + random());
      const lambdaD = lambdaC * (1 + 0.002 + 0.05 * random());
      const x = Math.max(1e-3, df + lambdaA + (random() - 0.5) * 6 * Math.sqrt(2 * (df + 2 * lambdaA)));
      const lambdas = [lambdaA, lambdaB, lambdaC, lambdaD];
      const f = lambdas.map((lambda) => noncentralChisqCdf(x, df, lambda));
      const targets = f.map((fj) => fj + offset());
      if (f.some((fj, j) => Math.abs(fj - targets[j]) < 1e-11)) continue; // closer than the series' own accuracy
      if (joint(lambdaA, lambdaB)) jointPairs++;
      // the pair alone, in the first and in the second slot, and in the other order
      expect(noncentralCdfTests(x, df, lambdaA, targets[0], lambdaB, targets[1], none, 0, none, 0)).toBe(expected([f[0], f[1], none, none], targets));
      expect(noncentralCdfTests(x, df, none, 0, none, 0, lambdaA, targets[0], lambdaB, targets[1])).toBe(expected([none, none, f[0], f[1]], [0, 0, targets[0], targets[1]]));
      expect(noncentralCdfTests(x, df, lambdaB, targets[1], lambdaA, targets[0], none, 0, none, 0)).toBe(expected([f[1], f[0], none, none], [targets[1], targets[0], 0, 0]));
      // two pairs, as the RMSEA interval check makes them
      const four = expected(f, targets);
      expect(noncentralCdfTests(x, df, lambdaA, targets[0], lambdaB, targets[1], lambdaC, targets[2], lambdaD, targets[3])).toBe(four);
      if (four >= 0) allFour++;
    }
    expect(jointPairs).toBeGreaterThan(2_000);
    expect(allFour).toBeGreaterThan(500);
  });

  // Edge cases, each decided 1e-6 and 1e-10 either side of the full series' value.
  const EDGES: Array<[string, number, number, number, number]> = [
    ["λ = 0 for the first test (no joint pass)", 30, 24, 0, 0.4],
    ["λ = 0 for the second test (no joint pass)", 30, 24, 0.4, 0],
    ["both modes 0 (μ < 1): the joint pass has no downward side", 3, 2, 1.2, 1.25],
    ["modes 9 and 10: the direct weight and Stirling's", 40, 20, 19.9, 20.3],
    ["x near 0", 1e-6, 1, 0.5, 0.51],
    ["x near 0 with many degrees of freedom", 0.05, 3, 1.4, 1.5],
    ["modes far apart (two single passes)", 120, 40, 30, 60],
    ["λ = 2·10⁶, modes 100 apart", 2_000_000 + 2100, 150, 2_000_000, 2_000_200],
    ["λ = 2·10⁶, second mode below the first", 2_000_000 - 1500, 150, 2_000_200, 2_000_000],
    ["identical noncentralities", 95, 40, 57.9, 57.9],
  ];
  it.each(EDGES)("%s: x = %s, df = %s, λ = %s and %s", (_name, x, df, lambdaA, lambdaB) => {
    const fA = noncentralChisqCdf(x, df, lambdaA);
    const fB = noncentralChisqCdf(x, df, lambdaB);
    for (const delta of [1e-6, 1e-10]) {
      for (const [dA, dB] of [[-delta, delta], [-delta, -delta], [delta, delta], [delta, -delta]]) {
        const targets = [fA + dA, fB + dB];
        const want = expected([fA, fB, none, none], [targets[0], targets[1], 0, 0]);
        expect(noncentralCdfTests(x, df, lambdaA, targets[0], lambdaB, targets[1], none, 0, none, 0)).toBe(want);
        expect(noncentralCdfTests(x, df, none, 0, none, 0, lambdaA, targets[0], lambdaB, targets[1])).toBe(want === -1 ? -1 : want << 2);
      }
    }
  });
});

// Source: computed for this test with mpmath 1.3.0 at 40 digits by the Poisson-mixture definition
// Σ_j Pois(j; λ/2) · P(k/2 + j, x/2), summed over ±14√(λ/2) terms around the mode (not R). Points with
// modes from 0 to 100 000, so that the Poisson weight at the mode comes from Stirling's series for most,
// among them μ = 10.999 and 19.999, where its series converge slowest (u = (μ − m)/m is largest). Their
// last terms (below 1e-15 of the weight) are beyond what a test through F can see.
const MPMATH: Array<[number, number, number, string]> = [
  [28, 6, 19.98, "0.6198578695994818216716"],
  [25, 4, 21.998, "0.499183390850853785734384"],
  [72, 30, 39.998, "0.577286027734373099305628"],
  [30.5, 12, 20.6, "0.4538422572662269685604574"],
  [95, 40, 57.9, "0.454826141914918313349352"],
  [2600, 150, 2469, "0.4290217724030622473994728"],
  [21000, 300, 20000.9, "0.9927565855061269757391014"],
  [201500, 1000, 200001, "0.7115677535412306075207609"],
  [1.2, 3, 1.5, "0.1374464109668517974493241"],
  [0.001, 2, 0.3, "0.0004302625507424464394642183"],
];

describe("noncentralCdfTests: the Poisson weight at the mode", () => {
  it.each(MPMATH)("F(%s; df = %s, λ = %s) = %s is decided right 1e-11 either side", (x, df, lambda, want) => {
    const f = Number(want);
    expect(noncentralCdfAtLeast(x, df, lambda, f - 1e-11)).toBe(true);
    expect(noncentralCdfAtLeast(x, df, lambda, f + 1e-11)).toBe(false);
    // the same noncentrality twice, in one joint pass
    expect(noncentralCdfTests(x, df, lambda, f - 1e-11, lambda, f + 1e-11, none, 0, none, 0)).toBe(0);
    expect(noncentralCdfTests(x, df, lambda, f - 1e-11, lambda, f - 1e-11, none, 0, none, 0)).toBe(2);
  });
});
