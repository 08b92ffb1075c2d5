// Turns the "true" fit of an invented model into the figures a paper would print, using the same
// formulas the recheck engine checks (so a clean report raises no finding). Errors are injected later,
// on the printed text, exactly as a typo or a wrong procedure would appear in a paper.
import { chisqUpperTail } from "@/lib/recheck/distributions/chisq";
import { noncentralChisqCdf, noncentralityForCdf } from "@/lib/recheck/distributions/noncentral";
import type { Estimator } from "@/lib/recheck/types";
import type { ModelFigure } from "@/models/figures";

export type PrintedFigures = Partial<Record<ModelFigure, string>>;

export interface TrueModel {
  label: string;
  estimator: Estimator;
  /** normal-theory chi-square */
  chisq: number;
  df: number;
  npar: number;
  nObserved: number;
  meanStructure: boolean;
  n: number;
  groups: number;
  baselineChisq: number;
  baselineDf: number;
  /** log-likelihood of the saturated model (ML) */
  loglikSaturated: number;
  /** chi-square scaling correction factor c (robust estimators) */
  scaling: number;
  /** log-likelihood scaling correction factor (MLR) */
  loglikScaling: number;
}

export interface PrintStyle {
  chisqDecimals: number;
  fitDecimals: number;
  /** print RMSEA with the √G factor for several groups (Steiger 1998) or without */
  rmseaSqrtG: boolean;
  baseline: boolean;
  informationCriteria: boolean;
  /** MLR papers that print only the scaled statistic with LL and its scaling factor */
  loglikForm: boolean;
  parameterCounts: boolean;
}

export const ROBUST: readonly Estimator[] = ["MLR", "MLM", "MLMV", "WLSMV", "ULSMV"];

export function fixed(value: number, decimals: number): string {
  return value.toFixed(decimals);
}

/** APA style: no leading zero, "< .001" below a thousandth. */
export function printP(p: number): string {
  if (p < 0.001) return "< .001";
  return p.toFixed(3).replace(/^0\./, ".");
}

/** APA style for fit indices bounded by one: ".954". */
export function printFit(value: number, decimals: number): string {
  return value.toFixed(decimals).replace(/^(-?)0\./, "$1.");
}

export function rmsea(chisq: number, df: number, n: number, groups: number, sqrtG: boolean): number {
  const base = Math.sqrt(Math.max(0, (chisq - df) / (df * n)));
  return sqrtG ? base * Math.sqrt(groups) : base;
}

/** 90 % interval by inverting the noncentral chi-square (Browne & Cudeck 1993). */
export function rmseaInterval(chisq: number, df: number, n: number, groups: number, sqrtG: boolean): [number, number] {
  const factor = sqrtG ? Math.sqrt(groups) : 1;
  const bound = (target: number) =>
    noncentralChisqCdf(chisq, df, 0) < target ? 0 : Math.sqrt(noncentralityForCdf(chisq, df, target) / (n * df)) * factor;
  return [bound(0.95), bound(0.05)];
}

export function cfi(chisq: number, df: number, baselineChisq: number, baselineDf: number): number {
  const model = Math.max(chisq - df, 0);
  return 1 - model / Math.max(chisq - df, baselineChisq - baselineDf, 0);
}

export function tli(chisq: number, df: number, baselineChisq: number, baselineDf: number): number {
  return (baselineChisq / baselineDf - chisq / df) / (baselineChisq / baselineDf - 1);
}

export function loglik(model: TrueModel): number {
  return model.loglikSaturated - model.chisq / 2;
}

export function printModel(model: TrueModel, style: PrintStyle): PrintedFigures {
  const robust = ROBUST.includes(model.estimator);
  const tested = robust ? model.chisq / model.scaling : model.chisq;
  const figures: PrintedFigures = { df: String(model.df) };
  if (model.df <= 0) {
    figures.chisq = fixed(0, style.chisqDecimals);
    return figures;
  }
  if (!robust || !style.loglikForm) figures.chisq = fixed(model.chisq, style.chisqDecimals);
  if (robust) {
    figures.chisqScaled = fixed(tested, style.chisqDecimals);
    if (!style.loglikForm && model.estimator !== "WLSMV") figures.scaling = fixed(model.scaling, 3);
    if (model.estimator === "WLSMV") delete figures.chisq;
  }
  figures.p = printP(chisqUpperTail(tested, model.df));
  const [lo, hi] = rmseaInterval(tested, model.df, model.n, model.groups, style.rmseaSqrtG);
  figures.rmsea = printFit(rmsea(tested, model.df, model.n, model.groups, style.rmseaSqrtG), style.fitDecimals);
  figures.rmseaLo = printFit(lo, style.fitDecimals);
  figures.rmseaHi = printFit(hi, style.fitDecimals);
  figures.cfi = printFit(cfi(tested, model.df, model.baselineChisq, model.baselineDf), style.fitDecimals);
  figures.tli = printFit(tli(tested, model.df, model.baselineChisq, model.baselineDf), style.fitDecimals);
  figures.srmr = printFit(0.02 + 0.5 * Math.sqrt(Math.max(0, model.chisq - model.df) / (model.df * model.n)), style.fitDecimals);
  if (style.baseline && !robust) {
    figures.baselineChisq = fixed(model.baselineChisq, style.chisqDecimals);
    figures.baselineDf = String(model.baselineDf);
  }
  if (style.informationCriteria && model.estimator !== "WLSMV") {
    const ll = loglik(model);
    figures.loglik = fixed(ll, 2);
    figures.aic = fixed(-2 * ll + 2 * model.npar, 2);
    figures.bic = fixed(-2 * ll + model.npar * Math.log(model.n), 2);
    figures.npar = String(model.npar);
    if (robust && style.loglikForm) figures.loglikScaling = fixed(model.loglikScaling, 3);
  }
  if (style.parameterCounts) {
    figures.npar = String(model.npar);
    figures.nObserved = String(model.nObserved);
  }
  return figures;
}

/** Satorra & Bentler (2001) scaled difference from the true (unrounded) figures. */
export function scaledDifference(a: TrueModel, b: TrueModel, loglikForm: boolean): { statistic: number; cd: number } {
  if (loglikForm) {
    const cd = (a.npar * a.loglikScaling - b.npar * b.loglikScaling) / (a.npar - b.npar);
    return { statistic: (-2 * (loglik(a) - loglik(b))) / cd, cd };
  }
  const cd = (a.df * a.scaling - b.df * b.scaling) / (a.df - b.df);
  return { statistic: (a.chisq - b.chisq) / cd, cd };
}
