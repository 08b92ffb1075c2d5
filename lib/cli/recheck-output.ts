// The recheck command's output (DESIGN §4.5): result text encoded straight into Buffers, and the JSON
// line of a rechecked row written byte by byte, the same bytes as JSON.stringify of the §4.5 object.
// Kept apart from lib/cli/recheck.ts (which runs as soon as it is loaded) so that the tests can hold the
// writer to JSON.stringify on many more results than a run of the command would give them.
import type { Finding, RecheckResult, SkippedCheck } from "@/lib/recheck/types";

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
    this.buffer = Buffer.allocUnsafe(capacity);
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
    // the sink may hold on to the buffer until it is written out, so what follows goes into a new one
    this.buffer = Buffer.allocUnsafe(this.capacity);
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

/** Text made once and kept as UTF-8 bytes; forgotten all at once when it grows too big (the texts are no fixed list). */
class ByteCache {
  private readonly map = new Map<string, Uint8Array>();

  constructor(
    private readonly make: (key: string) => string,
    private readonly limit = 10_000,
  ) {}

  get(key: string): Uint8Array {
    let bytes = this.map.get(key);
    if (bytes === undefined) {
      if (this.map.size >= this.limit) this.map.clear();
      bytes = utf8(this.make(key));
      this.map.set(key, bytes);
    }
    return bytes;
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
 * Writes the JSON lines of rechecked rows: {"row","comparison","findings","skipped","recomputed","engineVersion"},
 * byte for byte what JSON.stringify of that object gives (tests/unit/cli compares the two). The same
 * texts come back row after row — the keys, each skipped check with its reason, finding codes, the
 * RMSEA conventions — so their bytes are made once; the numbers of the rows queued together are
 * printed by one JSON.stringify of an array (V8's own shortest form, so the text cannot differ) and
 * copied out of it one by one. On the bench sheet's 100 000 results this takes about a third less time
 * than JSON.stringify of the parts and Buffer.write of the strings did (0.64–0.69 of it, measured
 * step by step); what is left is mostly V8 printing the doubles (about half) and copying bytes.
 */
export class JsonLineWriter {
  /** a skipped check's JSON text by reason, check and subject (a SkippedCheck has no other fields) */
  private readonly skippedText = new Map<string, { check: string; subject: string; text: Uint8Array }[]>();
  private skippedCount = 0;
  /** `{"code":…,"severity":…,"message":` by code, then severity */
  private readonly findingHead = new Map<string, Map<string, Uint8Array>>();
  /** `,"key":` of a recomputed figure */
  private readonly keys = new ByteCache((key) => "," + JSON.stringify(key) + ":");
  /** the text values of recomputed figures (the RMSEA conventions, the matched forms) */
  private readonly strings = new ByteCache((text) => JSON.stringify(text));
  /** `,"engineVersion":…}` */
  private readonly tails = new ByteCache((version) => ',"engineVersion":' + JSON.stringify(version) + "}", 100);
  /** the lines queued by add() and addLine(): row, label, result (null for a line of text) and text */
  private readonly rows: number[] = [];
  private readonly comparisons: (string | null)[] = [];
  private readonly results: (RecheckResult | null)[] = [];
  private readonly texts: (string | null)[] = [];
  /** the numbers of the queued results' recomputed figures, in order; then their JSON text, and where the next one starts */
  private numbers: number[] = [];
  private printed = Buffer.allocUnsafe(1 << 16);
  private at = 1;
  /** the keys of the last result's recomputed fields by position, and their bytes */
  private readonly lastKeys: string[] = [];
  private readonly lastKeyBytes: Uint8Array[] = [];
  /** the text values of the last result's recomputed fields by position, and their bytes */
  private readonly lastTexts: string[] = [];
  private readonly lastTextBytes: Uint8Array[] = [];

  constructor(private readonly out: OutputBuffer) {}

  /** One rechecked row's line, line feed included, written at once. */
  write(row: number, comparison: string | null, result: RecheckResult): void {
    this.add(row, comparison, result);
    this.flush();
  }

  /**
   * Queues a rechecked row's line; flush() writes the queued lines. The numbers of all queued rows are
   * printed by one JSON.stringify: one call per row cost about 1.4 µs more per row (each call sets up
   * its own string builder, and hands back a rope of its parts that the copy must flatten first).
   */
  add(row: number, comparison: string | null, result: RecheckResult): void {
    this.rows.push(row);
    this.comparisons.push(comparison);
    this.results.push(result);
    this.texts.push(null);
    const recomputed = result.recomputed;
    if (Object.getPrototypeOf(recomputed) !== Object.prototype) return;
    const numbers = this.numbers;
    for (const key in recomputed) {
      const value = recomputed[key];
      if (typeof value === "number") numbers.push(value);
      else if (typeof value === "object" && value !== null && isPlainInterval(value)) numbers.push(value.lo, value.hi);
    }
  }

  /** Queues a line made elsewhere (a row's cell errors), to keep the lines in row order; the line feed is added. */
  addLine(text: string): void {
    this.rows.push(0);
    this.comparisons.push(null);
    this.results.push(null);
    this.texts.push(text);
  }

  /** Writes the queued lines. */
  flush(): void {
    const { rows, comparisons, results, texts, out } = this;
    if (rows.length === 0) return;
    const printed = JSON.stringify(this.numbers);
    // only digits, signs, points, "e", "null", commas and brackets: one byte a character
    if (this.printed.length < printed.length) this.printed = Buffer.allocUnsafe(Math.max(printed.length, 2 * this.printed.length));
    this.printed.write(printed, 0, "latin1");
    this.at = 1;
    for (let i = 0; i < rows.length; i++) {
      const result = results[i];
      if (result === null) {
        out.text(texts[i]!);
        out.lineFeed();
      } else {
        this.line(rows[i], comparisons[i], result);
      }
    }
    rows.length = 0;
    comparisons.length = 0;
    results.length = 0;
    texts.length = 0;
    this.numbers = [];
  }

  private line(row: number, comparison: string | null, result: RecheckResult): void {
    const out = this.out;
    const { findings, skipped, recomputed, engineVersion } = result;
    out.bytes(ROW);
    out.integer(row);
    out.bytes(COMPARISON);
    if (comparison === null) out.bytes(NULL);
    else out.jsonString(comparison);
    out.bytes(FINDINGS);
    for (let i = 0; i < findings.length; i++) {
      if (i > 0) out.byte(COMMA);
      this.finding(findings[i]);
    }
    out.bytes(SKIPPED);
    for (let i = 0; i < skipped.length; i++) {
      if (i > 0) out.byte(COMMA);
      out.bytes(this.skippedEntry(skipped[i]));
    }
    out.bytes(RECOMPUTED);
    this.recomputed(recomputed);
    out.bytes(this.tails.get(engineVersion));
    out.lineFeed();
  }

  private finding(finding: Finding): void {
    const { code, severity } = finding;
    let bySeverity = this.findingHead.get(code);
    if (bySeverity === undefined) {
      // the codes and severities are the catalogue's: a fixed, short list
      this.findingHead.set(code, (bySeverity = new Map()));
    }
    let head = bySeverity.get(severity);
    if (head === undefined) {
      head = utf8('{"code":' + JSON.stringify(code) + ',"severity":' + JSON.stringify(severity) + ',"message":');
      bySeverity.set(severity, head);
    }
    this.out.bytes(head);
    this.out.jsonString(finding.message);
    this.out.byte(CLOSE_BRACE);
  }

  private skippedEntry(skip: SkippedCheck): Uint8Array {
    const { check, subject, reason } = skip;
    // one lookup by reason, then a look along the few checks and subjects that give it (three nested
    // Map lookups per entry were 1.5 % of a run: six entries a row)
    let entries = this.skippedText.get(reason);
    if (entries === undefined) {
      // the reasons are no fixed list (some are put together from parts): never let the table grow without end
      if (this.skippedCount >= 10_000) {
        this.skippedText.clear();
        this.skippedCount = 0;
      }
      this.skippedText.set(reason, (entries = []));
    }
    for (let i = 0; i < entries.length; i++) {
      const entry = entries[i];
      if (entry.check === check && entry.subject === subject) return entry.text;
    }
    const text = utf8(JSON.stringify(skip));
    entries.push({ check, subject, text });
    this.skippedCount++;
    return text;
  }

  /** JSON.stringify(recomputed): its fields in their own order, undefined ones left out. */
  private recomputed(recomputed: RecheckResult["recomputed"]): void {
    const out = this.out;
    // (add() took its numbers only when this holds)
    if (Object.getPrototypeOf(recomputed) !== Object.prototype) return out.text(JSON.stringify(recomputed));
    // the numbers were printed by flush(): each is taken from that text in turn
    const printed = this.printed;
    let at = this.at;
    let first = true;
    // every result has the same fields in the same order: the n-th field's key is looked up in the table
    // only when it is not the key the n-th field had last time (a string compare instead of a Map lookup)
    const { lastKeys, lastKeyBytes, lastTexts, lastTextBytes } = this;
    let position = 0;
    for (const key in recomputed) {
      const value = recomputed[key];
      const n = position++;
      // JSON leaves out what it cannot show (undefined here; functions and symbols are not Values)
      if (value === undefined || typeof value === "function" || typeof value === "symbol") continue;
      let keyBytes = lastKeyBytes[n];
      if (lastKeys[n] !== key) {
        keyBytes = this.keys.get(key);
        lastKeys[n] = key;
        lastKeyBytes[n] = keyBytes;
      }
      if (first) {
        // the key's bytes start with the comma between fields: the first field has a brace instead
        out.byte(OPEN_BRACE);
        out.bytes(keyBytes, 1);
        first = false;
      } else {
        out.bytes(keyBytes);
      }
      if (typeof value === "number") {
        at = out.numberFrom(printed, at);
      } else if (typeof value === "string") {
        // mostly the same text in the same field as last time (the RMSEA conventions): compared, not looked up
        let bytes = lastTextBytes[n];
        if (lastTexts[n] !== value) {
          bytes = this.strings.get(value);
          lastTexts[n] = value;
          lastTextBytes[n] = bytes;
        }
        out.bytes(bytes);
      } else if (typeof value === "boolean") {
        out.bytes(value ? TRUE : FALSE);
      } else if (value === null) {
        out.bytes(NULL);
      } else if (isPlainInterval(value)) {
        out.bytes(INTERVAL_LO);
        at = out.numberFrom(printed, at);
        out.bytes(INTERVAL_HI);
        at = out.numberFrom(printed, at);
        out.byte(CLOSE_BRACE);
      } else {
        out.text(JSON.stringify(value));
      }
    }
    if (first) out.byte(OPEN_BRACE);
    out.byte(CLOSE_BRACE);
    this.at = at;
  }
}
