// The streaming sheet reader. Bytes come in chunks (a Node file stream, a browser File.stream(), an array
// in tests); each chunk is decoded, split into records by papaparse's Parser and handed on as SheetRows,
// so only the current chunk and one unfinished record are ever held — never the whole file.
//
// papaparse's own Papa.parse streams by pushing into callbacks; its Parser is the same engine driven one
// chunk at a time (the way its ChunkStreamer drives it), which lets the consumer pull, so backpressure
// from the output reaches the file. The Parser has no type conversion at all (dynamicTyping lives in
// Papa.parse's wrapper), so "9.20" stays "9.20" and "0012" stays "0012".
import Papa from "papaparse";
import { WHOLE_ROW, type SheetRow } from "@/lib/csv/columns";
import { Utf8ChunkDecoder } from "@/lib/csv/decode-utf8";
import { resolveHeader, type SheetLayout } from "@/lib/csv/header";
import { SheetError } from "@/lib/csv/sheet-error";
import { buildRow } from "@/lib/csv/sheet-row";
import type { FieldError } from "@/lib/recheck/types";

export type ByteSource = AsyncIterable<Uint8Array> | Iterable<Uint8Array>;

/** Shared by every sound row, so that reading a row allocates no empty array for it. */
const NO_PROBLEMS: readonly FieldError[] = Object.freeze([]);

/** A header line longer than this without a line break is not a comparison sheet's header. */
const MAX_HEADER_CHARS = 1 << 20;

/**
 * A record still unfinished after this much text is a quote that never closes: everything after it would
 * be read into one cell, and re-parsed from its start with every chunk (quadratic time). A comparison row
 * is a few hundred bytes to a few kilobytes.
 */
const MAX_RECORD_CHARS = 1 << 20;

interface ParserResult {
  data: string[][];
  errors: Papa.ParseError[];
  meta: { cursor: number };
}

type Delimiter = "," | ";";
type Newline = "\n" | "\r\n" | "\r";

function count(text: string, char: string): number {
  let n = 0;
  for (let i = text.indexOf(char); i >= 0; i = text.indexOf(char, i + 1)) n++;
  return n;
}

function isBlank(cells: readonly string[]): boolean {
  for (const cell of cells) if (cell !== "" && cell.trim() !== "") return false;
  return true;
}

function quoteProblem(error: Papa.ParseError): string {
  if (error.code === "MissingQuotes") return "a quoted cell opens but never closes, so the rest of the file was read into it";
  if (error.code === "InvalidQuotes") return 'a quoted cell has text after its closing quote (a stray ")';
  return error.message;
}

const QUOTE = 0x22;
const LINE_FEED = 0x0a;
const CARRIAGE_RETURN = 0x0d;

/**
 * The records of `text` exactly as papaparse's Parser gives them (same cells, same cursor), for text
 * that holds only plain cells and well-formed quoted cells; null at the first thing that is anything
 * else (text after a closing quote, a quote that never closes in the last chunk), for papaparse to
 * read instead and report. A quote inside a plain cell is part of it, as papaparse reads it.
 *
 * Why: papaparse cuts every cell with an indexOf and a substring, and each quoted one with a regular
 * expression; on the bench sheet (70 columns, two quoted cells a row) that was the reader's largest
 * part. This scans the characters once. tests/unit/csv/split-records.test.ts holds it to papaparse.
 */
export function splitPlainRecords(text: string, delimiter: Delimiter, newline: Newline, ignoreLastRow: boolean): ParserResult | null {
  const data: string[][] = [];
  const length = text.length;
  if (length === 0) return { data, errors: [], meta: { cursor: 0 } };
  const delimiterCode = delimiter.charCodeAt(0);
  // the first character of a line break; a "\r" is one only when "\r\n" is not the sheet's break
  const breakCode = newline === "\n" ? LINE_FEED : CARRIAGE_RETURN;
  const twoCharBreak = newline === "\r\n";
  /** where the last complete record ends (after its line break) */
  let cursor = 0;
  let row: string[] = [];
  let at = 0;
  for (;;) {
    let cell: string;
    /** the index just after the cell: a delimiter, a line break or the end */
    let end: number;
    if (at < length && text.charCodeAt(at) === QUOTE) {
      let from = at + 1;
      let escaped = false;
      let close: number;
      for (;;) {
        close = text.indexOf('"', from);
        // a quote still open at the end: an unfinished record, or (in the last chunk) papaparse's error to report
        if (close < 0) return ignoreLastRow ? { data, errors: [], meta: { cursor } } : null;
        if (close + 1 < length && text.charCodeAt(close + 1) === QUOTE) {
          escaped = true;
          from = close + 2;
          continue;
        }
        break;
      }
      cell = text.substring(at + 1, close);
      if (escaped) cell = cell.replaceAll('""', '"');
      end = close + 1;
      if (end < length) {
        const next = text.charCodeAt(end);
        const isBreak = next === breakCode && (!twoCharBreak || (end + 1 < length && text.charCodeAt(end + 1) === LINE_FEED));
        // anything else after the closing quote (spaces included, which papaparse skips) is papaparse's to read
        if (next !== delimiterCode && !isBreak) return null;
      }
    } else {
      end = at;
      for (; end < length; end++) {
        const c = text.charCodeAt(end);
        if (c === delimiterCode) break;
        if (c === breakCode && (!twoCharBreak || (end + 1 < length && text.charCodeAt(end + 1) === LINE_FEED))) break;
      }
      cell = text.substring(at, end);
    }
    row.push(cell);
    if (end >= length) {
      // the text ends inside this record: in a chunk that is not the last, it is left for the next one
      if (!ignoreLastRow) {
        data.push(row);
        cursor = length;
      }
      return { data, errors: [], meta: { cursor } };
    }
    if (text.charCodeAt(end) === delimiterCode) {
      at = end + 1;
    } else {
      data.push(row);
      row = [];
      at = end + (twoCharBreak ? 2 : 1);
      cursor = at;
    }
  }
}

/**
 * Push-style core: feed decoded text, get the rows completed so far. Throws SheetError when the sheet
 * as a whole cannot be read (no header, a header the catalogue refuses).
 */
export class SheetParser {
  private pending = "";
  private parser: Papa.Parser | undefined;
  private delimiter: Delimiter = ",";
  private newline: Newline = "\n";
  private layout: SheetLayout | undefined;
  /** data records seen so far, blank ones included (the row number of the last record) */
  private records = 0;
  private refusal: SheetError | undefined;

  push(text: string, final: boolean): SheetRow[] {
    if (this.refusal) throw this.refusal;
    // join, not +: it copies the two into one flat string, where `+` makes a rope (and the slice below a
    // view into the last chunk) that every charCodeAt of splitPlainRecords would have to look through
    this.pending = this.pending === "" ? text : [this.pending, text].join("");
    if (!this.parser && !this.start(final)) return [];
    const result =
      splitPlainRecords(this.pending, this.delimiter, this.newline, !final) ?? (this.parser!.parse(this.pending, 0, !final) as ParserResult);
    this.pending = final ? "" : this.pending.slice(result.meta.cursor);

    const problemsAt = new Map<number, FieldError[]>();
    for (const error of result.errors) {
      if (error.row === undefined) continue;
      const list = problemsAt.get(error.row) ?? [];
      list.push({ column: WHOLE_ROW, message: quoteProblem(error) });
      problemsAt.set(error.row, list);
    }

    const rows: SheetRow[] = [];
    const data = result.data;
    for (let i = 0; i < data.length; i++) {
      const cells = data[i];
      if (!this.layout) {
        this.layout = resolveHeader(cells);
        continue;
      }
      this.records++;
      let problems = problemsAt.get(i);
      if (problems === undefined && isBlank(cells)) continue;
      const width = this.layout.columns.length;
      if (cells.length !== width) {
        (problems ??= []).push({ column: WHOLE_ROW, message: `has ${cells.length} cells but the header has ${width} columns` });
      }
      rows.push(buildRow(this.layout, cells, this.records, problems ?? NO_PROBLEMS));
    }
    if (final && !this.layout) throw new SheetError("empty_file", "the file is empty (no header row)");
    if (this.pending.length > MAX_RECORD_CHARS) {
      // refused at the next push, so that the rows completed in this one still reach the caller
      const which = this.layout ? `row ${this.records + 1}` : "the header row";
      this.refusal = new SheetError("record_too_long", `${which} runs on for more than 1 MB: probably a quoted cell that never closes`);
    }
    return rows;
  }

  /** Reads the delimiter and line break off the header line; false while that line is still incomplete. */
  private start(final: boolean): boolean {
    const text = this.pending;
    const lineEnd = text.search(/[\r\n]/);
    const crAtEnd = lineEnd === text.length - 1 && text[lineEnd] === "\r";
    if ((lineEnd < 0 || crAtEnd) && !final) {
      if (text.length > MAX_HEADER_CHARS) throw new SheetError("no_header", "no line break in the first 1 MB: not a comparison sheet");
      return false;
    }
    if (text.trim() === "") {
      if (final) throw new SheetError("empty_file", "the file is empty (no header row)");
      return false;
    }
    const headerLine = lineEnd < 0 ? text : text.slice(0, lineEnd);
    if (headerLine.trim() === "") throw new SheetError("no_header", "the first line is empty; the header row must come first");

    let newline: Newline = "\n";
    if (lineEnd >= 0 && text[lineEnd] === "\r") newline = text[lineEnd + 1] === "\n" ? "\r\n" : "\r";
    // The header names never contain either character, so the one it uses is the delimiter.
    const delimiter: Delimiter = count(headerLine, ";") > count(headerLine, ",") ? ";" : ",";
    this.parser = new Papa.Parser({ delimiter, newline, quoteChar: '"' });
    this.delimiter = delimiter;
    this.newline = newline;
    return true;
  }
}

/** Rows in the batches they were completed in (one batch per input chunk): cheaper for bulk consumers. */
export async function* readSheetBatches(source: ByteSource): AsyncGenerator<SheetRow[]> {
  const decoder = new Utf8ChunkDecoder();
  const parser = new SheetParser();
  for await (const chunk of source) {
    const rows = parser.push(decoder.decode(chunk), false);
    if (rows.length > 0) yield rows;
  }
  const rows = parser.push(decoder.end(), true);
  if (rows.length > 0) yield rows;
}

/**
 * Reads a comparison sheet (DESIGN §5) row by row: UTF-8 with or without BOM, "," or ";" (whichever the
 * header uses), LF, CRLF or CR line breaks, RFC 4180 quoting. Throws SheetError for a file that is not a
 * sheet at all — possibly after some rows, when the bad bytes come late; row-level problems come with the row.
 */
export async function* readSheet(source: ByteSource): AsyncGenerator<SheetRow> {
  for await (const batch of readSheetBatches(source)) yield* batch;
}
