// The recheck engine's public contract. Pure types: no database, no framework.
// Every reported figure travels as the text that was printed ("9.20", "< .001", ".000"), because the
// number of printed decimals is what the rounding tolerance is computed from (DESIGN §4.1).

export const ESTIMATORS = ["ML", "MLR", "MLM", "MLMV", "WLSMV", "ULSMV", "GLS", "WLS", "DWLS", "ULS", "other"] as const;
export type Estimator = (typeof ESTIMATORS)[number];

/** Estimators whose test statistic is a scaled (robust) chi-square. */
export const ROBUST_ESTIMATORS: readonly Estimator[] = ["MLR", "MLM", "MLMV", "WLSMV", "ULSMV"];

export const METHODS = ["lrt", "scaled_lrt", "ic", "invariance"] as const;
export type Method = (typeof METHODS)[number];

export const NESTED_VALUES = ["yes", "no", "unknown"] as const;
export type Nested = (typeof NESTED_VALUES)[number];

export const PREFERRED_VALUES = ["a", "b", "none"] as const;
export type Preferred = (typeof PREFERRED_VALUES)[number];

export const INVARIANCE_CLAIMS = ["yes", "no", "n/a"] as const;
export type InvarianceClaim = (typeof INVARIANCE_CLAIMS)[number];

export const SEVERITIES = ["error", "warning", "note"] as const;
export type Severity = (typeof SEVERITIES)[number];

/**
 * One reported model, every figure as printed. A missing or empty string means "not reported".
 * Field names are the sheet columns of DESIGN §5 without the a_/b_ prefix, in camelCase.
 */
export interface ModelInput {
  label?: string;
  estimator?: string;
  chisq?: string;
  df?: string;
  p?: string;
  chisqScaled?: string;
  scaling?: string;
  cfi?: string;
  tli?: string;
  rmsea?: string;
  rmseaLo?: string;
  rmseaHi?: string;
  srmr?: string;
  aic?: string;
  bic?: string;
  loglik?: string;
  loglikScaling?: string;
  npar?: string;
  nObserved?: string;
  nFixedX?: string;
  /** "yes" | "no" as printed in the sheet */
  meanStructure?: string;
  baselineChisq?: string;
  baselineDf?: string;
}

export interface SampleInput {
  label?: string;
  /** total N over all groups */
  n?: string;
  /** number of groups (default 1) */
  groups?: string;
}

/** One reported comparison with its two models and sample, all as printed. */
export interface ComparisonInput {
  label?: string;
  method?: string;
  nested?: string;
  alpha?: string;
  dChisq?: string;
  dDf?: string;
  dP?: string;
  dCfi?: string;
  dRmsea?: string;
  dAic?: string;
  dBic?: string;
  preferred?: string;
  invarianceClaimed?: string;
  sample: SampleInput;
  /** model A: the restricted one (more df) — sheet prefix a_ */
  restricted: ModelInput;
  /** model B: the free one (fewer df) — sheet prefix b_ */
  free: ModelInput;
}

/**
 * A cell that cannot be read. `column` is the sheet column name of DESIGN §5
 * (e.g. "a_chisq", "d_df", "n", "n_groups"), so the sheet reader and the API can point at it.
 */
export interface FieldError {
  column: string;
  message: string;
}

/** A closed interval; a point value has lo === hi. */
export interface Interval {
  lo: number;
  hi: number;
}

/**
 * Which part of the comparison a finding is about. "a" and "b" name the sheet columns the model was
 * entered in (a_ / b_), also when the engine found them in the wrong order and swapped them for the
 * comparison checks; a model checked on its own by recheckModel() is reported as "a".
 */
export type FindingSubject = "comparison" | "a" | "b";

export interface Finding {
  /** stable kebab-case code from the DESIGN §4.3 table */
  code: string;
  severity: Severity;
  subject: FindingSubject;
  /** states the numbers: "reported Δdf = 2, but 27 − 24 = 3" */
  message: string;
  /** the reported and recomputed figures behind the finding; JSON-serialisable, no NaN */
  values: Record<string, number | string | boolean | null | Interval>;
}

export interface SkippedCheck {
  /** the finding code(s) the check would raise */
  check: string;
  subject: FindingSubject;
  reason: string;
}

export interface RecheckSettings {
  /** default alpha when the comparison gives none */
  alpha: number;
  /** fit cutoffs for poor-fit-both (common practice) */
  fitCutoffs: { rmseaMax: number; cfiMin: number };
  /** invariance change-in-fit cutoffs: ΔCFI ≤ −.01 (Cheung & Rensvold 2002), ΔRMSEA ≥ .015 (Chen 2007) */
  invarianceCutoffs: { dCfi: number; dRmsea: number };
  /** |ΔAIC| below this is a near tie (Burnham & Anderson 2002) */
  aicNearTie: number;
}

export interface RecheckResult {
  findings: Finding[];
  skipped: SkippedCheck[];
  /**
   * recomputed figures (Δdf, Δχ² interval, p interval, scaled difference, cd, RMSEA per model …);
   * JSON-serialisable. Every key of lib/recheck/report.ts is present; a figure this comparison did not
   * need is undefined, so JSON leaves it out.
   */
  recomputed: Record<string, number | string | boolean | null | Interval | undefined>;
  engineVersion: string;
}

/** recheck() answers either a result or the cells that could not be read — never both, never a throw. */
export type RecheckOutcome = { ok: true; result: RecheckResult } | { ok: false; errors: FieldError[] };
