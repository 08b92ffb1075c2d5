// The recheck command's output (DESIGN §4.5): result text encoded straight into Buffers, and the JSON
// line of a rechecked row written byte by byte, the same bytes as JSON.stringify of the §4.5 object.
// Kept apart from lib/cli/recheck.ts (which runs as soon as it is loaded) so that the tests can hold the
// writer to JSON.stringify on many more results than a run of the command would give them.
import type { RecheckResult, SkippedCheck } from "@/lib/recheck/types";

const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const COMMA = 0x2c;
const OPEN_BRACE = 0x7b;
const CLOSE_BRACE = 0x7d;
const CLOSE_BRACKET = 0x5d;
const LINE_FEED = 0x0a;

/** Longest text of a number as JSON.stringify prints it ("-2.2250738585072014e-308"), with room to spare. */
const MAX_NUMBER_BYTES = 32;

const utf8 = (text: string): Uint8Array => Buffer.from(text, "utf8");

/** What JSON.stringify writes other than as itself: quotes, backslashes, control characters, and (lone) surrogates, which the byte loop leaves to it too. */
const NEEDS_ESCAPE = /["\\\u0000-\u001f\ud800-\udfff]/;
/** Texts at least this long are encoded natively by jsonString. */
const NATIVE_FROM = 48;

/**
 * Result text encoded into a Buffer as it comes, and handed on a full buffer at a time. Writing strings
 * instead meant gluing each batch into one long string (a rope V8 then has to flatten) and the stream
 * encoding it to UTF-8 again in one piece; the messages hold χ², Δ and −, so those strings are two-byte
 * and the copies are not cheap.
 */
export class OutputBuffer {
  private buffer: Buffer;
  private used = 0;

  constructor(
    /** takes a full buffer (or one piece too long for a buffer) and keeps it: the next bytes go into a new one */
    private readonly emit: (chunk: Buffer) => void,
    // 64 KB, what a Linux pipe holds: a buffer handed to stdout then usually goes into the pipe at once
    // (the reader emptied it while the next rows were rechecked). With 256 KB buffers only the first
    // 64 KB went in, stdout said it was full after every buffer, and the command sat waiting for
    // "drain" 500 times a run (0.2–0.4 s of a 100 000-row run into the bench's pipe; 15 times with 64 KB)
    private readonly capacity = 1 << 16,
  ) {
    this.buffer = Buffer.allocUnsafeSlow(capacity);
  }

  /** Appends text as UTF-8. */
  text(text: string): void {
    // one UTF-16 code unit is at most 3 bytes of UTF-8 (a surrogate pair: 2 units, 4 bytes)
    if (text.length * 3 > this.capacity) {
      this.send();
      this.emit(Buffer.from(text, "utf8"));
      return;
    }
    this.room(text.length * 3);
    this.used += this.buffer.write(text, this.used, "utf8");
  }

  /** Appends a line feed. */
  lineFeed(): void {
    this.byte(LINE_FEED);
  }

  /** Hands what the buffer holds to the sink. */
  send(): void {
    if (this.used === 0) return;
    const full = this.buffer.subarray(0, this.used);
    // the sink may hold on to the buffer until it is written out (or hand its memory to another thread:
    // allocUnsafeSlow, never a slice of Node's shared pool), so what follows goes into a new one
    this.buffer = Buffer.allocUnsafeSlow(this.capacity);
    this.used = 0;
    this.emit(full);
  }

  /** Makes room for `bytes` more (at most the capacity). */
  room(bytes: number): void {
    if (this.used + bytes > this.capacity) this.send();
  }

  byte(value: number): void {
    this.room(1);
    this.buffer[this.used++] = value;
  }

  /** Appends bytes made earlier, from `start` on. */
  bytes(chunk: Uint8Array, start = 0): void {
    const length = chunk.length - start;
    if (length > this.capacity) {
      this.send();
      this.emit(Buffer.from(chunk.subarray(start)));
      return;
    }
    this.room(length);
    const buffer = this.buffer;
    let used = this.used;
    // a loop for the short pieces (keys, codes): set() is a builtin call, and a call costs more than a few bytes
    if (length < 48) {
      for (let i = start; i < chunk.length; i++) buffer[used++] = chunk[i];
    } else {
      buffer.set(start === 0 ? chunk : chunk.subarray(start), used);
      used += length;
    }
    this.used = used;
  }

  /**
   * Appends JSON.stringify(text) as UTF-8, encoded here: the common characters one by one, anything
   * JSON.stringify escapes (quotes, backslashes, control characters, lone surrogates) and surrogate
   * pairs by JSON.stringify itself. Skips the string JSON.stringify would make and the call into C++
   * that Buffer.write is.
   */
  jsonString(text: string): void {
    const length = text.length;
    // every character the loop takes is at most 3 bytes
    if (length * 3 + 2 > this.capacity) return this.text(JSON.stringify(text));
    this.room(length * 3 + 2);
    if (length >= NATIVE_FROM) {
      // a longer text (the findings' messages): one native test for anything to escape, one native
      // UTF-8 encoding; both cost more than the loop below on short texts
      if (NEEDS_ESCAPE.test(text)) return this.text(JSON.stringify(text));
      this.buffer[this.used++] = QUOTE;
      this.used += this.buffer.write(text, this.used, "utf8");
      this.buffer[this.used++] = QUOTE;
      return;
    }
    const buffer = this.buffer;
    let used = this.used;
    buffer[used++] = QUOTE;
    for (let i = 0; i < length; i++) {
      const c = text.charCodeAt(i);
      if (c < 0x80) {
        if (c < 0x20 || c === QUOTE || c === BACKSLASH) return this.text(JSON.stringify(text));
        buffer[used++] = c;
      } else if (c < 0x800) {
        buffer[used++] = 0xc0 | (c >> 6);
        buffer[used++] = 0x80 | (c & 0x3f);
      } else if (c < 0xd800 || c > 0xdfff) {
        buffer[used++] = 0xe0 | (c >> 12);
        buffer[used++] = 0x80 | ((c >> 6) & 0x3f);
        buffer[used++] = 0x80 | (c & 0x3f);
      } else {
        // nothing of it was committed: `used` is still where the string began
        return this.text(JSON.stringify(text));
      }
    }
    buffer[used++] = QUOTE;
    this.used = used;
  }

  /** A non-negative integer below 2³¹ in decimal, as String() gives it; anything else through String(). */
  integer(value: number): void {
    if (!(value >= 0 && value < 0x80000000 && value === Math.floor(value))) return this.text(String(value));
    this.room(10);
    let digits = 1;
    for (let rest = value; rest >= 10; rest = Math.floor(rest / 10)) digits++;
    const buffer = this.buffer;
    let at = this.used + digits;
    this.used = at;
    let rest = value;
    do {
      buffer[--at] = 0x30 + (rest % 10);
      rest = Math.floor(rest / 10);
    } while (rest > 0);
  }

  /**
   * Copies one number from `list`, the JSON text of an array of numbers (as bytes), starting at `from`;
   * returns where the next one starts. JSON.stringify prints an array's numbers straight into its own
   * text, where String() of each number would make a string apiece; copying from bytes skips the
   * string's representation checks on every charCodeAt.
   */
  numberFrom(list: Uint8Array, from: number): number {
    this.room(MAX_NUMBER_BYTES);
    const buffer = this.buffer;
    let used = this.used;
    let at = from;
    for (let c = list[at]; c !== COMMA && c !== CLOSE_BRACKET; c = list[++at]) buffer[used++] = c;
    this.used = used;
    return at + 1;
  }
}


/** The kinds of a recomputed figure's value in EncodedLines.ops, in the low bits beside its key's id. */
const NUMBER = 0;
const INTERVAL = 1;
/** a text value: a fixed text's id follows */
const TEXT = 2;
const TRUE_VALUE = 3;
const FALSE_VALUE = 4;
const NULL_VALUE = 5;
/** anything else: the length of its JSON text in `strings` follows */
const OTHER = 6;
const KIND_BITS = 3;

/** Operations in EncodedLines.ops, each followed by its operands. */
/** a rechecked row: row, label (its length in `strings`, or -1 for null), findings, skipped, recomputed, tail; see JsonLineEncoder.add */
const RESULT_LINE = 1;
/** a line given whole: the length of its text in `strings` */
const TEXT_LINE = 2;
/** recomputed figures that are not a plain object: the length of their JSON text in `strings` follows */
const RECOMPUTED_TEXT = -1;

/**
 * A run of JSON lines as plain data: integers, doubles and strings, which postMessage copies (or, for
 * the typed arrays, hands over) with no object graph to walk. JsonLineEncoder makes it, JsonLinePrinter
 * turns it into the lines' bytes: in one thread (JsonLineWriter) or in two (the recheck command).
 */
export interface EncodedLines {
  /** the operations and their operands (RESULT_LINE, TEXT_LINE) */
  ops: Int32Array<ArrayBuffer>;
  /** the recomputed figures' numbers, in the order the lines use them */
  numbers: Float64Array<ArrayBuffer>;
  /**
   * the texts of these lines alone (labels, messages, whole lines, odd values' JSON), one after the
   * other in the order the operations use them, each operand giving a text's length: one string for
   * postMessage to copy, where an array of them cost it about twice as long (each message a rope of
   * its parts, flattened one by one)
   */
  strings: string;
  /** the repeated texts first used in these lines (keys, finding heads, skipped checks), as JSON text, their ids continuing the table */
  texts: string[];
  /** the table of repeated texts starts again from id 0 with these lines */
  reset: boolean;
}

/** What the recheck command's printer thread (lib/cli/json-printer-thread.ts) says: a batch printed and written, the end written, or a failed write. */
export type PrinterMessage = "printed" | "ended" | { failed: { code: string | undefined; message: string } };

/** Repeated texts the table holds before it starts again (the reasons of skipped checks are no fixed list). */
const TABLE_LIMIT = 10_000;

/**
 * The first half of writing JSON lines: each line's parts as the ids of repeated texts, its own texts
 * and its numbers (EncodedLines), in about a fifth of the time the bytes take. The same texts come back
 * row after row — the keys, each skipped check with its reason, finding codes, the RMSEA conventions —
 * so each is given an id once, looked up by what it is made from (no JSON text made to look it up).
 */
export class JsonLineEncoder {
  private ops = new Int32Array(1 << 12);
  private opCount = 0;
  private numbers = new Float64Array(1 << 12);
  private numberCount = 0;
  private strings: string[] = [];
  private texts: string[] = [];
  /** ids given so far since the table last started again */
  private textCount = 0;
  private reset = false;
  /** a skipped check's text id by reason, then check and subject (a SkippedCheck has no other fields) */
  private readonly skippedIds = new Map<string, { check: string; subject: string; id: number }[]>();
  /** `{"code":…,"severity":…,"message":` by code, then severity */
  private readonly findingHeads = new Map<string, Map<string, number>>();
  /** `,"key":` of a recomputed figure, by key */
  private readonly keyIds = new Map<string, number>();
  /** the JSON text of a recomputed text value (the RMSEA conventions, the matched forms), by value */
  private readonly valueIds = new Map<string, number>();
  /** `,"engineVersion":…}` by version */
  private readonly tailIds = new Map<string, number>();
  /** the keys of the last result's recomputed fields by position, and their ids */
  private readonly lastKeys: string[] = [];
  private readonly lastKeyIds: number[] = [];
  /** the text values of the last result's recomputed fields by position, and their ids */
  private readonly lastValues: string[] = [];
  private readonly lastValueIds: number[] = [];

  /** Operands encoded since the last take(): 0 when there is nothing to take. */
  get size(): number {
    return this.opCount;
  }

  /** A rechecked row's line. */
  add(row: number, comparison: string | null, result: RecheckResult): void {
    const { findings, skipped, recomputed, engineVersion } = result;
    // a row number JSON prints as digits goes in as itself; any other (only tests make them) as its JSON text
    const plainRow = row >= 0 && row < 0x80000000 && row === Math.floor(row);
    this.room(5 + 2 * findings.length + skipped.length);
    const ops = this.ops;
    let n = this.opCount;
    ops[n++] = plainRow ? RESULT_LINE : -RESULT_LINE;
    ops[n++] = plainRow ? row : this.string(JSON.stringify(row));
    ops[n++] = comparison === null ? -1 : this.string(comparison);
    ops[n++] = findings.length;
    for (let i = 0; i < findings.length; i++) {
      const finding = findings[i];
      ops[n++] = this.findingHead(finding.code, finding.severity);
      ops[n++] = this.string(finding.message);
    }
    ops[n++] = skipped.length;
    for (let i = 0; i < skipped.length; i++) ops[n++] = this.skippedId(skipped[i]);
    this.opCount = n;
    this.recomputed(recomputed);
    let tail = this.tailIds.get(engineVersion);
    if (tail === undefined) {
      tail = this.text(',"engineVersion":' + JSON.stringify(engineVersion) + "}");
      this.tailIds.set(engineVersion, tail);
    }
    this.room(1);
    this.ops[this.opCount++] = tail;
  }

  /** A line made elsewhere (a row's cell errors), kept in its place among the others; the line feed is added. */
  addLine(text: string): void {
    this.room(2);
    this.ops[this.opCount++] = TEXT_LINE;
    this.ops[this.opCount++] = this.string(text);
  }

  /** The lines encoded since the last take(), in arrays of their own (free to hand to another thread). */
  take(): EncodedLines {
    const lines: EncodedLines = {
      ops: this.ops.slice(0, this.opCount),
      numbers: this.numbers.slice(0, this.numberCount),
      strings: this.strings.join(""),
      texts: this.texts,
      reset: this.reset,
    };
    this.opCount = 0;
    this.numberCount = 0;
    this.strings = [];
    this.texts = [];
    this.reset = false;
    // the table starts again only between runs of lines, so that each run's ids all mean one thing
    if (this.textCount >= TABLE_LIMIT) this.restartTable();
    return lines;
  }

  private restartTable(): void {
    this.textCount = 0;
    this.reset = true;
    this.skippedIds.clear();
    this.findingHeads.clear();
    this.keyIds.clear();
    this.valueIds.clear();
    this.tailIds.clear();
    this.lastKeys.length = 0;
    this.lastKeyIds.length = 0;
    this.lastValues.length = 0;
    this.lastValueIds.length = 0;
  }

  /** JSON.stringify(recomputed): its fields in their own order, undefined ones left out. */
  private recomputed(recomputed: RecheckResult["recomputed"]): void {
    if (Object.getPrototypeOf(recomputed) !== Object.prototype) {
      this.room(2);
      this.ops[this.opCount++] = RECOMPUTED_TEXT;
      this.ops[this.opCount++] = this.string(JSON.stringify(recomputed));
      return;
    }
    // the field count goes first; it is known once the fields are done
    this.room(1);
    const countAt = this.opCount++;
    let fields = 0;
    // every result has the same fields in the same order: the n-th field's key is looked up in the table
    // only when it is not the key the n-th field had last time (a string compare instead of a Map lookup)
    const { lastKeys, lastKeyIds, lastValues, lastValueIds } = this;
    let position = 0;
    for (const key in recomputed) {
      const value = recomputed[key];
      const at = position++;
      // JSON leaves out what it cannot show (undefined here; functions and symbols are not Values)
      if (value === undefined || typeof value === "function" || typeof value === "symbol") continue;
      let keyId = lastKeyIds[at];
      if (lastKeys[at] !== key) {
        keyId = this.keyIds.get(key) ?? this.newKey(key);
        lastKeys[at] = key;
        lastKeyIds[at] = keyId;
      }
      this.room(2);
      const ops = this.ops;
      fields++;
      if (typeof value === "number") {
        ops[this.opCount++] = (keyId << KIND_BITS) | NUMBER;
        this.number(value);
      } else if (typeof value === "string") {
        // mostly the same text in the same field as last time (the RMSEA conventions): compared, not looked up
        let valueId = lastValueIds[at];
        if (lastValues[at] !== value) {
          valueId = this.valueIds.get(value) ?? this.newValue(value);
          lastValues[at] = value;
          lastValueIds[at] = valueId;
        }
        ops[this.opCount++] = (keyId << KIND_BITS) | TEXT;
        ops[this.opCount++] = valueId;
      } else if (typeof value === "boolean") {
        ops[this.opCount++] = (keyId << KIND_BITS) | (value ? TRUE_VALUE : FALSE_VALUE);
      } else if (value === null) {
        ops[this.opCount++] = (keyId << KIND_BITS) | NULL_VALUE;
      } else if (isPlainInterval(value)) {
        ops[this.opCount++] = (keyId << KIND_BITS) | INTERVAL;
        this.number(value.lo);
        this.number(value.hi);
      } else {
        ops[this.opCount++] = (keyId << KIND_BITS) | OTHER;
        ops[this.opCount++] = this.string(JSON.stringify(value));
      }
    }
    this.ops[countAt] = fields;
  }

  private newKey(key: string): number {
    const id = this.text("," + JSON.stringify(key) + ":");
    this.keyIds.set(key, id);
    return id;
  }

  private newValue(value: string): number {
    const id = this.text(JSON.stringify(value));
    this.valueIds.set(value, id);
    return id;
  }

  private findingHead(code: string, severity: string): number {
    let bySeverity = this.findingHeads.get(code);
    if (bySeverity === undefined) this.findingHeads.set(code, (bySeverity = new Map()));
    let id = bySeverity.get(severity);
    if (id === undefined) {
      id = this.text('{"code":' + JSON.stringify(code) + ',"severity":' + JSON.stringify(severity) + ',"message":');
      bySeverity.set(severity, id);
    }
    return id;
  }

  private skippedId(skip: SkippedCheck): number {
    const { check, subject, reason } = skip;
    // one lookup by reason, then a look along the few checks and subjects that give it (three nested
    // Map lookups per entry were 1.5 % of a run: six entries a row)
    let entries = this.skippedIds.get(reason);
    if (entries === undefined) this.skippedIds.set(reason, (entries = []));
    for (let i = 0; i < entries.length; i++) {
      const entry = entries[i];
      if (entry.check === check && entry.subject === subject) return entry.id;
    }
    const id = this.text(JSON.stringify(skip));
    entries.push({ check, subject, id });
    return id;
  }

  /** A new repeated text's id. */
  private text(json: string): number {
    this.texts.push(json);
    return this.textCount++;
  }

  /** A text of these lines alone: its length, its place in the lines' order. */
  private string(text: string): number {
    this.strings.push(text);
    return text.length;
  }

  private number(value: number): void {
    if (this.numberCount === this.numbers.length) {
      const grown = new Float64Array(2 * this.numbers.length);
      grown.set(this.numbers);
      this.numbers = grown;
    }
    this.numbers[this.numberCount++] = value;
  }

  /** Makes room for `more` operands. */
  private room(more: number): void {
    if (this.opCount + more <= this.ops.length) return;
    const grown = new Int32Array(Math.max(2 * this.ops.length, this.opCount + more));
    grown.set(this.ops.subarray(0, this.opCount));
    this.ops = grown;
  }
}

/**
 * An interval as the engine makes it (an object literal): its only enumerable fields are lo then hi,
 * both numbers. JSON.stringify gives it as {"lo":…,"hi":…}; anything else is left to JSON.stringify.
 * (Its prototype is not looked at: Object.getPrototypeOf is a call into the runtime here, 2 % of the
 * writer's time, and the engine's Values are plain data.)
 */
function isPlainInterval(value: object): value is { lo: number; hi: number } {
  let fields = 0;
  for (const key in value) {
    if (fields === 0 ? key !== "lo" : fields !== 1 || key !== "hi") return false;
    fields++;
  }
  return fields === 2 && typeof (value as { lo: unknown }).lo === "number" && typeof (value as { hi: unknown }).hi === "number";
}

const INTERVAL_LO = utf8('{"lo":');
const INTERVAL_HI = utf8(',"hi":');
const TRUE = utf8("true");
const FALSE = utf8("false");
const NULL = utf8("null");
const ROW = utf8('{"row":');
const COMPARISON = utf8(',"comparison":');
const FINDINGS = utf8(',"findings":[');
const SKIPPED = utf8('],"skipped":[');
const RECOMPUTED = utf8('],"recomputed":');

/**
 * The second half: EncodedLines into the bytes of their JSON lines, byte for byte what JSON.stringify
 * of each line's §4.5 object gives (tests/unit/cli compares the two). The repeated texts are kept as
 * UTF-8 bytes; the numbers of a run of lines are printed by one JSON.stringify of an array (V8's own
 * shortest form, so the text cannot differ) and copied out of it one by one: one call per row cost about
 * 1.4 µs more per row (each call sets up its own string builder, and hands back a rope of its parts).
 */
export class JsonLinePrinter {
  private readonly table: Uint8Array[] = [];
  private printed = Buffer.allocUnsafe(1 << 16);

  constructor(private readonly out: OutputBuffer) {}

  print(lines: EncodedLines): void {
    const { ops, strings, texts } = lines;
    /** where the next of the lines' own texts starts in `strings` */
    let from = 0;
    const next = (length: number) => strings.substring(from, (from += length));
    const { out, table } = this;
    if (lines.reset) table.length = 0;
    for (let i = 0; i < texts.length; i++) table.push(utf8(texts[i]));
    let at = 0;
    if (lines.numbers.length > 0) {
      const printed = JSON.stringify(Array.from(lines.numbers));
      // only digits, signs, points, "e", "null", commas and brackets: one byte a character
      if (this.printed.length < printed.length) this.printed = Buffer.allocUnsafe(Math.max(printed.length, 2 * this.printed.length));
      this.printed.write(printed, 0, "latin1");
      at = 1;
    }
    const printed = this.printed;
    let n = 0;
    while (n < ops.length) {
      const op = ops[n++];
      if (op === TEXT_LINE) {
        out.text(next(ops[n++]));
        out.lineFeed();
        continue;
      }
      out.bytes(ROW);
      if (op === RESULT_LINE) out.integer(ops[n++]);
      else out.text(next(ops[n++]));
      out.bytes(COMPARISON);
      const label = ops[n++];
      if (label < 0) out.bytes(NULL);
      else out.jsonString(next(label));
      out.bytes(FINDINGS);
      const findings = ops[n++];
      for (let i = 0; i < findings; i++) {
        if (i > 0) out.byte(COMMA);
        out.bytes(table[ops[n++]]);
        out.jsonString(next(ops[n++]));
        out.byte(CLOSE_BRACE);
      }
      out.bytes(SKIPPED);
      const skipped = ops[n++];
      for (let i = 0; i < skipped; i++) {
        if (i > 0) out.byte(COMMA);
        out.bytes(table[ops[n++]]);
      }
      out.bytes(RECOMPUTED);
      const fields = ops[n++];
      if (fields === RECOMPUTED_TEXT) {
        out.text(next(ops[n++]));
      } else {
        for (let i = 0; i < fields; i++) {
          const field = ops[n++];
          const key = table[field >> KIND_BITS];
          // the key's bytes start with the comma between fields: the first field has a brace instead
          if (i === 0) {
            out.byte(OPEN_BRACE);
            out.bytes(key, 1);
          } else {
            out.bytes(key);
          }
          switch (field & ((1 << KIND_BITS) - 1)) {
            case NUMBER:
              at = out.numberFrom(printed, at);
              break;
            case INTERVAL:
              out.bytes(INTERVAL_LO);
              at = out.numberFrom(printed, at);
              out.bytes(INTERVAL_HI);
              at = out.numberFrom(printed, at);
              out.byte(CLOSE_BRACE);
              break;
            case TEXT:
              out.bytes(table[ops[n++]]);
              break;
            case TRUE_VALUE:
              out.bytes(TRUE);
              break;
            case FALSE_VALUE:
              out.bytes(FALSE);
              break;
            case NULL_VALUE:
              out.bytes(NULL);
              break;
            default:
              out.text(next(ops[n++]));
          }
        }
        if (fields === 0) out.byte(OPEN_BRACE);
        out.byte(CLOSE_BRACE);
      }
      out.bytes(table[ops[n++]]);
      out.lineFeed();
    }
  }
}

/**
 * Writes the JSON lines of rechecked rows in one thread: {"row","comparison","findings","skipped",
 * "recomputed","engineVersion"}, the encoder's lines printed at each flush(). The recheck command runs
 * the two halves in two threads instead (lib/cli/recheck.ts).
 */
export class JsonLineWriter {
  private readonly encoder = new JsonLineEncoder();
  private readonly printer: JsonLinePrinter;

  constructor(out: OutputBuffer) {
    this.printer = new JsonLinePrinter(out);
  }

  /** One rechecked row's line, line feed included, written at once. */
  write(row: number, comparison: string | null, result: RecheckResult): void {
    this.add(row, comparison, result);
    this.flush();
  }

  /** Queues a rechecked row's line; flush() writes the queued lines (their numbers printed together). */
  add(row: number, comparison: string | null, result: RecheckResult): void {
    this.encoder.add(row, comparison, result);
  }

  /** Queues a line made elsewhere (a row's cell errors), to keep the lines in row order; the line feed is added. */
  addLine(text: string): void {
    this.encoder.addLine(text);
  }

  /** Writes the queued lines. */
  flush(): void {
    if (this.encoder.size === 0) return;
    this.printer.print(this.encoder.take());
  }
}
