// `npm run --silent recheck -- FILE.csv [--format jsonl|csv]` (DESIGN §4.5): rechecks every row of a
// comparison sheet and writes one result per data row. The file is streamed chunk by chunk and output
// waits for stdout to drain, so memory stays flat however long the sheet and however slow the reader.
// Sheets of a few megabytes are rechecked by worker threads, one per core (lib/cli/recheck-pool.ts).
import { once } from "node:events";
import { createReadStream } from "node:fs";
import { stat } from "node:fs/promises";
import { isSheetError, readSheetBatches } from "@/lib/csv";
import { oneLine } from "./one-line";
import { recordCells, RowPool, serveRows, WorkerFailure, workerCount } from "./recheck-pool";
import { batchLines, CSV_HEADER, type Format } from "./recheck-rows";

const USAGE = `Usage: npm run --silent recheck -- FILE.csv [--format jsonl|csv]

Rechecks every comparison in a comparison sheet (UTF-8 CSV, "," or ";") and writes one result per
data row to standard output. Row 1 is the first row after the header.

  --format jsonl   one JSON object per row (default):
                   {"row","comparison","findings":[{"code","severity","message"}],"skipped","recomputed","engineVersion"}
                   or, for a row with unreadable cells, {"row","comparison","errors":[{"column","message"}]}
  --format csv     one line per finding or cell error (a "clean" line for a row with neither)
  -h, --help       show this text

A sheet of 2 MB or more is rechecked on every core (at most four); FITLEDGER_RECHECK_THREADS=N sets
the number of worker threads instead (0: none).

Exit status: 0 when the file was read (whatever was flagged); 2 when it could not be read as a
comparison sheet or the command line is wrong; 1 when the results could not be written. Each failure
is one line on standard error.`;

type Command = { help: true } | { help: false; file: string; format: Format };

/** A problem the user can fix: one line on stderr, exit status 2. */
class CommandError extends Error {}

/** Standard output failed (not the sheet): one line on stderr, exit status 1. */
class OutputError extends Error {}

function parseArguments(args: readonly string[]): Command {
  let file: string | undefined;
  let format: Format = "jsonl";
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
    } else if (!optionsEnded && arg.startsWith("-")) {
      throw new CommandError(`unknown option ${arg} (see --help)`);
    } else if (file === undefined) {
      file = arg;
    } else {
      throw new CommandError(`one sheet at a time: unexpected "${arg}" after "${file}"`);
    }
  }
  if (file === undefined) throw new CommandError("no sheet given (usage: recheck FILE.csv [--format jsonl|csv]; see --help)");
  return { help: false, file, format };
}

/** The file's size in bytes, or a CommandError saying why it cannot be read. */
async function checkReadable(file: string): Promise<number> {
  try {
    const info = await stat(file);
    if (info.isDirectory()) throw new CommandError(`${file} is a directory, not a comparison sheet`);
    return info.size;
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
 * Text collected into batches and written with backpressure: a pipe that reads slowly slows us down.
 * Bytes (a worker thread's lines, already UTF-8) go out as they come, after the text before them.
 */
class Output {
  private pending = "";

  constructor(
    private readonly stream: NodeJS.WritableStream,
    private readonly batchChars = 1 << 16,
  ) {}

  async write(text: string | Uint8Array): Promise<void> {
    if (typeof text !== "string") {
      await this.flush();
      await this.send(text);
      return;
    }
    this.pending += text;
    if (this.pending.length >= this.batchChars) await this.flush();
  }

  async flush(): Promise<void> {
    if (this.pending === "") return;
    const text = this.pending;
    this.pending = "";
    await this.send(text);
  }

  private async send(chunk: string | Uint8Array): Promise<void> {
    try {
      if (!this.stream.write(chunk)) await once(this.stream, "drain");
    } catch (error) {
      throw new OutputError(`cannot write the results: ${oneLine(error)}`);
    }
  }
}

async function run(args: readonly string[]): Promise<number> {
  const command = parseArguments(args);
  if (command.help) {
    process.stdout.write(USAGE + "\n");
    return 0;
  }
  const bytes = await checkReadable(command.file);
  let threads: number;
  try {
    threads = workerCount(bytes, process.env.FITLEDGER_RECHECK_THREADS);
  } catch (error) {
    throw new CommandError(oneLine(error));
  }
  const output = new Output(process.stdout);
  if (command.format === "csv") await output.write(CSV_HEADER);
  const pool = threads > 0 ? new RowPool(new URL(import.meta.url), threads, command.format) : null;
  // batches handed to the workers, oldest first: written in this order, at most a few per worker at once
  const inFlight: Promise<Uint8Array>[] = [];
  const maxInFlight = 4 * threads;
  const writeOldest = async () => output.write(await inFlight.shift()!);
  // 64 KB chunks (measured: 1 MB chunks were 2.4x slower end to end, the rows of a big chunk outliving
  // the young-generation collections); one chunk and one unfinished row in memory at a time
  const source = createReadStream(command.file, { highWaterMark: 1 << 16 });
  try {
    if (!pool) {
      for await (const batch of readSheetBatches(source)) await output.write(batchLines(batch, command.format));
    }
    for await (const batch of pool ? readSheetBatches(source, recordCells) : []) {
      const lines = pool!.lines(batch);
      lines.catch(() => undefined); // awaited in order below; until then not an unhandled rejection
      inFlight.push(lines);
      if (inFlight.length >= maxInFlight) await writeOldest();
    }
    while (inFlight.length > 0) await writeOldest();
  } catch (error) {
    if (error instanceof OutputError || error instanceof WorkerFailure) throw error;
    // rows already rechecked still go out before the refusal
    if (isSheetError(error) || (error as NodeJS.ErrnoException).code) {
      while (inFlight.length > 0) await writeOldest();
      await output.flush();
    }
    if (isSheetError(error)) throw new CommandError(`${command.file}: ${error.message}`);
    if ((error as NodeJS.ErrnoException).code) throw new CommandError(fileProblem(command.file, error));
    throw error;
  } finally {
    await pool?.close();
  }
  await output.flush();
  return 0;
}

// In a worker thread (lib/cli/recheck-pool.ts) this module only answers batches of rows.
if (!serveRows()) startCommand();

function startCommand(): void {
  // A reader that stops early (`| head`) closes the pipe: that is its choice, not our failure.
  process.stdout.on("error", (error: NodeJS.ErrnoException) => {
    if (error.code === "EPIPE") process.exit(0);
    process.stderr.write(`recheck: cannot write the results: ${oneLine(error)}\n`);
    process.exit(1);
  });

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
}
