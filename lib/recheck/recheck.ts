// Orchestrates the checks of DESIGN §4.3 for one comparison (or one model on its own).
//
// Subjects: findings about a single model name it by the sheet column it was entered in ("a" = the a_
// columns, "b" = the b_ columns), so a coder can find the cell even when the models were entered in the
// wrong order. Comparison-level checks run on the models in restricted/free order. A model checked on
// its own by recheckModel() is reported as subject "a".
import {
  checkCriteriaArithmetic as checkCriteriaArithmeticImport,
  checkPreference as checkPreferenceImport,
} from "./checks/criteria";
import {
  checkDfDifference as checkDfDifferenceImport,
  checkNegativeDifference as checkNegativeDifferenceImport,
  checkPlainDifference as checkPlainDifferenceImport,
  checkScaledDifference as checkScaledDifferenceImport,
} from "./checks/difference";
import {
  checkDeltaFit as checkDeltaFitImport,
  checkInvarianceClaim as checkInvarianceClaimImport,
  checkPoorFitBoth as checkPoorFitBothImport,
} from "./checks/fit-rules";
import { checkModel as checkModelImport } from "./checks/model";
import {
  parseComparison as parseComparisonImport,
  parseModel as parseModelImport,
  parseSample as parseSampleImport,
  type ParsedComparison,
} from "./parse";
import { Report } from "./report";
import { ENGINE_VERSION, resolveSettings as resolveSettingsImport } from "./settings";
import type { ComparisonInput, FieldError, ModelInput, RecheckOutcome, RecheckSettings, SampleInput } from "./types";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const checkCriteriaArithmetic = checkCriteriaArithmeticImport;
const checkDeltaFit = checkDeltaFitImport;
const checkDfDifference = checkDfDifferenceImport;
const checkInvarianceClaim = checkInvarianceClaimImport;
const checkModel = checkModelImport;
const checkNegativeDifference = checkNegativeDifferenceImport;
const checkPlainDifference = checkPlainDifferenceImport;
const checkPoorFitBoth = checkPoorFitBothImport;
const checkPreference = checkPreferenceImport;
const checkScaledDifference = checkScaledDifferenceImport;
const parseComparison = parseComparisonImport;
const parseModel = parseModelImport;
const parseSample = parseSampleImport;
const resolveSettings = resolveSettingsImport;

/** Rechecks one reported comparison. Never throws: unreadable cells come back as field errors. */
export function recheck(input: ComparisonInput, settings?: Partial<RecheckSettings>): RecheckOutcome {
  try {
    const resolved = resolveSettings(settings);
    const errors: FieldError[] = [];
    const parsed = parseComparison(input ?? { sample: {}, restricted: {}, free: {} }, resolved.alpha, errors);
    if (errors.length > 0) return { ok: false, errors };
    const report = new Report();
    runComparison(parsed, resolved, report);
    return { ok: true, result: { findings: report.findings, skipped: report.skipped, recomputed: report.recomputed, engineVersion: ENGINE_VERSION } };
  } catch (error) {
    // Defensive only: a bug must not take down a whole import. Reported as a field-less error row.
    return { ok: false, errors: [{ column: "", message: `internal error in the recheck engine: ${error instanceof Error ? error.message : String(error)}` }] };
  }
}

/** Rechecks one model's own figures when it is not part of any comparison (columns without a_/b_). */
export function recheckModel(model: ModelInput, sample: SampleInput, settings?: Partial<RecheckSettings>): RecheckOutcome {
  try {
    const resolved = resolveSettings(settings);
    const errors: FieldError[] = [];
    const parsedSample = parseSample(sample ?? {}, errors);
    const parsedModel = parseModel(model ?? {}, "", resolved.alpha, errors);
    if (errors.length > 0) return { ok: false, errors };
    const report = new Report();
    checkModel({ model: parsedModel, subject: "a", sample: parsedSample, alpha: resolved.alpha, report, inComparison: false });
    return { ok: true, result: { findings: report.findings, skipped: report.skipped, recomputed: report.recomputed, engineVersion: ENGINE_VERSION } };
  } catch (error) {
    return { ok: false, errors: [{ column: "", message: `internal error in the recheck engine: ${error instanceof Error ? error.message : String(error)}` }] };
  }
}

/**
 * Model A must be the restricted one (more df; failing df, fewer parameters). Returns whether A and B
 * are to be swapped (a boolean rather than a [restricted, free] pair, which was allocated per comparison).
 */
function modelsSwapped(c: ParsedComparison, report: Report): boolean {
  const a = c.restricted;
  const b = c.free;
  if (a.df !== null && b.df !== null && a.df >= 0 && b.df >= 0) {
    if (a.df < b.df) {
      report.add("restricted-model-order", "comparison", `model A has df = ${a.df} but model B has df = ${b.df}: the restricted model (more df) belongs in the a_ columns; checked with them swapped`, {
        aDf: a.df,
        bDf: b.df,
      });
      return true;
    }
    return false;
  }
  if (a.npar !== null && b.npar !== null && a.npar > b.npar) {
    report.add("restricted-model-order", "comparison", `model A has ${a.npar} free parameters but model B has ${b.npar}: the restricted model (fewer parameters) belongs in the a_ columns; checked with them swapped`, {
      aNpar: a.npar,
      bNpar: b.npar,
    });
    return true;
  }
  return false;
}

function runComparison(c: ParsedComparison, settings: RecheckSettings, report: Report): void {
  checkModel({ model: c.restricted, subject: "a", sample: c.sample, alpha: c.alpha, report, inComparison: true });
  checkModel({ model: c.free, subject: "b", sample: c.sample, alpha: c.alpha, report, inComparison: true });
  const swapped = modelsSwapped(c, report);
  const restricted = swapped ? c.free : c.restricted;
  const free = swapped ? c.restricted : c.free;

  if ((c.method === "lrt" || c.method === "scaled_lrt") && c.nested === "no") {
    report.add("lrt-on-non-nested", "comparison", `${c.method === "scaled_lrt" ? "a" : "an"} ${c.method} comparison of models recorded as not nested: the chi-square difference is only a test for nested models`, {
      method: c.method,
      nested: c.nested,
    });
  }
  if (c.dP !== null && c.dP.printedZero) {
    report.add("p-printed-as-zero", "comparison", `difference-test p printed as ${c.dP.text}; a p-value is never zero (report p < .001)`, { reported: c.dP.text });
  }

  const testDf = checkDfDifference(c, restricted, free, report);
  checkNegativeDifference(c, restricted, free, report);
  const ctx = { comparison: c, restricted, free, testDf, report };
  const scaledContext = c.method === "scaled_lrt" || restricted.robust || free.robust;
  if (scaledContext) checkScaledDifference(ctx);
  else checkPlainDifference(ctx);

  checkCriteriaArithmetic(c, restricted, free, report);
  if (c.method === "ic") checkPreference(c, restricted, free, settings.aicNearTie, report);
  checkPoorFitBoth(restricted, free, settings, report);
  checkInvarianceClaim(c, restricted, free, settings, report);
  checkDeltaFit(c, restricted, free, report);
}
