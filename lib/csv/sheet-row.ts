// From a row's cells to a SheetRow, and from a SheetRow to the engine's ComparisonInput.
import type { ComparisonInput, FieldError } from "@/lib/recheck/types";
import {
  DEFAULT_GROUP_COUNT,
  DEFAULT_SAMPLE_LABEL,
  type ColumnPart,
  type SheetRecord,
  type SheetRow,
} from "@/lib/csv/columns";
import type { SheetLayout } from "@/lib/csv/header";
import { unescapeFormula } from "@/lib/csv/formula-escape";
import { normaliseDoi } from "@/lib/csv/doi";

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

/**
 * Builds a row from its cells. Cells stay text exactly as printed, except that the writer's formula
 * escape is removed, a valid DOI is normalised, and the §5 defaults fill an empty sample label and group
 * count. Cells beyond the header (a row with too many cells) are not read; `problems` says why.
 */
export function buildRow(layout: SheetLayout, cells: readonly string[], row: number, problems: FieldError[]): SheetRow {
  const record = emptyRecord();
  const columns = layout.columns;
  const count = Math.min(columns.length, cells.length);
  for (let i = 0; i < count; i++) {
    const cell = cells[i];
    if (cell === "") continue;
    const column = columns[i];
    recordPart(record, column.part)[column.key] = unescapeFormula(cell);
  }
  if (record.paper.doi !== undefined) record.paper.doi = normaliseDoi(record.paper.doi) ?? record.paper.doi;
  record.sample.label ??= DEFAULT_SAMPLE_LABEL;
  record.sample.groups ??= DEFAULT_GROUP_COUNT;
  return { row, problems, ...record };
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
