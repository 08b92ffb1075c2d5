// Engine-only benchmark (DESIGN §8): throughput of recheck() on generated comparisons on one core, and
// the worst relative p-value error against R's pchisq reference grid. Run by `npm run bench:recheck`.
// Prints figures; asserts nothing (speed targets are measured, never timed in tests).
import { readFileSync } from "node:fs";
import { cpus, loadavg } from "node:os";
import { recheck } from "../../lib/recheck";
import { chisqUpperTail } from "../../lib/recheck/distributions/chisq";
import { generateComparisons } from "../support/generate-comparisons";

const TARGET_PER_SECOND = 200_000;
const COUNT = Number(process.argv[2] ?? 100_000);
const SEED = 20240601;

interface GridEntry {
  x: number;
  df: number;
  p_upper: number;
}

function maxRelativeGridError(): { error: number; entries: number } {
  const file = new URL("../fixtures/lavaan-holzinger-swineford.json", import.meta.url);
  const grid = (JSON.parse(readFileSync(file, "utf8")) as { pchisq_grid: GridEntry[] }).pchisq_grid;
  let worst = 0;
  for (const entry of grid) {
    const p = chisqUpperTail(entry.x, entry.df);
    worst = Math.max(worst, Math.abs(p - entry.p_upper) / entry.p_upper);
  }
  return { error: worst, entries: grid.length };
}

function main(): void {
  const started = performance.now();
  const inputs = generateComparisons({ count: COUNT, seed: SEED });
  const generatedIn = (performance.now() - started) / 1000;

  // Warm-up so the JIT has compiled the hot paths before timing.
  for (let i = 0; i < Math.min(20_000, inputs.length); i++) recheck(inputs[i]);

  // Wall-clock rate, and the rate per CPU-second of this (single-threaded) process: on a shared
  // machine the second is the fairer figure for "one core".
  const rounds = 5;
  const wallRates: number[] = [];
  const cpuRates: number[] = [];
  let findings = 0;
  let fieldErrors = 0;
  for (let round = 0; round < rounds; round++) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    for (let i = 0; i < inputs.length; i++) {
      const outcome = recheck(inputs[i]);
      if (outcome.ok) findings += outcome.result.findings.length;
      else fieldErrors++;
    }
    const cpu = process.cpuUsage(c0);
    wallRates.push(inputs.length / ((performance.now() - t0) / 1000));
    cpuRates.push(inputs.length / ((cpu.user + cpu.system) / 1e6));
  }
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
  const wall = median(wallRates);
  const perCpu = median(cpuRates);
  const grid = maxRelativeGridError();

  console.log(`recheck engine benchmark (${COUNT} generated comparisons, seed ${SEED}, generated in ${generatedIn.toFixed(1)} s)`);
  // Other work on the machine slows a single-threaded run too (shared cores); print what it was.
  console.log(`  machine: ${cpus().length} cores (${cpus()[0]?.model ?? "unknown"}), load average ${loadavg().map((x) => x.toFixed(2)).join(" / ")} (1 / 5 / 15 min)`);
  const fmt = (x: number) => Math.round(x).toLocaleString("en-US");
  console.log(`  throughput, one core: median ${fmt(wall)} comparisons/s wall clock, ${fmt(perCpu)} per CPU-second, over ${rounds} rounds (wall min ${fmt(Math.min(...wallRates))}, max ${fmt(Math.max(...wallRates))})`);
  console.log(`  target ≥ ${fmt(TARGET_PER_SECOND)} comparisons/s — ${wall >= TARGET_PER_SECOND ? "met (wall clock)" : perCpu >= TARGET_PER_SECOND ? "met per CPU-second, not on the wall clock (machine shared?)" : "NOT met"}`);
  console.log(`  findings per comparison: ${(findings / (rounds * inputs.length)).toFixed(2)}; rows with field errors: ${fieldErrors / rounds}`);
  console.log(`  p-value accuracy: max relative error ${grid.error.toExponential(2)} over ${grid.entries} pchisq_grid entries (R 4.2.2); target ≤ 1e-10 — ${grid.error <= 1e-10 ? "met" : "NOT met"}`);
}

main();
