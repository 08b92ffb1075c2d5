// The Satorra–Bentler (2001) scaled difference test, in its two computable forms:
//  chi-square form   cd = (df_A·c_A − df_B·c_B)/(df_A − df_B),  T = (χ²_ML,A − χ²_ML,B)/cd
//  log-likelihood    cd = (q_A·s_A − q_B·s_B)/(q_A − q_B),     T = −2(LL_A − LL_B)/cd
// (q: free parameters, s: the log-likelihood scaling factors printed with MLR). As lavaan does, c_B is
// taken as 1 when the free model has df = 0. Every factor is a printed value, so cd and T are carried
// as intervals: a small cd makes T very sensitive to the printed decimals.
import type { ParsedModel } from "../parse";
import type { Interval } from "../types";
import { scalingFactor as scalingFactorImport } from "./derived";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const scalingFactor = scalingFactorImport;

export type ScaledFormName = "chi-square form" | "log-likelihood form";

export interface ScaledForm {
  name: ScaledFormName;
  cd: Interval;
  cdValue: number;
  statistic: Interval;
  statisticValue: number;
}

export type FormOutcome =
  | { kind: "form"; form: ScaledForm }
  | { kind: "negative"; name: ScaledFormName; cd: Interval; cdValue: number }
  | { kind: "unavailable"; name: ScaledFormName; reason: string };

/** Does the 2001 difference apply: MLR and MLM, whose scaled χ² is a plain mean scaling. */
export function sbApplies(m: ParsedModel): boolean {
  return m.estimator === null ? m.robust : m.estimator === "MLR" || m.estimator === "MLM";
}

/** T = Δ / cd for an interval Δ and a positive interval cd (both ends of each considered). */
function divide(delta: Interval, cd: Interval): Interval {
  if (delta.lo >= 0) return { lo: delta.lo / cd.hi, hi: delta.hi / cd.lo };
  if (delta.hi <= 0) return { lo: delta.lo / cd.lo, hi: delta.hi / cd.hi };
  return { lo: delta.lo / cd.lo, hi: delta.hi / cd.lo };
}

function classify(name: ScaledFormName, cd: Interval, cdValue: number, delta: Interval, deltaValue: number): FormOutcome {
  if (cd.hi <= 0) return { kind: "negative", name, cd, cdValue };
  if (cd.lo <= 0) return { kind: "unavailable", name, reason: `cd = ${cdValue.toFixed(4)} is not bounded away from 0 at the printed precision` };
  return { kind: "form", form: { name, cd, cdValue, statistic: divide(delta, cd), statisticValue: deltaValue / cdValue } };
}

export function chisqForm(a: ParsedModel, b: ParsedModel): FormOutcome {
  const name: ScaledFormName = "chi-square form";
  if (a.chisq === null || b.chisq === null || a.df === null || b.df === null || a.df < 0 || b.df < 0) {
    return { kind: "unavailable", name, reason: "needs both models' ML χ² and (non-negative) df" };
  }
  const dfA = a.df;
  const dfB = b.df;
  if (dfA - dfB <= 0) return { kind: "unavailable", name, reason: "needs df_A > df_B" };
  const cA = scalingFactor(a);
  const cB = dfB === 0 ? { interval: { lo: 1, hi: 1 }, value: 1 } : scalingFactor(b);
  if (cA === null || cB === null) return { kind: "unavailable", name, reason: "needs both models' scaling factors (or ML and scaled χ²)" };
  const ddf = dfA - dfB;
  const cd = {
    lo: (dfA * cA.interval.lo - dfB * cB.interval.hi) / ddf,
    hi: (dfA * cA.interval.hi - dfB * cB.interval.lo) / ddf,
  };
  const cdValue = (dfA * cA.value - dfB * cB.value) / ddf;
  const delta = { lo: a.chisq.lo - b.chisq.hi, hi: a.chisq.hi - b.chisq.lo };
  return classify(name, cd, cdValue, delta, a.chisq.value - b.chisq.value);
}

export function loglikForm(a: ParsedModel, b: ParsedModel): FormOutcome {
  const name: ScaledFormName = "log-likelihood form";
  if (a.loglik === null || b.loglik === null || a.loglikScaling === null || b.loglikScaling === null || a.npar === null || b.npar === null) {
    return { kind: "unavailable", name, reason: "needs both models' log-likelihood, its scaling factor and npar" };
  }
  const qA = a.npar;
  const qB = b.npar;
  if (qB - qA <= 0) return { kind: "unavailable", name, reason: "needs npar_A < npar_B" };
  const sA = a.loglikScaling;
  const sB = b.loglikScaling;
  // cd = (q_B·s_B − q_A·s_A)/(q_B − q_A): rises with s_B, falls with s_A.
  const dq = qB - qA;
  const cd = { lo: (qB * sB.lo - qA * sA.hi) / dq, hi: (qB * sB.hi - qA * sA.lo) / dq };
  const cdValue = (qB * sB.value - qA * sA.value) / dq;
  const delta = { lo: 2 * (b.loglik.lo - a.loglik.hi), hi: 2 * (b.loglik.hi - a.loglik.lo) };
  return classify(name, cd, cdValue, delta, 2 * (b.loglik.value - a.loglik.value));
}
