// The comparison sheet (DESIGN §5): catalogue, streaming reader, row validation and writer. No node:*
// imports, so the browser importer can read a File.stream() with the same code.
export {
  SHEET_COLUMNS,
  COLUMNS_BY_NAME,
  WHOLE_ROW,
  DEFAULT_SAMPLE_LABEL,
  DEFAULT_GROUP_COUNT,
  type ColumnSpec,
  type ColumnPart,
  type Requirement,
  type SheetPaper,
  type SheetComparison,
  type SheetRecord,
  type SheetRow,
} from "./columns";
export { SheetError, isSheetError, type SheetErrorCode } from "./sheet-error";
export { resolveHeader, suggestColumn, nearestName, unknownColumnMessage, normaliseColumnName, type SheetLayout } from "./header";
export { readSheet, readSheetBatches, SheetParser, type ByteSource } from "./read-sheet";
export { buildRow, emptyRecord, recordPart, toComparisonInput } from "./sheet-row";
export { checkSheetRow, checkSheetRecord, validateSheetRow, mergeFieldErrors } from "./validate-row";
export { normaliseDoi, DOI_PATTERN } from "./doi";
export { escapeFormula, unescapeFormula } from "./formula-escape";
export { csvLine, formatCell, sheetHeaderLine, sheetRecordLine, writeSheet } from "./write-sheet";
