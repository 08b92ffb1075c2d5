// Benchmark of the sheet importer (DESIGN §8, issue 6: a 100 000-row sheet validated, stored and
// rechecked in ≤ 30 s on this machine, ≤ 1 GB, streaming). Prints figures; asserts nothing about time.
//
// 1. Generates 100 000 comparisons (tests/support/generate-comparisons.ts), ten to a paper with invented
//    DOIs under 10.5555, and writes them as a sheet with lib/csv's writer to a temporary file.
// 2. On a fresh migrated SQLite file: stages the file as the upload route does (streamed in 64 KB
//    pieces), runs the dry run, then the commit — the same functions the app calls — timing each phase.
// 3. Imports the same sheet a second time (dry run + commit), which must create nothing.
// 4. Peak memory: process.resourceUsage().maxRSS, plus the largest RSS sampled every 50 ms (overall and per phase).
// 5. Beside each phase's wall time, the CPU time this process used: on a shared machine the wall clock
//    also measures the other tenants.
import { createReadStream, createWriteStream, mkdtempSync, rmSync, statSync } from "node:fs";
import { once } from "node:events";
import { availableParallelism, loadavg, tmpdir } from "node:os";
import { join } from "node:path";
import { performance } from "node:perf_hooks";
import { getHeapStatistics } from "node:v8";
import { sheetHeaderLine, sheetRecordLine, type SheetRecord } from "@/lib/csv";
import { createDatabase, setDatabase } from "@/lib/db/connection";
import { migrateUp } from "@/lib/db/migrate";
import { createBatch, runCommit, runDryRun, stageUpload } from "@/lib/import/batches";
import type { ComparisonInput } from "@/lib/recheck/types";
import { AuditEvent, Comparison, FitModel, Flag, ImportBatch, Paper, User } from "@/models";
import { generateComparisons } from "../support/generate-comparisons";

const ROWS = Number(process.env.BENCH_IMPORT_ROWS ?? 100_000);
const SEED = 20261201;
const PER_PAPER = 10;
const JOURNALS = ["Journal of Invented Measurement", "Invented Review of Assessment", "Annals of Made-up Methods"];

function toRecord(input: ComparisonInput, index: number): SheetRecord {
  const paperNo = Math.floor(index / PER_PAPER);
  const { sample, restricted, free, ...comparison } = input;
  return {
    paper: {
      doi: `10.5555/import-bench.${paperNo}`,
      title: `Factor structure of an invented scale, study ${paperNo}`,
      year: String(1995 + (paperNo % 30)),
      journal: JOURNALS[paperNo % JOURNALS.length],
      authors: "Quill, Ada; Marsh, Tobias",
      field: "psychology",
    },
    // each generated comparison is its own study: its own sample, so sample and model figures never clash
    sample: { ...sample, label: `Study ${index % PER_PAPER}` },
    comparison: { ...comparison, label: `Comparison ${index + 1}`, location: `Table ${1 + (index % 6)}` },
    restricted,
    free,
  };
}

let peakRss = 0;
/** the largest RSS sampled during the phase being timed */
let phasePeakRss = 0;
const sampler = setInterval(() => {
  const rss = process.memoryUsage().rss;
  peakRss = Math.max(peakRss, rss);
  phasePeakRss = Math.max(phasePeakRss, rss);
}, 50);

async function timed<T>(name: string, work: () => Promise<T>, rows: number, lines: string[]): Promise<T> {
  const started = performance.now();
  const cpu = process.cpuUsage();
  const loop = performance.eventLoopUtilization();
  phasePeakRss = process.memoryUsage().rss;
  const result = await work();
  const seconds = (performance.now() - started) / 1000;
  const used = process.cpuUsage(cpu);
  // the share of the wall time the JavaScript thread was busy; the rest it waited (mostly for SQLite)
  const busy = performance.eventLoopUtilization(loop).utilization;
  // CPU time of this process (SQLite's worker threads included) beside the wall clock: the machine is shared
  const cpuSeconds = (used.user + used.system) / 1e6;
  lines.push(
    `${name.padEnd(34)} ${seconds.toFixed(2).padStart(7)} s wall  ${cpuSeconds.toFixed(2).padStart(7)} s CPU  JS thread busy ${(100 * busy).toFixed(0).padStart(3)} %  ${Math.round(rows / seconds).toLocaleString("en").padStart(9)} rows/s  rss ${(process.memoryUsage().rss / 2 ** 20).toFixed(0)} MB (phase peak ${(Math.max(phasePeakRss, process.memoryUsage().rss) / 2 ** 20).toFixed(0)} MB)`,
  );
  return result;
}

async function main() {
  const folder = mkdtempSync(join(tmpdir(), "fitledger-bench-import-"));
  const sheet = join(folder, "sheet.csv");
  const lines: string[] = [];
  try {
    const generated = generateComparisons({ count: ROWS, seed: SEED });
    const out = createWriteStream(sheet);
    out.write(sheetHeaderLine());
    for (let i = 0; i < generated.length; i++) if (!out.write(sheetRecordLine(toRecord(generated[i], i)))) await once(out, "drain");
    out.end();
    await once(out, "finish");
    generated.length = 0;
    lines.push(`sheet: ${ROWS.toLocaleString("en")} rows, ${(statSync(sheet).size / 2 ** 20).toFixed(1)} MB`);

    const database = createDatabase(`sqlite:${join(folder, "bench.sqlite")}`);
    await database.ready;
    await migrateUp(database.sequelize);
    setDatabase(database);
    const user = await User.create({ email: "bench@fitledger.test", name: "Bench Coder", affiliation: null, reason: null, passwordHash: "x", role: "contributor", status: "active", statusNote: null });

    const started = performance.now();
    for (const round of ["first import", "same sheet again"] as const) {
      const batchId = await createBatch({ uploaderId: user.id, fileName: "bench.csv" });
      await timed(`${round}: stage upload`, () => stageUpload(batchId, createReadStream(sheet, { highWaterMark: 1 << 16 })), ROWS, lines);
      const preview = await timed(`${round}: dry run`, () => runDryRun(batchId), ROWS, lines);
      const commit = await timed(`${round}: commit`, () => runCommit(batchId, user.id), ROWS, lines);
      const batch = await ImportBatch.findByPk(batchId);
      lines.push(
        `  → ${batch?.status}; dry run new ${preview?.new} / updated ${preview?.updated} / unchanged ${preview?.unchanged} / rejected ${preview?.rejected}; ` +
          `written: ${commit ? `${commit.totals.comparisonsWritten} comparisons, ${commit.totals.modelsWritten} models, ${commit.totals.flagsWritten} flags, ${commit.totals.auditEvents} audit events` : `nothing (${batch?.failure})`}`,
      );
      if (round === "first import") lines.push(`  end to end (stage + dry run + commit): ${((performance.now() - started) / 1000).toFixed(2)} s`);
    }
    const counts = await Promise.all([Paper.count(), Comparison.count(), FitModel.count(), Flag.count(), AuditEvent.count()]);
    lines.push(`database after both imports: ${counts[0]} papers, ${counts[1]} comparisons, ${counts[2]} models, ${counts[3]} flags, ${counts[4]} audit events`);
    await database.sequelize.close();
  } finally {
    clearInterval(sampler);
    rmSync(folder, { recursive: true, force: true });
  }
  const maxRss = process.resourceUsage().maxRSS / 1024;
  console.log(`bench:import — ${ROWS.toLocaleString("en")} rows, ${availableParallelism()} cores, load average ${loadavg().map((l) => l.toFixed(2)).join(" ")}`);
  // package.json runs this bench with the V8 heap limit `npm start` gives the app server
  console.log(`V8 heap limit: ${(getHeapStatistics().heap_size_limit / 2 ** 20).toFixed(0)} MB (as npm start sets it for the server)`);
  for (const line of lines) console.log(line);
  console.log(`peak memory: ${maxRss.toFixed(0)} MB (maxRSS), ${(peakRss / 2 ** 20).toFixed(0)} MB (largest sampled RSS); target ≤ 30 s and ≤ 1024 MB`);
}

main().catch((error: unknown) => {
  console.error("bench:import failed:", error);
  process.exit(1);
});
