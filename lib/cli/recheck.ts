// `npm run --silent recheck -- FILE.csv [--format jsonl|csv]` (DESIGN §4.5): rechecks every row of a
// comparison sheet and writes one result per data row. The file is streamed chunk by chunk and output
// waits for stdout to drain, so memory stays flat however long the sheet and however slow the reader.
// JSON lines are printed by a second thread (lib/cli/json-printer-thread.ts) while this one rechecks.
import { closeSync, openSync, readFileSync, readSync } from "node:fs";
import { stat } from "node:fs/promises";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { Worker } from "node:worker_threads";
import { checkSheetRow, csvLine, isSheetError, mergeFieldErrors, readSheetBatches, toComparisonInput, type SheetRow } from "@/lib/csv";
import { recheck } from "@/lib/recheck";
import type { RecheckResult } from "@/lib/recheck/types";
import { oneLine } from "./one-line";
import { JsonLineEncoder, JsonLineWriter, OutputBuffer, type PrinterMessage } from "./recheck-output";

const USAGE = `Usage: npm run --silent recheck -- FILE.csv [--format jsonl|csv]

Rechecks every comparison in a comparison sheet (UTF-8 CSV, "," or ";") and writes one result per
data row to standard output. Row 1 is the first row after the header.

  --format jsonl   one JSON object per row (default):
                   {"row","comparison","findings":[{"code","severity","message"}],"skipped","recomputed","engineVersion"}
                   or, for a row with unreadable cells, {"row","comparison","errors":[{"column","message"}]}
  --format csv     one line per finding or cell error (a "clean" line for a row with neither)
  --one-thread     do all the work in one thread (JSON lines are otherwise printed by a second
                   thread while the next rows are rechecked; the output is the same)
  -h, --help       show this text

Exit status: 0 when the file was read (whatever was flagged); 2 when it could not be read as a
comparison sheet or the command line is wrong; 1 when the results could not be written. Each failure
is one line on standard error.`;

type Format = "jsonl" | "csv";
type Command = { help: true } | { help: false; file: string; format: Format; oneThread: boolean };

/** A problem the user can fix: one line on stderr, exit status 2. */
class CommandError extends Error {}

/** Standard output failed (not the sheet): one line on stderr, exit status 1. */
class OutputError extends Error {}

function parseArguments(args: readonly string[]): Command {
  let file: string | undefined;
  let format: Format = "jsonl";
  let oneThread = false;
  let optionsEnded = false;
  for (let i = 0; i < args.length; i++) {
    const arg = args[i];
    if (!optionsEnded && (arg === "-h" || arg === "--help")) return { help: true };
    if (!optionsEnded && arg === "--") {
      optionsEnded = true;
    } else if (!optionsEnded && (arg === "--format" || arg.startsWith("--format="))) {
      const value = arg === "--format" ? args[++i] : arg.slice("--format=".length);
      if (value !== "jsonl" && value !== "csv") {
        throw new CommandError(value === undefined ? "--format needs a value: jsonl or csv" : `unknown format "${value}" (use jsonl or csv)`);
      }
      format = value;
    } else if (!optionsEnded && arg === "--one-thread") {
      oneThread = true;
    } else if (!optionsEnded && arg.startsWith("-")) {
      throw new CommandError(`unknown option ${arg} (see --help)`);
    } else if (file === undefined) {
      file = arg;
    } else {
      throw new CommandError(`one sheet at a time: unexpected "${arg}" after "${file}"`);
    }
  }
  if (file === undefined) throw new CommandError("no sheet given (usage: recheck FILE.csv [--format jsonl|csv]; see --help)");
  return { help: false, file, format, oneThread };
}

async function checkReadable(file: string): Promise<void> {
  try {
    const info = await stat(file);
    if (info.isDirectory()) throw new CommandError(`${file} is a directory, not a comparison sheet`);
  } catch (error) {
    if (error instanceof CommandError) throw error;
    throw new CommandError(fileProblem(file, error));
  }
}

function fileProblem(file: string, error: unknown): string {
  const code = (error as NodeJS.ErrnoException | undefined)?.code;
  if (code === "ENOENT") return `cannot read ${file}: no such file`;
  if (code === "EACCES" || code === "EPERM") return `cannot read ${file}: permission denied`;
  if (code === "EISDIR") return `${file} is a directory, not a comparison sheet`;
  return `cannot read ${file}: ${oneLine(error)}`;
}

/**
 * The stream end of the output: full buffers go to stdout at once, without waiting (see settle); a
 * stream that has queued more than it wants makes the next batch wait for "drain". Made by stdout().
 */
class Output extends OutputBuffer {
  /** the stream said it has queued more than it wants, and has not drained since */
  private congested = false;
  private drained: (() => void) | undefined;

  constructor(private readonly stream: NodeJS.WritableStream) {
    super((chunk) => this.write(chunk));
    // listened to all along, so that a "drain" that comes while the run waits for something else is
    // not missed by the next settle()
    stream.on("drain", () => {
      this.congested = false;
      const drained = this.drained;
      this.drained = undefined;
      drained?.();
    });
  }

  /** Backpressure: a pipe that reads slowly slows us down, so memory stays flat. */
  async settle(): Promise<void> {
    while (this.congested) await new Promise<void>((resolve) => (this.drained = resolve));
  }

  async flush(): Promise<void> {
    this.send();
    await this.settle();
  }

  private write(chunk: Uint8Array): void {
    try {
      if (!this.stream.write(chunk)) this.congested = true;
    } catch (error) {
      throw new OutputError(`cannot write the results: ${oneLine(error)}`);
    }
  }
}

const CSV_HEADER = csvLine(["row", "comparison", "outcome", "code", "severity", "subject", "column", "message", "engine_version"]);

/** Where the JSON lines go: queued row by row, handed on a batch at a time. */
interface JsonLines {
  add(row: number, comparison: string | null, result: RecheckResult): void;
  addLine(text: string): void;
  /** Hands on the lines queued so far; resolves when the output is ready for more. */
  flush(): Promise<void>;
  /** Hands on the lines queued so far; resolves when all of them are in the Output. */
  finish(): Promise<void>;
  /** Lets go of what it holds (a thread), whether the run ended well or not. */
  close(): void;
}

/** The JSON lines written in this thread. */
class JsonLinesHere implements JsonLines {
  private readonly writer: JsonLineWriter;

  constructor(private readonly output: Output) {
    this.writer = new JsonLineWriter(output);
  }

  add(row: number, comparison: string | null, result: RecheckResult): void {
    this.writer.add(row, comparison, result);
  }

  addLine(text: string): void {
    this.writer.addLine(text);
  }

  async flush(): Promise<void> {
    this.writer.flush();
    await this.output.settle();
  }

  async finish(): Promise<void> {
    this.writer.flush();
    await this.output.flush();
  }

  close(): void {}
}

/** Batches handed to the printer and not yet printed, at most: what waits in memory stays small. */
const MAX_IN_FLIGHT = 16;

/**
 * The JSON lines encoded here (JsonLineEncoder: ids, strings and numbers) and printed by a second
 * thread, which writes the bytes to stdout itself, in order. On the bench sheet the bytes took about as
 * long as the engine (0.5–0.9 s of a 100 000-row run; the encoding takes about a fifth of that), so on
 * two cores they are made while the next rows are rechecked. Only the printer runs in the thread: the
 * engine stays in this one, whose JIT has warmed it (rechecking in two threads was measured and
 * dropped: each thread compiles and warms the engine again).
 */
class JsonLinesThread implements JsonLines {
  private readonly encoder = new JsonLineEncoder();
  private inFlight = 0;
  private ended = false;
  private failure: Error | undefined;
  private wake: (() => void) | undefined;

  constructor(private readonly worker: Worker) {
    worker.on("message", (message: PrinterMessage) => {
      if (message === "printed") this.inFlight--;
      else if (message === "ended") this.ended = true;
      // a reader that stops early (`| head`) closes the pipe: that is its choice, not our failure
      else if (message.failed.code === "EPIPE") process.exit(0);
      else this.failure = new OutputError(`cannot write the results: ${message.failed.message}`);
      this.wakeUp();
    });
    worker.on("error", (error) => {
      this.failure = new Error(`the thread that prints the JSON lines failed: ${oneLine(error)}`);
      this.wakeUp();
    });
    worker.on("exit", () => {
      if (!this.ended) this.failure ??= new Error("the thread that prints the JSON lines stopped early");
      this.wakeUp();
    });
  }

  add(row: number, comparison: string | null, result: RecheckResult): void {
    this.encoder.add(row, comparison, result);
  }

  addLine(text: string): void {
    this.encoder.addLine(text);
  }

  /** Waits only when the printer is that many batches behind (it is the one waiting for a slow reader of stdout). */
  async flush(): Promise<void> {
    this.handOn();
    await this.until(() => this.inFlight < MAX_IN_FLIGHT);
  }

  async finish(): Promise<void> {
    this.handOn();
    this.worker.postMessage(null);
    await this.until(() => this.ended);
  }

  /** Stops the thread: after "ended" it is on its way out anyway; after a failure it would keep the process alive. */
  close(): void {
    void this.worker.terminate();
  }

  private handOn(): void {
    if (this.encoder.size === 0) return;
    const lines = this.encoder.take();
    this.worker.postMessage(lines, [lines.ops.buffer, lines.numbers.buffer]);
    this.inFlight++;
  }

  private async until(done: () => boolean): Promise<void> {
    while (!done() && this.failure === undefined) await new Promise<void>((resolve) => (this.wake = resolve));
    if (this.failure !== undefined) throw this.failure;
  }

  private wakeUp(): void {
    const wake = this.wake;
    this.wake = undefined;
    wake?.();
  }
}

/**
 * The printer thread (lib/cli/json-printer-thread.ts). From the bundled build (the launcher's) that is
 * the printer's own small bundle beside this one; from the source through tsx (the tests, the bench's
 * --tsx), a worker does not inherit tsx's loader, so it loads the source through tsx's own API.
 */
function startPrinter(): Worker {
  const self = import.meta.url;
  // stdout: true keeps the worker's own process.stdout (it writes none) from being piped into this one's
  const options = { stdout: true };
  let worker: Worker;
  if (!fileURLToPath(self).endsWith(".ts")) {
    worker = new Worker(new URL("./json-printer-thread.mjs", self), options);
  } else {
    const printer = new URL("./json-printer-thread.ts", self).href;
    const require = createRequire(self);
    const manifest = require.resolve("tsx/package.json");
    const api = (JSON.parse(readFileSync(manifest, "utf8")) as { exports: Record<string, { import: { default: string } }> }).exports["./esm/api"].import.default;
    const apiUrl = pathToFileURL(join(dirname(manifest), api)).href;
    worker = new Worker(`import(${JSON.stringify(apiUrl)}).then((tsx) => tsx.tsImport(${JSON.stringify(printer)}, ${JSON.stringify(self)}))`, { ...options, eval: true });
  }
  // Starting a worker opens process.stdout here all the same, and Node's stream for a pipe or terminal
  // makes the descriptor non-blocking: the printer's writeSync would then be refused (EAGAIN) whenever
  // the pipe is full, instead of waiting for the reader. Its handle sets it back (files have no handle
  // and never block); the printer copes with EAGAIN should it still come.
  (process.stdout as unknown as { _handle?: { setBlocking?: (blocking: boolean) => number } })._handle?.setBlocking?.(true);
  return worker;
}

/** The JSON lines' way out: a printer thread, or this thread when asked (--one-thread) or when none can be started. */
function jsonLines(oneThread: boolean): JsonLines {
  if (oneThread) return new JsonLinesHere(stdout());
  let worker: Worker;
  try {
    worker = startPrinter();
  } catch {
    return new JsonLinesHere(stdout());
  }
  return new JsonLinesThread(worker);
}

let stdoutOutput: Output | undefined;

/** process.stdout as an Output, made when first asked for (JSON lines from the printer thread do without: it writes to the descriptor itself). */
function stdout(): Output {
  if (stdoutOutput) return stdoutOutput;
  // A reader that stops early (`| head`) closes the pipe: that is its choice, not our failure.
  process.stdout.on("error", (error: NodeJS.ErrnoException) => {
    if (error.code === "EPIPE") process.exit(0);
    process.stderr.write(`recheck: cannot write the results: ${oneLine(error)}\n`);
    process.exit(1);
  });
  return (stdoutOutput = new Output(process.stdout));
}

/** What stays the same from row to row of one run. */
interface RunState {
  /** one date for the whole run: the sheet checks test publication years against it */
  today: Date;
  /** where JSON lines go (--format jsonl) */
  json: JsonLines | undefined;
  /** where CSV lines go (--format csv) */
  csv: Output | undefined;
}

/** Writes the result lines of one row. The sheet's own checks run first; the engine validates the figures once. */
function writeResult(row: SheetRow, run: RunState): void {
  const { json, csv } = run;
  const comparison = row.comparison.label ?? null;
  const sheetErrors = checkSheetRow(row, run.today);
  const outcome = row.problems.length > 0 ? null : recheck(toComparisonInput(row));
  const errors = outcome && !outcome.ok ? mergeFieldErrors(sheetErrors, outcome.errors) : sheetErrors;

  if (errors.length > 0 || !outcome?.ok) {
    if (json) {
      return json.addLine(JSON.stringify({ row: row.row, comparison, errors }));
    }
    for (const e of errors) csv!.text(csvLine([String(row.row), comparison ?? "", "error", "", "", "", e.column, e.message, ""]));
    return;
  }

  if (json) return json.add(row.row, comparison, outcome.result);
  const { findings, engineVersion } = outcome.result;
  if (findings.length === 0) return csv!.text(csvLine([String(row.row), comparison ?? "", "clean", "", "", "", "", "", engineVersion]));
  for (const f of findings) csv!.text(csvLine([String(row.row), comparison ?? "", "finding", f.code, f.severity, f.subject, "", f.message, engineVersion]));
}

/**
 * The file in 64 KB chunks, read synchronously as the rows ask for them. A chunk comes from the page
 * cache in some microseconds; a ReadStream hands each one over through the thread pool, a stream buffer
 * and an async iterator, which took about 40 ms of a 100 000-row sheet's main thread against 10 ms.
 */
function* fileChunks(file: string): Generator<Uint8Array> {
  const fd = openSync(file, "r");
  try {
    for (;;) {
      const chunk = Buffer.allocUnsafe(1 << 16);
      const length = readSync(fd, chunk, 0, chunk.length, null);
      if (length === 0) return;
      yield length === chunk.length ? chunk : chunk.subarray(0, length);
    }
  } finally {
    closeSync(fd);
  }
}

async function run(args: readonly string[]): Promise<number> {
  const command = parseArguments(args);
  if (command.help) {
    process.stdout.write(USAGE + "\n");
    return 0;
  }
  await checkReadable(command.file);
  const json = command.format === "jsonl" ? jsonLines(command.oneThread) : undefined;
  const csv = command.format === "csv" ? stdout() : undefined;
  const state: RunState = { today: new Date(), json, csv };
  csv?.text(CSV_HEADER);
  // 64 KB chunks (measured: 1 MB chunks were 2.4x slower end to end, the rows of a big chunk outliving
  // the young-generation collections); one chunk and one unfinished row in memory at a time
  const source = fileChunks(command.file);
  try {
    await recheckSheet(command.file, source, state);
  } finally {
    json?.close();
  }
  return 0;
}

/** Rechecks the rows of the sheet as they are read, and writes their results. */
async function recheckSheet(file: string, source: Iterable<Uint8Array>, state: RunState): Promise<void> {
  const { json, csv } = state;
  try {
    for await (const batch of readSheetBatches(source)) {
      for (const row of batch) writeResult(row, state);
      // the JSON lines of a batch go on together, to print all their numbers at once
      await json?.flush();
      await csv?.settle();
    }
    await json?.finish();
    await csv?.flush();
  } catch (error) {
    if (error instanceof OutputError) throw error;
    // rows already rechecked still go out before the refusal
    await json?.finish();
    await csv?.flush();
    if (isSheetError(error)) throw new CommandError(`${file}: ${error.message}`);
    if ((error as NodeJS.ErrnoException).code) throw new CommandError(fileProblem(file, error));
    throw error;
  }
}

run(process.argv.slice(2)).then(
  (status) => {
    process.exitCode = status;
  },
  (error: unknown) => {
    if (error instanceof CommandError) {
      process.stderr.write(`recheck: ${oneLine(error)}\n`);
      process.exitCode = 2;
    } else if (error instanceof OutputError) {
      process.stderr.write(`recheck: ${oneLine(error)}\n`);
      process.exitCode = 1;
    } else {
      process.stderr.write(`recheck failed unexpectedly: ${oneLine(error)}\n`);
      process.exitCode = 1;
    }
  },
);
