// The recheck command's JSON line writer (lib/cli/recheck-output.ts) against JSON.stringify, the reading
// it is held to byte for byte: on engine results of generated comparisons, and on made-up results with
// every kind of value JSON.stringify treats in its own way (escapes, surrogates, -0, NaN, objects that
// are not intervals), written into small buffers so that every piece also meets a buffer's end.
import { describe, expect, it } from "vitest";
import { JsonLineEncoder, JsonLinePrinter, JsonLineWriter, OutputBuffer } from "@/lib/cli/recheck-output";
import { recheck } from "@/lib/recheck";
import type { Finding, RecheckResult, SkippedCheck } from "@/lib/recheck/types";
import { generateComparisons } from "../../support/generate-comparisons";
import { mulberry32 as random } from "@/tests/support/mulberry32";

/** What the command printed before it had a writer of its own: JSON.stringify of the §4.5 object. */
function plainLine(row: number, comparison: string | null, result: RecheckResult): string {
  const { findings, skipped, recomputed, engineVersion } = result;
  const brief = findings.map((f) => ({ code: f.code, severity: f.severity, message: f.message }));
  return JSON.stringify({ row, comparison, findings: brief, skipped, recomputed, engineVersion }) + "\n";
}

/** Writes with a buffer of `capacity` bytes; answers all bytes written and how many buffers they came in. */
function written(capacity: number, write: (writer: JsonLineWriter, out: OutputBuffer) => void): { text: string; chunks: number } {
  const chunks: Buffer[] = [];
  const out = new OutputBuffer((chunk) => chunks.push(chunk), capacity);
  write(new JsonLineWriter(out), out);
  out.send();
  return { text: Buffer.concat(chunks).toString("utf8"), chunks: chunks.length };
}

/** Equal texts; when not, the first difference with a little context. */
function expectSameText(actual: string, expected: string): void {
  if (actual === expected) return;
  let at = 0;
  while (at < actual.length && actual[at] === expected[at]) at++;
  const around = (text: string) => JSON.stringify(text.slice(Math.max(0, at - 60), at + 60));
  expect.fail(`differs at character ${at} of ${expected.length}: got ${around(actual)}, expected ${around(expected)}`);
}

/** Any double: random bits, so every exponent, subnormals, NaN and ±Infinity all turn up. */
function anyDouble(next: () => number): number {
  const view = new DataView(new ArrayBuffer(8));
  view.setUint32(0, Math.floor(next() * 2 ** 32));
  view.setUint32(4, Math.floor(next() * 2 ** 32));
  return view.getFloat64(0);
}

/** Doubles as the engine makes them (p-values, statistics, differences) and the edge cases of printing. */
function someNumber(next: () => number): number {
  const pick = next();
  if (pick < 0.3) return anyDouble(next);
  if (pick < 0.5) return next() * 10 ** Math.floor(next() * 40 - 30);
  if (pick < 0.6) return -next() * 10 ** Math.floor(next() * 10);
  if (pick < 0.7) return Math.floor(next() * 1000);
  if (pick < 0.8) return Math.round(next() * 1e4) / 100 + 0.01 * Math.floor(next() * 3);
  const special = [0, -0, NaN, Infinity, -Infinity, 1e21, 1e-7, 9.999999999999999e20, 1e-6, 5e-324, Number.MAX_VALUE, 2 ** 53, -(2 ** 31)];
  return special[Math.floor(next() * special.length)];
}

/** Characters JSON.stringify escapes or encodes in more than one byte, among plain ones. */
const CHARACTERS = ["a", "Z", "0", " ", ",", ":", "{", '"', "\\", "/", "\n", "\t", "\u0000", "\u001f", "\u007f", "é", "χ", "²", "Δ", "−", "√", "\u2028", "\u2029", "\ufeff", "\uffff", "😀", "\ud83d", "\ude00"];

function someText(next: () => number, maxLength = 24): string {
  let text = "";
  const length = Math.floor(next() * maxLength);
  for (let i = 0; i < length; i++) text += next() < 0.6 ? "x" : CHARACTERS[Math.floor(next() * CHARACTERS.length)];
  return text;
}

function someValue(next: () => number): unknown {
  const pick = next();
  if (pick < 0.25) return someNumber(next);
  if (pick < 0.6) return { lo: someNumber(next), hi: someNumber(next) };
  if (pick < 0.7) return someText(next);
  if (pick < 0.75) return next() < 0.5;
  if (pick < 0.8) return null;
  if (pick < 0.9) return undefined;
  // objects that are not intervals: JSON.stringify must have its way with each
  const odd = [{ hi: 1, lo: 0 }, { lo: 1 }, { lo: 1, hi: 2, at: 3 }, { lo: "1", hi: 2 }, [1, 2.5, -0], {}, { lo: { lo: 1, hi: 2 }, hi: 3 }, { lo: 1, hi: undefined }, new Date(0), { lo: NaN, hi: -0 }];
  return odd[Math.floor(next() * odd.length)];
}

function someResult(next: () => number): RecheckResult {
  const recomputed: Record<string, unknown> = {};
  const fields = Math.floor(next() * 12);
  for (let i = 0; i < fields; i++) recomputed[next() < 0.8 ? `f${Math.floor(next() * 20)}.x` : someText(next, 6)] = someValue(next);
  const findings: Finding[] = [];
  for (let i = Math.floor(next() * 3); i > 0; i--) {
    findings.push({ code: next() < 0.5 ? "halved-p" : someText(next, 8), severity: next() < 0.5 ? "note" : "warning", subject: "a", message: someText(next, 80), values: { x: 1 } });
  }
  const skipped: SkippedCheck[] = [];
  for (let i = Math.floor(next() * 4); i > 0; i--) skipped.push({ check: someText(next, 6), subject: next() < 0.5 ? "a" : "comparison", reason: someText(next, 30) });
  return { findings, skipped, recomputed: recomputed as RecheckResult["recomputed"], engineVersion: next() < 0.9 ? "1.0.0" : someText(next, 5) };
}

/** Large inputs: seconds, not milliseconds, on a busy machine. */
const TIMEOUT = 60_000;

describe("JSON line writer", () => {
  it("writes the engine's results of 3 000 generated comparisons as JSON.stringify does", { timeout: TIMEOUT }, () => {
    const rows = generateComparisons({ count: 3000, seed: 424242 }).flatMap((input, i) => {
      const outcome = recheck(input);
      return outcome.ok ? [{ row: i + 1, comparison: input.label ?? null, result: outcome.result }] : [];
    });
    expect(rows.length).toBeGreaterThan(2500);
    const expected = rows.map((r) => plainLine(r.row, r.comparison, r.result)).join("");
    for (const capacity of [1 << 18, 4096, 700]) {
      const { text, chunks } = written(capacity, (writer) => rows.forEach((r) => writer.write(r.row, r.comparison, r.result)));
      expectSameText(text, expected);
      expect(chunks).toBeGreaterThan(expected.length / capacity);
    }
  });

  it("writes 20 000 made-up results with every kind of value, text and number as JSON.stringify does", { timeout: TIMEOUT }, () => {
    const next = random(20261202);
    const results = Array.from({ length: 20_000 }, () => someResult(next));
    const labels = results.map(() => (next() < 0.1 ? null : someText(next, 40)));
    const rowNumbers = results.map((_, i) => (i % 97 === 0 ? [0, 2 ** 31 - 1, 2 ** 31, 1e21, 2.5, -3][i % 6] : i + 1));
    const expected = results.map((result, i) => plainLine(rowNumbers[i], labels[i], result)).join("");
    for (const capacity of [1 << 16, 512]) {
      const { text } = written(capacity, (writer) => results.forEach((result, i) => writer.write(rowNumbers[i], labels[i], result)));
      expectSameText(text, expected);
    }
  });

  it("keeps each number's text where JSON.stringify puts it, on 750 000 doubles", { timeout: TIMEOUT }, () => {
    // the row's numbers are printed by one JSON.stringify of an array and cut apart again: every number
    // must come back whole and in its place, whatever its form (exponent, sign, NaN as null)
    const next = random(7);
    const results: RecheckResult[] = [];
    for (let i = 0; i < 50_000; i++) {
      const recomputed: Record<string, unknown> = {};
      for (let k = 0; k < 10; k++) recomputed[`n${k}`] = k % 2 === 0 ? someNumber(next) : { lo: someNumber(next), hi: someNumber(next) };
      results.push({ findings: [], skipped: [], recomputed: recomputed as RecheckResult["recomputed"], engineVersion: "1.0.0" });
    }
    const expected = results.map((result, i) => plainLine(i + 1, null, result)).join("");
    expectSameText(written(1 << 18, (writer) => results.forEach((result, i) => writer.write(i + 1, null, result))).text, expected);
  });

  it("writes queued lines in order, whatever the batches and the error lines between them", { timeout: TIMEOUT }, () => {
    const next = random(31);
    const items = Array.from({ length: 6000 }, (_, i) => (next() < 0.1 ? { row: i + 1, error: `{"row":${i + 1},"errors":[${JSON.stringify(someText(next))}]}` } : { row: i + 1, result: someResult(next) }));
    const expected = items.map((item) => ("error" in item ? item.error + "\n" : plainLine(item.row, `C${item.row}`, item.result!))).join("");
    const { text } = written(1024, (writer) => {
      let inBatch = 0;
      for (const item of items) {
        if ("error" in item) writer.addLine(item.error!);
        else writer.add(item.row, `C${item.row}`, item.result!);
        // batches of 1 to 400 lines; sometimes a flush with nothing queued
        if (++inBatch >= 1 + Math.floor(next() * 400)) {
          writer.flush();
          if (next() < 0.1) writer.flush();
          inBatch = 0;
        }
      }
      writer.flush();
    });
    expectSameText(text, expected);
  });

  it("prints the same bytes from encoded lines copied as postMessage copies them, the repeated texts' table starting again on the way", { timeout: TIMEOUT }, () => {
    // the recheck command encodes in its main thread and prints in another: each run of lines crosses
    // as a structured clone, its typed arrays handed over (transferred), as the command does
    const next = random(99);
    const results = Array.from({ length: 14_000 }, () => someResult(next));
    // a skipped check with a text of its own in every result: more repeated texts than the table keeps (10 000)
    results.forEach((result, i) => result.skipped.push({ check: "cfi-mismatch", subject: "a", reason: `needs the baseline χ² and df (${i})` }));
    const expected = results.map((result, i) => plainLine(i + 1, `C${i + 1}`, result)).join("");
    const encoder = new JsonLineEncoder();
    const chunks: Buffer[] = [];
    const out = new OutputBuffer((chunk) => chunks.push(chunk), 4096);
    const printer = new JsonLinePrinter(out);
    let restarts = 0;
    for (let i = 0; i < results.length; ) {
      for (const end = Math.min(results.length, i + 1 + Math.floor(next() * 300)); i < end; i++) encoder.add(i + 1, `C${i + 1}`, results[i]);
      const lines = encoder.take();
      const copy = structuredClone(lines, { transfer: [lines.ops.buffer, lines.numbers.buffer] });
      expect(lines.ops.length).toBe(0); // handed over, not shared
      if (copy.reset) restarts++;
      printer.print(copy);
    }
    printer.print(encoder.take());
    out.send();
    expect(restarts).toBeGreaterThan(0);
    expectSameText(Buffer.concat(chunks).toString("utf8"), expected);
  });

  it("writes a label and a message far longer than a buffer", () => {
    const result: RecheckResult = {
      findings: [{ code: "halved-p", severity: "warning", subject: "comparison", message: "Δ".repeat(5000) + '"' + "x".repeat(5000), values: {} }],
      skipped: [{ check: "dP", subject: "comparison", reason: "−".repeat(3000) }],
      recomputed: { "dP": { lo: 0.1, hi: 0.2 }, "a.rmseaConvention": "scaled χ², N".repeat(400) },
      engineVersion: "1.0.0",
    };
    const label = "χ".repeat(9000);
    const { text, chunks } = written(4096, (writer) => {
      writer.write(1, label, result);
      writer.write(2, "short", result);
    });
    expectSameText(text, plainLine(1, label, result) + plainLine(2, "short", result));
    expect(chunks).toBeGreaterThan(10);
  });
});

describe("OutputBuffer", () => {
  it("encodes strings as JSON.stringify does, then as UTF-8", { timeout: TIMEOUT }, () => {
    const next = random(99);
    // up to 84 characters, the most a 256-byte buffer takes in one piece: from 48 on jsonString tests and
    // encodes natively instead of character by character, so both ways are held to JSON.stringify
    const texts = Array.from({ length: 50_000 }, (_, i) => someText(next, i % 2 === 0 ? 40 : 84));
    texts.push("", "\ud800", "\udfff\ud800", "a\ud83d\ude00b", "\u2028\u2029", "\u007f\u0080\u07ff\u0800\uffff");
    const chunks: Buffer[] = [];
    const out = new OutputBuffer((chunk) => chunks.push(chunk), 256);
    for (const text of texts) {
      out.jsonString(text);
      out.lineFeed();
    }
    out.send();
    expectSameText(Buffer.concat(chunks).toString("utf8"), texts.map((t) => JSON.stringify(t) + "\n").join(""));
  });

  it("writes whole numbers as String() does", () => {
    const values = [0, 1, 9, 10, 99, 100, 12345, 2 ** 31 - 1, 2 ** 31, 2 ** 53, -1, -0, 0.5, 1e21, NaN, Infinity];
    for (let n = 1; n < 1e9; n = Math.floor(n * 1.7) + 1) values.push(n);
    const chunks: Buffer[] = [];
    const out = new OutputBuffer((chunk) => chunks.push(chunk), 64);
    for (const value of values) {
      out.integer(value);
      out.lineFeed();
    }
    out.send();
    expect(Buffer.concat(chunks).toString("utf8")).toBe(values.map((v) => String(v) + "\n").join(""));
  });
});
