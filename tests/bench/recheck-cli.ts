// Benchmark of the recheck command line end to end (DESIGN §8; targets from the CLI brief: < 2 s wall and
// < 300 MB peak memory for a 100 000-row sheet on this machine). Prints figures; asserts nothing about time.
//
// 1. Generates 100 000 synthetic comparisons (tests/support/generate-comparisons.ts) and writes them as a
//    sheet with lib/csv's writer to a temporary file.
// 2. Runs the CLI as `npm run recheck` does (node lib/cli/recheck-launcher.mjs FILE, which runs a bundled
//    build of lib/cli/recheck.ts; `--tsx` runs the source through tsx instead, for an A/B), stdout into a
//    pipe that this process drains and counts, and measures wall time from spawn to exit: JSON Lines
//    (printed by the command's second thread), JSON Lines with --one-thread for comparison, and CSV,
//    the three alternated round by round.
// 3. Peak memory: a preload passed through NODE_OPTIONS prints process.resourceUsage().maxRSS of every
//    node process on exit (tsx's launcher and the CLI child it spawns); the largest is reported. On Linux
//    the VmHWM of /proc/<pid>/status of the launcher and its descendants is sampled as a cross-check.
// 4. Says where the time goes when a target is missed: tsx start-up (`--help`), and, each in a fresh
//    process (this script run again with --pass, so no JIT warm-up from the generator flatters it), the
//    sheet read alone and the read plus the row checks and the engine, without any output.
import { spawn } from "node:child_process";
import { once } from "node:events";
import { createReadStream, createWriteStream, mkdtempSync, readFileSync, rmSync, statSync } from "node:fs";
import { availableParallelism, loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { checkSheetRow, readSheetBatches, sheetHeaderLine, sheetRecordLine, toComparisonInput, type SheetRecord } from "@/lib/csv";
import { recheck } from "@/lib/recheck";
import type { ComparisonInput } from "@/lib/recheck/types";
import { generateComparisons } from "../support/generate-comparisons";

const ROWS = 100_000;
const SEED = 20240917;
const RUNS = 3;
const TARGET_SECONDS = 2;
const TARGET_MB = 300;
const ROOT = fileURLToPath(new URL("../..", import.meta.url));
const TSX = join(ROOT, "node_modules", ".bin", "tsx");
const VIA_TSX = process.argv.includes("--tsx");
/** The command and its leading arguments: the launcher (bundled build) or the source through tsx. */
const CLI: [string, string[]] = VIA_TSX ? [TSX, ["lib/cli/recheck.ts"]] : [process.execPath, ["lib/cli/recheck-launcher.mjs"]];

// Invented papers for the generated comparisons: eight comparisons per paper, DOIs under 10.5555.
const JOURNALS = ["Journal of Invented Measurement", "Invented Review of Assessment", "Annals of Made-up Methods"];

function toRecord(input: ComparisonInput, index: number): SheetRecord {
  const paperNo = Math.floor(index / 8);
  const { sample, restricted, free, ...comparison } = input;
  return {
    paper: {
      doi: `10.5555/bench.${paperNo}`,
      title: `Factor structure of an invented scale, study ${paperNo}`,
      year: String(1995 + (paperNo % 30)),
      journal: JOURNALS[paperNo % JOURNALS.length],
      authors: "Quill, Ada; Marsh, Tobias",
      field: "psychology",
    },
    sample: { label: "Sample 1", ...sample },
    comparison: { label: `Comparison ${index + 1}`, ...comparison, location: `Table ${1 + (index % 6)}` },
    restricted: { label: "Model A", ...restricted },
    free: { label: "Model B", ...free },
  };
}

async function writeBenchSheet(file: string): Promise<number> {
  const out = createWriteStream(file);
  let batch = sheetHeaderLine();
  let index = 0;
  for (const input of generateComparisons({ count: ROWS, seed: SEED })) {
    batch += sheetRecordLine(toRecord(input, index++));
    if (batch.length >= 1 << 16) {
      if (!out.write(batch)) await once(out, "drain");
      batch = "";
    }
  }
  out.end(batch);
  await once(out, "finish");
  return index;
}

// Printed by every node process started with NODE_OPTIONS, when it exits.
const PRELOAD = `data:text/javascript,${encodeURIComponent(
  `process.on("exit", () => { const u = process.resourceUsage(); process.stderr.write("[bench] pid=" + process.pid + " maxrss_kb=" + u.maxRSS + " cpu_us=" + (u.userCPUTime + u.systemCPUTime) + "\\n"); });`,
)}`;

interface Measured {
  seconds: number;
  cpuSeconds: number;
  status: number | null;
  outputLines: number;
  outputBytes: number;
  peakKb: number;
  vmHwmKb: number;
  stderr: string;
}

function readVmHwm(pid: number): number {
  try {
    const match = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, "utf8"));
    return match ? Number(match[1]) : 0;
  } catch {
    return 0;
  }
}

/** The process and its descendants (Linux /proc; empty elsewhere). */
function processTree(pid: number): number[] {
  try {
    const children = readFileSync(`/proc/${pid}/task/${pid}/children`, "utf8").trim().split(/\s+/).filter(Boolean).map(Number);
    return [pid, ...children.flatMap(processTree)];
  } catch {
    return [];
  }
}

async function runCli(args: string[]): Promise<Measured> {
  const started = performance.now();
  const child = spawn(CLI[0], [...CLI[1], ...args], {
    cwd: ROOT,
    stdio: ["ignore", "pipe", "pipe"],
    env: { ...process.env, NODE_OPTIONS: `--import=${PRELOAD}` },
  });
  let outputBytes = 0;
  let outputLines = 0;
  let stderr = "";
  let vmHwmKb = 0;
  const sampler = setInterval(() => {
    for (const pid of processTree(child.pid ?? 0)) vmHwmKb = Math.max(vmHwmKb, readVmHwm(pid));
  }, 20);
  child.stdout.on("data", (chunk: Buffer) => {
    outputBytes += chunk.length;
    for (let i = chunk.indexOf(10); i >= 0; i = chunk.indexOf(10, i + 1)) outputLines++;
  });
  child.stderr.on("data", (chunk: Buffer) => (stderr += chunk.toString()));
  const [status] = (await once(child, "close")) as [number | null];
  clearInterval(sampler);
  const seconds = (performance.now() - started) / 1000;
  const reports = [...stderr.matchAll(/\[bench\] pid=\d+ maxrss_kb=(\d+) cpu_us=(\d+)/g)];
  const peaks = reports.map((m) => Number(m[1]));
  // CPU time of all node processes (launcher and CLI): less sensitive than wall time to a busy machine
  const cpuSeconds = reports.reduce((sum, m) => sum + Number(m[2]), 0) / 1e6;
  const cliStderr = stderr.replace(/\[bench\][^\n]*\n/g, "");
  return { seconds, cpuSeconds, status, outputLines, outputBytes, peakKb: Math.max(0, ...peaks), vmHwmKb, stderr: cliStderr };
}

/** One pass of the CLI's work without its output; run in a child so that it starts cold like the CLI. */
async function pass(file: string, withEngine: boolean): Promise<void> {
  const started = performance.now();
  let rows = 0;
  for await (const batch of readSheetBatches(createReadStream(file, { highWaterMark: 1 << 16 }))) {
    for (const row of batch) {
      rows++;
      if (withEngine && checkSheetRow(row).length === 0) recheck(toComparisonInput(row));
    }
  }
  const seconds = (performance.now() - started) / 1000;
  process.stdout.write(JSON.stringify({ rows, seconds }) + "\n");
}

async function coldPass(file: string, withEngine: boolean): Promise<number> {
  const self = fileURLToPath(import.meta.url);
  const child = spawn(TSX, [self, "--pass", withEngine ? "recheck" : "read", file], { cwd: ROOT, stdio: ["ignore", "pipe", "inherit"] });
  let out = "";
  child.stdout.on("data", (chunk: Buffer) => (out += chunk.toString()));
  const [status] = (await once(child, "close")) as [number | null];
  if (status !== 0) throw new Error(`the ${withEngine ? "recheck" : "read"} pass failed (status ${status})`);
  const { rows, seconds } = JSON.parse(out) as { rows: number; seconds: number };
  if (rows !== ROWS) throw new Error(`read ${rows} rows, expected ${ROWS}`);
  return seconds;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

const mb = (kb: number) => (kb / 1024).toFixed(0);

async function main(): Promise<void> {
  // `--write-sheet FILE`: only write the generated sheet (for profiling the command line by hand)
  const writeOnly = process.argv.indexOf("--write-sheet");
  if (writeOnly >= 0) {
    const target = process.argv[writeOnly + 1];
    if (!target) throw new Error("--write-sheet needs a file name");
    console.log(`sheet: ${await writeBenchSheet(target)} rows written to ${target}`);
    return;
  }
  const dir = mkdtempSync(join(tmpdir(), "fitledger-bench-"));
  const file = join(dir, "comparisons-100k.csv");
  try {
    const t0 = performance.now();
    const rows = await writeBenchSheet(file);
    const size = statSync(file).size;
    console.log(`sheet: ${rows} rows, ${(size / 1e6).toFixed(1)} MB, written in ${((performance.now() - t0) / 1000).toFixed(1)} s`);

    // Other work on the machine inflates every figure below: say how busy it was.
    const load = () => loadavg()[0].toFixed(1);
    console.log(`machine: ${availableParallelism()} cores, load average ${load()} (1 min) before the runs`);
    // (the first start also (re)builds the launcher's bundle when it is stale: not timed)
    if (!VIA_TSX) await runCli(["--help"]);
    const startup = await runCli(["--help"]);
    console.log(`${VIA_TSX ? "tsx" : "launcher (bundled build)"} start-up alone (--help): ${startup.seconds.toFixed(2)} s (CPU ${startup.cpuSeconds.toFixed(2)} s), ${mb(startup.peakKb)} MB`);
    const read = await coldPass(file, false);
    const rechecked = await coldPass(file, true);
    console.log(
      `without output, after start-up: read ${read.toFixed(2)} s; read + row checks + engine ${rechecked.toFixed(2)} s ` +
        `(engine share ${(rechecked - read).toFixed(2)} s)`,
    );

    // the rounds alternate the variants, so that a change in how busy the machine is falls on all of them alike
    const variants = [
      { name: "--format jsonl", args: ["--format", "jsonl"], target: true },
      { name: "--format jsonl --one-thread", args: ["--format", "jsonl", "--one-thread"], target: false },
      { name: "--format csv", args: ["--format", "csv"], target: true },
    ];
    const measured = variants.map(() => [] as Measured[]);
    for (let i = 0; i < RUNS; i++) for (const [v, variant] of variants.entries()) measured[v].push(await runCli([file, ...variant.args]));
    for (const [v, variant] of variants.entries()) {
      const runs = measured[v];
      for (const run of runs) {
        if (run.status !== 0 || run.stderr !== "") throw new Error(`CLI failed (status ${run.status}): ${run.stderr.trim()}`);
      }
      if (variant.args[1] === "jsonl" && runs.some((r) => r.outputLines !== rows)) {
        throw new Error(`expected ${rows} result lines, got ${runs.map((r) => r.outputLines).join(", ")}`);
      }
      const seconds = median(runs.map((r) => r.seconds));
      const peak = Math.max(...runs.map((r) => r.peakKb));
      const hwm = Math.max(...runs.map((r) => r.vmHwmKb));
      const verdict = (target: string, ok: boolean) => (variant.target ? `target < ${target}: ${ok ? "met" : "MISSED"}; ` : "for comparison; ");
      console.log(
        `${variant.name}: wall ${runs.map((r) => r.seconds.toFixed(2)).join(" / ")} s (median ${seconds.toFixed(2)} s, ` +
          `${verdict(`${TARGET_SECONDS} s`, seconds < TARGET_SECONDS)}${(seconds - startup.seconds).toFixed(2)} s after start-up, ` +
          `${Math.round(rows / (seconds - startup.seconds)).toLocaleString("en")} rows/s; CPU ${median(runs.map((r) => r.cpuSeconds)).toFixed(2)} s), ` +
          `peak RSS ${mb(peak)} MB (${verdict(`${TARGET_MB} MB`, peak / 1024 < TARGET_MB)}sampled VmHWM ${mb(hwm)} MB), ` +
          `output ${runs[0].outputLines} lines, ${(runs[0].outputBytes / 1e6).toFixed(1)} MB`,
      );
    }
    console.log(`load average ${load()} (1 min) after the runs`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const fail = (error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exitCode = 1;
};
if (process.argv[2] === "--pass") pass(process.argv[4], process.argv[3] === "recheck").catch(fail);
else main().catch(fail);
