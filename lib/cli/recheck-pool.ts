// Worker threads for the recheck command line: the main thread reads the sheet and splits it into
// records, the workers build the rows, recheck them and turn them into result lines, and the main thread
// writes those in sheet order. A batch travels as bare cell arrays: copying finished row objects between
// threads (structured clone, their keys included) cost more than it saved (measured: 0.84 s + 0.99 s
// per 100 000 rows, against 0.26 s + 0.35 s for the cells).
//
// The workers run the command's own module (the bundled build, or under tsx the source, through
// lib/cli/recheck-worker.mjs); that module calls serveRows() instead of the command when it is not the
// main thread.
import { availableParallelism } from "node:os";
import { isMainThread, parentPort, Worker, workerData } from "node:worker_threads";
import { buildRow, type RowBuilder, type SheetLayout } from "@/lib/csv";
import type { FieldError } from "@/lib/recheck/types";
import { batchLines, type Format } from "./recheck-rows";

/** A data record as the main thread hands it on: what buildRow needs, nothing more. */
export interface RecordCells {
  cells: string[];
  row: number;
  problems: readonly FieldError[];
  layout: SheetLayout;
}

/** The RowBuilder the main thread reads with when workers build the rows. */
export const recordCells: RowBuilder<RecordCells> = (layout, cells, row, problems) => ({ cells, row, problems, layout });

interface Job {
  id: number;
  /** the header's layout as buildRow reads it (the same for every batch of a sheet) */
  partSlots: readonly number[];
  keys: readonly string[];
  records: Array<[cells: string[], row: number, problems: readonly FieldError[]]>;
}

interface Done {
  id: number;
  /** the batch's result lines, UTF-8 encoded by the worker (its buffer is transferred, not copied) */
  bytes: Uint8Array;
}

/** Below this size a sheet is rechecked on the main thread: starting workers would cost more than it saves. */
const WORKER_MIN_BYTES = 2 * 1024 * 1024;

/**
 * How many worker threads to use for a sheet of `bytes`: `setting` (FITLEDGER_RECHECK_THREADS) when
 * given (0 = none), else one per core for sheets of 2 MB and more on a machine with two cores or more,
 * at most four.
 */
export function workerCount(bytes: number, setting: string | undefined): number {
  if (setting !== undefined && setting.trim() !== "") {
    const count = Number(setting);
    if (!Number.isInteger(count) || count < 0 || count > 64) throw new RangeError(`FITLEDGER_RECHECK_THREADS must be a whole number from 0 to 64, not "${setting}"`);
    return count;
  }
  const cores = availableParallelism();
  return cores >= 2 && bytes >= WORKER_MIN_BYTES ? Math.min(cores, 4) : 0;
}

/** A worker thread failed: an internal error of the command, never a problem of the sheet. */
export class WorkerFailure extends Error {
  constructor(cause: Error) {
    super(cause.message, { cause });
  }
}

/** The main thread's side: hands out batches round-robin and answers each with its result lines. */
export class RowPool {
  private readonly workers: Worker[];
  private readonly waiting = new Map<number, { resolve: (bytes: Uint8Array) => void; reject: (error: Error) => void }>();
  private nextId = 0;
  private failure: WorkerFailure | null = null;

  /** `entry`: the command's module (import.meta.url of lib/cli/recheck.ts or of its bundle). */
  constructor(entry: URL, size: number, format: Format) {
    const fromSource = entry.pathname.endsWith(".ts");
    const start = fromSource ? new URL("./recheck-worker.mjs", entry) : entry;
    this.workers = Array.from({ length: size }, () => {
      const worker = new Worker(start, { workerData: { format, entry: entry.href } });
      worker.on("message", (done: Done) => {
        const job = this.waiting.get(done.id);
        this.waiting.delete(done.id);
        job?.resolve(done.bytes);
      });
      worker.on("error", (error) => this.fail(new WorkerFailure(error)));
      worker.on("exit", (code) => {
        if (this.waiting.size > 0) this.fail(new WorkerFailure(new Error(`a worker thread stopped (exit code ${code}) with rows still to do`)));
      });
      return worker;
    });
  }

  private fail(error: WorkerFailure): void {
    this.failure = this.failure ?? error;
    for (const job of this.waiting.values()) job.reject(this.failure);
    this.waiting.clear();
  }

  /** The result lines of a batch, UTF-8; batches may finish out of order, so the caller keeps its own order. */
  lines(records: readonly RecordCells[]): Promise<Uint8Array> {
    if (this.failure) return Promise.reject(this.failure);
    const id = this.nextId++;
    const done = new Promise<Uint8Array>((resolve, reject) => this.waiting.set(id, { resolve, reject }));
    const { partSlots, keys } = records[0].layout;
    const job: Job = { id, partSlots, keys, records: records.map((r) => [r.cells, r.row, r.problems]) };
    this.workers[id % this.workers.length].postMessage(job);
    return done;
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((worker) => worker.terminate()));
  }
}

/** The worker's side: answers every batch with its result lines. Returns false on the main thread. */
export function serveRows(): boolean {
  if (isMainThread || !parentPort) return false;
  const port = parentPort;
  const { format } = workerData as { format: Format };
  const encoder = new TextEncoder();
  port.on("message", (job: Job) => {
    // buildRow reads only these two of the layout
    const layout = { partSlots: job.partSlots, keys: job.keys } as SheetLayout;
    const rows = job.records.map(([cells, row, problems]) => buildRow(layout, cells, row, problems));
    // encoded here, in parallel, rather than by the main thread as it writes (its own ArrayBuffer, so it can be transferred)
    const bytes = encoder.encode(batchLines(rows, format));
    port.postMessage({ id: job.id, bytes } satisfies Done, [bytes.buffer]);
  });
  return true;
}
