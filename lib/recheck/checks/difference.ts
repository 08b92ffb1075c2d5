// The difference test of a comparison (DESIGN §4.3): Δdf, Δχ², its p, and for robust estimators the
// Satorra–Bentler scaled difference. A and B are already in restricted/free order here, and every
// printed Δ is read as restricted − free.
import {
  differenceOf as differenceOfImport,
  meets as meetsImport,
  show as showImport,
  showInterval as showIntervalImport,
  showPInterval as showPIntervalImport,
} from "../interval";
import type { ParsedComparison, ParsedModel } from "../parse";
import type { PrintedNumber, PrintedP } from "../printed";
import type { Report } from "../report";
import type { Interval } from "../types";
import {
  conclusionChanged as conclusionChangedImport,
  isMlFamily as isMlFamilyImport,
  judgeP as judgePImport,
  upperTailInterval as upperTailIntervalImport,
} from "./common";
import { pText as pTextImport } from "./model";
import {
  chisqForm as chisqFormImport,
  loglikForm as loglikFormImport,
  sbApplies as sbAppliesImport,
  type FormOutcome,
  type ScaledForm,
} from "./scaled";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const chisqForm = chisqFormImport;
const conclusionChanged = conclusionChangedImport;
const differenceOf = differenceOfImport;
const isMlFamily = isMlFamilyImport;
const judgeP = judgePImport;
const loglikForm = loglikFormImport;
const meets = meetsImport;
const pText = pTextImport;
const sbApplies = sbAppliesImport;
const show = showImport;
const showInterval = showIntervalImport;
const showPInterval = showPIntervalImport;
const upperTailInterval = upperTailIntervalImport;


/** Δdf checks; returns the df of the difference test (models' df first, else the printed Δdf) or null. */
export function checkDfDifference(c: ParsedComparison, a: ParsedModel, b: ParsedModel, report: Report): number | null {
  const known = a.df !== null && b.df !== null && a.df >= 0 && b.df >= 0;
  const modelDdf = known ? (a.df as number) - (b.df as number) : null;
  if (modelDdf !== null) report.recomputed.dDf = modelDdf;
  if (c.dDf !== null) {
    if (modelDdf !== null && c.dDf !== modelDdf) {
      report.add("df-difference-mismatch", "comparison", `reported Δdf = ${c.dDf}, but ${a.df} − ${b.df} = ${modelDdf}`, {
        reported: c.dDf,
        recomputed: modelDdf,
        restrictedDf: a.df as number,
        freeDf: b.df as number,
      });
    } else if (modelDdf === null && c.dDf < 0) {
      report.add("df-difference-mismatch", "comparison", `reported Δdf = ${c.dDf} is negative, but Δdf is read as restricted − free and cannot be below 0`, { reported: c.dDf });
    } else if (modelDdf === null) {
      report.skip("df-difference-mismatch", "comparison", "needs both models' (non-negative) df");
    }
  } else {
    report.skip("df-difference-mismatch", "comparison", "no Δdf printed");
  }
  const testDf = modelDdf ?? c.dDf;
  // the methods that are a difference test (comparisons, not a Set: see isMlFamily)
  if (testDf === 0 && (c.method === "lrt" || c.method === "scaled_lrt" || c.method === "invariance")) {
    const how = modelDdf !== null ? `both models have df = ${a.df}` : "the reported Δdf is 0";
    report.add("zero-df-difference", "comparison", `${how}: ${c.method === "scaled_lrt" ? "a" : "an"} ${c.method} comparison needs Δdf > 0, so no difference test exists`, { dDf: 0 });
  }
  return testDf !== null && testDf > 0 ? testDf : null;
}

/** A restricted model cannot fit better than the model it is nested in, under ML. */
export function checkNegativeDifference(c: ParsedComparison, a: ParsedModel, b: ParsedModel, report: Report): void {
  if (c.dChisq !== null && c.dChisq.hi < 0) {
    report.add(
      "negative-chisq-difference",
      "comparison",
      `reported Δχ² = ${c.dChisq.text} is negative; read as restricted − free, the restricted model would fit better than the model it is nested in`,
      { reported: c.dChisq.text },
    );
  }
  const nestedClaimed = c.nested === "yes" || (c.nested === "unknown" && c.method !== "ic");
  if (!nestedClaimed || a.chisq === null || b.chisq === null) return;
  if (!isMlFamily(a.estimator) || !isMlFamily(b.estimator)) return;
  if (a.df !== null && b.df !== null && a.df === b.df) return;
  if (a.chisq.hi < b.chisq.lo) {
    report.add(
      "negative-chisq-difference",
      "comparison",
      `the restricted model's χ² = ${a.chisq.text} is below the free model's χ² = ${b.chisq.text}: under ML a nested model with more constraints cannot fit better`,
      { restrictedChisq: a.chisq.text, freeChisq: b.chisq.text },
    );
  }
}

/**
 * Raises the p verdict of a difference test of `stat` (the printed Δχ² when there is one). The basis of
 * the message is built here, after the verdict: most p are consistent and need no message.
 */
function reportDifferenceP(p: PrintedP, recomputed: Interval, printedStat: PrintedNumber | null, stat: Interval, df: number, alpha: number, report: Report): void {
  const verdict = judgeP(p, recomputed.lo, recomputed.hi, alpha);
  if (verdict === "consistent") return;
  const basis = printedStat !== null ? `Δχ² = ${printedStat.text}` : `Δχ² = ${showInterval(stat.lo, stat.hi, 2)} (from the models)`;
  const because = `${basis} with Δdf = ${df} gives p = ${showPInterval(recomputed.lo, recomputed.hi)}`;
  const values = { reported: p.text, recomputed, df, alpha };
  if (verdict === "halved" || verdict === "halved-changed") {
    report.add("halved-p", "comparison", `reported difference-test p = ${p.text} is half the p of its test: ${because}`, values);
  }
  if (verdict === "changed" || verdict === "halved-changed") {
    report.add("difference-conclusion-changed", "comparison", `reported p ${pText(p.text)}, but ${because}, on the other side of α = ${alpha}`, values);
  } else if (verdict === "mismatch") {
    report.add("difference-p-mismatch", "comparison", `reported p ${pText(p.text)}, but ${because}`, values);
  }
}

export interface DifferenceContext {
  comparison: ParsedComparison;
  restricted: ParsedModel;
  free: ParsedModel;
  testDf: number | null;
  report: Report;
}

/** Plain (normal-theory) chi-square difference test. */
export function checkPlainDifference(ctx: DifferenceContext): void {
  const { comparison: c, restricted: a, free: b, report } = ctx;
  const modelDiff = a.chisq !== null && b.chisq !== null ? differenceOf(a.chisq, b.chisq) : null;
  if (modelDiff !== null) report.recomputed.dChisq = modelDiff;
  if (c.dChisq !== null && modelDiff !== null) {
    if (!meets(c.dChisq.lo, c.dChisq.hi, modelDiff.lo, modelDiff.hi)) {
      report.add(
        "chisq-difference-mismatch",
        "comparison",
        `reported Δχ² = ${c.dChisq.text}, but ${a.chisq?.text} − ${b.chisq?.text} = ${showInterval(modelDiff.lo, modelDiff.hi, 2)}`,
        { reported: c.dChisq.text, recomputed: modelDiff },
      );
    }
  } else {
    report.skip("chisq-difference-mismatch", "comparison", c.dChisq === null ? "no Δχ² printed" : "needs both models' χ²");
  }
  checkPOfStatistic(ctx, modelDiff);
}

/** The difference p against the printed Δχ² when there is one (the paper's p came from it), else against `fallback`. */
function checkPOfStatistic(ctx: DifferenceContext, fallback: Interval | null): void {
  const { comparison: c, testDf, report } = ctx;
  if (c.dP === null) {
    report.skip("difference-p-mismatch", "comparison", "no difference-test p printed");
    return;
  }
  const stat = c.dChisq ?? fallback;
  if (stat === null || testDf === null) {
    report.skip("difference-p-mismatch", "comparison", stat === null ? "no Δχ² printed or computable" : "no positive Δdf known");
    return;
  }
  const p = upperTailInterval(stat, testDf);
  report.recomputed.dP = p;
  reportDifferenceP(c.dP, p, c.dChisq, stat, testDf, c.alpha, report);
}

/** Scaled (robust) difference: Satorra–Bentler forms, the naive difference of scaled χ², and the p. */
export function checkScaledDifference(ctx: DifferenceContext): void {
  const { comparison: c, restricted: a, free: b, testDf, report } = ctx;
  // The two outcomes held in variables, the forms as a list of its final length, and the texts of
  // negative and unavailable forms built only when a finding or a skip needs them.
  const applies = sbApplies(a) && sbApplies(b);
  const chisqOutcome = applies ? chisqForm(a, b) : null;
  const loglikOutcome = applies ? loglikForm(a, b) : null;
  const chisqSb = chisqOutcome !== null && chisqOutcome.kind === "form" ? chisqOutcome.form : null;
  const loglikSb = loglikOutcome !== null && loglikOutcome.kind === "form" ? loglikOutcome.form : null;
  const forms: ScaledForm[] = chisqSb !== null ? (loglikSb !== null ? [chisqSb, loglikSb] : [chisqSb]) : loglikSb !== null ? [loglikSb] : [];
  if (chisqSb !== null) {
    report.recomputed["sb2001.cd"] = chisqSb.cd;
    report.recomputed["sb2001.statistic"] = chisqSb.statistic;
  }
  if (loglikSb !== null) {
    report.recomputed["sb2001Loglik.cd"] = loglikSb.cd;
    report.recomputed["sb2001Loglik.statistic"] = loglikSb.statistic;
  }
  if (forms.length === 0 && ((chisqOutcome !== null && chisqOutcome.kind === "negative") || (loglikOutcome !== null && loglikOutcome.kind === "negative"))) {
    const negatives = negativeText(chisqOutcome, loglikOutcome);
    report.add(
      "negative-scaling-correction",
      "comparison",
      `the scaling correction of the difference is not positive (${negatives}), so the 2001 scaled difference is undefined; the strictly positive 2010 version needs output papers rarely print`,
      { forms: negatives },
    );
  }
  // The naive difference of the *printed* scaled statistics: what a paper subtracting them would get
  // (a derived χ²/c is too wide at printed precision to show that anyone subtracted it).
  // Only needed when the printed Δχ² matches no form, so computed there.
  const plain = a.chisq !== null && b.chisq !== null ? differenceOf(a.chisq, b.chisq) : null;
  if (plain !== null) report.recomputed.dChisq = plain;

  if (c.dChisq !== null) {
    const d = c.dChisq;
    const matched = chisqSb !== null && meets(d.lo, d.hi, chisqSb.statistic.lo, chisqSb.statistic.hi) ? chisqSb : loglikSb !== null && meets(d.lo, d.hi, loglikSb.statistic.lo, loglikSb.statistic.hi) ? loglikSb : null;
    const naive = matched === null && a.chisqScaled !== null && b.chisqScaled !== null ? differenceOf(a.chisqScaled, b.chisqScaled) : null;
    if (matched !== null) {
      report.recomputed.scaledFormMatched = matched.name;
    } else if (naive !== null && (a.robust || b.robust) && meets(d.lo, d.hi, naive.lo, naive.hi)) {
      report.add(
        "unscaled-robust-difference",
        "comparison",
        `reported Δχ² = ${d.text} equals the plain difference of the scaled χ² (${a.chisqScaled?.text} − ${b.chisqScaled?.text} = ${showInterval(naive.lo, naive.hi, 2)}), which is not chi-square distributed${forms.length > 0 ? `; the scaled difference is ${describeForms(forms)}` : ""}`,
        { reported: d.text, naiveDifference: naive, ...(forms.length > 0 ? { scaledDifference: forms[0].statistic } : {}) },
      );
    } else if (c.method === "lrt" && plain !== null && meets(d.lo, d.hi, plain.lo, plain.hi)) {
      report.recomputed.differenceBasis = "normal-theory χ² (as the method lrt says)";
    } else if (forms.length > 0) {
      const impliedP = c.dP ?? null;
      const formP = testDf === null ? null : formPValues(forms, testDf, report);
      const changed = testDf !== null && formP !== null && formP.every((p) => changedAgainst(impliedP, d, testDf, p, c.alpha));
      report.add(
        "scaled-difference-mismatch",
        "comparison",
        `reported scaled Δχ² = ${d.text}, but the Satorra–Bentler (2001) difference is ${describeForms(forms)}${changed ? `; the conclusion at α = ${c.alpha} changes` : ""}`,
        { reported: d.text, recomputed: forms[0].statistic, cd: forms[0].cd },
        changed ? "error" : "warning",
      );
    } else if (c.method === "lrt" && plain !== null) {
      report.add("chisq-difference-mismatch", "comparison", `reported Δχ² = ${d.text}, but ${a.chisq?.text} − ${b.chisq?.text} = ${showInterval(plain.lo, plain.hi, 2)}`, {
        reported: d.text,
        recomputed: plain,
      });
    } else {
      report.skip("scaled-difference-mismatch", "comparison", reasonsText(applies, chisqOutcome, loglikOutcome));
    }
    // The paper's p came from its printed statistic.
    checkPOfStatistic(ctx, null);
    return;
  }
  // No printed Δχ²: the printed p against the recomputed scaled difference.
  if (c.dP === null) {
    report.skip("scaled-difference-mismatch", "comparison", "no scaled Δχ² or p printed");
    return;
  }
  if (testDf === null) {
    report.skip("scaled-difference-mismatch", "comparison", "no positive Δdf known");
    return;
  }
  const printedP = c.dP;
  if (forms.length === 0) {
    if (c.method === "lrt" && plain !== null) checkPOfStatistic(ctx, plain);
    else report.skip("scaled-difference-mismatch", "comparison", reasonsText(applies, chisqOutcome, loglikOutcome));
    return;
  }
  const formP = formPValues(forms, testDf, report);
  for (const p of formP) if (meets(printedP.lo, printedP.hi, p.lo, p.hi)) return;
  const changed = formP.every((p) => conclusionChanged(printedP, p.lo, p.hi, c.alpha));
  const pTextAll = forms.map((form, i) => `p = ${showPInterval(formP[i].lo, formP[i].hi)} (${form.name}, T = ${showInterval(form.statistic.lo, form.statistic.hi, 2)})`).join(" or ");
  report.add(
    "scaled-difference-mismatch",
    "comparison",
    `reported p ${pText(printedP.text)}, but the Satorra–Bentler (2001) difference with Δdf = ${testDf} gives ${pTextAll}${changed ? `; the conclusion at α = ${c.alpha} changes` : ""}`,
    { reported: printedP.text, recomputed: formP[0], df: testDf },
    changed ? "error" : "warning",
  );
}

/**
 * The p of each scaled form, computed only when a decision needs it (a printed statistic that matches a
 * form is judged by its own p), and recorded in `recomputed` when computed.
 */
function formPValues(forms: ScaledForm[], testDf: number, report: Report): Interval[] {
  const out: Interval[] = [];
  for (const form of forms) {
    const p = upperTailInterval(form.statistic, testDf);
    if (form.name === "chi-square form") report.recomputed["sb2001.p"] = p;
    else report.recomputed["sb2001Loglik.p"] = p;
    out.push(p);
  }
  return out;
}

/** "chi-square form: cd = −0.1234; …" for the forms whose cd is not positive. */
function negativeText(...outcomes: (FormOutcome | null)[]): string {
  const parts: string[] = [];
  for (const o of outcomes) if (o !== null && o.kind === "negative") parts.push(`${o.name}: cd = ${show(o.cdValue, 4)}`);
  return parts.join("; ");
}

/** Why no scaled difference was computed, joined only when a check is actually skipped. */
function reasonsText(applies: boolean, ...outcomes: (FormOutcome | null)[]): string {
  if (!applies) return "Satorra–Bentler 2001: applies to MLR/MLM; MLMV, WLSMV and ULSMV differences (e.g. DIFFTEST) need output papers do not print";
  const parts: string[] = [];
  for (const o of outcomes) if (o !== null && o.kind === "unavailable") parts.push(`${o.name}: ${o.reason}`);
  return parts.length > 0 ? parts.join("; ") : "no scaled difference computable";
}

function describeForms(forms: ScaledForm[]): string {
  return forms.map((form) => `${showInterval(form.statistic.lo, form.statistic.hi, 2)} (${form.name}, cd = ${show(form.cdValue, 4)})`).join(" or ");
}

/**
 * Conclusion of the paper (its printed p, or else the p its printed statistic implies) against the
 * recomputed p interval: changed only when both lie entirely on opposite sides of alpha.
 */
function changedAgainst(printedP: PrintedP | null, printedStat: PrintedNumber, df: number, recomputed: Interval, alpha: number): boolean {
  if (printedP !== null) return conclusionChanged(printedP, recomputed.lo, recomputed.hi, alpha);
  const implied = upperTailInterval(printedStat, df);
  return (implied.hi < alpha && recomputed.lo >= alpha) || (implied.lo >= alpha && recomputed.hi < alpha);
}
