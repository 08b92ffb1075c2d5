// Noncentral chi-square CDF, needed to invert RMSEA confidence intervals (Browne & Cudeck 1993).
//
// Method: the Poisson-mixture series F(x; k, λ) = Σ_j e^(−λ/2) (λ/2)^j / j! · P(k/2 + j, x/2)
// (Johnson, Kotz & Balakrishnan 1995, ch. 29), summed as in Ding (1992, Applied Statistics AS 275) with
// the incomplete-gamma terms obtained by recurrence, but started at the Poisson mode and summed both
// ways (Benton & Krishnamoorthy 2003) so large noncentralities neither underflow e^(−λ/2) nor need
// thousands of terms. Absolute error below ~1e-13, ample for locating .05 / .95 points.
import { standardNormalUpperQuantile as standardNormalUpperQuantileImport } from "./chisq";
import {
  gammaPrefactor as gammaPrefactorImport,
  lowerSeriesWithin as lowerSeriesWithinImport,
  lowerWithPrefactor as lowerWithPrefactorImport,
  regularizedGammaP as regularizedGammaPImport,
} from "./gamma";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const gammaPrefactor = gammaPrefactorImport;
const lowerSeriesWithin = lowerSeriesWithinImport;
const lowerWithPrefactor = lowerWithPrefactorImport;
const regularizedGammaP = regularizedGammaPImport;
const standardNormalUpperQuantile = standardNormalUpperQuantileImport;

// The series' constants (truncation error 1e-13, at most 100 000 terms) are declared inside each
// function: V8 reloads a module-level binding on every iteration of the loops.

/** P(X ≤ x) for X ~ χ²(df, ncp = lambda), df > 0, lambda ≥ 0 (R's pchisq(x, df, ncp)). */
export function noncentralChisqCdf(x: number, df: number, lambda: number): number {
  return cdfAndSlope(x, df, lambda).cdf;
}

interface CdfAndSlope {
  cdf: number;
  /** ∂F/∂λ (never positive) */
  slope: number;
}

/**
 * F(x; df, λ) and its slope in λ from one pass of the series. With t_j = P(a+j, y) − P(a+j+1, y), the
 * term the recurrence already carries, ∂F/∂λ = −½ Σ_j w_j t_j, i.e. −½[F(x; df, λ) − F(x; df + 2, λ)]
 * (Johnson, Kotz & Balakrishnan 1995, ch. 29). Since t_j ≤ P(a+j, y) and t_j ≤ 1, the truncation rules
 * that bound the rest of F's series bound the rest of the slope's as well.
 */
function cdfAndSlope(x: number, df: number, lambda: number): CdfAndSlope {
  const TAIL = 1e-13;
  const MAX_TERMS = 100_000;
  if (!(df > 0) || !(lambda >= 0) || Number.isNaN(x)) return { cdf: Number.NaN, slope: Number.NaN };
  if (x <= 0) return { cdf: 0, slope: 0 };
  const a = df / 2;
  const y = x / 2;
  if (lambda === 0) return { cdf: regularizedGammaP(a, y), slope: -gammaPrefactor(a, y) / a / 2 };
  const mu = lambda / 2;
  const mode = Math.floor(mu);
  // Poisson weight at the mode: μ^m e^−μ / m! = gammaPrefactor(m + 1, μ) / μ.
  const weightAtMode = gammaPrefactor(mode + 1, mu) / mu;
  const prefactor = gammaPrefactor(a + mode, y);
  const pAtMode = y > 0 ? lowerWithPrefactor(a + mode, y, prefactor) : 0;
  // t_j = y^(a+j) e^−y / Γ(a+j+1), so that P(a+j+1, y) = P(a+j, y) − t_j.
  const termAtMode = prefactor / (a + mode);

  let sum = weightAtMode * pAtMode;
  let slopeSum = weightAtMode * termAtMode;

  // Upward from the mode: P decreases, so the remainder is at most P_j times the Poisson tail beyond j.
  let weight = weightAtMode;
  let p = pAtMode;
  let term = termAtMode;
  for (let j = mode; j < mode + MAX_TERMS; j++) {
    p -= term;
    if (p < 0) p = 0;
    term *= y / (a + j + 1);
    weight *= mu / (j + 1);
    sum += weight * p;
    slopeSum += weight * term;
    // Remainder ≤ w·P·r/(1 − r) with r = μ/(j + 2) < 1, written without divisions.
    if (j + 2 > mu && weight * p * mu < TAIL * (j + 2 - mu)) break;
    if (weight === 0 || p === 0) break;
  }

  // Downward from the mode: P increases towards 1, so the remainder is at most the Poisson mass below j.
  weight = weightAtMode;
  p = pAtMode;
  term = termAtMode;
  for (let j = mode - 1; j >= 0; j--) {
    term *= (a + j + 1) / y; // t_j from t_(j+1)
    p += term;
    if (p > 1) p = 1;
    weight *= (j + 1) / mu;
    sum += weight * p;
    slopeSum += weight * term;
    // Remainder ≤ w·r/(1 − r) with r = j/μ < 1.
    if (weight * j < TAIL * (mu - j)) break;
    if (weight === 0) break;
  }
  return { cdf: sum > 1 ? 1 : sum, slope: -slopeSum / 2 };
}

/**
 * Is F(x; df, λ) ≥ target? The same series, summed outwards from the mode alternately up and down, and
 * stopped as soon as the answer is certain (see noncentralCdfTests, which does the work).
 */
export function noncentralCdfAtLeast(x: number, df: number, lambda: number, target: number): boolean {
  return noncentralCdfTests(x, df, lambda, target, Number.NaN, 0, Number.NaN, 0, Number.NaN, 0) === 0;
}

/**
 * Up to four sign tests at one (x, df), taken in order: F(x; df, λ1) ≥ target1, F(x; df, λ2) < target2,
 * F(x; df, λ3) ≥ target3, F(x; df, λ4) < target4 (a test whose λ is NaN is left out): the shape of the
 * RMSEA interval checks, two tests for each printed bound (see cornersMeet in checks/rmsea.ts). Returns
 * −1 as soon as a "≥" test fails; otherwise the failed "<" tests as bits (2 for the second test, 8 for
 * the fourth), so 0 when all hold.
 *
 * Each test is the Poisson-mixture series, summed outwards from the mode alternately up and down, and
 * stopped as soon as the answer is certain: the partial sum S only grows, and what is left is at most the
 * Poisson mass not yet visited (each P ≤ 1), so F ∈ [S, S + 1 − W] with W the weights summed so far.
 * A bound that is not close to the target is decided after a few standard deviations of the Poisson
 * weights instead of the ±7σ a full evaluation needs.
 *
 * Where P at the mode comes from the power series (y < a + mode + 1), it is taken to within COARSE only
 * (lowerSeriesWithin: under half the terms of a full evaluation on the engine's calls). Every P_j is
 * then P_mode plus exact differences, so each is short of its true value by at most COARSE and
 * F ∈ [S, S + 1 − W + COARSE] (the weights sum to 1). Only a test still undecided when the series has
 * converged, i.e. F within COARSE of the target, is decided by the full sum instead.
 *
 * The tests share x and df, so P(a + j, y) is the same function of j in all of them. A later test's P at
 * its own mode is therefore walked to, by the same exact recurrences, from the nearest index the
 * previous test reached (its mode, or either end of its window) when that is at most WALK steps away: a
 * step costs one division, a fresh start (the prefactor's exp and log1p, then the power series or
 * continued fraction) about as much as 60. The walked P carries the first start's error bound (short by
 * at most COARSE after the series, near-exact after the continued fraction), so the same certified
 * stopping rules apply with that start's slack. A start whose term has (nearly) underflowed, far in a
 * tail, is not walked from: the recurrence could not bring back the precision lost there.
 *
 * The two tests of a pair (first and second, third and fourth: the two ends of one printed bound, whose
 * noncentralities differ by a few per cent) are summed in one joint pass when their modes are within
 * about a standard deviation of each other: one window, the P_j stepped once for both, two sequences of
 * Poisson weights, each test with its own bounds and stopping rules, until one of them is decided or
 * has converged on a side; each then goes on alone from that state. On the engine benchmark's calls
 * this cut the instructions of noncentralCdfTests by 13 %. Monotonicity in λ (F falls as λ grows) settles
 * one test of a pair from the other only in cases the benchmark hardly has: with λ_lo < λ_hi, F(λ_hi) ≥
 * .95 + s implies F(λ_lo) ≥ .95 − s, but that second test fails in under 1 % of the calls, and
 * F(λ_lo) < .95 + s, which would settle F(λ_hi) < .95 + s, is certified only when F(λ_lo) lies within 2s
 * of .95; in the usual case, F(λ_hi) < .95 < F(λ_lo), each test needs its own bound.
 *
 * Tried and dropped, as no faster or slower under V8 on the engine's recorded calls: the loop's sharper
 * upper bound and the lower bound below tested at every step (14.5 instead of 18.5 steps, but 9–16 %
 * more time for the arithmetic per step); the matching lower bound
 * F ≥ S + P_(j_lo) · max(0, R − w_(j_hi) μ/(j_hi + 1 − μ)) (P_j ≥ P_(j_lo) below the window, and U_lo
 * = R − U_hi), even every fourth step; stepping the side that decides more often (up for targets
 * above ½, down below: 30 % fewer terms, but more passes through the loop, or twice the code when
 * unrolled, for no measurable gain); one reciprocal for the two upward ratios instead of two divisions.
 */
export function noncentralCdfTests(
  x: number,
  df: number,
  lambda1: number,
  target1: number,
  lambda2: number,
  target2: number,
  lambda3: number,
  target3: number,
  lambda4: number,
  target4: number,
): number {
  const TAIL = 1e-13;
  const MAX_TERMS = 100_000;
  const COARSE = 1e-7;
  const WALK = 64;
  const a = df / 2;
  const y = x / 2;
  const inverseY = 1 / y;
  // What the previous test left: P̃ and t at its mode and at both ends of its window, and their slack.
  let known = false;
  let slack = 0;
  let jStart = 0;
  let pStart = 0;
  let tStart = 0;
  let jUp = 0;
  let pUp = 0;
  let tUp = 0;
  let jDown = 0;
  let pDown = 0;
  let tDown = 0;
  // What a joint pass (see below) left for the second test of its pair: its decision (0: none yet), its
  // partial sum, unseen mass and weights at both ends, and the window's ends.
  let resumed = false;
  let rDecided = 0;
  let rSum = 0;
  let rUnseen = 0;
  let rWUp = 0;
  let rWDown = 0;
  let rJUp = 0;
  let rPUp = 0;
  let rTUp = 0;
  let rJDown = 0;
  let rPDown = 0;
  let rTDown = 0;
  let failed = 0;
  for (let test = 0; test < 4; test++) {
    const lambda = test === 0 ? lambda1 : test === 1 ? lambda2 : test === 2 ? lambda3 : lambda4;
    const target = test === 0 ? target1 : test === 1 ? target2 : test === 2 ? target3 : target4;
    if (Number.isNaN(lambda)) continue;
    let answer: boolean;
    if (x <= 0) {
      answer = target <= 0;
    } else if (lambda <= 0) {
      answer = regularizedGammaP(a, y) >= target;
    } else {
      const mu = lambda / 2;
      const inverseMu = 1 / mu;
      // 1: F ≥ target certain, −1: F < target certain, 0: not yet (after the loop: the series converged).
      let decided = 0;
      let sum = 0;
      let unseen = 0;
      let wUp = 0;
      let wDown = 0;
      if (resumed) {
        // the second test of a pair: carry on from where the joint pass stopped
        resumed = false;
        decided = rDecided;
        sum = rSum;
        unseen = rUnseen;
        wUp = rWUp;
        wDown = rWDown;
        jUp = rJUp;
        pUp = rPUp;
        tUp = rTUp;
        jDown = rJDown;
        pDown = rPDown;
        tDown = rTDown;
      } else {
        const mode = Math.floor(mu);
        // The next test is summed jointly with this one when its noncentrality is positive and its mode
        // m_B is within about a standard deviation of this one's, (m_B − m)² ≤ μ + 1 (see below; of the
        // bounds tried, σ/4, σ/2, σ, 1.5σ, 2σ and σ plus one or more steps, the fewest instructions).
        let muB = Number.NaN;
        let modeB = 0;
        if (test === 0 || test === 2) {
          const lambdaB = test === 0 ? lambda2 : lambda4;
          modeB = Math.floor(lambdaB / 2);
          if (lambdaB > 0 && (modeB - mode) * (modeB - mode) <= mu + 1) muB = lambdaB / 2;
        }
        const paired = muB === muB;
        // The Poisson probabilities at the modes, μ^m e^−μ / m!, written out here rather than called: a
        // call that V8 does not inline (its inlining budget is spent on the gamma functions) returns an
        // untyped value, and the loops' variables it flows into would then be boxed at every step.
        // For m < 10 directly as e^−μ · Π μ/i (no underflow as μ < 10; m rounding errors of one unit
        // each). For m ≥ 10 from Stirling's formula for m! (Abramowitz & Stegun 6.1.40): with f = μ − m
        // ∈ [0, 1) and u = f/m < 0.1, ln w = m·ln(1 + u) − f − ½ ln(2πm) − δ(m), where m·ln(1 + u) − f
        // = −f·u·Σ_k (−u)^k/(k + 2) and δ is the remainder of Stirling's series. The alternating sum is
        // cut after 15 terms (the rest is below u^15/17 < 6e-17), so z = −f·u·Σ − δ(m) lies in (−0.06, 0]
        // and e^z is taken from its Taylor series to z^8/8! (the rest below 3e-17 of it): about 100
        // instructions fewer than gammaPrefactor(m + 1, μ)/μ (Loader 2000, through log1p and exp), and as
        // accurate (within 2.3e-16 of mpmath's value at 40 digits on 313 modes from 10 to 3·10⁸).
        let weightAtMode = 0;
        let weightB = 0;
        for (let q = 0; q < 2; q++) {
          const m = q === 0 ? mode : modeB;
          const mq = q === 0 ? mu : muB;
          let w: number;
          if (m >= 10) {
            const f = mq - m;
            const u = f / m;
            const sumU = 1 / 2 - u * (1 / 3 - u * (1 / 4 - u * (1 / 5 - u * (1 / 6 - u * (1 / 7 - u * (1 / 8 - u * (1 / 9 - u * (1 / 10 - u * (1 / 11 - u * (1 / 12 - u * (1 / 13 - u * (1 / 14 - u * (1 / 15 - u * (1 / 16))))))))))))));
            const r = 1 / m;
            const r2 = r * r;
            const stirling = r * (1 / 12 - r2 * (1 / 360 - r2 * (1 / 1260 - r2 * (1 / 1680 - r2 * (1 / 1188 - r2 * (691 / 360360 - r2 * (1 / 156)))))));
            const z = -f * u * sumU - stirling;
            const expZ = 1 + z * (1 + z * (1 / 2 + z * (1 / 6 + z * (1 / 24 + z * (1 / 120 + z * (1 / 720 + z * (1 / 5040 + z * (1 / 40320))))))));
            w = expZ / Math.sqrt(2 * Math.PI * m);
          } else {
            w = Math.exp(-mq);
            for (let i = 1; i <= m; i++) w *= mq / i;
          }
          if (q === 0) {
            weightAtMode = w;
            if (!paired) break;
          } else {
            weightB = w;
          }
        }
        // Start from the nearest index the previous test reached, if there is one close enough.
        let j = jStart;
        let p = pStart;
        let t = tStart;
        if (known && mode >= jUp) {
          j = jUp;
          p = pUp;
          t = tUp;
        } else if (known && mode <= jDown) {
          j = jDown;
          p = pDown;
          t = tDown;
        }
        if (known && t > 1e-300 && Math.abs(mode - j) <= WALK) {
          for (; j < mode; j++) {
            p -= t;
            t *= y / (a + j + 1);
          }
          for (; j > mode; j--) {
            t *= (a + j) * inverseY;
            p += t;
          }
        } else {
          const prefactor = +gammaPrefactor(a + mode, y);
          // The power series' partial sum is a lower bound on P at the mode, within COARSE; the continued
          // fraction's value is taken as exact (its error is of the order of the series' TAIL).
          // (The unary + types each result as a number even when V8 leaves the call out of line; an untyped
          // value here made the loops' variables boxed, a heap allocation per step.)
          slack = y < a + mode + 1 ? COARSE : 0;
          p = slack > 0 ? +lowerSeriesWithin(a + mode, y, prefactor, COARSE) : +lowerWithPrefactor(a + mode, y, prefactor);
          t = prefactor / (a + mode);
        }
        known = true;
        jStart = mode;
        pStart = p;
        tStart = t;
        sum = weightAtMode * p;
        unseen = 1 - weightAtMode;
        wUp = weightAtMode;
        pUp = p;
        tUp = t;
        jUp = mode;
        wDown = weightAtMode;
        pDown = p;
        tDown = t;
        jDown = mode;
        if (paired) {
          // Joint pass: the two tests of a pair share x and df, so the P_j are the same; only the Poisson
          // weights differ. Both sums are taken over one window, started at this test's mode (the
          // partner's weight there walked from its own mode by the ratios w_(j−1)/w_j = j/μ), each with
          // its own certified bounds as in the single pass below (which hold for any window), until
          // either test is decided or either side of either series has converged; what is left of
          // either test is then finished by the single pass from that state.
          for (let i = modeB; i > mode; i--) weightB *= i / muB;
          for (let i = modeB; i < mode; i++) weightB *= muB / (i + 1);
          const targetB = test === 0 ? target2 : target4;
          const limitA = target - slack;
          const limitB = targetB - slack;
          const inverseMuB = 1 / muB;
          let sumB = weightB * p;
          let unseenB = 1 - weightB;
          let wUpB = weightB;
          let wDownB = weightB;
          let decidedB = 0;
          for (let step = 1; step < MAX_TERMS && jDown > 0; step++) {
            if (sum >= target || sum + unseen < limitA || sumB >= targetB || sumB + unseenB < limitB) break;
            if ((step & 3) === 0) {
              const gap = limitA - sum - pUp * unseen;
              if (gap > 0 && jDown < mu && (1 - pUp) * wDown * jDown < gap * (mu - jDown)) {
                decided = -1;
                break;
              }
              const gapB = limitB - sumB - pUp * unseenB;
              if (gapB > 0 && jDown < muB && (1 - pUp) * wDownB * jDown < gapB * (muB - jDown)) {
                decidedB = -1;
                break;
              }
              if ((jUp + 1 > mu && wUp * pUp * mu < TAIL * (jUp + 1 - mu)) || wUp === 0 || pUp === 0) break;
              if ((jUp + 1 > muB && wUpB * pUp * muB < TAIL * (jUp + 1 - muB)) || wUpB === 0) break;
              if (wDown * jDown < TAIL * (mu - jDown) || wDown === 0) break;
              if (wDownB * jDown < TAIL * (muB - jDown) || wDownB === 0) break;
            }
            pUp -= tUp;
            tUp *= y / (a + jUp + 1);
            wUp *= mu / (jUp + 1);
            wUpB *= muB / (jUp + 1);
            jUp++;
            sum += wUp * pUp;
            unseen -= wUp;
            sumB += wUpB * pUp;
            unseenB -= wUpB;
            tDown *= (a + jDown) * inverseY;
            pDown += tDown;
            wDown *= jDown * inverseMu;
            wDownB *= jDown * inverseMuB;
            jDown--;
            sum += wDown * pDown;
            unseen -= wDown;
            sumB += wDownB * pDown;
            unseenB -= wDownB;
          }
          if (decided === 0) {
            if (sum >= target) decided = 1;
            else if (sum + unseen < limitA) decided = -1;
          }
          if (decidedB === 0) {
            if (sumB >= targetB) decidedB = 1;
            else if (sumB + unseenB < limitB) decidedB = -1;
          }
          resumed = true;
          rDecided = decidedB;
          rSum = sumB;
          rUnseen = unseenB;
          rWUp = wUpB;
          rWDown = wDownB;
          rJUp = jUp;
          rPUp = pUp;
          rTUp = tUp;
          rJDown = jDown;
          rPDown = pDown;
          rTDown = tDown;
        }
      }
      const limit = target - slack;
      let upDone = false;
      let downDone = jDown === 0;
      for (let step = 1; decided === 0 && step < MAX_TERMS; step++) {
        if (sum >= target) {
          decided = 1;
          break;
        }
        if (sum + unseen < limit) {
          decided = -1;
          break;
        }
        // Every fourth step, a sharper upper bound and the TAIL tests. Sharper bound: every P_j above the
        // window is at most α = P_(j_hi), so with U_hi + U_lo = R the Poisson mass above and below the
        // window, F ≤ S + α U_hi + U_lo = S + α R + (1 − α) U_lo. The ratios w_(j−1)/w_j = j/μ fall as j
        // does, so for j_lo < μ, w_(j_lo−k) ≤ w_(j_lo) (j_lo/μ)^k and U_lo ≤ w_(j_lo) j_lo/(μ − j_lo) (the
        // geometric series, k ≥ 1); written cross-multiplied. It decides a test a few steps sooner, but
        // costs more than it saves when evaluated every step. Whether a direction's remainder is below
        // TAIL only matters once the answer is close; stepping on past that point adds negligible terms.
        if ((step & 3) === 0) {
          const gap = limit - sum - pUp * unseen;
          if (gap > 0 && jDown < mu && (1 - pUp) * wDown * jDown < gap * (mu - jDown)) {
            decided = -1;
            break;
          }
          if ((jUp + 1 > mu && wUp * pUp * mu < TAIL * (jUp + 1 - mu)) || wUp === 0 || pUp === 0) upDone = true;
          if (wDown * jDown < TAIL * (mu - jDown) || wDown === 0) downDone = true;
          if (upDone && downDone) break;
        }
        // No clamping of P_j to [0, 1] here, unlike the full sum: the recurrences can leave that range only
        // by rounding (of the order of 1e-16 per step, far below TAIL), and the two tests cost 2–5 %.
        if (!upDone) {
          pUp -= tUp;
          tUp *= y / (a + jUp + 1);
          wUp *= mu / (jUp + 1);
          jUp++;
          sum += wUp * pUp;
          unseen -= wUp;
        }
        if (!downDone) {
          tDown *= (a + jDown) * inverseY;
          pDown += tDown;
          wDown *= jDown * inverseMu;
          jDown--;
          sum += wDown * pDown;
          unseen -= wDown;
          if (jDown === 0) downDone = true;
        }
      }
      // Converged to TAIL: with P at the mode exact that is the answer; otherwise F lies within COARSE
      // of the target, which is rare, and the full sum decides. (A second pass of this loop with the
      // precise P, tried first, made V8 recompile the function into slower code once it had run.)
      if (decided !== 0) answer = decided > 0;
      else if (slack === 0 || sum + slack < target) answer = sum >= target;
      else answer = noncentralChisqCdf(x, df, lambda) >= target;
    }
    if (test === 0 || test === 2) {
      if (!answer) return -1;
    } else if (answer) {
      failed |= 1 << test;
    }
  }
  return failed;
}

/**
 * The noncentrality λ ≥ 0 with F(x; df, λ) = target (F falls as λ grows), or 0 when even λ = 0 gives
 * F < target, to a relative tolerance of 1e-12 in λ. Newton's method on F − target, with the slope from
 * the same series (cdfAndSlope), started from the normal approximation X ≈ N(df + λ, 2(df + 2λ)), and
 * safeguarded by a bracket: a step that leaves it doubles the upper end while none is known and bisects
 * otherwise. (Regula falsi, used before, needed about 13 evaluations of the series per root.)
 */
export function noncentralityForCdf(x: number, df: number, target: number): number {
  const atZero = cdfAndSlope(x, df, 0);
  if (!(atZero.cdf > target)) return 0;
  // Φ((x − df − λ)/√(2df + 4λ)) = target, i.e. u = x − df − λ = z·√(2df + 4λ) with Φ(z) = target:
  // u² + 4z²u − z²(4x − 2df) = 0, the root with the sign of z.
  const z = standardNormalUpperQuantile(1 - target);
  const u = -2 * z * z + Math.sign(z) * Math.sqrt(4 * z ** 4 + z * z * Math.max(0, 4 * x - 2 * df));
  let lambda = Math.max(0, x - df - u);
  let lo = 0;
  let hi = Infinity;
  for (let i = 0; i < 200; i++) {
    const { cdf, slope } = cdfAndSlope(x, df, lambda);
    const g = cdf - target;
    if (g === 0) return lambda;
    if (g > 0) lo = lambda;
    else hi = lambda;
    let next = slope < 0 ? lambda - g / slope : Number.NaN;
    if (!(next > lo && next < hi)) next = hi === Infinity ? Math.max(2 * lambda, lambda + 1) : (lo + hi) / 2;
    if (Math.abs(next - lambda) <= 1e-12 * Math.max(1, lambda) || hi - lo <= 1e-12 * Math.max(1, lo)) return next;
    if (next > 1e12) return next;
    lambda = next;
  }
  return lambda;
}
