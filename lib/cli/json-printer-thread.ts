// The printer thread of the recheck command (lib/cli/recheck.ts starts it for --format jsonl): encoded
// JSON lines in (JsonLineEncoder's), their bytes written to stdout, in order, by this thread itself. A
// module of its own, so that the thread loads the printer alone, not the engine and the sheet reader.
import { writeSync } from "node:fs";
import { parentPort } from "node:worker_threads";
import { JsonLinePrinter, OutputBuffer, type EncodedLines, type PrinterMessage } from "./recheck-output";

const STDOUT = 1;
/** for sleeping a little when stdout is a non-blocking descriptor that is full */
const pause = new Int32Array(new SharedArrayBuffer(4));

/**
 * Writes all of `chunk` to stdout. The descriptor is blocking (the command's main thread sees to it, see
 * startPrinter there), so writeSync waits for a slow reader, and the main thread, batches ahead, waits
 * in turn. One left non-blocking all the same (by another program sharing it) says EAGAIN instead when
 * full: tried again after a pause that starts at 20 µs and doubles up to a millisecond while the reader
 * stays behind.
 */
function writeAll(chunk: Uint8Array): void {
  let at = 0;
  let pauseMs = 0.02;
  while (at < chunk.length) {
    try {
      at += writeSync(STDOUT, chunk, at, chunk.length - at);
      pauseMs = 0.02;
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== "EAGAIN") throw error;
      Atomics.wait(pause, 0, 0, pauseMs);
      pauseMs = Math.min(1, 2 * pauseMs);
    }
  }
}

/** Encoded lines in, "printed" out once their bytes are written; null ends it ("ended" once all is written). */
function servePrinter(port: NonNullable<typeof parentPort>): void {
  const say = (message: PrinterMessage) => port.postMessage(message);
  const out = new OutputBuffer(writeAll);
  const printer = new JsonLinePrinter(out);
  let failed = false;
  port.on("message", (lines: EncodedLines | null) => {
    if (failed) return;
    try {
      if (lines === null) {
        out.send();
        say("ended");
        port.close();
        return;
      }
      printer.print(lines);
      say("printed");
    } catch (error) {
      const { code, message, syscall } = error as NodeJS.ErrnoException;
      // anything but a failed write is a fault of ours: the thread's "error", which the main thread reports
      if (syscall !== "write") throw error;
      // a write that failed (EPIPE: the reader is gone): nothing more is written, the main thread decides
      failed = true;
      say({ failed: { code, message: String(message).split("\n")[0] } });
    }
  });
}

if (parentPort) servePrinter(parentPort);
