// CFI (Bentler 1990) and TLI (Tucker & Lewis 1973) recomputed from the model's and the baseline
// model's χ² and df, by interval arithmetic.
import { meets as meetsImport, showInterval as showIntervalImport } from "../interval";
import type { ParsedModel } from "../parse";
import type { Report } from "../report";
import type { Interval } from "../types";
import { modelName as modelNameImport } from "./common";
import { scaledStatistic as scaledStatisticImport, type Derived } from "./derived";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const meets = meetsImport;
const modelName = modelNameImport;
const scaledStatistic = scaledStatisticImport;
const showInterval = showIntervalImport;

/** CFI = 1 − max(χ² − df, 0) / max(χ² − df, χ²_b − df_b, 0); 1 when the denominator is 0 (as lavaan). */
export function cfiOf(chisq: number, df: number, baselineChisq: number, baselineDf: number): number {
  const model = Math.max(chisq - df, 0);
  const denominator = Math.max(chisq - df, baselineChisq - baselineDf, 0);
  return denominator > 0 ? 1 - model / denominator : 1;
}

/** TLI = (χ²_b/df_b − χ²/df) / (χ²_b/df_b − 1), not truncated. */
export function tliOf(chisq: number, df: number, baselineChisq: number, baselineDf: number): number {
  const b = baselineChisq / baselineDf;
  return (b - chisq / df) / (b - 1);
}

function cfiInterval(stat: Interval, df: number, baseline: Interval, baselineDf: number): Interval {
  // CFI falls as χ² grows and rises as the baseline χ² grows.
  return { lo: cfiOf(stat.hi, df, baseline.lo, baselineDf), hi: cfiOf(stat.lo, df, baseline.hi, baselineDf) };
}

/**
 * TLI is linear in χ²/df for a fixed baseline and monotone in the baseline for a fixed model, so its
 * extremes over the box of the two intervals lie at the corners. Null when χ²_b/df_b can reach 1.
 */
function tliInterval(stat: Interval, df: number, baseline: Interval, baselineDf: number): Interval | null {
  if (baseline.lo / baselineDf <= 1) return null;
  const c1 = tliOf(stat.lo, df, baseline.lo, baselineDf);
  const c2 = tliOf(stat.lo, df, baseline.hi, baselineDf);
  const c3 = tliOf(stat.hi, df, baseline.lo, baselineDf);
  const c4 = tliOf(stat.hi, df, baseline.hi, baselineDf);
  return { lo: Math.min(c1, c2, c3, c4), hi: Math.max(c1, c2, c3, c4) };
}

/**
 * The first reading's χ² as printed, for messages only. A function of its own rather than a closure in
 * checkFitIndices: under tsx every closure created at run time is also named (esbuild's keepNames), which
 * showed in the engine benchmark's profile.
 */
function firstReadingText(m: ParsedModel, scaled: Derived | null): string {
  if (m.chisq !== null) return m.chisq.text;
  if (scaled === null) return "";
  return scaled.source === "printed" ? (m.chisqScaled?.text ?? "") : showInterval(scaled.interval.lo, scaled.interval.hi, 2);
}

export function checkFitIndices(m: ParsedModel, subject: "a" | "b", report: Report): void {
  if (m.cfi === null && m.tli === null) return;
  if (m.baselineChisq === null || m.baselineDf === null || m.df === null || m.df <= 0) {
    if (m.cfi !== null) report.skip("cfi-mismatch", subject, "needs the baseline χ² and df");
    if (m.tli !== null) report.skip("tli-mismatch", subject, "needs the baseline χ² and df");
    return;
  }
  // The printed index may come from the ML χ² or, for robust estimators, from the scaled χ² (with the
  // baseline as printed): either reading reproduces it. At most two readings, so they are held in two
  // variables rather than a list (this runs for every model with a CFI or TLI).
  const scaled = m.robust ? scaledStatistic(m) : null;
  const first: Interval | null = m.chisq ?? (scaled === null ? null : scaled.interval);
  const second: Interval | null = m.chisq !== null && scaled !== null ? scaled.interval : null;
  if (first === null) {
    if (m.cfi !== null) report.skip("cfi-mismatch", subject, "no χ² printed");
    if (m.tli !== null) report.skip("tli-mismatch", subject, "no χ² printed");
    return;
  }
  const df = m.df;
  const baseline = m.baselineChisq;
  const baselineDf = m.baselineDf;
  if (m.cfi !== null) {
    const cfi = m.cfi;
    const c1 = cfiInterval(first, df, baseline, baselineDf);
    if (subject === "a") report.recomputed["a.cfi"] = c1;
    else report.recomputed["b.cfi"] = c1;
    // the second reading only when the first fails
    const c2 = second === null || meets(cfi.lo, cfi.hi, c1.lo, c1.hi) ? null : cfiInterval(second, df, baseline, baselineDf);
    if (!meets(cfi.lo, cfi.hi, c1.lo, c1.hi) && !(c2 !== null && meets(cfi.lo, cfi.hi, c2.lo, c2.hi))) {
      report.add(
        "cfi-mismatch",
        subject,
        `${modelName(subject, m.label)}: reported CFI = ${cfi.text}, but χ² = ${firstReadingText(m, scaled)} (df = ${df}) with baseline χ² = ${baseline.text} (df = ${baselineDf}) gives CFI = ${showInterval(c1.lo, c1.hi, 4)}${c2 !== null ? ` (${showInterval(c2.lo, c2.hi, 4)} from the scaled χ²)` : ""}`,
        { reported: cfi.text, recomputed: c1 },
      );
    }
  }
  if (m.tli !== null) {
    const tli = m.tli;
    const t1 = tliInterval(first, df, baseline, baselineDf);
    if (t1 === null) {
      report.skip("tli-mismatch", subject, "baseline χ²/df is not above 1, so TLI is undefined at this precision");
      return;
    }
    if (subject === "a") report.recomputed["a.tli"] = t1;
    else report.recomputed["b.tli"] = t1;
    if (meets(tli.lo, tli.hi, t1.lo, t1.hi)) return;
    const t2 = second === null ? null : tliInterval(second, df, baseline, baselineDf);
    if (!(t2 !== null && meets(tli.lo, tli.hi, t2.lo, t2.hi))) {
      report.add(
        "tli-mismatch",
        subject,
        `${modelName(subject, m.label)}: reported TLI = ${tli.text}, but χ² = ${firstReadingText(m, scaled)} (df = ${df}) with baseline χ² = ${baseline.text} (df = ${baselineDf}) gives TLI = ${showInterval(t1.lo, t1.hi, 4)}`,
        { reported: tli.text, recomputed: t1 },
      );
    }
  }
}
