// One sheet row → the values an entry stores: printed text trimmed and kept, its parsed number beside it,
// choice cells in their canonical spelling (the engine's own reading of them), defaults of DESIGN §5.
// Validation is the sheet's (lib/csv checkSheetRow) and the engine's (parseComparison); nothing here
// judges a figure a second way.
import { SHEET_COLUMNS, checkSheetRow, mergeFieldErrors, toComparisonInput, type SheetRow } from "@/lib/csv";
import { parseComparison as parseComparisonImport } from "@/lib/recheck/parse";
import type { ComparisonInput, Estimator, FieldError, InvarianceClaim, Method, ModelInput, Nested, Preferred } from "@/lib/recheck/types";
import { MAX_FIGURE_TEXT, TEXT_LIMITS, tooLong } from "@/lib/validation/import";
import { COMPARISON_FIGURES, MODEL_FIGURES, textAttribute } from "@/models/figures";
import type { CslName } from "@/models/paper";
import { readPrintedNumber as readPrintedNumberImport } from "@/lib/recheck/printed";
import { formatAuthors, parseAuthors } from "./authors";

// Imported functions bound once: under tsx (CommonJS) each call to an import otherwise goes through an
// export getter, measurable at 100 000 rows (the same trick as lib/recheck/parse.ts).
const parseComparison = parseComparisonImport;

/** Paper metadata as the sheet gives it; an absent field leaves what is stored alone. */
export interface PaperCells {
  doi: string | null;
  ref: string | null;
  title?: string;
  year?: number;
  journal?: string;
  authors?: CslName[];
  field?: string;
}

export interface SampleValues {
  label: string;
  n: number | null;
  groups: number;
}

/** Printed figures in catalogue order (MODEL_FIGURES or COMPARISON_FIGURES), null when not reported. */
export type FigureTexts = (string | null)[];

export interface ModelValues {
  label: string;
  estimator: Estimator | null;
  meanStructure: boolean | null;
  texts: FigureTexts;
}

export interface ComparisonValues {
  label: string;
  method: Method;
  nested: Nested;
  alphaText: string | null;
  alpha: number | null;
  location: string | null;
  preferred: Preferred | null;
  invarianceClaimed: InvarianceClaim;
  notes: string | null;
  texts: FigureTexts;
}

export interface RowEntry {
  row: number;
  /** "doi:10.5555/…" or "ref:…": the paper's identity within the sheet */
  paperKey: string;
  paper: PaperCells;
  sample: SampleValues;
  restricted: ModelValues;
  free: ModelValues;
  comparison: ComparisonValues;
}

export type EntryReading = { ok: true; entry: RowEntry; notes: string[] } | { ok: false; errors: FieldError[] };

const COLUMN_NAME = new Map(SHEET_COLUMNS.map((c) => [`${c.part}.${c.key}`, c.name]));
const columnOf = (part: string, key: string) => COLUMN_NAME.get(`${part}.${key}`) ?? key;

// Text cells a spreadsheet would run as a formula when the cell starts with one of these (OWASP CSV
// injection). Fitledger never evaluates a cell and the writer escapes them on export, so they are kept
// as text, and the preview says so.
const FORMULA_START = /^[=+\-@]/;
const PLAIN_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

function clean(value: string | undefined): string | undefined {
  if (value === undefined) return undefined;
  const text = value.trim();
  return text === "" ? undefined : text;
}

function figureTexts(source: Record<string, string | undefined>, names: readonly string[], part: string, errors: FieldError[]): FigureTexts {
  const texts: FigureTexts = new Array(names.length);
  for (let i = 0; i < names.length; i++) {
    const text = clean(source[names[i]]);
    if (text !== undefined && text.length > MAX_FIGURE_TEXT) errors.push(tooLong(columnOf(part, names[i]), text, MAX_FIGURE_TEXT));
    texts[i] = text ?? null;
  }
  return texts;
}

function limited(column: keyof typeof TEXT_LIMITS, value: string | undefined, errors: FieldError[]): string | undefined {
  const text = clean(value);
  if (text !== undefined && text.length > TEXT_LIMITS[column]) errors.push(tooLong(column, text, TEXT_LIMITS[column]));
  return text;
}

function formulaNote(notes: string[], column: string, value: string | undefined): void {
  if (value === undefined) return;
  const text = value.trim();
  if (text !== "" && FORMULA_START.test(text) && !PLAIN_NUMBER.test(text)) {
    notes.push(`${column} starts with "${text[0]}" like a spreadsheet formula; it is stored as text, never run, and exported with a leading apostrophe`);
  }
}

function formulaNotes(row: SheetRow): string[] {
  const notes: string[] = [];
  const { paper, sample, comparison, restricted, free } = row;
  formulaNote(notes, "title", paper.title);
  formulaNote(notes, "journal", paper.journal);
  formulaNote(notes, "authors", paper.authors);
  formulaNote(notes, "field", paper.field);
  formulaNote(notes, "paper_ref", paper.paperRef);
  formulaNote(notes, "sample", sample.label);
  formulaNote(notes, "comparison", comparison.label);
  formulaNote(notes, "location", comparison.location);
  formulaNote(notes, "notes", comparison.notes);
  formulaNote(notes, "a_label", restricted.label);
  formulaNote(notes, "b_label", free.label);
  return notes;
}

function model(input: ModelInput, part: "a" | "b", parsed: { estimator: Estimator | null; meanStructure: boolean | null }, errors: FieldError[]): ModelValues {
  const label = limited(part === "a" ? "a_label" : "b_label", input.label, errors) ?? "";
  return {
    label,
    estimator: parsed.estimator,
    meanStructure: parsed.meanStructure,
    texts: figureTexts(input as Record<string, string | undefined>, MODEL_FIGURES, part, errors),
  };
}

/** Reads one row: its errors (sheet rules, then every unreadable cell), or the values to store. */
export function readEntry(row: SheetRow): EntryReading {
  const sheetErrors = checkSheetRow(row);
  if (row.problems.length > 0) return { ok: false, errors: sheetErrors };
  const engineErrors: FieldError[] = [];
  const parsed = parseComparison(toComparisonInput(row), 0.05, engineErrors);
  const errors = mergeFieldErrors(sheetErrors, engineErrors);

  const { paper, sample, comparison } = row;
  const doi = clean(paper.doi) ?? null;
  const ref = limited("paper_ref", paper.paperRef, errors) ?? null;
  if (doi !== null && doi.length > TEXT_LIMITS.doi) errors.push(tooLong("doi", doi, TEXT_LIMITS.doi));
  const title = limited("title", paper.title, errors);
  const journal = limited("journal", paper.journal, errors);
  const field = limited("field", paper.field, errors);
  const authorsText = clean(paper.authors);
  const sampleLabel = limited("sample", sample.label, errors) ?? "Sample 1";
  const label = limited("comparison", comparison.label, errors) ?? "";
  const location = limited("location", comparison.location, errors) ?? null;
  const alphaText = limited("alpha", comparison.alpha, errors) ?? null;
  const restricted = model(row.restricted, "a", parsed.restricted, errors);
  const free = model(row.free, "b", parsed.free, errors);
  const texts = figureTexts(comparison as Record<string, string | undefined>, COMPARISON_FIGURES, "comparison", errors);
  if (errors.length > 0 || parsed.method === null) return { ok: false, errors };

  const paperCells: PaperCells = { doi, ref };
  if (title !== undefined) paperCells.title = title;
  if (paper.year !== undefined && paper.year.trim() !== "") paperCells.year = Number(paper.year.trim());
  if (journal !== undefined) paperCells.journal = journal;
  if (authorsText !== undefined) paperCells.authors = parseAuthors(authorsText);
  if (field !== undefined) paperCells.field = field;

  return {
    ok: true,
    notes: formulaNotes(row),
    entry: {
      row: row.row,
      paperKey: doi !== null ? `doi:${doi}` : `ref:${ref}`,
      paper: paperCells,
      sample: { label: sampleLabel, n: parsed.sample.n, groups: parsed.sample.groups },
      restricted,
      free,
      comparison: {
        label,
        method: parsed.method,
        nested: parsed.nested,
        alphaText,
        alpha: alphaText === null ? null : parsed.alpha,
        location,
        preferred: parsed.preferred,
        invarianceClaimed: parsed.invarianceClaimed ?? "n/a",
        notes: clean(comparison.notes) ?? null,
        texts,
      },
    },
  };
}

/**
 * An empty part and the mark between parts: ASCII's record and unit separators, control characters no
 * printed figure or label has a use for (a cell holding one could make two codings look alike; the sheet
 * reader itself refuses only NUL). Not NUL here: the database builds stored rows' signatures itself
 * (lib/import/existing.ts), and PostgreSQL's text cannot hold NUL, nor do SQLite's string functions
 * treat it as a character.
 */
export const SIGNATURE_NULL = "\u001e";
export const SIGNATURE_SEPARATOR = "\u001f";
const NULL_PART = SIGNATURE_NULL;
const SEPARATOR = SIGNATURE_SEPARATOR;

/**
 * A signature as one flat string: cheaper to keep for 100 000 rows than an array, and — unlike the cells,
 * which are slices of the piece of file they were read from — it keeps no piece of the file alive.
 */
export function encodeSignature(parts: readonly (string | null)[]): string {
  return parts.map((part) => (part === null ? NULL_PART : part)).join(SEPARATOR);
}

export function decodeSignature(encoded: string): (string | null)[] {
  return encoded.split(SEPARATOR).map((part) => (part === NULL_PART ? null : part));
}

/**
 * What identifies a model's coding: estimator, mean structure ("yes"/"no") and every printed figure, here
 * from a sheet row's values. The database builds the same string for stored rows (lib/import/existing.ts
 * signatureSql, tested in tests/integration/import/stored-signatures.test.ts).
 */
export function valuesModelSignature(model: ModelValues): (string | null)[] {
  return [model.estimator, model.meanStructure === null ? null : model.meanStructure ? "yes" : "no", ...model.texts];
}

export const MODEL_SIGNATURE_COLUMNS = ["estimator", "mean_structure", ...MODEL_FIGURES.map((f) => SHEET_COLUMNS.find((c) => c.part === "a" && c.key === f)!.name.slice(2))];

/** What identifies a comparison's coding, with its models' labels, from a sheet row's values. */
export function valuesComparisonSignature(c: ComparisonValues, restrictedLabel: string, freeLabel: string): (string | null)[] {
  return [c.method, c.nested, c.alphaText, c.location, c.preferred, c.invarianceClaimed, c.notes, restrictedLabel, freeLabel, ...c.texts];
}

export const COMPARISON_SIGNATURE_COLUMNS = [
  "method", "nested", "alpha", "location", "preferred", "invariance_claimed", "notes", "a_label", "b_label",
  ...COMPARISON_FIGURES.map((f) => SHEET_COLUMNS.find((c) => c.part === "comparison" && c.key === f)!.name),
];

const MODEL_TEXT_ATTRIBUTES = MODEL_FIGURES.map(textAttribute);
const COMPARISON_TEXT_ATTRIBUTES = COMPARISON_FIGURES.map(textAttribute);
const readPrintedNumber = readPrintedNumberImport;
const RELATION = /^[<>=≤≥]\s*/;

/** The parsed number stored beside a printed figure: the rule of figureColumns (lib/curation), one cell at a time. */
export function figureValue(printed: string | null): number | null {
  if (printed === null) return null;
  return readPrintedNumber(printed.replace(RELATION, ""))?.value ?? null;
}

/** Writes text and value of each figure into `target`; same result as figureColumns (tests/unit/import compares). */
function putFigures(target: Record<string, unknown>, texts: FigureTexts, figures: readonly string[], textAttributes: readonly string[]): void {
  for (let i = 0; i < figures.length; i++) {
    const text = texts[i];
    target[textAttributes[i]] = text;
    target[figures[i]] = figureValue(text);
  }
}

/**
 * Every key of an object the importer fills key by key (record[key] = …), undefined. The records start as
 * copies of these: V8 turns a small object literal that then grows by a dozen or more computed keys into
 * a slow dictionary, and every later read of it, copy of it or SQL built from it pays for that (seen in
 * the commit's profile); a copy of a complete template keeps one fast shape.
 */
function templateOf(keys: readonly string[]): Readonly<Record<string, undefined>> {
  return Object.fromEntries(keys.map((key) => [key, undefined]));
}
const MODEL_RECORD = templateOf(["label", "estimator", "meanStructure", ...MODEL_FIGURES.flatMap((figure, i) => [MODEL_TEXT_ATTRIBUTES[i], figure])]);
const MODEL_INPUT = templateOf(["label", "estimator", ...MODEL_FIGURES, "meanStructure"]);

/** The stored attributes of a model (printed text and parsed value of each figure). */
export function modelRecord(values: ModelValues): Record<string, unknown> {
  const record: Record<string, unknown> = { ...MODEL_RECORD };
  record.label = values.label;
  record.estimator = values.estimator;
  record.meanStructure = values.meanStructure;
  putFigures(record, values.texts, MODEL_FIGURES, MODEL_TEXT_ATTRIBUTES);
  return record;
}

export function comparisonRecord(values: ComparisonValues): Record<string, unknown> {
  const record: Record<string, unknown> = {
    label: values.label,
    method: values.method,
    nested: values.nested,
    alphaText: values.alphaText,
    alpha: values.alpha,
    location: values.location,
    preferred: values.preferred,
    invarianceClaimed: values.invarianceClaimed,
    notes: values.notes,
  };
  putFigures(record, values.texts, COMPARISON_FIGURES, COMPARISON_TEXT_ATTRIBUTES);
  return record;
}

function modelInputOf(values: ModelValues): ModelInput {
  const input: ModelInput = { ...MODEL_INPUT };
  input.label = values.label;
  input.estimator = values.estimator ?? undefined;
  const fields = input as Record<string, string | undefined>;
  for (let i = 0; i < MODEL_FIGURES.length; i++) fields[MODEL_FIGURES[i]] = values.texts[i] ?? undefined;
  if (values.meanStructure !== null) input.meanStructure = values.meanStructure ? "yes" : "no";
  return input;
}

/**
 * The engine's input as a later flag rewrite will read the stored entry (lib/db/flags comparisonInput:
 * same fields, same order), built straight from the values; tests/unit/import compares the two.
 */
export function storedComparisonInput(entry: RowEntry): ComparisonInput {
  const c = entry.comparison;
  const input: ComparisonInput = {
    label: c.label,
    method: c.method,
    nested: c.nested,
    alpha: c.alphaText ?? undefined,
    preferred: c.preferred ?? undefined,
    invarianceClaimed: c.invarianceClaimed,
    sample: { label: entry.sample.label, n: entry.sample.n === null ? undefined : String(entry.sample.n), groups: String(entry.sample.groups) },
    restricted: modelInputOf(entry.restricted),
    free: modelInputOf(entry.free),
  };
  const fields = input as unknown as Record<string, string | undefined>;
  for (let i = 0; i < COMPARISON_FIGURES.length; i++) fields[COMPARISON_FIGURES[i]] = c.texts[i] ?? undefined;
  return input;
}

export { formatAuthors };
