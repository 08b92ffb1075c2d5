// Rules on reported fit figures: both models misfitting, invariance claims against the change-in-fit
// cutoffs, and printed ΔCFI / ΔRMSEA against the models' values. Cutoff rules fire only when the whole
// interval of the printed figure (or of the difference of printed figures) lies beyond the cutoff.
import { differenceOf as differenceOfImport, meets as meetsImport, showInterval as showIntervalImport } from "../interval";
import type { ParsedComparison, ParsedModel } from "../parse";
import type { PrintedNumber } from "../printed";
import type { Report } from "../report";
import type { Interval, RecheckSettings } from "../types";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const differenceOf = differenceOfImport;
const meets = meetsImport;
const showInterval = showIntervalImport;

/** Does the model miss a cutoff with the whole interval of its printed figure? */
function fails(m: ParsedModel, cutoffs: RecheckSettings["fitCutoffs"]): boolean {
  return (m.rmsea !== null && m.rmsea.lo > cutoffs.rmseaMax) || (m.cfi !== null && m.cfi.hi < cutoffs.cfiMin);
}

// The cutoffs as text, converted once per value rather than for every message (a third of the
// benchmark's consistent comparisons raise poor-fit-both). Only strings are kept, so no result shares
// anything mutable.
let rmseaMaxValue = Number.NaN;
let rmseaMaxText = "";
let cfiMinValue = Number.NaN;
let cfiMinText = "";

function rmseaCutoffText(x: number): string {
  if (x !== rmseaMaxValue) {
    rmseaMaxValue = x;
    rmseaMaxText = `${x}`;
  }
  return rmseaMaxText;
}

function cfiCutoffText(x: number): string {
  if (x !== cfiMinValue) {
    cfiMinValue = x;
    cfiMinText = `${x}`;
  }
  return cfiMinText;
}

function whyFails(m: ParsedModel, cutoffs: RecheckSettings["fitCutoffs"]): string {
  // the reasons joined by ", ", without building a list for them
  const rmsea = m.rmsea !== null && m.rmsea.lo > cutoffs.rmseaMax ? `RMSEA = ${m.rmsea.text} > ${rmseaCutoffText(cutoffs.rmseaMax)}` : "";
  const cfi = m.cfi !== null && m.cfi.hi < cutoffs.cfiMin ? `CFI = ${m.cfi.text} < ${cfiCutoffText(cutoffs.cfiMin)}` : "";
  return rmsea === "" ? cfi : cfi === "" ? rmsea : `${rmsea}, ${cfi}`;
}

/** Neither model meets the configured cutoffs (common practice: RMSEA ≤ .08, CFI ≥ .90). */
export function checkPoorFitBoth(a: ParsedModel, b: ParsedModel, settings: RecheckSettings, report: Report): void {
  if ((a.rmsea === null && a.cfi === null) || (b.rmsea === null && b.cfi === null)) {
    report.skip("poor-fit-both", "comparison", "needs RMSEA or CFI for both models");
    return;
  }
  const cutoffs = settings.fitCutoffs;
  if (fails(a, cutoffs) && fails(b, cutoffs)) {
    report.add("poor-fit-both", "comparison", `neither model meets the fit cutoffs: restricted model ${whyFails(a, cutoffs)}; free model ${whyFails(b, cutoffs)}`, {
      rmseaMax: cutoffs.rmseaMax,
      cfiMin: cutoffs.cfiMin,
    });
  }
}

/** The printed Δ, else the difference of the printed values (restricted − free). */
function deltaOf(printed: PrintedNumber | null, a: PrintedNumber | null, b: PrintedNumber | null): Interval | null {
  if (printed !== null) return { lo: printed.lo, hi: printed.hi };
  if (a !== null && b !== null) return differenceOf(a, b);
  return null;
}

/** How a Δ was obtained, for messages. */
function deltaText(printed: PrintedNumber | null, a: PrintedNumber | null, b: PrintedNumber | null, d: Interval): string {
  return printed !== null ? printed.text : `${a?.text} − ${b?.text} = ${showInterval(d.lo, d.hi, 3)}`;
}

/** Invariance claimed although ΔCFI ≤ −.01 (Cheung & Rensvold 2002) or ΔRMSEA ≥ .015 (Chen 2007). */
export function checkInvarianceClaim(c: ParsedComparison, a: ParsedModel, b: ParsedModel, settings: RecheckSettings, report: Report): void {
  if (c.invarianceClaimed !== "yes") {
    if (c.method === "invariance") report.skip("invariance-cutoff-exceeded", "comparison", "no invariance claim recorded");
    return;
  }
  const dCfi = deltaOf(c.dCfi, a.cfi, b.cfi);
  const dRmsea = deltaOf(c.dRmsea, a.rmsea, b.rmsea);
  if (dCfi === null && dRmsea === null) {
    report.skip("invariance-cutoff-exceeded", "comparison", "needs ΔCFI or ΔRMSEA (or both models' CFI or RMSEA)");
    return;
  }
  const { dCfi: cfiCut, dRmsea: rmseaCut } = settings.invarianceCutoffs;
  const reasons: string[] = [];
  if (dCfi !== null && dCfi.hi <= cfiCut) reasons.push(`ΔCFI = ${deltaText(c.dCfi, a.cfi, b.cfi, dCfi)} ≤ ${cfiCut} (Cheung & Rensvold 2002)`);
  if (dRmsea !== null && dRmsea.lo >= rmseaCut) reasons.push(`ΔRMSEA = ${deltaText(c.dRmsea, a.rmsea, b.rmsea, dRmsea)} ≥ ${rmseaCut} (Chen 2007)`);
  if (reasons.length > 0) {
    report.add("invariance-cutoff-exceeded", "comparison", `invariance is claimed although ${reasons.join(" and ")}`, {
      ...(dCfi ? { dCfi } : {}),
      ...(dRmsea ? { dRmsea } : {}),
      cfiCutoff: cfiCut,
      rmseaCutoff: rmseaCut,
    });
  }
}

/** Printed ΔCFI / ΔRMSEA against the difference of the printed values (restricted − free). */
export function checkDeltaFit(c: ParsedComparison, a: ParsedModel, b: ParsedModel, report: Report): void {
  // most comparisons print neither Δ: nothing to build then
  if (c.dCfi !== null) checkDelta("CFI", c.dCfi, a.cfi, b.cfi, report);
  if (c.dRmsea !== null) checkDelta("RMSEA", c.dRmsea, a.rmsea, b.rmsea, report);
}

function checkDelta(label: string, printed: PrintedNumber, pa: PrintedNumber | null, pb: PrintedNumber | null, report: Report): void {
  if (pa === null || pb === null) {
    report.skip("delta-fit-mismatch", "comparison", `Δ${label} needs both models' ${label}`);
    return;
  }
  const d = differenceOf(pa, pb);
  if (!meets(printed.lo, printed.hi, d.lo, d.hi)) {
    report.add("delta-fit-mismatch", "comparison", `reported Δ${label} = ${printed.text}, but ${pa.text} − ${pb.text} = ${showInterval(d.lo, d.hi, 3)} (restricted − free)`, {
      reported: printed.text,
      recomputed: d,
      index: label,
    });
  }
}
