// The recheck command line (DESIGN §4.5), run as a child process exactly as `npm run recheck` runs it.
import { execFile, spawn } from "node:child_process";
import { once } from "node:events";
import { closeSync, existsSync, mkdtempSync, openSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import Papa from "papaparse";
import { afterAll, describe, expect, it } from "vitest";
import { checkSheetRow, csvLine, mergeFieldErrors, readSheet, sheetHeaderLine, sheetRecordLine, toComparisonInput, type SheetRecord } from "@/lib/csv";
import { ENGINE_VERSION, recheck } from "@/lib/recheck";
import type { ComparisonInput } from "@/lib/recheck/types";
import { generateComparisons } from "../../support/generate-comparisons";

const ROOT = fileURLToPath(new URL("../../..", import.meta.url));
const TSX = join(ROOT, "node_modules", ".bin", "tsx");
const SHEETS = "tests/fixtures/sheets";
const scratch = mkdtempSync(join(tmpdir(), "fitledger-cli-"));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

interface Run {
  status: number;
  stdout: string;
  stderr: string;
}

function recheckCli(...args: string[]): Promise<Run> {
  return new Promise((resolve) => {
    execFile(TSX, ["lib/cli/recheck.ts", ...args], { cwd: ROOT, maxBuffer: 1 << 26 }, (error, stdout, stderr) => {
      const status = error ? Number((error as NodeJS.ErrnoException & { code?: unknown }).code) : 0;
      resolve({ status, stdout, stderr });
    });
  });
}

function jsonLines(text: string): Record<string, unknown>[] {
  return text
    .split("\n")
    .filter((line) => line !== "")
    .map((line) => JSON.parse(line) as Record<string, unknown>);
}

/** A refusal: status 2, exactly one line on stderr, no stack trace. */
function expectRefusal(run: Run, pattern: RegExp): void {
  expect(run.status).toBe(2);
  const lines = run.stderr.split("\n").filter((line) => line !== "");
  expect(lines).toHaveLength(1);
  expect(lines[0]).toMatch(pattern);
  expect(run.stderr).not.toMatch(/\bat .*\.ts:\d+/);
}

const TIMEOUT = 30_000;

describe("recheck command line: refusals", () => {
  it("prints its usage for --help and exits 0", { timeout: TIMEOUT }, async () => {
    const run = await recheckCli("--help");
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/^Usage: npm run --silent recheck -- FILE\.csv \[--format jsonl\|csv\]/);
  });

  it("exits 2 with one line naming the file when it does not exist", { timeout: TIMEOUT }, async () => {
    const run = await recheckCli("no-such-sheet.csv");
    expectRefusal(run, /^recheck: cannot read no-such-sheet\.csv: no such file$/);
    expect(run.stdout).toBe("");
  });

  it("exits 2 for a directory", { timeout: TIMEOUT }, async () => {
    expectRefusal(await recheckCli(SHEETS), /is a directory, not a comparison sheet$/);
  });

  it("exits 2 for a missing file argument, an unknown option and an unknown format", { timeout: TIMEOUT }, async () => {
    const [none, option, format] = await Promise.all([
      recheckCli(),
      recheckCli(`${SHEETS}/holzinger-swineford.csv`, "--colour"),
      recheckCli(`${SHEETS}/holzinger-swineford.csv`, "--format", "xml"),
    ]);
    expectRefusal(none, /^recheck: no sheet given/);
    expectRefusal(option, /^recheck: unknown option --colour \(see --help\)$/);
    expectRefusal(format, /^recheck: unknown format "xml" \(use jsonl or csv\)$/);
  });

  it("exits 2 naming an unknown column and the column it was probably meant to be", { timeout: TIMEOUT }, async () => {
    const run = await recheckCli(`${SHEETS}/unknown-column.csv`);
    expectRefusal(run, /unknown column "a_chisqq" \(did you mean "a_chisq"\?\)$/);
  });

  it("exits 2 naming a missing required column", { timeout: TIMEOUT }, async () => {
    expectRefusal(await recheckCli(`${SHEETS}/missing-column.csv`), /required column "method" missing from the header$/);
  });

  it("exits 2 for a binary file and for a Latin-1 file, naming the offending byte", { timeout: TIMEOUT }, async () => {
    const binary = join(scratch, "archive.csv");
    writeFileSync(binary, Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00]));
    const latin1 = join(scratch, "latin1.csv");
    writeFileSync(latin1, Buffer.concat([Buffer.from("doi,comparison,method,a_label,b_label\n10.5555/x,Caf"), Buffer.from([0xe9]), Buffer.from(",lrt,A,B\n")]));
    const [b, l] = await Promise.all([recheckCli(binary), recheckCli(latin1)]);
    expectRefusal(b, /not UTF-8 text \(NUL byte at offset 4; a binary file or UTF-16\?\)$/);
    expectRefusal(l, /not UTF-8 text \(byte 0xE9 at offset 51; Latin-1\?\)$/);
  });
});

describe("recheck command line: results", () => {
  it("writes one JSON line per data row with exactly the §4.5 fields, and exits 0 whatever was flagged", { timeout: TIMEOUT }, async () => {
    const run = await recheckCli(`${SHEETS}/holzinger-swineford.csv`);
    expect(run.stderr).toBe("");
    expect(run.status).toBe(0);
    const lines = jsonLines(run.stdout);
    expect(lines.map((l) => [l.row, l.comparison])).toEqual([
      [1, "Two vs three factors"],
      [2, "One vs three factors"],
      [3, "Metric vs configural"],
    ]);
    for (const line of lines) {
      expect(Object.keys(line)).toEqual(["row", "comparison", "findings", "skipped", "recomputed", "engineVersion"]);
      expect(line.engineVersion).toBe(ENGINE_VERSION);
      for (const finding of line.findings as Record<string, unknown>[]) expect(Object.keys(finding)).toEqual(["code", "severity", "message"]);
    }
  });

  it("flags the planted Δdf error of row 2: 27 − 24 = 3, printed as 2 (lavaan reference, hs1_vs_hs3_ML)", { timeout: TIMEOUT }, async () => {
    const lines = jsonLines((await recheckCli(`${SHEETS}/holzinger-swineford.csv`)).stdout);
    const codes = (line: Record<string, unknown>) => (line.findings as { code: string }[]).map((f) => f.code);
    expect(codes(lines[1])).toContain("df-difference-mismatch");
    expect(codes(lines[0])).not.toContain("df-difference-mismatch");
    expect(codes(lines[2])).not.toContain("df-difference-mismatch");
  });

  it("answers a row with bad cells with its errors by column, and still rechecks the other rows", { timeout: TIMEOUT }, async () => {
    const run = await recheckCli(`${SHEETS}/with-bad-cells.csv`);
    expect(run.status).toBe(0);
    const lines = jsonLines(run.stdout);
    expect(lines).toHaveLength(3);
    expect(Object.keys(lines[1])).toEqual(["row", "comparison", "errors"]);
    expect(lines[1].row).toBe(2);
    const columns = (lines[1].errors as { column: string; message: string }[]).map((e) => e.column).sort();
    expect(columns).toEqual(["a_chisq", "a_df"]);
    expect(lines[0]).toHaveProperty("findings");
    expect(lines[2]).toHaveProperty("findings");
  });

  it("writes one CSV line per finding or cell error under a header with --format csv", { timeout: TIMEOUT }, async () => {
    const run = await recheckCli(`${SHEETS}/with-bad-cells.csv`, "--format", "csv");
    expect(run.status).toBe(0);
    const parsed = Papa.parse<string[]>(run.stdout.trimEnd(), { newline: "\r\n" });
    const [header, ...lines] = parsed.data;
    expect(header).toEqual(["row", "comparison", "outcome", "code", "severity", "subject", "column", "message", "engine_version"]);
    const errorLines = lines.filter((l) => l[2] === "error");
    expect(errorLines.map((l) => [l[0], l[6]]).sort()).toEqual([
      ["2", "a_chisq"],
      ["2", "a_df"],
    ]);
    // rows 1 and 3 are still there, as findings or as a clean line
    expect(new Set(lines.map((l) => l[0]))).toEqual(new Set(["1", "2", "3"]));
    for (const line of lines.filter((l) => l[2] === "finding")) {
      expect(line[3]).toMatch(/^[a-z]+(-[a-z]+)*$/);
      expect(["error", "warning", "note"]).toContain(line[4]);
      expect(line[8]).toBe(ENGINE_VERSION);
    }
  });

  it("accepts --format=jsonl written with an equals sign", { timeout: TIMEOUT }, async () => {
    const run = await recheckCli("--format=jsonl", `${SHEETS}/holzinger-swineford.csv`);
    expect(run.status).toBe(0);
    expect(jsonLines(run.stdout)).toHaveLength(3);
  });

  it("exits 0 with no output for a header-only sheet", { timeout: TIMEOUT }, async () => {
    const file = join(scratch, "header-only.csv");
    writeFileSync(file, "doi;comparison;method;a_label;b_label\r\n");
    const run = await recheckCli(file);
    expect(run).toEqual({ status: 0, stdout: "", stderr: "" });
  });
});

describe("recheck command line: output into a pipe", () => {
  it("stops quietly with status 0 when the reader closes the pipe after the first line", { timeout: TIMEOUT }, async () => {
    // 6 000 rows make far more output than a pipe buffers, so the CLI must meet the closed pipe
    const rows = [];
    for await (const row of readSheet([readFileSync(join(ROOT, SHEETS, "holzinger-swineford.csv"))])) rows.push(row);
    let text = sheetHeaderLine();
    for (let i = 0; i < 2000; i++) for (const row of rows) text += sheetRecordLine({ ...row, comparison: { ...row.comparison, label: `${row.comparison.label} ${i}` } });
    const file = join(scratch, "long.csv");
    writeFileSync(file, text);

    const child = spawn(TSX, ["lib/cli/recheck.ts", file], { cwd: ROOT, stdio: ["ignore", "pipe", "pipe"] });
    let stderr = "";
    child.stderr.on("data", (chunk: Buffer) => (stderr += chunk.toString()));
    const [first] = (await once(child.stdout, "data")) as [Buffer];
    child.stdout.destroy();
    const [status] = (await once(child, "close")) as [number];
    expect(JSON.parse(first.toString().split("\n")[0])).toMatchObject({ row: 1 });
    expect(status).toBe(0);
    expect(stderr).toBe("");
  });
});

/**
 * What the command must print for a sheet, made the plain way: JSON.stringify of each §4.5 object and
 * csvLine of each CSV line. The command assembles its lines from parts and encodes them into buffers of
 * its own, so this is the reading it is held to, byte for byte.
 */
async function expectedOutput(file: string, format: "jsonl" | "csv"): Promise<string> {
  let text = format === "csv" ? csvLine(["row", "comparison", "outcome", "code", "severity", "subject", "column", "message", "engine_version"]) : "";
  for await (const row of readSheet([readFileSync(file)])) {
    const comparison = row.comparison.label ?? null;
    const sheetErrors = checkSheetRow(row);
    const outcome = row.problems.length > 0 ? null : recheck(toComparisonInput(row));
    const errors = outcome && !outcome.ok ? mergeFieldErrors(sheetErrors, outcome.errors) : sheetErrors;
    if (errors.length > 0 || !outcome?.ok) {
      if (format === "jsonl") text += JSON.stringify({ row: row.row, comparison, errors }) + "\n";
      else for (const e of errors) text += csvLine([String(row.row), comparison ?? "", "error", "", "", "", e.column, e.message, ""]);
      continue;
    }
    const { findings, skipped, recomputed, engineVersion } = outcome.result;
    if (format === "jsonl") {
      const brief = findings.map((f) => ({ code: f.code, severity: f.severity, message: f.message }));
      text += JSON.stringify({ row: row.row, comparison, findings: brief, skipped, recomputed, engineVersion }) + "\n";
    } else if (findings.length === 0) {
      text += csvLine([String(row.row), comparison ?? "", "clean", "", "", "", "", "", engineVersion]);
    } else {
      for (const f of findings) text += csvLine([String(row.row), comparison ?? "", "finding", f.code, f.severity, f.subject, "", f.message, engineVersion]);
    }
  }
  return text;
}

/** Equal texts; when not, the first difference with a little context (not a 600 KB diff). */
function expectSameText(actual: string, expected: string, what = "output"): void {
  if (actual === expected) return;
  let at = 0;
  while (at < actual.length && actual[at] === expected[at]) at++;
  const around = (text: string) => JSON.stringify(text.slice(Math.max(0, at - 60), at + 60));
  expect.fail(`${what} differs at character ${at} of ${expected.length}: got ${around(actual)}, expected ${around(expected)}`);
}

/** Labels that JSON must escape or that take more than one byte (or unit) per character. */
const AWKWARD_LABELS = ['say "yes"', "back\\slash", "tab\there", "bell\u0007", "😀 χ² Δ − × √", "line\u2028separator", "=SUM(A1)", "é"];

/** A sheet of generated comparisons, some with awkward labels and one with a label far longer than a write buffer. */
function generatedSheet(rows: number, seed: number): string {
  const record = (input: ComparisonInput, i: number): SheetRecord => {
    const { sample, restricted, free, ...comparison } = input;
    let label = `Comparison ${i + 1} ${AWKWARD_LABELS[i % AWKWARD_LABELS.length]}`;
    // 300 000 two-byte characters: 600 000 bytes of UTF-8, more than one output buffer holds
    if (i === 5) label = "χ".repeat(300_000);
    return {
      paper: { doi: `10.5555/cli.${Math.floor(i / 4)}`, title: "An invented paper, with a comma", year: "2001" },
      sample: { label: "Sample 1", ...sample },
      comparison: { ...comparison, label },
      restricted: { label: "Model A", ...restricted },
      free: { label: "Model B", ...free },
    };
  };
  let text = sheetHeaderLine();
  generateComparisons({ count: rows, seed }).forEach((input, i) => (text += sheetRecordLine(record(input, i))));
  return text;
}

describe("recheck command line: the exact bytes", () => {
  const repoSheets = [
    ...readdirSync(join(ROOT, SHEETS)).map((name) => join(SHEETS, name)),
    ...readdirSync(join(ROOT, "imports")).map((name) => join("imports", name)),
  ].filter((name) => name.endsWith(".csv"));

  for (const format of ["jsonl", "csv"] as const) {
    it(`writes for every fixture and example sheet what the plain ${format} reading gives`, { timeout: TIMEOUT * 2 }, async () => {
      let compared = 0;
      for (const name of repoSheets) {
        const run = await recheckCli(name, "--format", format);
        if (run.status !== 0) continue; // the refused fixtures: their messages are tested above
        expectSameText(run.stdout, await expectedOutput(join(ROOT, name), format), name);
        compared++;
      }
      expect(compared).toBeGreaterThanOrEqual(4);
    });

    it(`writes generated comparisons with awkward and very long labels exactly (${format})`, { timeout: TIMEOUT }, async () => {
      const file = join(scratch, `generated-${format}.csv`);
      writeFileSync(file, generatedSheet(400, 11));
      const run = await recheckCli(file, "--format", format);
      expect(run.stderr).toBe("");
      expectSameText(run.stdout, await expectedOutput(file, format));
      if (format === "jsonl") expect(jsonLines(run.stdout)[5].comparison === "χ".repeat(300_000)).toBe(true);
    });
  }

  it("writes the same JSON lines with --one-thread as with its printer thread", { timeout: TIMEOUT }, async () => {
    const file = join(scratch, "one-thread.csv");
    // 3 000 rows: dozens of batches for the printer thread, and a label longer than a buffer (row 6)
    writeFileSync(file, generatedSheet(3000, 13));
    const [threads, oneThread] = await Promise.all([recheckCli(file), recheckCli("--one-thread", file)]);
    expect(threads.status).toBe(0);
    expect(oneThread.status).toBe(0);
    expect(jsonLines(threads.stdout)).toHaveLength(3000);
    expectSameText(threads.stdout, oneThread.stdout);
  });

  it("writes the rows read before a bad byte late in the file, then exits 2 naming it (in either thread mode)", { timeout: TIMEOUT }, async () => {
    const sheet = generatedSheet(3000, 15);
    const clean = join(scratch, "late-clean.csv");
    const late = join(scratch, "late-bad-byte.csv");
    writeFileSync(clean, sheet);
    // a Latin-1 "é" in a label of the last row, about a megabyte in
    writeFileSync(late, Buffer.concat([Buffer.from(sheet.slice(0, sheet.lastIndexOf("Comparison 3000 ")), "utf8"), Buffer.from([0x43, 0xe9]), Buffer.from(sheet.slice(sheet.lastIndexOf("Comparison 3000 ")), "utf8")]));
    const all = (await recheckCli(clean)).stdout;
    for (const args of [[late], ["--one-thread", late]]) {
      const run = await recheckCli(...args);
      expectRefusal(run, /^recheck: .*late-bad-byte\.csv: not UTF-8 text \(byte 0xE9 at offset \d+; Latin-1\?\)$/);
      // the rows of the chunks before the bad one, whole and in order
      expect(jsonLines(run.stdout).length).toBeGreaterThan(2000);
      expect(all.startsWith(run.stdout)).toBe(true);
      expect(run.stdout.endsWith("\n")).toBe(true);
    }
  });

  it.skipIf(!existsSync("/dev/full"))("exits 1 with one line when stdout cannot be written (a full disk), in either thread mode", { timeout: TIMEOUT }, async () => {
    const file = join(scratch, "full-disk.csv");
    writeFileSync(file, generatedSheet(300, 14));
    for (const args of [[file], ["--one-thread", file], ["--format", "csv", file]]) {
      const full = openSync("/dev/full", "w");
      const child = spawn(TSX, ["lib/cli/recheck.ts", ...args], { cwd: ROOT, stdio: ["ignore", full, "pipe"] });
      closeSync(full);
      let stderr = "";
      child.stderr!.on("data", (chunk: Buffer) => (stderr += chunk.toString()));
      // the printer thread's failure must end the process too, not leave it waiting
      const [status] = (await once(child, "close")) as [number];
      expect(status, args.join(" ")).toBe(1);
      expect(stderr).toMatch(/^recheck: cannot write the results: ENOSPC[^\n]*\n$/);
    }
  });

  it("writes the same bytes into a pipe that is read slowly (it waits for the reader, and loses nothing)", { timeout: TIMEOUT }, async () => {
    const file = join(scratch, "slow-reader.csv");
    writeFileSync(file, generatedSheet(3000, 12));
    const child = spawn(TSX, ["lib/cli/recheck.ts", file], { cwd: ROOT, stdio: ["ignore", "pipe", "pipe"] });
    let stderr = "";
    child.stderr.on("data", (chunk: Buffer) => (stderr += chunk.toString()));
    // read a chunk, then leave the pipe full for a moment, until the command is done
    const chunks: Buffer[] = [];
    child.stdout.on("data", (chunk: Buffer) => {
      chunks.push(chunk);
      child.stdout.pause();
      setTimeout(() => child.stdout.resume(), 2);
    });
    const [status] = (await once(child, "close")) as [number];
    expect(stderr).toBe("");
    expect(status).toBe(0);
    expect(chunks.length).toBeGreaterThan(10);
    expectSameText(Buffer.concat(chunks).toString(), await expectedOutput(file, "jsonl"));
  });
});
