// Per-row validation of a sheet row: the sheet's own rules here, the figures left to the engine's
// validateComparison, so that the sheet, the entry form and the API judge a figure the same way.
import type { SheetRecord, SheetRow } from "@/lib/csv/columns";
import { DOI_PATTERN } from "@/lib/csv/doi";
import { toComparisonInput } from "@/lib/csv/sheet-row";
import { validateComparison } from "@/lib/recheck";
import type { FieldError } from "@/lib/recheck/types";

// Factor analysis in print goes back to 1904 (Spearman) and path analysis to 1921 (Wright); a paper
// "in press" may carry next year. The range is a plausibility check, not a rule from a source.
const EARLIEST_YEAR = 1900;

// The last text tested as a DOI and the answer: a paper's rows come one after another with one DOI.
let lastDoiText = "";
let lastDoiOk = false;

function isDoi(text: string): boolean {
  if (text !== lastDoiText) {
    lastDoiOk = DOI_PATTERN.test(text);
    lastDoiText = text;
  }
  return lastDoiOk;
}

function missing(value: string | undefined): boolean {
  return value === undefined || value.trim() === "";
}

/** The sheet-level checks only (cheap; no figures). A row with a structural problem reports just that. */
export function checkSheetRow(row: SheetRow, today: Date = new Date()): FieldError[] {
  if (row.problems.length > 0) return [...row.problems];
  return checkSheetRecord(row, today);
}

export function checkSheetRecord(record: SheetRecord, today: Date = new Date()): FieldError[] {
  const errors: FieldError[] = [];
  const { paper, comparison, restricted, free } = record;

  if (missing(paper.doi) && missing(paper.paperRef)) {
    errors.push({ column: "doi", message: "the paper needs a DOI, or a paper_ref when it has none" });
  } else if (!missing(paper.doi) && !isDoi(paper.doi!)) {
    errors.push({ column: "doi", message: `"${paper.doi}" is not a DOI (expected 10.NNNN/…, such as 10.5555/demo.17)` });
  }

  if (!missing(paper.year)) {
    const text = paper.year!.trim();
    const latest = today.getFullYear() + 1;
    const year = Number(text);
    if (!/^\d{4}$/.test(text) || year < EARLIEST_YEAR || year > latest) {
      errors.push({ column: "year", message: `"${paper.year}" is not a publication year between ${EARLIEST_YEAR} and ${latest}` });
    }
  }

  if (missing(comparison.label)) errors.push({ column: "comparison", message: "the comparison needs a label" });
  if (missing(comparison.method)) errors.push({ column: "method", message: "the method is missing (lrt, scaled_lrt, ic or invariance)" });
  if (missing(restricted.label)) errors.push({ column: "a_label", message: "model A (restricted) needs a label" });
  if (missing(free.label)) errors.push({ column: "b_label", message: "model B (free) needs a label" });
  // a model is identified by (paper, sample, label): two equal labels would import as one model
  if (!missing(restricted.label) && restricted.label!.trim() === free.label?.trim()) {
    errors.push({ column: "b_label", message: `both models are labelled "${restricted.label}"; each model needs its own label` });
  }
  return errors;
}

/** Keeps every error of `first`, and those of `second` about columns `first` does not already name. */
export function mergeFieldErrors(first: readonly FieldError[], second: readonly FieldError[]): FieldError[] {
  if (second.length === 0) return [...first];
  const named = new Set(first.map((e) => e.column));
  return [...first, ...second.filter((e) => !named.has(e.column))];
}

/** Everything wrong with a row: its structure, the sheet rules, and each figure the engine cannot read. */
export function validateSheetRow(row: SheetRow, today: Date = new Date()): FieldError[] {
  if (row.problems.length > 0) return [...row.problems];
  return mergeFieldErrors(checkSheetRecord(row, today), validateComparison(toComparisonInput(row)));
}
