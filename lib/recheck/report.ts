// Collects what the checks find. One Report per recheck() call: nothing global, so results stay pure.
import { FINDING_CATALOGUE, type FindingCode } from "./catalogue";
import type { Finding, FindingSubject, Interval, Severity, SkippedCheck } from "./types";

export type Value = number | string | boolean | null | Interval;
export type Values = Record<string, Value>;

/**
 * Every figure the engine can recompute, in the order results list them; `recomputed` starts as this
 * object with each one undefined (JSON leaves undefined out). Grown key by key instead, the results took
 * hundreds of V8 shapes, and each store went through V8's megamorphic lookup (about 7 % of the engine's
 * time). The checks store into it directly (`report.recomputed["a.p"] = p`, a subject's key chosen by a
 * branch): each store then names its property and is a plain store at a known offset. A `set(key, value)`
 * method with one case per key was too large for V8 to inline, and its call and case search took about
 * 1.3 % of the engine's time.
 */
function notRecomputed() {
  return {
    // model A (a model checked on its own is A)
    "a.aicFromLoglik": undefined,
    "a.bicFromLoglik": undefined,
    "a.dfRecount": undefined,
    "a.p": undefined,
    "a.rmsea": undefined,
    "a.rmseaConvention": undefined,
    "a.rmseaIntervalConvention": undefined,
    "a.rmseaInterval": undefined,
    "a.cfi": undefined,
    "a.tli": undefined,
    // model B
    "b.aicFromLoglik": undefined,
    "b.bicFromLoglik": undefined,
    "b.dfRecount": undefined,
    "b.p": undefined,
    "b.rmsea": undefined,
    "b.rmseaConvention": undefined,
    "b.rmseaIntervalConvention": undefined,
    "b.rmseaInterval": undefined,
    "b.cfi": undefined,
    "b.tli": undefined,
    // the comparison
    "dDf": undefined,
    "sb2001.cd": undefined,
    "sb2001.statistic": undefined,
    "sb2001Loglik.cd": undefined,
    "sb2001Loglik.statistic": undefined,
    "dChisq": undefined,
    "scaledFormMatched": undefined,
    "differenceBasis": undefined,
    "sb2001.p": undefined,
    "sb2001Loglik.p": undefined,
    "dP": undefined,
    "dAic": undefined,
    "dBic": undefined,
  } satisfies Record<string, undefined>;
}

export type RecomputedKey = keyof ReturnType<typeof notRecomputed>;
/** The recomputed figures of one result; a figure this comparison did not need is undefined. */
export type Recomputed = { [K in RecomputedKey]: Value | undefined };

export class Report {
  readonly findings: Finding[] = [];
  readonly skipped: SkippedCheck[] = [];
  readonly recomputed: Recomputed = notRecomputed();

  /** Raises a finding with the catalogue's default severity unless one is given. */
  add(code: FindingCode, subject: FindingSubject, message: string, values: Values, severity?: Severity): void {
    this.findings.push({ code, severity: severity ?? FINDING_CATALOGUE[code].severity, subject, message, values });
  }

  skip(check: FindingCode | string, subject: FindingSubject, reason: string): void {
    this.skipped.push({ check, subject, reason });
  }
}
