// A model's own checks (DESIGN §4.3): identification, its χ² p, RMSEA and CI, CFI/TLI, the df recount
// and AIC/BIC from the log-likelihood. Used for both models of a comparison and for lone models.
import { chisqUpperTailInterval as chisqUpperTailIntervalImport } from "../distributions/chisq";
import { showPInterval as showPIntervalImport } from "../interval";
import type { ParsedModel, ParsedSample } from "../parse";
import type { Report } from "../report";
import type { Interval } from "../types";
import { judgeP as judgePImport, modelName as modelNameImport } from "./common";
import { checkModelCriteria as checkModelCriteriaImport } from "./criteria";
import { type Derived, scaledStatistic as scaledStatisticImport, scalingFactor as scalingFactorImport } from "./derived";
import { checkFitIndices as checkFitIndicesImport } from "./fit-indices";
import {
  describeInterval as describeIntervalImport,
  describePoint as describePointImport,
  intervalMeets as intervalMeetsImport,
  matchRmseaInterval as matchRmseaIntervalImport,
  matchRmseaPoint as matchRmseaPointImport,
  primaryConvention as primaryConventionImport,
  primaryConventionName as primaryConventionNameImport,
  primaryIntervalMeets as primaryIntervalMeetsImport,
  primaryPoint as primaryPointImport,
  primaryPointMeets as primaryPointMeetsImport,
  recomputeRmseaInterval as recomputeRmseaIntervalImport,
  rmseaConventions as rmseaConventionsImport,
  type RmseaConvention,
  type RmseaInputs,
} from "./rmsea";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const checkFitIndices = checkFitIndicesImport;
const chisqUpperTailInterval = chisqUpperTailIntervalImport;
const checkModelCriteria = checkModelCriteriaImport;
const describeInterval = describeIntervalImport;
const describePoint = describePointImport;
const intervalMeets = intervalMeetsImport;
const judgeP = judgePImport;
const matchRmseaInterval = matchRmseaIntervalImport;
const matchRmseaPoint = matchRmseaPointImport;
const modelName = modelNameImport;
const primaryConvention = primaryConventionImport;
const primaryConventionName = primaryConventionNameImport;
const primaryIntervalMeets = primaryIntervalMeetsImport;
const primaryPoint = primaryPointImport;
const primaryPointMeets = primaryPointMeetsImport;
const recomputeRmseaInterval = recomputeRmseaIntervalImport;
const rmseaConventions = rmseaConventionsImport;
const scaledStatistic = scaledStatisticImport;
const scalingFactor = scalingFactorImport;
const showPInterval = showPIntervalImport;

// A model's recomputed figures, stored under its subject's key by a branch: each store then names its
// property (see notRecomputed in report.ts); a keyed store `recomputed[key]` whose key alternates
// between two names would be megamorphic.
function storeP(report: Report, subject: "a" | "b", value: Interval): void {
  if (subject === "a") report.recomputed["a.p"] = value;
  else report.recomputed["b.p"] = value;
}
function storeRmsea(report: Report, subject: "a" | "b", point: Interval, convention: string | null): void {
  const r = report.recomputed;
  if (subject === "a") {
    r["a.rmsea"] = point;
    if (convention !== null) r["a.rmseaConvention"] = convention;
  } else {
    r["b.rmsea"] = point;
    if (convention !== null) r["b.rmseaConvention"] = convention;
  }
}
function storeIntervalConvention(report: Report, subject: "a" | "b", convention: string): void {
  if (subject === "a") report.recomputed["a.rmseaIntervalConvention"] = convention;
  else report.recomputed["b.rmseaIntervalConvention"] = convention;
}
function storeRmseaInterval(report: Report, subject: "a" | "b", value: Interval): void {
  if (subject === "a") report.recomputed["a.rmseaInterval"] = value;
  else report.recomputed["b.rmseaInterval"] = value;
}
function storeDfRecount(report: Report, subject: "a" | "b", value: number): void {
  if (subject === "a") report.recomputed["a.dfRecount"] = value;
  else report.recomputed["b.dfRecount"] = value;
}

export interface ModelCheckContext {
  model: ParsedModel;
  subject: "a" | "b";
  sample: ParsedSample;
  alpha: number;
  report: Report;
  /** a model of a comparison (df = 0 is then an error) or a model checked on its own (a note) */
  inComparison: boolean;
}

/** Runs every model-level check; returns whether the model's df can be used by other checks. */
export function checkModel(ctx: ModelCheckContext): boolean {
  const { model: m, subject, report } = ctx;
  if (m.p !== null && m.p.printedZero) {
    report.add("p-printed-as-zero", subject, `${modelName(subject, m.label)}: p printed as ${m.p.text}; a p-value is never zero (report p < .001)`, { reported: m.p.text });
  }
  checkModelCriteria(m, subject, ctx.sample.n, report);
  checkDfRecount(ctx);

  if (m.df === null) {
    for (const check of DF_CHECKS) report.skip(check, subject, "df not reported");
    return false;
  }
  if (m.df < 0) {
    report.add("negative-df", subject, `${modelName(subject, m.label)} has df = ${m.df}: fewer data moments than free parameters, so it is not identified`, { df: m.df });
    for (const check of DF_CHECKS) report.skip(check, subject, "negative df");
    return false;
  }
  if (m.df === 0) {
    const message = ctx.inComparison
      ? `${modelName(subject, m.label)} has df = 0: it is just-identified and reproduces the data exactly, so the comparison reduces to the other model's own fit test`
      : `${modelName(subject, m.label)} has df = 0: it is just-identified, so its fit cannot be tested`;
    report.add("just-identified-model", subject, message, { df: 0 }, ctx.inComparison ? "error" : "note");
    for (const check of DF_CHECKS) report.skip(check, subject, "df = 0, no fit test exists");
    return true;
  }
  checkModelP(ctx, m.df);
  checkRmsea(ctx, m.df);
  checkFitIndices(m, subject, report);
  return true;
}

const DF_CHECKS = ["model-p-mismatch", "rmsea-mismatch", "rmsea-interval-mismatch", "cfi-mismatch", "tli-mismatch"];

function checkModelP(ctx: ModelCheckContext, df: number): void {
  const { model: m, subject, report, alpha } = ctx;
  // DESIGN §5: the printed p belongs to the scaled χ² when the estimator is robust and one is printed.
  const useScaled = m.robust && m.chisqScaled !== null;
  const stat = useScaled ? m.chisqScaled : m.chisq;
  if (stat === null) {
    report.skip("model-p-mismatch", subject, "no χ² printed");
    return;
  }
  const p = chisqUpperTailInterval(Math.max(0, stat.lo), Math.max(0, stat.hi), df);
  storeP(report, subject, p);
  if (m.p === null) {
    report.skip("model-p-mismatch", subject, "no p printed");
    return;
  }
  const verdict = judgeP(m.p, p.lo, p.hi, alpha);
  if (verdict === "consistent") return;
  const statName = useScaled ? "scaled χ²" : "χ²";
  const values = { reported: m.p.text, recomputed: p, statistic: stat.text, df, alpha };
  const because = `${statName}(${df}) = ${stat.text} gives p = ${showPInterval(p.lo, p.hi)}`;
  if (verdict === "halved" || verdict === "halved-changed") {
    report.add("halved-p", subject, `${modelName(subject, m.label)}: reported p = ${m.p.text} is half the p of its test: ${because}`, values);
  }
  if (verdict === "changed" || verdict === "halved-changed") {
    report.add("model-conclusion-changed", subject, `${modelName(subject, m.label)}: reported p ${pText(m.p.text)}, but ${because}, on the other side of α = ${alpha}`, values);
  } else if (verdict === "mismatch") {
    report.add("model-p-mismatch", subject, `${modelName(subject, m.label)}: reported p ${pText(m.p.text)}, but ${because}`, values);
  }
}

/** "= .032" stays, ".032" becomes "= .032", so messages read naturally. */
export function pText(text: string): string {
  const c = text.charAt(0);
  return c === "<" || c === ">" || c === "=" || c === "≤" || c === "≥" ? text : c === "p" || c === "P" ? text.slice(1).trim() : `= ${text}`;
}

function checkRmsea(ctx: ModelCheckContext, df: number): void {
  const { model: m, subject, report, sample } = ctx;
  if (m.rmsea === null && m.rmseaLo === null && m.rmseaHi === null) {
    report.skip("rmsea-mismatch", subject, "no RMSEA printed");
    return;
  }
  const n = sample.n;
  if (n === null) {
    report.skip("rmsea-mismatch", subject, "N not reported");
    return;
  }
  const scaled = m.robust ? scaledStatistic(m) : null;
  // The primary convention (rmsea.ts) is tested from its statistic's interval without building it: a
  // consistent model then allocates only the point interval it reports (and, when robust, the scaled
  // χ²). The inputs, the convention objects and the full list are built only when that test fails.
  const useScaled = scaled !== null;
  const stat = scaled !== null ? scaled.interval : m.chisq;
  if (stat === null) {
    report.skip("rmsea-mismatch", subject, "no χ² printed to recompute the RMSEA from");
    return;
  }
  const groups = sample.groups;
  let inputs: RmseaInputs | null = null;
  let conventions: RmseaConvention[] | null = null;
  // The convention the interval is tried under first: the point estimate's when it matched one other
  // than the primary (null: the primary).
  let matched: RmseaConvention | null = null;
  if (m.rmsea !== null) {
    if (primaryPointMeets(m.rmsea, stat, df, n, groups)) {
      storeRmsea(report, subject, primaryPoint(stat, df, n, groups), primaryConventionName(useScaled, groups));
    } else {
      inputs = rmseaInputs(m, n, groups, df, scaled);
      conventions = rmseaConventions(inputs);
      const index = matchRmseaPoint(m.rmsea, conventions);
      if (index >= 0) {
        matched = conventions[index];
        storeRmsea(report, subject, matched.point, matched.name);
      } else {
        const primary = primaryConvention(inputs) as RmseaConvention; // stat is printed, so never null
        const tried = conventions.map((c) => c.name).join("; ");
        storeRmsea(report, subject, primary.point, null);
        report.add(
          "rmsea-mismatch",
          subject,
          `${modelName(subject, m.label)}: reported RMSEA = ${m.rmsea.text}, but the printed χ², df = ${df} and N = ${n} give ${describePoint(primary)}; no convention reproduces it (tried: ${tried})`,
          { reported: m.rmsea.text, recomputed: primary.point, df, n, groups, conventionsTried: tried },
        );
      }
    }
  } else {
    report.skip("rmsea-mismatch", subject, "no RMSEA point estimate printed");
  }
  if (m.rmseaLo === null && m.rmseaHi === null) {
    report.skip("rmsea-interval-mismatch", subject, "no RMSEA interval printed");
    return;
  }
  if (matched !== null ? intervalMeets(m.rmseaLo, m.rmseaHi, matched) : primaryIntervalMeets(m.rmseaLo, m.rmseaHi, stat, df, n, groups)) {
    storeIntervalConvention(report, subject, matched !== null ? matched.name : primaryConventionName(useScaled, groups));
    return;
  }
  inputs = inputs ?? rmseaInputs(m, n, groups, df, scaled);
  conventions = conventions ?? rmseaConventions(inputs);
  const index = matchRmseaInterval(m.rmseaLo, m.rmseaHi, conventions, -1);
  if (index >= 0) {
    storeIntervalConvention(report, subject, conventions[index].name);
    return;
  }
  const first = matched ?? (primaryConvention(inputs) as RmseaConvention);
  const recomputed = recomputeRmseaInterval(first);
  storeRmseaInterval(report, subject, recomputed);
  const printed = `[${m.rmseaLo?.text ?? "–"}, ${m.rmseaHi?.text ?? "–"}]`;
  report.add(
    "rmsea-interval-mismatch",
    subject,
    `${modelName(subject, m.label)}: reported 90 % RMSEA interval ${printed}, but inverting the noncentral χ² gives ${describeInterval(recomputed, first)}; no convention reproduces it (tried ${conventions.length})`,
    { reportedLower: m.rmseaLo?.text ?? null, reportedUpper: m.rmseaHi?.text ?? null, recomputed, df, n, groups },
  );
}

/** The printed figures every RMSEA convention is computed from (only built when the primary one fails). */
function rmseaInputs(m: ParsedModel, n: number, groups: number, df: number, scaled: Derived | null): RmseaInputs {
  const scaling = m.robust ? scalingFactor(m) : null;
  return {
    n,
    groups,
    df,
    chisq: m.chisq,
    scaled: scaled === null ? null : scaled.interval,
    scaling: scaling === null ? null : scaling.interval,
    robust: m.robust,
    chisqValue: m.chisq === null ? null : m.chisq.value,
    scaledValue: scaled === null ? null : scaled.value,
    scalingValue: scaling === null ? null : scaling.value,
  };
}

/** Moments minus free parameters, with or without a mean structure (see checkDfRecount). */
function recount(means: boolean, p: number, k: number, g: number, npar: number): number {
  return g * (p * (p + 1) / 2 + (means ? p : 0)) - g * (k * (k + 1) / 2 + (means ? k : 0)) - npar;
}

/**
 * df = G·(p(p+1)/2 + [mean structure]·p) − q, less the k(k+1)/2 (+ k) moments of fixed-x covariates,
 * which are neither moments nor parameters (DESIGN §4.3; e.g. SAS/STAT PROC CALIS documentation).
 * Without a printed mean structure both readings are tried: free intercepts add p moments and p
 * parameters alike, but constrained ones do not.
 */
function checkDfRecount(ctx: ModelCheckContext): void {
  const { model: m, subject, report, sample } = ctx;
  if (m.df === null || m.npar === null || m.nObserved === null) {
    report.skip("df-recount-mismatch", subject, "needs df, npar and n_observed");
    return;
  }
  if (m.df < 0) {
    report.skip("df-recount-mismatch", subject, "negative df");
    return;
  }
  const p = m.nObserved;
  const k = m.nFixedX ?? 0;
  const g = sample.groups;
  const npar = m.npar;
  // The readings one at a time, the common match first, so that no lists are built unless it fails.
  const firstReading = m.meanStructure === null ? false : m.meanStructure;
  const firstRecount = recount(firstReading, p, k, g, npar);
  if (firstRecount === m.df) {
    storeDfRecount(report, subject, firstRecount);
    return;
  }
  // without a printed mean structure, the reading with means; the lists are built only for a message
  const secondRecount = m.meanStructure === null ? recount(true, p, k, g, npar) : null;
  if (secondRecount === m.df) {
    storeDfRecount(report, subject, secondRecount);
    return;
  }
  const readings = secondRecount !== null ? [false, true] : [firstReading];
  const recounts = secondRecount !== null ? [firstRecount, secondRecount] : [firstRecount];
  storeDfRecount(report, subject, recounts[0]);
  const how = readings
    .map((means, i) => {
      const fixedX = k > 0 ? ` − ${k}·${k + 1}/2${means ? ` − ${k}` : ""}` : "";
      const reading = m.meanStructure === null ? (means ? " with means" : " without means") : "";
      return `${g > 1 ? `${g}·` : ""}(${p}·${p + 1}/2${means ? ` + ${p}` : ""}${fixedX}) − ${m.npar} = ${recounts[i]}${reading}`;
    })
    .join("; ");
  report.add("df-recount-mismatch", subject, `${modelName(subject, m.label)}: reported df = ${m.df}, but moments minus free parameters give ${how}`, {
    reported: m.df,
    recomputed: recounts[0],
    nObserved: p,
    npar: m.npar,
    groups: g,
    nFixedX: k,
  });
}
