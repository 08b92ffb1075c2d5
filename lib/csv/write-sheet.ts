// The sheet writer: the same format the reader takes (DESIGN §5), so export → import is a round trip.
// Header in catalogue order, "," between cells, CRLF after each line and quotes only where needed
// (RFC 4180 §2), and the formula escape on every cell.
import { SHEET_COLUMNS, type SheetRecord } from "@/lib/csv/columns";
import { escapeFormula } from "@/lib/csv/formula-escape";
import { recordPart } from "@/lib/csv/sheet-row";

const NEEDS_QUOTES = /[",;\r\n]/;

/** One cell as written: escaped, then quoted when it holds a quote, a delimiter or a line break. */
export function formatCell(value: string | undefined): string {
  if (value === undefined || value === "") return "";
  const cell = escapeFormula(value);
  // ";" is quoted as well, so the file also reads back if someone swaps the delimiter
  return NEEDS_QUOTES.test(cell) ? '"' + cell.replace(/"/g, '""') + '"' : cell;
}

/** One CSV line of cells, line break included. */
export function csvLine(cells: ReadonlyArray<string | undefined>): string {
  let line = "";
  for (let i = 0; i < cells.length; i++) line += (i === 0 ? "" : ",") + formatCell(cells[i]);
  return line + "\r\n";
}

export function sheetHeaderLine(): string {
  return csvLine(SHEET_COLUMNS.map((c) => c.name));
}

export function sheetRecordLine(record: SheetRecord): string {
  return csvLine(SHEET_COLUMNS.map((c) => recordPart(record, c.part)[c.key]));
}

/** The whole sheet as lines, header first, for a caller to write with its own backpressure. */
export function* writeSheet(records: Iterable<SheetRecord>): Generator<string> {
  yield sheetHeaderLine();
  for (const record of records) yield sheetRecordLine(record);
}
