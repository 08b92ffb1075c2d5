import { describe, expect, it } from "vitest";
import { chisqCdf, chisqUpperQuantile, chisqUpperTail, chisqUpperTailInterval } from "@/lib/recheck/distributions/chisq";
import { gammaPrefactor, logGamma, lowerSeriesWithin, regularizedGammaP, regularizedGammaQ } from "@/lib/recheck/distributions/gamma";
import { noncentralCdfAtLeast, noncentralCdfTests, noncentralChisqCdf, noncentralityForCdf } from "@/lib/recheck/distributions/noncentral";
import { reference } from "./reference";

const relativeError = (got: number, want: number) => Math.abs(got - want) / Math.abs(want);

describe("chisqUpperTail against R's pchisq(x, df, lower.tail = FALSE)", () => {
  // Source: the lavaan reference file's pchisq_grid (R 4.2.2; tests/fixtures/README.md).
  it.each(reference.pchisq_grid.map((g) => [g.x, g.df, g.p_upper] as const))("x = %s, df = %s is within 1e-10 relative", (x, df, p) => {
    expect(relativeError(chisqUpperTail(x, df), p)).toBeLessThanOrEqual(1e-10);
  });

  it("keeps full precision where 1 − CDF underflows: χ² = 200, df = 1 gives 2.09e-45 (R)", () => {
    // R: pchisq(200, 1, lower.tail = FALSE) = 2.088487583762545e-45 (pchisq_grid "explicit pair").
    expect(relativeError(chisqUpperTail(200, 1), 2.088487583762545e-45)).toBeLessThan(1e-12);
    expect(1 - chisqCdf(200, 1)).toBe(0); // the trap DESIGN §4.2 warns about
  });
});

// Source: computed for this test with mpmath 1.3.0 (Python) at 50 significant digits,
// mpmath.gammainc(df/2, x/2, inf, regularized=True), at x = the 8-significant-digit upper quantile of p.
// An independent arbitrary-precision implementation, not R; it extends the grid to df 10 000 and p 1e-300.
const MPMATH_GRID: Array<[number, number, string]> = [
  [0.015790774, 1, "0.90000000029428726961"],
  [0.45493642, 1, "0.50000000146974381677"],
  [10.827566, 1, "0.0010000000921737458154"],
  [41.821456, 1, "1.0000001865543653628e-10"],
  [224.38475, 1, "9.9999915568502334901e-51"],
  [453.94308, 1, "1.0000011218553143337e-100"],
  [913.7627, 1, "1.0000003933694044064e-200"],
  [1373.8726, 1, "1.0000156226655340822e-300"],
  [0.21072103, 2, "0.9000000005920436713"],
  [1.3862944, 2, "0.49999999027997274919"],
  [13.815511, 2, "0.0009999997789821614765"],
  [46.051702, 2, "9.9999992994045929435e-11"],
  [230.25851, 2, "9.9999964970234555514e-51"],
  [460.51702, 2, "9.9999929940481381872e-101"],
  [921.03404, 2, "9.9999859881011847106e-201"],
  [1381.5511, 2, "9.999778984579478847e-301"],
  [0.58437437, 3, "0.90000000094612941812"],
  [2.3659739, 3, "0.49999999706261440445"],
  [16.266236, 3, "0.0010000000927189940235"],
  [49.542156, 3, "9.9999996446541458251e-11"],
  [235.27613, 3, "1.0000017733581455675e-50"],
  [466.21436, 3, "9.9999878824001849577e-101"],
  [927.41701, 3, "1.0000004278823352307e-200"],
  [1388.3368, 3, "9.9998693683073140185e-301"],
  [1.0636232, 4, "0.90000000262142140663"],
  [3.356694, 4, "0.49999999687204317228"],
  [18.466827, 4, "0.00099999997875271590626"],
  [52.667963, 4, "1.0000001016700810048e-10"],
  [239.84884, 4, "1.0000003720385167067e-50"],
  [471.45082, 4, "1.0000001612401181524e-100"],
  [933.32954, 4, "1.0000003346401668525e-200"],
  [1394.6484, 4, "1.0000113631219158062e-300"],
  [2.8331069, 7, "0.90000000155263395422"],
  [6.3458112, 7, "0.49999999949395148075"],
  [24.321886, 7, "0.0010000001411828761712"],
  [60.895195, 7, "1.0000001678622678122e-10"],
  [252.07929, 7, "1.0000005295071764181e-50"],
  [485.59684, 7, "1.0000016260037532921e-100"],
  [949.45634, 7, "9.9999983625324407755e-201"],
  [1411.9541, 7, "1.000003559675761702e-300"],
  [4.8651821, 10, "0.89999999692042611224"],
  [9.3418178, 10, "0.49999999680497521853"],
  [29.588298, 10, "0.001000000166929863871"],
  [68.167618, 10, "1.0000000614271628245e-10"],
  [262.99562, 10, "1.0000004661079861911e-50"],
  [498.3382, 10, "1.0000002047626027291e-100"],
  [964.1191, 10, "1.0000003040107274007e-200"],
  [1427.772, 10, "9.9997818791463938538e-301"],
  [15.658684, 24, "0.90000000177344438698"],
  [23.336726, 24, "0.50000001791704319704"],
  [51.178598, 24, "0.00099999993381882211364"],
  [96.924643, 24, "1.000000084108887068e-10"],
  [306.07719, 24, "9.9999771583381347919e-51"],
  [549.12792, 24, "9.9999915200098587752e-101"],
  [1023.3009, 24, "1.0000090177436833274e-200"],
  [1492.1016, 24, "9.9998446991453754685e-301"],
  [38.560384, 51, "0.89999999558773024695"],
  [50.334905, 51, "0.49999999396242859282"],
  [87.96798, 51, "0.001000000111031901062"],
  [143.46162, 51, "1.0000009033453120961e-10"],
  [374.09603, 51, "1.0000009504390734377e-50"],
  [629.75729, 51, "9.9999895886616443597e-101"],
  [1118.3414, 51, "1.0000117745230859702e-200"],
  [1596.2665, 51, "9.9999837311255132823e-301"],
  [82.358136, 100, "0.8999999973484226495"],
  [99.334129, 100, "0.50000000668313105234"],
  [149.44925, 100, "0.0010000005081486742127"],
  [217.7142, 100, "1.0000008739852308003e-10"],
  [478.3475, 100, "9.9999989808824683634e-51"],
  [752.87756, 100, "1.0000020569466316165e-100"],
  [1264.0594, 100, "1.0000122529806144282e-200"],
  [1756.7875, 100, "1.0000156676155615039e-300"],
  [300.38479, 333, "0.89999997948890468499"],
  [332.33357, 333, "0.50000001746072091239"],
  [418.47855, 333, "0.0010000004235594667507"],
  [524.3217, 333, "9.9999921152247679748e-11"],
  [878.24426, 333, "9.999996320215936735e-51"],
  [1215.8646, 333, "9.9999876891306487044e-101"],
  [1807.3649, 333, "1.0000059370971175371e-200"],
  [2355.4497, 333, "1.0000209008783032652e-300"],
  [943.13256, 1000, "0.90000000956046708085"],
  [999.33341, 1000, "0.50000002144799159115"],
  [1143.9171, 1000, "0.00099999949174885993664"],
  [1311.303, 1000, "1.0000010083735116273e-10"],
  [1823.1501, 1000, "1.0000033264761408305e-50"],
  [2273.1361, 1000, "9.9998704132124101966e-101"],
  [3015.2642, 1000, "1.0000056148213524034e-200"],
  [3672.3665, 1000, "1.0000162286306191666e-300"],
  [1919.3879, 2000, "0.89999990148219624719"],
  [1999.3334, 2000, "0.49999982873386926204"],
  [2201.1562, 2000, "0.00099999982948626124101"],
  [2428.9991, 2000, "1.0000011450977271241e-10"],
  [3097.7782, 2000, "9.9999274729167163235e-51"],
  [3661.6939, 2000, "1.0000054812757521405e-100"],
  [4560.2537, 2000, "9.9999963142709212997e-201"],
  [5333.5041, 2000, "1.0000145780952453236e-300"],
  [4871.2935, 4999, "0.90000006320218295372"],
  [4998.3333, 4999, "0.50000019608017438454"],
  [5313.7005, 4999, "0.00099999855289539862242"],
  [5661.6131, 4999, "9.9999990217228252321e-11"],
  [6643.6263, 4999, "9.9999392385495766463e-51"],
  [7437.1138, 4999, "9.9999397254422188142e-101"],
  [8654.8652, 4999, "9.9999848418116269149e-201"],
  [9668.5841, 4999, "1.0000046523998486094e-300"],
  [9819.1949, 10000, "0.89999997719432333112"],
  [9999.3333, 10000, "0.50000011632671996658"],
  [10442.731, 10000, "0.00099998994702125023775"],
  [10926.105, 10000, "1.0000127053937713078e-10"],
  [12262.357, 10000, "9.9999246409448233929e-51"],
  [13316.709, 10000, "1.0000091201866157586e-100"],
  [14899.588, 10000, "1.0000056216659218857e-200"],
  [16190.628, 10000, "9.9999782646497959592e-301"],
];

describe("chisqUpperTail over df 1…10 000 and p down to 1e-300 (DESIGN §4.2)", () => {
  it("agrees with mpmath within 1e-10 relative at every one of the 112 points", () => {
    let worst = 0;
    for (const [x, df, p] of MPMATH_GRID) worst = Math.max(worst, relativeError(chisqUpperTail(x, df), Number(p)));
    expect(worst).toBeLessThanOrEqual(1e-10);
  });

  it("covers the whole range the design asks for", () => {
    const dfs = MPMATH_GRID.map((row) => row[1]);
    const ps = MPMATH_GRID.map((row) => Number(row[2]));
    expect(Math.min(...dfs)).toBe(1);
    expect(Math.max(...dfs)).toBe(10_000);
    expect(Math.min(...ps)).toBeLessThan(1.1e-300);
  });
});

describe("chisqUpperTailInterval: the p interval of a printed statistic's interval", () => {
  it("gives P(X > hi) exactly as chisqUpperTail does", () => {
    for (const [x, df] of MPMATH_GRID) expect(chisqUpperTailInterval(x - 0.005, x, df).lo).toBe(chisqUpperTail(x, df));
  });

  it.each([1e-4, 1e-3, 1e-2, 0.1, 1])("derives P(X > lo) within 1e-12 relative of R's pchisq_grid, interval %s wide", (width) => {
    // Source: the lavaan reference file's pchisq_grid (R 4.2.2), at the interval's lower end.
    for (const g of reference.pchisq_grid) expect(relativeError(chisqUpperTailInterval(g.x, g.x + width, g.df).hi, g.p_upper)).toBeLessThanOrEqual(1e-12);
  });

  it.each([1e-4, 1e-2, 1])("derives P(X > lo) within 1e-12 relative of mpmath over df 1…10 000 and p down to 1e-300, interval %s wide", (width) => {
    // Source: MPMATH_GRID above (mpmath 1.3.0, 50 digits), at the interval's lower end.
    for (const [x, df, p] of MPMATH_GRID) expect(relativeError(chisqUpperTailInterval(x, x + width, df).hi, Number(p))).toBeLessThanOrEqual(1e-12);
  });

  it("agrees with two direct evaluations within 1e-12 relative on 20 000 seeded random intervals", () => {
    // Park & Miller (1988) minimal standard generator, so the points are the same on every run.
    let state = 97531;
    const random = () => (state = (state * 16807) % 2147483647) / 2147483647;
    for (let i = 0; i < 20_000; i++) {
      const df = random() < 0.5 ? 1 + Math.floor(random() * 30) : 1 + Math.floor(random() * 5000);
      const x = Math.max(0.001, df + (random() - 0.3) * 12 * Math.sqrt(2 * df));
      const width = 10 ** (-4 + 4.5 * random()); // 1e-4 … 30: narrow ones take the series, wide ones not
      const p = chisqUpperTailInterval(x, x + width, df);
      expect(p.lo).toBe(chisqUpperTail(x + width, df));
      expect(relativeError(p.hi, chisqUpperTail(x, df))).toBeLessThanOrEqual(1e-12);
    }
  });

  it("handles df = 0, a lower end at 0 and an empty interval as chisqUpperTail does", () => {
    expect(chisqUpperTailInterval(1, 2, 0)).toEqual({ lo: 0, hi: 0 });
    expect(chisqUpperTailInterval(0, 2, 3)).toEqual({ lo: chisqUpperTail(2, 3), hi: 1 });
    expect(chisqUpperTailInterval(7.5, 7.5, 3)).toEqual({ lo: chisqUpperTail(7.5, 3), hi: chisqUpperTail(7.5, 3) });
  });
});

describe("incomplete gamma identities", () => {
  it("the truncated power series brackets P: P̃ ≤ P ≤ P̃ + tolerance", () => {
    // The full evaluation (relative error ~1e-16) is the reference; 1e-15 allows for its rounding.
    let cases = 0;
    for (const a of [0.5, 1, 3.5, 22, 48.5, 300, 5000]) {
      for (const x of [0.01, 0.1 * a, a - 2 * Math.sqrt(a), a - 0.5, a, a + 0.99]) {
        if (!(x > 0)) continue;
        const p = regularizedGammaP(a, x);
        for (const tolerance of [1e-3, 1e-7, 1e-12]) {
          const lower = lowerSeriesWithin(a, x, gammaPrefactor(a, x), tolerance);
          expect(lower).toBeLessThanOrEqual(p + 1e-15);
          expect(p).toBeLessThanOrEqual(lower + tolerance + 1e-15);
          cases++;
        }
      }
    }
    expect(cases).toBeGreaterThan(100);
  });

  // Source: computed for this test with mpmath 1.3.0 at 40 digits, mpmath.gammainc(a, x, inf,
  // regularized=True), at x = a + 1 + k·max(1, √a) for k = 0, 1, 3, 30: the continued fraction's side
  // of the switch, from where it converges slowest (x = a + 1) to far tails.
  const Q_CONTINUED_FRACTION: Array<[number, number, string]> = [
    [0.5, 1.5, "0.083264516663550401855"],
    [0.5, 2.5, "0.025347318677468263932"],
    [0.5, 4.5, "0.0026997960632601890533"],
    [0.5, 31.5, "2.0670658180782592053e-15"],
    [1.5, 2.5, "0.17179714429673313506"],
    [1.5, 3.724744871391589, "0.058870578918192810142"],
    [1.5, 6.174234614174766, "0.0062799734555634628552"],
    [1.5, 39.24234614174767, "6.4867860688936425042e-17"],
    [3.5, 4.5, "0.25265604649656379376"],
    [3.5, 6.37082869338697, "0.078658686072713118661"],
    [3.5, 10.112486080160913, "0.0051037058167015256859"],
    [3.5, 60.62486080160912, "4.2071372248411545059e-23"],
    [22, 23.0, "0.38938116683383153129"],
    [22, 27.69041575982343, "0.11668252031078631209"],
    [22, 37.071247279470285, "0.0029985532713489015942"],
    [22, 163.7124727947029, "5.5863604255045429452e-45"],
    [50.5, 51.5, "0.42596629886506529065"],
    [50.5, 58.60633520177595, "0.12899368023764814151"],
    [50.5, 72.81900560532785, "0.0024375275064695114896"],
    [50.5, 264.69005605327845, "2.6855559612946731938e-59"],
    [300, 301.0, "0.46934669052574384613"],
    [300, 318.3205080756888, "0.14546355034924300336"],
    [300, 352.9615242270663, "0.0017881538800083294601"],
    [300, 820.6152422706632, "1.3387396089788634798e-97"],
    [5000, 5001.0, "0.49247831627390178971"],
    [5000, 5071.710678118655, "0.15528125200728931505"],
    [5000, 5213.132034355965, "0.0014551984907152947391"],
    [5000, 7122.320343559642, "4.6598606054159315682e-156"],
    [20000, 20001.0, "0.49623884162964638123"],
    [20000, 20142.421356237308, "0.15695630941168717409"],
    [20000, 20425.264068711927, "0.0014023437225546683732"],
    [20000, 24243.640687119285, "3.0919312747507622772e-174"],
  ];
  it("Q from the continued fraction agrees with mpmath within 1e-12 relative at 32 points, 5e-14 where Q > 1e-4", () => {
    // In the far tails the error is the prefactor's (e^−deviance with a deviance in the hundreds):
    // 2.4e-13 at a = 20 000, Q = 3e-174. Where Q is not small the continued fraction's own error shows
    // (it is below 6e-15 relative) beside the prefactor's for large a.
    let worst = 0;
    let worstNotSmall = 0;
    for (const [a, x, q] of Q_CONTINUED_FRACTION) {
      const error = relativeError(regularizedGammaQ(a, x), Number(q));
      worst = Math.max(worst, error);
      if (Number(q) > 1e-4) worstNotSmall = Math.max(worstNotSmall, error);
    }
    expect(worst).toBeLessThan(1e-12);
    expect(worstNotSmall).toBeLessThan(5e-14); // 2.0e-14 at a = 20 000, as with the Lentz evaluation before
  });

  it("P + Q = 1 across the series / continued-fraction switch", () => {
    for (const a of [0.5, 1, 3.7, 12, 50.5, 400]) {
      for (const x of [0.1, a * 0.5, a, a + 1, a + 1.0001, a * 2 + 3]) expect(regularizedGammaP(a, x) + regularizedGammaQ(a, x)).toBeCloseTo(1, 14);
    }
  });

  it("ln Γ matches factorials (ln Γ(n + 1) = ln n!) and Γ(½) = √π", () => {
    expect(logGamma(11)).toBeCloseTo(Math.log(3628800), 12);
    expect(logGamma(0.5)).toBeCloseTo(Math.log(Math.sqrt(Math.PI)), 14);
    expect(logGamma(171)).toBeCloseTo(706.5730622457874, 9); // ln 170!, Abramowitz & Stegun style check (from memory)
  });

  it("Q(1, x) = e^−x exactly in closed form (the exponential distribution)", () => {
    for (const x of [0.01, 1, 5, 50, 700]) expect(relativeError(regularizedGammaQ(1, x), Math.exp(-x))).toBeLessThan(1e-13);
  });
});

describe("chisqUpperQuantile", () => {
  // Source: the reference file's qchisq_95 (R's qchisq(.95, df), df 1–30).
  it.each(reference.qchisq_95.map((q) => [q.df, q.q95] as const))("95-percent critical value for df = %s matches R", (df, q) => {
    expect(relativeError(chisqUpperQuantile(0.05, df), q)).toBeLessThan(1e-9);
  });

  // Source: NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.4 "Critical values of the
  // chi-square distribution", upper-tail .05 column (3 decimals). These values are written from memory
  // of that standard table; each is also checked against R above where the file has it.
  const NIST_95: Array<[number, number]> = [
    [1, 3.841], [2, 5.991], [3, 7.815], [4, 9.488], [5, 11.07], [6, 12.592], [7, 14.067], [8, 15.507], [9, 16.919],
    [10, 18.307], [15, 24.996], [20, 31.41], [25, 37.652], [30, 43.773], [40, 55.758], [50, 67.505], [60, 79.082],
    [70, 90.531], [80, 101.879], [90, 113.145], [100, 124.342],
  ];
  it.each(NIST_95)("df = %s agrees with the handbook's %s at 3 decimals", (df, value) => {
    expect(chisqUpperQuantile(0.05, df).toFixed(3)).toBe(value.toFixed(3));
  });

  it("inverts the upper tail down to p = 1e-300", () => {
    for (const df of [1, 24, 5000]) {
      const x = chisqUpperQuantile(1e-300, df);
      expect(relativeError(chisqUpperTail(x, df), 1e-300)).toBeLessThan(1e-9);
    }
  });
});

// Source: computed for this test with mpmath 1.3.0 at 40 digits by the Poisson-mixture definition
// Σ_j Pois(j; λ/2) · P(k/2 + j, x/2), summed over ±40√(λ/2) terms around the mode (not R).
const NONCENTRAL: Array<[number, number, number, string]> = [
  [3.0, 1, 0.5, "0.83994442693982614"],
  [10, 5, 2, "0.79227110543390994"],
  [150, 100, 30, "0.86663124397050961"],
  [2500, 200, 2000, "0.99925343098053722"],
  [1000, 50, 1200, "8.5508400736868112e-5"],
  [60, 48, 0.001, "0.8853327881635749"],
  [12000, 500, 11000, "0.99025994133674902"],
  [40, 10, 100, "1.1251088992136437e-5"],
];

describe("noncentralChisqCdf (Poisson-mixture series)", () => {
  it.each(NONCENTRAL)("F(%s; df = %s, λ = %s) matches mpmath within 1e-12 absolute", (x, df, lambda, want) => {
    expect(Math.abs(noncentralChisqCdf(x, df, lambda) - Number(want))).toBeLessThan(1e-12);
  });

  it("reduces to the central CDF at λ = 0", () => {
    expect(noncentralChisqCdf(30, 24, 0)).toBe(chisqCdf(30, 24));
  });

  // Source: the reference file's rmsea_ci entries, whose noncentralities solve R's
  // pchisq(chisq, df, ncp = λ) = .95 / .05 (hand_tight_tol, uniroot tolerance 1e-13).
  it.each(reference.rmsea_ci.map((r) => [r.label, r] as const))("%s: F(χ²; df, λ) is .95 / .05 at R's interval noncentralities", (_label, r) => {
    expect(noncentralChisqCdf(r.chisq, r.df, r.hand_tight_tol.lambda_lower)).toBeCloseTo(0.95, 10);
    expect(noncentralChisqCdf(r.chisq, r.df, r.hand_tight_tol.lambda_upper)).toBeCloseTo(0.05, 10);
  });

  it.each(reference.rmsea_ci.map((r) => [r.label, r] as const))("%s: root finding recovers R's λ bounds within 1e-6 relative", (_label, r) => {
    expect(relativeError(noncentralityForCdf(r.chisq, r.df, 0.95), r.hand_tight_tol.lambda_lower)).toBeLessThan(1e-6);
    expect(relativeError(noncentralityForCdf(r.chisq, r.df, 0.05), r.hand_tight_tol.lambda_upper)).toBeLessThan(1e-6);
  });

  it("the early-stopping comparison F ≥ target agrees with the full sum on 20 000 seeded random points", () => {
    // Park & Miller (1988) minimal standard generator, so the points are the same on every run.
    let state = 12345;
    const random = () => (state = (state * 16807) % 2147483647) / 2147483647;
    let checked = 0;
    for (let i = 0; i < 20_000; i++) {
      const df = 1 + Math.floor(random() * 300);
      const lambda = random() < 0.1 ? 0 : random() * 400;
      const x = Math.max(0.01, df + lambda + (random() - 0.5) * 6 * Math.sqrt(2 * (df + 2 * lambda)));
      const f = noncentralChisqCdf(x, df, lambda);
      const target = Math.min(0.999, Math.max(0.001, f + (random() - 0.5) * 0.01));
      if (Math.abs(f - target) < 1e-11) continue; // closer than the series' own accuracy
      expect(noncentralCdfAtLeast(x, df, lambda, target)).toBe(f >= target);
      checked++;
    }
    expect(checked).toBeGreaterThan(19_000);
  });

  // Source: computed for this test with mpmath 1.3.0 at 40 digits by the same Poisson-mixture
  // definition as NONCENTRAL above, summed over ±(40√(λ/2 + 1) + 60) terms around the mode (not R).
  // The points cover P at the mode from the power series and from the continued fraction, λ = 1e-6
  // (mode 0), df = 1, df = 2000, and λ up to 59 000; (12000, 500, 11000) reproduces NONCENTRAL's value.
  const NEAR_TARGET: Array<[number, number, number, string]> = [
    [50, 40, 12, "0.45679266899074239907"],
    [90.575, 69, 48.168831, "0.063049199570345731087"],
    [120, 40, 30, "0.99879834037061041196"],
    [30, 24, 1e-6, "0.81524815954644978799"],
    [2, 1, 3, "0.37447734620034813102"],
    [0.5, 3, 0.2, "0.074105308376853737673"],
    [2100, 2000, 100, "0.50419180656231929192"],
    [453.255, 96, 288.034152, "0.96625426426509507273"],
    [12000, 500, 11000, "0.99025994133674901668"],
    [60000, 100, 59000, "0.96761806238355089579"],
  ];
  it.each(NEAR_TARGET)("F(%s; df = %s, λ = %s) ≥ target is decided right 1e-3, 1e-6 and 1e-9 either side of F", (x, df, lambda, want) => {
    // 1e-9 lies inside the first pass's allowance for a coarse P (1e-7), so it also takes the full sum.
    const f = Number(want);
    for (const delta of [1e-3, 1e-6, 1e-9]) {
      expect(noncentralCdfAtLeast(x, df, lambda, f - delta)).toBe(true);
      expect(noncentralCdfAtLeast(x, df, lambda, f + delta)).toBe(false);
    }
  });

  // Source: computed for this test with mpmath 1.3.0 at 40 digits, by the same Poisson-mixture sum as
  // NEAR_TARGET (not R). Two noncentralities at one (x, df), as the RMSEA interval check tests them: the
  // later test's P at its mode is walked to from the earlier test's window upwards (the benchmark's
  // shape), downwards, across the switch from the power series to the continued fraction (200, 100),
  // within one mode (50, 40), and started afresh when the modes are more than 64 apart (120, 40).
  const PAIRS: Array<[number, number, number, string, number, string]> = [
    [453.255, 96, 288.034152, "0.96625426426509507273", 422.5338, "0.062302960164803344777"],
    [453.245, 96, 295.234728, "0.94864369569209283749", 431.245608, "0.041332752486781689128"],
    [90.575, 69, 48.168831, "0.063049199570345731087", 30, "0.3129861300470183701"],
    [120, 40, 30, "0.99879834037061041196", 200, "1.0027941987502322645e-6"],
    [50, 40, 12, "0.45679266899074239907", 13, "0.42236536573946159107"],
    [200, 100, 120, "0.22569258099610545521", 40, "0.99785387076365719771"],
    [2100, 2000, 100, "0.50419180656231929192", 160, "0.18981119364297494269"],
    [12000, 500, 11000, "0.99025994133674901668", 11100, "0.96896352267527969828"],
  ];
  it.each(PAIRS)("at x = %s, df = %s, tests at λ = %s (F = %s) and λ = %s (F = %s) in one call are decided right 1e-6 and 1e-9 either side of F", (x, df, lambda1, want1, lambda2, want2) => {
    const [f1, f2] = [Number(want1), Number(want2)];
    const none = Number.NaN; // leaves a test out
    for (const delta of [1e-6, 1e-9]) {
      // the two "≥" tests (first and third): −1 as soon as one fails
      expect(noncentralCdfTests(x, df, lambda1, f1 - delta, none, 0, lambda2, f2 - delta, none, 0)).toBe(0);
      expect(noncentralCdfTests(x, df, lambda1, f1 - delta, none, 0, lambda2, f2 + delta, none, 0)).toBe(-1);
      expect(noncentralCdfTests(x, df, lambda2, f2 - delta, none, 0, lambda1, f1 - delta, none, 0)).toBe(0);
      expect(noncentralCdfTests(x, df, lambda2, f2 - delta, none, 0, lambda1, f1 + delta, none, 0)).toBe(-1);
      // the two "<" tests (second and fourth): each failure is reported as its bit
      expect(noncentralCdfTests(x, df, none, 0, lambda1, f1 + delta, none, 0, lambda2, f2 + delta)).toBe(0);
      expect(noncentralCdfTests(x, df, none, 0, lambda1, f1 + delta, none, 0, lambda2, f2 - delta)).toBe(8);
      expect(noncentralCdfTests(x, df, none, 0, lambda1, f1 - delta, none, 0, lambda2, f2 - delta)).toBe(2 | 8);
      // all four, alternating between the two noncentralities
      expect(noncentralCdfTests(x, df, lambda1, f1 - delta, lambda2, f2 + delta, lambda1, f1 - delta, lambda2, f2 + delta)).toBe(0);
      expect(noncentralCdfTests(x, df, lambda1, f1 - delta, lambda2, f2 - delta, lambda2, f2 - delta, lambda1, f1 + delta)).toBe(2);
    }
  });

  it("decides four tests at one (x, df) as the full sum does, on 10 000 seeded random points", () => {
    // Park & Miller (1988) minimal standard generator, so the points are the same on every run.
    let state = 54321;
    const random = () => (state = (state * 16807) % 2147483647) / 2147483647;
    let checked = 0;
    for (let i = 0; i < 10_000; i++) {
      const df = 1 + Math.floor(random() * 300);
      const base = random() * 400;
      // noncentralities near each other (walks) or anywhere (often fresh starts)
      const lambdas = [0, 1, 2, 3].map(() => (random() < 0.7 ? Math.max(0, base + (random() - 0.3) * 150) : random() * 400));
      const x = Math.max(0.01, df + base + (random() - 0.5) * 6 * Math.sqrt(2 * (df + 2 * base)));
      const f = lambdas.map((lambda) => noncentralChisqCdf(x, df, lambda));
      const targets = f.map((fj) => Math.min(0.999, Math.max(0.001, fj + (random() - 0.5) * 0.01)));
      if (f.some((fj, j) => Math.abs(fj - targets[j]) < 1e-11)) continue; // closer than the series' own accuracy
      let expected = 0;
      for (let j = 0; j < 4; j++) {
        const atLeast = f[j] >= targets[j];
        if (j % 2 === 0 && !atLeast) {
          expected = -1;
          break;
        }
        if (j % 2 === 1 && atLeast) expected |= 1 << j;
      }
      const got = noncentralCdfTests(x, df, lambdas[0], targets[0], lambdas[1], targets[1], lambdas[2], targets[2], lambdas[3], targets[3]);
      expect(got).toBe(expected);
      if (expected >= 0) checked++; // all four tests were reached
    }
    expect(checked).toBeGreaterThan(1_500);
  });

  it("decides right next to the full sum for small modes (the direct Poisson weight) and at λ = 0", () => {
    for (const lambda of [0, 1e-9, 0.6, 2, 5, 13, 19.98, 20, 21]) {
      for (const df of [1, 4, 24, 150]) {
        for (const z of [-2, 0, 2]) {
          const x = df + lambda + z * Math.sqrt(2 * (df + 2 * lambda));
          if (!(x > 0)) continue;
          const f = noncentralChisqCdf(x, df, lambda);
          if (f < 1e-6 || f > 1 - 1e-6) continue;
          for (const delta of [1e-4, 1e-9]) {
            expect(noncentralCdfAtLeast(x, df, lambda, f - delta)).toBe(true);
            expect(noncentralCdfAtLeast(x, df, lambda, f + delta)).toBe(false);
          }
        }
      }
    }
  });

  it("gives λ = 0 when the χ² is too small to bound the interval away from zero", () => {
    // F(10; 24, 0) ≈ .005 < .95, so no positive λ reaches .95 (Browne & Cudeck 1993's lower bound of 0).
    expect(noncentralityForCdf(10, 24, 0.95)).toBe(0);
  });

  it("finds roots where F(x; df, λ) equals the target within 1e-11, over 2 000 seeded random points", () => {
    // The defining property of the root, checked with the series itself (which the mpmath points above
    // hold to 1e-12); covers small and large df, χ² far below and above df, and both interval ends.
    let state = 4242;
    const random = () => (state = (state * 16807) % 2147483647) / 2147483647;
    let positive = 0;
    for (let i = 0; i < 2000; i++) {
      const df = 1 + Math.floor(random() ** 2 * 2000);
      const x = df * (0.3 + 4 * random()) + 0.5;
      const target = random() < 0.5 ? 0.95 : 0.05;
      const lambda = noncentralityForCdf(x, df, target);
      if (lambda === 0) {
        expect(noncentralChisqCdf(x, df, 0)).toBeLessThanOrEqual(target);
        continue;
      }
      positive++;
      expect(Math.abs(noncentralChisqCdf(x, df, lambda) - target)).toBeLessThan(1e-11);
    }
    expect(positive).toBeGreaterThan(1500);
  });
});
