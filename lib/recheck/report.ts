// Collects what the checks find. One Report per recheck() call: nothing global, so results stay pure.
import { FINDING_CATALOGUE, type FindingCode } from "./catalogue";
import type { Finding, FindingSubject, Interval, Severity, SkippedCheck } from "./types";

export type Value = number | string | boolean | null | Interval;
export type Values = Record<string, Value>;

/**
 * Every figure the engine can recompute, in the order results list them; `recomputed` starts as this
 * object with each one undefined (JSON leaves undefined out). Grown key by key instead, the results took
 * hundreds of V8 shapes, and each store went through V8's megamorphic lookup (about 7 % of the engine's
 * time). A new recomputed figure needs its key here and a case in Report.set (the compiler checks both).
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

  /**
   * One case per key, so that each store names its property: inlined where the key is a constant, it
   * is a plain store at a known offset (`recomputed[key] = value` would be one megamorphic store for all).
   */
  set(key: RecomputedKey, value: Value): void {
    const r = this.recomputed;
    switch (key) {
      case "a.aicFromLoglik":
        r["a.aicFromLoglik"] = value;
        return;
      case "a.bicFromLoglik":
        r["a.bicFromLoglik"] = value;
        return;
      case "a.dfRecount":
        r["a.dfRecount"] = value;
        return;
      case "a.p":
        r["a.p"] = value;
        return;
      case "a.rmsea":
        r["a.rmsea"] = value;
        return;
      case "a.rmseaConvention":
        r["a.rmseaConvention"] = value;
        return;
      case "a.rmseaIntervalConvention":
        r["a.rmseaIntervalConvention"] = value;
        return;
      case "a.rmseaInterval":
        r["a.rmseaInterval"] = value;
        return;
      case "a.cfi":
        r["a.cfi"] = value;
        return;
      case "a.tli":
        r["a.tli"] = value;
        return;
      case "b.aicFromLoglik":
        r["b.aicFromLoglik"] = value;
        return;
      case "b.bicFromLoglik":
        r["b.bicFromLoglik"] = value;
        return;
      case "b.dfRecount":
        r["b.dfRecount"] = value;
        return;
      case "b.p":
        r["b.p"] = value;
        return;
      case "b.rmsea":
        r["b.rmsea"] = value;
        return;
      case "b.rmseaConvention":
        r["b.rmseaConvention"] = value;
        return;
      case "b.rmseaIntervalConvention":
        r["b.rmseaIntervalConvention"] = value;
        return;
      case "b.rmseaInterval":
        r["b.rmseaInterval"] = value;
        return;
      case "b.cfi":
        r["b.cfi"] = value;
        return;
      case "b.tli":
        r["b.tli"] = value;
        return;
      case "dDf":
        r["dDf"] = value;
        return;
      case "sb2001.cd":
        r["sb2001.cd"] = value;
        return;
      case "sb2001.statistic":
        r["sb2001.statistic"] = value;
        return;
      case "sb2001Loglik.cd":
        r["sb2001Loglik.cd"] = value;
        return;
      case "sb2001Loglik.statistic":
        r["sb2001Loglik.statistic"] = value;
        return;
      case "dChisq":
        r["dChisq"] = value;
        return;
      case "scaledFormMatched":
        r["scaledFormMatched"] = value;
        return;
      case "differenceBasis":
        r["differenceBasis"] = value;
        return;
      case "sb2001.p":
        r["sb2001.p"] = value;
        return;
      case "sb2001Loglik.p":
        r["sb2001Loglik.p"] = value;
        return;
      case "dP":
        r["dP"] = value;
        return;
      case "dAic":
        r["dAic"] = value;
        return;
      case "dBic":
        r["dBic"] = value;
        return;
      default: {
        const unknown: never = key;
        throw new Error(`no case for the recomputed figure ${String(unknown)}`);
      }
    }
  }
}
