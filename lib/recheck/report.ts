// Collects what the checks find. One Report per recheck() call: nothing global, so results stay pure.
import { FINDING_CATALOGUE, type FindingCode } from "./catalogue";
import type { Finding, FindingSubject, Interval, Severity, SkippedCheck } from "./types";

export type Value = number | string | boolean | null | Interval;
export type Values = Record<string, Value>;

export class Report {
  readonly findings: Finding[] = [];
  readonly skipped: SkippedCheck[] = [];
  readonly recomputed: Values = {};

  /** Raises a finding with the catalogue's default severity unless one is given. */
  add(code: FindingCode, subject: FindingSubject, message: string, values: Values, severity?: Severity): void {
    this.findings.push({ code, severity: severity ?? FINDING_CATALOGUE[code].severity, subject, message, values });
  }

  skip(check: FindingCode | string, subject: FindingSubject, reason: string): void {
    this.skipped.push({ check, subject, reason });
  }

  set(key: string, value: Value): void {
    this.recomputed[key] = value;
  }
}
