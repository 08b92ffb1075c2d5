// Information criteria: AIC = −2LL + 2q (Akaike 1974), BIC = −2LL + q·ln N (Schwarz 1978). For two ML
// models of the same data χ² = 2(LL_saturated − LL) and df = moments − q, so whatever AIC convention the
// software prints, ΔAIC = Δχ² − 2Δdf and ΔBIC = Δχ² − Δdf·ln N (DESIGN §4.3). These checks always use
// the normal-theory χ² and log-likelihood, also for robust estimators.
import { differenceOf as differenceOfImport, meets as meetsImport, showInterval as showIntervalImport } from "../interval";
import type { ParsedComparison, ParsedModel } from "../parse";
import type { PrintedNumber } from "../printed";
import type { RecomputedKey, Report } from "../report";
import type { Interval } from "../types";
import { isMlFamily as isMlFamilyImport, modelName as modelNameImport } from "./common";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const differenceOf = differenceOfImport;
const isMlFamily = isMlFamilyImport;
const meets = meetsImport;
const modelName = modelNameImport;
const showInterval = showIntervalImport;

interface Convention {
  name: string;
  value: Interval;
}

/** AIC and BIC of one model against its log-likelihood and number of free parameters. */
export function checkModelCriteria(m: ParsedModel, subject: "a" | "b", n: number | null, report: Report): void {
  if (m.aic === null && m.bic === null) return;
  if (m.loglik === null || m.npar === null) {
    report.skip("information-criteria-inconsistent", subject, "AIC/BIC from the log-likelihood need loglik and npar");
    return;
  }
  if (!isMlFamily(m.estimator)) {
    report.skip("information-criteria-inconsistent", subject, "the estimator is not maximum likelihood");
    return;
  }
  const ll = m.loglik;
  const q = m.npar;
  if (m.aic !== null) {
    const aic = m.aic;
    const primary = { lo: -2 * ll.hi + 2 * q, hi: -2 * ll.lo + 2 * q };
    const key = subject === "a" ? "a.aicFromLoglik" : "b.aicFromLoglik";
    // the usual case: the log-likelihood convention reproduces it, and no list of conventions is built
    if (meets(aic.lo, aic.hi, primary.lo, primary.hi)) {
      if (subject === "a") report.recomputed["a.aicFromLoglik"] = primary;
      else report.recomputed["b.aicFromLoglik"] = primary;
    } else {
      const conventions: Convention[] = [{ name: "−2LL + 2q", value: primary }];
      // Some programs print χ²-based AIC variants (χ² + 2q; χ² − 2df); a printed value is consistent
      // when any convention reproduces it.
      if (m.chisq !== null) conventions.push({ name: "χ² + 2q", value: { lo: m.chisq.lo + 2 * q, hi: m.chisq.hi + 2 * q } });
      if (m.chisq !== null && m.df !== null && m.df >= 0) conventions.push({ name: "χ² − 2df", value: { lo: m.chisq.lo - 2 * m.df, hi: m.chisq.hi - 2 * m.df } });
      judgeCriterion(report, subject, () => `${modelName(subject, m.label)}: reported AIC = ${aic.text}, but −2·(${ll.text}) + 2·${q}`, aic, conventions, key);
    }
  }
  if (m.bic !== null) {
    if (n === null) {
      report.skip("information-criteria-inconsistent", subject, "BIC needs N");
      return;
    }
    const lnN = Math.log(n);
    const bic = m.bic;
    const primary = { lo: -2 * ll.hi + q * lnN, hi: -2 * ll.lo + q * lnN };
    const key = subject === "a" ? "a.bicFromLoglik" : "b.bicFromLoglik";
    if (meets(bic.lo, bic.hi, primary.lo, primary.hi)) {
      if (subject === "a") report.recomputed["a.bicFromLoglik"] = primary;
      else report.recomputed["b.bicFromLoglik"] = primary;
      return;
    }
    const conventions: Convention[] = [{ name: "−2LL + q·ln N", value: primary }];
    if (m.chisq !== null) conventions.push({ name: "χ² + q·ln N", value: { lo: m.chisq.lo + q * lnN, hi: m.chisq.hi + q * lnN } });
    if (m.chisq !== null && m.df !== null && m.df >= 0) conventions.push({ name: "χ² − df·ln N", value: { lo: m.chisq.lo - m.df * lnN, hi: m.chisq.hi - m.df * lnN } });
    judgeCriterion(report, subject, () => `${modelName(subject, m.label)}: reported BIC = ${bic.text}, but −2·(${ll.text}) + ${q}·ln ${n}`, bic, conventions, key);
  }
}

/** `lead` builds the message only when there is a finding. */
function judgeCriterion(report: Report, subject: "a" | "b" | "comparison", lead: () => string, printed: PrintedNumber, conventions: Convention[], key: RecomputedKey): void {
  // a keyed store (one of four keys): only reached when the primary convention failed
  report.recomputed[key] = conventions[0].value;
  for (const c of conventions) if (meets(printed.lo, printed.hi, c.value.lo, c.value.hi)) return;
  const others = conventions.length > 1 ? `; nor does ${conventions.slice(1).map((c) => `${c.name} = ${showInterval(c.value.lo, c.value.hi, 2)}`).join(" or ")}` : "";
  report.add("information-criteria-inconsistent", subject, `${lead()} = ${showInterval(conventions[0].value.lo, conventions[0].value.hi, 2)}${others}`, {
    reported: printed.text,
    recomputed: conventions[0].value,
  });
}

/** ΔAIC and ΔBIC (restricted − free) against the χ² difference, and printed deltas against the pairs. */
export function checkCriteriaArithmetic(c: ParsedComparison, a: ParsedModel, b: ParsedModel, report: Report): void {
  const hasAic = (a.aic !== null && b.aic !== null) || c.dAic !== null;
  const hasBic = (a.bic !== null && b.bic !== null) || c.dBic !== null;
  if (!hasAic && !hasBic) return;
  const mlBoth = isMlFamily(a.estimator) && isMlFamily(b.estimator);
  const haveChisq = a.chisq !== null && b.chisq !== null && a.df !== null && b.df !== null && a.df >= 0 && b.df >= 0;
  const dChisq = haveChisq ? differenceOf(a.chisq as PrintedNumber, b.chisq as PrintedNumber) : null;
  const dDf = haveChisq ? (a.df as number) - (b.df as number) : 0;
  const usable = mlBoth && dChisq !== null;
  if (!usable) {
    // whole literals, so that a skip builds no string
    const reason = !mlBoth ? "ΔAIC/ΔBIC against Δχ²: needs both models fitted by maximum likelihood" : "ΔAIC/ΔBIC against Δχ²: needs both models' χ² and df";
    report.skip("information-criteria-inconsistent", "comparison", reason);
  }
  const ctx: CriterionContext = { report, dChisq: usable ? dChisq : null };
  if (hasAic) checkCriterion(ctx, "AIC", a.aic, b.aic, c.dAic, 2 * dDf, 2, dDf);
  if (hasBic) {
    const n = c.sample.n;
    if (n === null) report.skip("information-criteria-inconsistent", "comparison", "ΔBIC needs N");
    else checkCriterion(ctx, "BIC", a.bic, b.bic, c.dBic, dDf * Math.log(n), dDf, n);
  }
}

interface CriterionContext {
  report: Report;
  /** Δχ² (restricted − free) when both models are ML fits with χ² and df */
  dChisq: Interval | null;
}

/**
 * "Δχ² − 2·Δdf = 22.11 − 2·6" (AIC, unit = Δdf) or "Δχ² − Δdf·ln N = 22.11 − 6·ln 301" (BIC, unit = N);
 * built only for a message.
 */
function expectedText(label: "AIC" | "BIC", dChisq: Interval | null, factor: number, unit: number): string {
  const chi = dChisq ? showInterval(dChisq.lo, dChisq.hi, 2) : "?";
  return label === "AIC" ? `Δχ² − 2·Δdf = ${chi} − 2·${unit}` : `Δχ² − Δdf·ln N = ${chi} − ${factor}·ln ${unit}`;
}

/** One criterion: the printed pair and Δ against Δχ² − penalty, and the printed Δ against the pair. */
function checkCriterion(
  ctx: CriterionContext,
  label: "AIC" | "BIC",
  pa: PrintedNumber | null,
  pb: PrintedNumber | null,
  printedDelta: PrintedNumber | null,
  penalty: number,
  penaltyFactor: number,
  penaltyUnit: number,
): void {
  const { report, dChisq } = ctx;
  const expected = dChisq ? { lo: dChisq.lo - penalty, hi: dChisq.hi - penalty } : null;
  if (expected) {
    if (label === "AIC") report.recomputed.dAic = expected;
    else report.recomputed.dBic = expected;
  }
  if (pa !== null && pb !== null) {
    const pair = differenceOf(pa, pb);
    if (expected && !meets(pair.lo, pair.hi, expected.lo, expected.hi)) {
      report.add(
        "information-criteria-inconsistent",
        "comparison",
        `${label}_A − ${label}_B = ${pa.text} − ${pb.text} = ${showInterval(pair.lo, pair.hi, 2)}, but ${expectedText(label, dChisq, penaltyFactor, penaltyUnit)} = ${showInterval(expected.lo, expected.hi, 2)}`,
        { reported: showInterval(pair.lo, pair.hi, 2), recomputed: expected, criterion: label },
      );
    }
    if (printedDelta !== null && !meets(printedDelta.lo, printedDelta.hi, pair.lo, pair.hi)) {
      report.add(
        "information-criteria-inconsistent",
        "comparison",
        `reported Δ${label} = ${printedDelta.text}, but ${pa.text} − ${pb.text} = ${showInterval(pair.lo, pair.hi, 2)}`,
        { reported: printedDelta.text, recomputed: pair, criterion: label },
      );
    }
  } else if (printedDelta !== null && expected && !meets(printedDelta.lo, printedDelta.hi, expected.lo, expected.hi)) {
    report.add(
      "information-criteria-inconsistent",
      "comparison",
      `reported Δ${label} = ${printedDelta.text}, but ${expectedText(label, dChisq, penaltyFactor, penaltyUnit)} = ${showInterval(expected.lo, expected.hi, 2)}`,
      { reported: printedDelta.text, recomputed: expected, criterion: label },
    );
  }
}

type Verdict = "a" | "b" | "undecided";

/** Which model a criterion difference (restricted − free) favours, beyond rounding. */
function favoured(delta: Interval): Verdict {
  if (delta.lo > 0) return "b";
  if (delta.hi < 0) return "a";
  return "undecided";
}

function criterionDelta(pa: PrintedNumber | null, pb: PrintedNumber | null, printed: PrintedNumber | null): Interval | null {
  if (pa !== null && pb !== null) return differenceOf(pa, pb);
  if (printed !== null) return { lo: printed.lo, hi: printed.hi };
  return null;
}

/**
 * For `ic` comparisons: the preferred model against AIC/BIC (smaller is better), AIC/BIC disagreement,
 * and near ties |ΔAIC| < 2 (Burnham & Anderson 2002). When both criteria are printed and disagree, the
 * preference contradicts "the criteria" only if it contradicts both (DESIGN §4.3), i.e. never.
 */
export function checkPreference(c: ParsedComparison, a: ParsedModel, b: ParsedModel, nearTie: number, report: Report): void {
  const dAic = criterionDelta(a.aic, b.aic, c.dAic);
  const dBic = criterionDelta(a.bic, b.bic, c.dBic);
  if (dAic === null && dBic === null) {
    report.skip("preferred-model-contradicts-criteria", "comparison", "no AIC or BIC printed");
    return;
  }
  const aic = dAic ? favoured(dAic) : "undecided";
  const bic = dBic ? favoured(dBic) : "undecided";
  const disagree = (aic === "a" && bic === "b") || (aic === "b" && bic === "a");
  if (disagree && dAic && dBic) {
    report.add(
      "criteria-disagree",
      "comparison",
      `AIC favours model ${aic.toUpperCase()} (ΔAIC = ${showInterval(dAic.lo, dAic.hi, 2)}) but BIC favours model ${bic.toUpperCase()} (ΔBIC = ${showInterval(dBic.lo, dBic.hi, 2)})`,
      { dAic, dBic },
    );
  }
  const preferred = c.preferred;
  if (preferred === "a" || preferred === "b") {
    const other = preferred === "a" ? "b" : "a";
    const againstAic = dAic !== null && aic === other;
    const againstBic = dBic !== null && bic === other;
    const contradicts = dAic !== null && dBic !== null ? againstAic && againstBic : againstAic || againstBic;
    if (contradicts) {
      const parts: string[] = [];
      if (againstAic && dAic) parts.push(`ΔAIC (A − B) = ${showInterval(dAic.lo, dAic.hi, 2)}`);
      if (againstBic && dBic) parts.push(`ΔBIC (A − B) = ${showInterval(dBic.lo, dBic.hi, 2)}`);
      report.add(
        "preferred-model-contradicts-criteria",
        "comparison",
        `model ${preferred.toUpperCase()} is preferred, but ${parts.join(" and ")} favour${parts.length === 1 ? "s" : ""} model ${other.toUpperCase()}`,
        { preferred, ...(dAic ? { dAic } : {}), ...(dBic ? { dBic } : {}) },
      );
    }
  } else if (preferred === null) {
    report.skip("preferred-model-contradicts-criteria", "comparison", "no preferred model recorded");
  }
  if (dAic !== null) {
    if (dAic.lo > -nearTie && dAic.hi < nearTie) {
      report.add("criteria-near-tie", "comparison", `ΔAIC = ${showInterval(dAic.lo, dAic.hi, 2)} lies within ±${nearTie}: the data barely distinguish the models`, { dAic, threshold: nearTie });
    }
  } else {
    report.skip("criteria-near-tie", "comparison", "no AIC printed");
  }
}
