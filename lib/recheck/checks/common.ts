// Helpers shared by the checks: p-value verdicts with the DESIGN §4.1 rounding and alpha rules.
import { chisqUpperTailInterval as chisqUpperTailIntervalImport } from "../distributions/chisq";
import { meets as meetsImport } from "../interval";
import type { PrintedP } from "../printed";
import type { Estimator, Interval } from "../types";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const chisqUpperTailInterval = chisqUpperTailIntervalImport;
const meets = meetsImport;

/** How a printed p relates to a recomputed p interval. */
export type PVerdict = "consistent" | "halved" | "halved-changed" | "changed" | "mismatch";

/** p < alpha for every value the printed p allows ("< .05" excludes .05 itself). */
export function printedSignificant(p: PrintedP, alpha: number): boolean {
  return p.hi < alpha || (p.hiOpen && p.hi <= alpha);
}

/** p ≥ alpha for every value the printed p allows ("ns" is [alpha, 1]). */
export function printedNotSignificant(p: PrintedP, alpha: number): boolean {
  return p.lo >= alpha;
}

/**
 * A changed conclusion needs both intervals entirely on opposite sides of alpha (DESIGN §4.1): a p that
 * straddles alpha at its printed precision never changes a conclusion.
 */
export function conclusionChanged(p: PrintedP, lo: number, hi: number, alpha: number): boolean {
  return (printedSignificant(p, alpha) && lo >= alpha) || (printedNotSignificant(p, alpha) && hi < alpha);
}

/**
 * Judges a printed p against the recomputed interval [lo, hi]. "halved": an exactly printed p matches
 * half the recomputed one (Bakker & Wicherts 2011) — only for "= x" prints, since an inequality such as
 * "< .001" says nothing about halving.
 */
export function judgeP(p: PrintedP, lo: number, hi: number, alpha: number): PVerdict {
  if (meets(p.lo, p.hi, lo, hi)) return "consistent";
  const changed = conclusionChanged(p, lo, hi, alpha);
  if (p.relation === "=" && meets(p.lo, p.hi, lo / 2, hi / 2)) return changed ? "halved-changed" : "halved";
  return changed ? "changed" : "mismatch";
}

/**
 * Upper-tail p interval of a chi-square statistic interval (Q falls as x grows): [Q(hi), Q(lo)], the
 * second end from the first by chisqUpperTailInterval's short integral when the interval is narrow.
 */
export function upperTailInterval(stat: Interval, df: number): Interval {
  return chisqUpperTailInterval(Math.max(0, stat.lo), Math.max(0, stat.hi), df);
}

/**
 * Estimators whose χ² and log-likelihood are the normal-theory maximum-likelihood ones (the robust
 * variants keep the ML estimates and only correct the test), so that AIC/BIC arithmetic holds: ML, MLR,
 * MLM, MLMV. A missing estimator is read as ML, the default of every SEM program.
 */
export function isMlFamily(estimator: Estimator | null): boolean {
  // comparisons rather than a Set: the estimator is one of the parser's interned names, so each is a
  // pointer compare, where Set.has hashed the string (about 0.3 % of the engine's time)
  return estimator === null || estimator === "ML" || estimator === "MLR" || estimator === "MLM" || estimator === "MLMV";
}

/** Interval of a printed figure in the shape findings store. */
export function asInterval(x: { lo: number; hi: number }): Interval {
  return { lo: x.lo, hi: x.hi };
}

/** "Model A" / "Model B" plus the label when there is one, for messages. */
export function modelName(subject: "a" | "b", label: string): string {
  const name = subject === "a" ? "model A" : "model B";
  return label === "" ? name : `${name} (${label})`;
}
