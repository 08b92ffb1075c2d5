// From a row's cells to a SheetRow, and from a SheetRow to the engine's ComparisonInput.
import type { ComparisonInput, FieldError } from "@/lib/recheck/types";
import {
  DEFAULT_GROUP_COUNT,
  DEFAULT_SAMPLE_LABEL,
  SHEET_COLUMNS,
  type ColumnPart,
  type SheetRecord,
  type SheetRow,
} from "@/lib/csv/columns";
import type { SheetLayout } from "@/lib/csv/header";
import { unescapeFormula as unescapeFormulaImport } from "@/lib/csv/formula-escape";
import { normaliseDoi } from "@/lib/csv/doi";

// Bound once: under tsx (CommonJS output, as the CLI runs) each call of an import goes through an export
// getter, and buildRow calls this for every cell (about 50 ms per 100 000 rows in the CLI's profile).
const unescapeFormula = unescapeFormulaImport;

/** Every part of a record holds optional text fields, so one writable view serves them all. */
type TextFields = Record<string, string | undefined>;

export function emptyRecord(): SheetRecord {
  return { paper: {}, sample: {}, comparison: {}, restricted: {}, free: {} };
}

/** The record part a column fills (a_ → restricted, b_ → free). */
export function recordPart(record: SheetRecord, part: ColumnPart): TextFields {
  switch (part) {
    case "paper":
      return record.paper as TextFields;
    case "sample":
      return record.sample as TextFields;
    case "comparison":
      return record.comparison as TextFields;
    case "a":
      return record.restricted as TextFields;
    case "b":
      return record.free as TextFields;
  }
}

/** Every field of a part, undefined, in catalogue order (the a_ and b_ columns share one order). */
function template(part: ColumnPart): Readonly<TextFields> {
  return Object.fromEntries(SHEET_COLUMNS.filter((c) => c.part === part).map((c) => [c.key, undefined]));
}

// Rows are built by copying these, so every paper, sample, comparison and model object has the same keys
// in the same order whichever cells a sheet fills: the engine's property reads then meet one object
// shape, not one per combination of columns (measured on the 100 000-row bench sheet: about 15 % less
// CPU time to read and recheck it).
const PAPER = template("paper");
const SAMPLE = template("sample");
const COMPARISON = template("comparison");
const MODEL = template("a");

/**
 * Builds a row from its cells; an empty cell is an undefined field. Cells stay text exactly as printed,
 * except that the writer's formula escape is removed, a valid DOI is normalised, and the §5 defaults fill
 * an empty sample label and group count. Cells beyond the header (a row with too many cells) are not
 * read; `problems` says why.
 */
export function buildRow(layout: SheetLayout, cells: readonly string[], row: number, problems: readonly FieldError[]): SheetRow {
  const sheetRow: SheetRow = {
    row,
    problems,
    paper: { ...PAPER },
    sample: { ...SAMPLE },
    comparison: { ...COMPARISON },
    restricted: { ...MODEL },
    free: { ...MODEL },
  };
  // in PART_ORDER; one array per row instead of a switch per cell (this loop runs for every cell of the file)
  const parts = [sheetRow.paper, sheetRow.sample, sheetRow.comparison, sheetRow.restricted, sheetRow.free] as TextFields[];
  const { partSlots, keys } = layout;
  const count = Math.min(keys.length, cells.length);
  for (let i = 0; i < count; i++) {
    const cell = cells[i];
    if (cell !== "") parts[partSlots[i]][keys[i]] = unescapeFormula(cell);
  }
  const { paper, sample } = sheetRow;
  if (paper.doi !== undefined) paper.doi = normaliseDoi(paper.doi) ?? paper.doi;
  sample.label ??= DEFAULT_SAMPLE_LABEL;
  sample.groups ??= DEFAULT_GROUP_COUNT;
  return sheetRow;
}

/** The engine's input for a row: the comparison's figures with its sample and two models. */
export function toComparisonInput(row: SheetRecord): ComparisonInput {
  const c = row.comparison;
  return {
    label: c.label,
    method: c.method,
    nested: c.nested,
    alpha: c.alpha,
    dChisq: c.dChisq,
    dDf: c.dDf,
    dP: c.dP,
    dCfi: c.dCfi,
    dRmsea: c.dRmsea,
    dAic: c.dAic,
    dBic: c.dBic,
    preferred: c.preferred,
    invarianceClaimed: c.invarianceClaimed,
    sample: row.sample,
    restricted: row.restricted,
    free: row.free,
  };
}
