// Turns the printed cells of one comparison into numbers with their rounding intervals, collecting a
// FieldError (named by its DESIGN §5 sheet column) for every cell that cannot be read. Empty cells are
// "not reported" (null), never zero.
import {
  CLIP_AT_ZERO,
  CLIP_NONE,
  CLIP_TO_UNIT,
  isBlank as isBlankImport,
  readPrintedFigure as readPrintedFigureImport,
  readPrintedInteger as readPrintedIntegerImport,
  readPrintedNumber as readPrintedNumberImport,
  scanP as scanPImport,
  type PrintedNumber,
  type PrintedP,
} from "./printed";
import {
  ESTIMATORS,
  INVARIANCE_CLAIMS,
  METHODS,
  NESTED_VALUES,
  PREFERRED_VALUES,
  ROBUST_ESTIMATORS,
  type ComparisonInput,
  type Estimator,
  type FieldError,
  type InvarianceClaim,
  type Method,
  type ModelInput,
  type Nested,
  type Preferred,
  type SampleInput,
} from "./types";

// Imported functions bound once: under tsx (CommonJS output, as the CLI runs) each call to an import
// otherwise goes through an export getter, which showed up in the engine benchmark's profile.
const isBlank = isBlankImport;
const readPrintedInteger = readPrintedIntegerImport;
const readPrintedFigure = readPrintedFigureImport;
const readPrintedNumber = readPrintedNumberImport;
const scanP = scanPImport;

export interface ParsedModel {
  label: string;
  /** null when not reported */
  estimator: Estimator | null;
  /** the estimator's statistic is a scaled (robust) chi-square, by name or by a printed scaled statistic */
  robust: boolean;
  chisq: PrintedNumber | null;
  df: number | null;
  p: PrintedP | null;
  chisqScaled: PrintedNumber | null;
  scaling: PrintedNumber | null;
  cfi: PrintedNumber | null;
  tli: PrintedNumber | null;
  rmsea: PrintedNumber | null;
  rmseaLo: PrintedNumber | null;
  rmseaHi: PrintedNumber | null;
  srmr: PrintedNumber | null;
  aic: PrintedNumber | null;
  bic: PrintedNumber | null;
  loglik: PrintedNumber | null;
  loglikScaling: PrintedNumber | null;
  npar: number | null;
  nObserved: number | null;
  nFixedX: number | null;
  meanStructure: boolean | null;
  baselineChisq: PrintedNumber | null;
  baselineDf: number | null;
}

export interface ParsedSample {
  n: number | null;
  groups: number;
}

export interface ParsedComparison {
  label: string;
  method: Method | null;
  nested: Nested;
  alpha: number;
  dChisq: PrintedNumber | null;
  dDf: number | null;
  dP: PrintedP | null;
  dCfi: PrintedNumber | null;
  dRmsea: PrintedNumber | null;
  dAic: PrintedNumber | null;
  dBic: PrintedNumber | null;
  preferred: Preferred | null;
  invarianceClaimed: InvarianceClaim | null;
  sample: ParsedSample;
  restricted: ParsedModel;
  free: ParsedModel;
}

/**
 * Empty or missing cell; the whitespace scan only runs for cells that start with a space, a control
 * character or a no-break space (which isBlank counts as a space: "\u00a0" alone is not reported).
 */
function blank(text: string | undefined): text is undefined {
  if (text === undefined || text === null || text.length === 0) return true;
  const first = text.charCodeAt(0);
  return (first <= 32 || first === 0xa0) && isBlank(text);
}

/** What a numeric cell may hold. */
type NumberKind = "any" | "nonNegative" | "positive" | "unit";

const KIND_RULE: Record<NumberKind, string> = {
  any: "",
  nonNegative: "cannot be negative",
  positive: "must be greater than zero",
  unit: "must lie between 0 and 1",
};

// Each cell is tested for undefined (the common missing cell: a model has 23 cells and most papers
// print about half of them) where parseModel and parseComparison read it, and only a present cell pays
// for a call to its reader. That test used to sit in small read…Cell wrappers meant to be inlined, but
// in the engine benchmark's profile the wrappers ran as functions of their own (12 % of the time), so
// every missing cell cost a call; without them the engine ran 1.06 and 1.09 times as fast.

function readNumberText(text: string, column: string, kind: NumberKind, errors: FieldError[]): PrintedNumber | null {
  // Read first, test for blank only when that fails: a blank cell has no digits, so it never reads as a
  // number, and the cells that do read are spared a second look at their first character.
  // "0.00" stands for [0, .005]: a statistic cannot be below zero, so the interval is clipped there.
  const printed = readPrintedFigure(text, kind === "unit" ? CLIP_TO_UNIT : kind === "nonNegative" ? CLIP_AT_ZERO : CLIP_NONE);
  if (printed === null) {
    if (blank(text)) return null;
    errors.push({ column, message: `"${text.trim()}" is not a number (use a decimal point and no thousands separators)` });
    return null;
  }
  const v = printed.value;
  const bad = kind === "nonNegative" ? v < 0 : kind === "positive" ? v <= 0 : kind === "unit" ? v < 0 || v > 1 : false;
  if (bad) {
    errors.push({ column, message: `${printed.text} ${KIND_RULE[kind]}` });
    return null;
  }
  return printed;
}

/** min: the smallest allowed integer (null = any sign, e.g. df, whose negative values are a finding). */
function readIntegerText(text: string, column: string, min: number | null, errors: FieldError[]): number | null {
  // As for numbers: a blank cell never reads as an integer, so it is looked for only when reading fails.
  const value = readPrintedInteger(text);
  if (value === null) {
    if (blank(text)) return null;
    const isNumber = readPrintedNumber(text) !== null;
    errors.push({ column, message: isNumber ? `${text.trim()} is not a whole number` : `"${text.trim()}" is not a whole number` });
    return null;
  }
  if (min !== null && value < min) {
    errors.push({ column, message: min === 1 ? `${value} must be at least 1` : `${value} cannot be negative` });
    return null;
  }
  return value;
}

function readPText(text: string, column: string, alpha: number, errors: FieldError[]): PrintedP | null {
  if (blank(text)) return null;
  const result = scanP(text, alpha);
  if (typeof result === "string") {
    errors.push({ column, message: result });
    return null;
  }
  return result;
}

/** A lookup table for a choice column: exact and lower-cased spellings (plus aliases) → value. */
interface Choices<T extends string> {
  /** the values as the codebook spells them, tried one by one before the map */
  values: readonly T[];
  map: Map<string, T>;
  list: string;
}

function choices<T extends string>(values: readonly T[], aliases: Record<string, T> = {}): Choices<T> {
  const map = new Map<string, T>();
  for (const value of values) {
    map.set(value, value);
    map.set(value.toLowerCase(), value);
  }
  for (const [alias, value] of Object.entries(aliases)) map.set(alias, value);
  return { values, map, list: values.join(", ") };
}

function readChoiceText<T extends string>(text: string, column: string, table: Choices<T>, errors: FieldError[]): T | null {
  // Nearly every cell spells its choice as the codebook does; comparing it with the few values is cheaper
  // than hashing it for the map (each Map.get showed in the benchmark's profile).
  const values = table.values;
  for (let i = 0; i < values.length; i++) if (text === values[i]) return values[i];
  if (blank(text)) return null;
  const exact = table.map.get(text);
  if (exact !== undefined) return exact;
  const found = table.map.get(text.trim().toLowerCase());
  if (found !== undefined) return found;
  errors.push({ column, message: `"${text.trim()}" is not one of ${table.list}` });
  return null;
}

const YES_NO_ALIASES: Record<string, "yes" | "no"> = { y: "yes", n: "no", true: "yes", false: "no", "1": "yes", "0": "no" };
const ESTIMATOR_CHOICES = choices(ESTIMATORS);
const YES_NO_CHOICES = choices(["yes", "no"] as const, YES_NO_ALIASES);
const METHOD_CHOICES = choices(METHODS);
const NESTED_CHOICES = choices(NESTED_VALUES);
const PREFERRED_CHOICES = choices(PREFERRED_VALUES);
const INVARIANCE_CHOICES = choices(INVARIANCE_CLAIMS, YES_NO_ALIASES);

/** A scaled (robust) chi-square estimator? A loop over the five names, cheaper than a Set look-up here. */
function isRobust(estimator: Estimator): boolean {
  for (let i = 0; i < ROBUST_ESTIMATORS.length; i++) if (estimator === ROBUST_ESTIMATORS[i]) return true;
  return false;
}

/** label.trim(), without the call when there is nothing to trim: printable ASCII at both ends is no space. */
function trimmedLabel(label: string): string {
  const last = label.length - 1;
  if (last < 0) return label;
  const first = label.charCodeAt(0);
  const end = label.charCodeAt(last);
  return first > 32 && first < 127 && end > 32 && end < 127 ? label : label.trim();
}

// Sheet column names per prefix, built once (no string concatenation per cell).
const MODEL_COLUMN_SUFFIXES = {
  estimator: "estimator",
  chisq: "chisq",
  df: "df",
  p: "p",
  chisqScaled: "chisq_scaled",
  scaling: "scaling",
  cfi: "cfi",
  tli: "tli",
  rmsea: "rmsea",
  rmseaLo: "rmsea_lo",
  rmseaHi: "rmsea_hi",
  srmr: "srmr",
  aic: "aic",
  bic: "bic",
  loglik: "loglik",
  loglikScaling: "loglik_scaling",
  npar: "npar",
  nObserved: "n_observed",
  nFixedX: "n_fixed_x",
  meanStructure: "mean_structure",
  baselineChisq: "baseline_chisq",
  baselineDf: "baseline_df",
} as const;

type ModelColumns = { -readonly [K in keyof typeof MODEL_COLUMN_SUFFIXES]: string };

/**
 * One model's column names, as a single object literal. Built key by key through computed names, the
 * object became a V8 dictionary, and each of parseModel's 22 `col.…` reads per model compiled to a
 * generic property lookup instead of a load at a known offset (parse took about 30 % less time without).
 */
function columnsFor(prefix: string): ModelColumns {
  const s = MODEL_COLUMN_SUFFIXES;
  return {
    estimator: prefix + s.estimator,
    chisq: prefix + s.chisq,
    df: prefix + s.df,
    p: prefix + s.p,
    chisqScaled: prefix + s.chisqScaled,
    scaling: prefix + s.scaling,
    cfi: prefix + s.cfi,
    tli: prefix + s.tli,
    rmsea: prefix + s.rmsea,
    rmseaLo: prefix + s.rmseaLo,
    rmseaHi: prefix + s.rmseaHi,
    srmr: prefix + s.srmr,
    aic: prefix + s.aic,
    bic: prefix + s.bic,
    loglik: prefix + s.loglik,
    loglikScaling: prefix + s.loglikScaling,
    npar: prefix + s.npar,
    nObserved: prefix + s.nObserved,
    nFixedX: prefix + s.nFixedX,
    meanStructure: prefix + s.meanStructure,
    baselineChisq: prefix + s.baselineChisq,
    baselineDf: prefix + s.baselineDf,
  };
}

const RESTRICTED_COLUMNS = columnsFor("a_");
const FREE_COLUMNS = columnsFor("b_");
const LONE_COLUMNS = columnsFor("");

/** Reads one model's cells; `prefix` is "a_", "b_" or "" (a model checked on its own). */
export function parseModel(input: ModelInput, prefix: string, alpha: number, errors: FieldError[]): ParsedModel {
  const col = prefix === "a_" ? RESTRICTED_COLUMNS : prefix === "b_" ? FREE_COLUMNS : prefix === "" ? LONE_COLUMNS : columnsFor(prefix);
  const estimator = input.estimator === undefined ? null : readChoiceText(input.estimator, col.estimator, ESTIMATOR_CHOICES, errors);
  const chisqScaled = input.chisqScaled === undefined ? null : readNumberText(input.chisqScaled, col.chisqScaled, "nonNegative", errors);
  const scaling = input.scaling === undefined ? null : readNumberText(input.scaling, col.scaling, "positive", errors);
  const nObserved = input.nObserved === undefined ? null : readIntegerText(input.nObserved, col.nObserved, 1, errors);
  const nFixedX = input.nFixedX === undefined ? null : readIntegerText(input.nFixedX, col.nFixedX, 0, errors);
  if (nObserved !== null && nFixedX !== null && nFixedX > nObserved) {
    errors.push({ column: col.nFixedX, message: `${nFixedX} fixed-x variables but only ${nObserved} observed variables` });
  }
  const meanStructure = input.meanStructure === undefined ? null : readChoiceText(input.meanStructure, col.meanStructure, YES_NO_CHOICES, errors);
  const label = input.label;
  return {
    label: label === undefined ? "" : trimmedLabel(label),
    estimator,
    // A model without a named estimator but with a printed scaled statistic or scaling factor was
    // evidently fitted with a robust correction.
    robust: estimator !== null ? isRobust(estimator) : chisqScaled !== null || scaling !== null,
    chisq: input.chisq === undefined ? null : readNumberText(input.chisq, col.chisq, "nonNegative", errors),
    df: input.df === undefined ? null : readIntegerText(input.df, col.df, null, errors),
    p: input.p === undefined ? null : readPText(input.p, col.p, alpha, errors),
    chisqScaled,
    scaling,
    cfi: input.cfi === undefined ? null : readNumberText(input.cfi, col.cfi, "unit", errors),
    tli: input.tli === undefined ? null : readNumberText(input.tli, col.tli, "any", errors),
    rmsea: input.rmsea === undefined ? null : readNumberText(input.rmsea, col.rmsea, "nonNegative", errors),
    rmseaLo: input.rmseaLo === undefined ? null : readNumberText(input.rmseaLo, col.rmseaLo, "nonNegative", errors),
    rmseaHi: input.rmseaHi === undefined ? null : readNumberText(input.rmseaHi, col.rmseaHi, "nonNegative", errors),
    srmr: input.srmr === undefined ? null : readNumberText(input.srmr, col.srmr, "nonNegative", errors),
    aic: input.aic === undefined ? null : readNumberText(input.aic, col.aic, "any", errors),
    bic: input.bic === undefined ? null : readNumberText(input.bic, col.bic, "any", errors),
    loglik: input.loglik === undefined ? null : readNumberText(input.loglik, col.loglik, "any", errors),
    loglikScaling: input.loglikScaling === undefined ? null : readNumberText(input.loglikScaling, col.loglikScaling, "positive", errors),
    npar: input.npar === undefined ? null : readIntegerText(input.npar, col.npar, 1, errors),
    nObserved,
    nFixedX,
    meanStructure: meanStructure === null ? null : meanStructure === "yes",
    baselineChisq: input.baselineChisq === undefined ? null : readNumberText(input.baselineChisq, col.baselineChisq, "nonNegative", errors),
    baselineDf: input.baselineDf === undefined ? null : readIntegerText(input.baselineDf, col.baselineDf, 1, errors),
  };
}

export function parseSample(input: SampleInput, errors: FieldError[]): ParsedSample {
  const n = input.n === undefined ? null : readIntegerText(input.n, "n", 1, errors);
  const groups = (input.groups === undefined ? null : readIntegerText(input.groups, "n_groups", 1, errors)) ?? 1;
  if (n !== null && groups > n) errors.push({ column: "n_groups", message: `${groups} groups but N = ${n}` });
  return { n, groups };
}

/** Alpha as printed, or the configured default; errors when outside (0, 1). */
export function parseAlpha(text: string | undefined, fallback: number, errors: FieldError[]): number {
  if (isBlank(text)) return fallback;
  const printed = readPrintedNumber(text);
  if (printed === null) {
    errors.push({ column: "alpha", message: `"${text.trim()}" is not a number` });
    return fallback;
  }
  if (!(printed.value > 0 && printed.value < 1)) {
    errors.push({ column: "alpha", message: `alpha = ${printed.text} must lie strictly between 0 and 1` });
    return fallback;
  }
  return printed.value;
}

/** Parses a whole comparison; `errors` collects every unreadable cell. */
export function parseComparison(input: ComparisonInput, defaultAlpha: number, errors: FieldError[]): ParsedComparison {
  const alpha = parseAlpha(input.alpha, defaultAlpha, errors);
  const method = input.method === undefined ? null : readChoiceText(input.method, "method", METHOD_CHOICES, errors);
  if (method === null && isBlank(input.method)) {
    errors.push({ column: "method", message: `the comparison method is required: one of ${METHODS.join(", ")}` });
  }
  return {
    label: input.label === undefined ? "" : trimmedLabel(input.label),
    method,
    nested: (input.nested === undefined ? null : readChoiceText(input.nested, "nested", NESTED_CHOICES, errors)) ?? "unknown",
    alpha,
    dChisq: input.dChisq === undefined ? null : readNumberText(input.dChisq, "d_chisq", "any", errors),
    dDf: input.dDf === undefined ? null : readIntegerText(input.dDf, "d_df", null, errors),
    dP: input.dP === undefined ? null : readPText(input.dP, "d_p", alpha, errors),
    dCfi: input.dCfi === undefined ? null : readNumberText(input.dCfi, "d_cfi", "any", errors),
    dRmsea: input.dRmsea === undefined ? null : readNumberText(input.dRmsea, "d_rmsea", "any", errors),
    dAic: input.dAic === undefined ? null : readNumberText(input.dAic, "d_aic", "any", errors),
    dBic: input.dBic === undefined ? null : readNumberText(input.dBic, "d_bic", "any", errors),
    preferred: input.preferred === undefined ? null : readChoiceText(input.preferred, "preferred", PREFERRED_CHOICES, errors),
    invarianceClaimed: input.invarianceClaimed === undefined ? null : readChoiceText(input.invarianceClaimed, "invariance_claimed", INVARIANCE_CHOICES, errors),
    sample: parseSample(input.sample ?? {}, errors),
    restricted: parseModel(input.restricted ?? {}, "a_", alpha, errors),
    free: parseModel(input.free ?? {}, "b_", alpha, errors),
  };
}

/**
 * Every unreadable cell of a comparison, each named by its sheet column, so a form can show the message
 * beside its field. recheck() runs exactly this validation first.
 */
export function validateComparison(input: ComparisonInput, defaultAlpha = 0.05): FieldError[] {
  const errors: FieldError[] = [];
  parseComparison(input, defaultAlpha, errors);
  return errors;
}

/** The same for a model checked on its own (columns without the a_/b_ prefix, plus n and n_groups). */
export function validateModel(model: ModelInput, sample: SampleInput, defaultAlpha = 0.05): FieldError[] {
  const errors: FieldError[] = [];
  parseSample(sample ?? {}, errors);
  parseModel(model ?? {}, "", defaultAlpha, errors);
  return errors;
}
