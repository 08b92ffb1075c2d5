// From a row's cells to a SheetRow, and from a SheetRow to the engine's ComparisonInput.
import type { ComparisonInput, FieldError, ModelInput, SampleInput } from "@/lib/recheck/types";
import {
  DEFAULT_GROUP_COUNT,
  DEFAULT_SAMPLE_LABEL,
  PART_ORDER,
  SHEET_COLUMNS,
  type ColumnPart,
  type SheetComparison,
  type SheetPaper,
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

/** Each field of a part present, undefined when its cell is empty: the row objects buildRow makes. */
type Full<T> = Record<keyof T, string | undefined>;

/**
 * For each part (in PART_ORDER), the index of the cell that fills each of its fields, in catalogue
 * order (the a_ and b_ columns share one order), or -1 when the sheet has no such column.
 */
interface CellIndexes {
  paper: Int32Array;
  sample: Int32Array;
  comparison: Int32Array;
  restricted: Int32Array;
  free: Int32Array;
}

function fieldKeys(part: ColumnPart): string[] {
  return SHEET_COLUMNS.filter((c) => c.part === part).map((c) => c.key);
}

/** The fields of each part in catalogue order, as the objects below list them (a unit test holds the two together). */
export const PART_FIELDS: Readonly<Record<ColumnPart, readonly string[]>> = {
  paper: fieldKeys("paper"),
  sample: fieldKeys("sample"),
  comparison: fieldKeys("comparison"),
  a: fieldKeys("a"),
  b: fieldKeys("b"),
};

const cellIndexesByLayout = new WeakMap<SheetLayout, CellIndexes>();

function cellIndexes(layout: SheetLayout): CellIndexes {
  let indexes = cellIndexesByLayout.get(layout);
  if (indexes === undefined) {
    const forPart = (part: ColumnPart) => {
      const slot = PART_ORDER.indexOf(part);
      return Int32Array.from(PART_FIELDS[part], (key) => layout.keys.findIndex((k, i) => k === key && layout.partSlots[i] === slot));
    };
    indexes = { paper: forPart("paper"), sample: forPart("sample"), comparison: forPart("comparison"), restricted: forPart("a"), free: forPart("b") };
    cellIndexesByLayout.set(layout, indexes);
  }
  return indexes;
}

/** The cell at `index` as a field: undefined when empty or missing (a short row), else without the formula escape. */
function field(cells: readonly string[], index: number): string | undefined {
  if (index < 0 || index >= cells.length) return undefined;
  const cell = cells[index];
  return cell === "" ? undefined : unescapeFormula(cell);
}

// The parts are object literals that name every field, in catalogue order, so every paper, sample,
// comparison and model object has the same keys in the same order whichever cells a sheet fills: the
// engine's property reads then meet one object shape, not one per combination of columns (measured on
// the 100 000-row bench sheet: about 15 % less CPU time to read and recheck it). Filling copies of a
// template cell by cell instead (`part[key] = cell`) was one megamorphic keyed store per cell and an
// object clone per part: reading the bench sheet took about a fifth longer.

// The DOI cell of the last row and its normal form: the rows of one paper come one after another and
// share the DOI, and normalising it (two trims, a regular expression, lower case) was a tenth of
// building a row. A pure function remembered for one argument, so nothing else depends on it.
let lastDoiCell = "";
let lastDoi = "";

function normalisedDoi(cell: string): string {
  if (cell !== lastDoiCell) {
    lastDoi = normaliseDoi(cell) ?? cell;
    lastDoiCell = cell;
  }
  return lastDoi;
}

function paperFields(cells: readonly string[], at: Int32Array): Full<SheetPaper> {
  const doi = field(cells, at[0]);
  return {
    doi: doi === undefined ? undefined : normalisedDoi(doi),
    paperRef: field(cells, at[1]),
    title: field(cells, at[2]),
    year: field(cells, at[3]),
    journal: field(cells, at[4]),
    authors: field(cells, at[5]),
    field: field(cells, at[6]),
  };
}

function sampleFields(cells: readonly string[], at: Int32Array): Full<SampleInput> {
  return {
    label: field(cells, at[0]) ?? DEFAULT_SAMPLE_LABEL,
    n: field(cells, at[1]),
    groups: field(cells, at[2]) ?? DEFAULT_GROUP_COUNT,
  };
}

function comparisonFields(cells: readonly string[], at: Int32Array): Full<SheetComparison> {
  return {
    label: field(cells, at[0]),
    method: field(cells, at[1]),
    nested: field(cells, at[2]),
    alpha: field(cells, at[3]),
    location: field(cells, at[4]),
    dChisq: field(cells, at[5]),
    dDf: field(cells, at[6]),
    dP: field(cells, at[7]),
    dCfi: field(cells, at[8]),
    dRmsea: field(cells, at[9]),
    dAic: field(cells, at[10]),
    dBic: field(cells, at[11]),
    preferred: field(cells, at[12]),
    invarianceClaimed: field(cells, at[13]),
    notes: field(cells, at[14]),
  };
}

function modelFields(cells: readonly string[], at: Int32Array): Full<ModelInput> {
  return {
    label: field(cells, at[0]),
    estimator: field(cells, at[1]),
    chisq: field(cells, at[2]),
    df: field(cells, at[3]),
    p: field(cells, at[4]),
    chisqScaled: field(cells, at[5]),
    scaling: field(cells, at[6]),
    cfi: field(cells, at[7]),
    tli: field(cells, at[8]),
    rmsea: field(cells, at[9]),
    rmseaLo: field(cells, at[10]),
    rmseaHi: field(cells, at[11]),
    srmr: field(cells, at[12]),
    aic: field(cells, at[13]),
    bic: field(cells, at[14]),
    loglik: field(cells, at[15]),
    loglikScaling: field(cells, at[16]),
    npar: field(cells, at[17]),
    nObserved: field(cells, at[18]),
    nFixedX: field(cells, at[19]),
    meanStructure: field(cells, at[20]),
    baselineChisq: field(cells, at[21]),
    baselineDf: field(cells, at[22]),
  };
}

/**
 * Builds a row from its cells; an empty cell is an undefined field. Cells stay text exactly as printed,
 * except that the writer's formula escape is removed, a valid DOI is normalised, and the §5 defaults fill
 * an empty sample label and group count. Cells beyond the header (a row with too many cells) are not
 * read; `problems` says why.
 */
export function buildRow(layout: SheetLayout, cells: readonly string[], row: number, problems: readonly FieldError[]): SheetRow {
  const at = cellIndexes(layout);
  return {
    row,
    problems,
    paper: paperFields(cells, at.paper),
    sample: sampleFields(cells, at.sample),
    comparison: comparisonFields(cells, at.comparison),
    restricted: modelFields(cells, at.restricted),
    free: modelFields(cells, at.free),
  };
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
