// Instructions per recheck() call, counted by valgrind: a figure for comparing two versions of the engine
// that the machine's speed does not move. On our shared two-core machines a timed run varies by ±20–40 %
// from minute to minute, so a change of a few per cent cannot be seen in seconds; the instruction count of
// the same work repeats within about 1 %. It is no speed target (the engine benchmark measures those):
// fewer instructions usually, not always, means less time, so a change is judged by both.
//
// Method: the engine and the comparison generator are bundled with esbuild (as the command line is), and
// a small driver rechecks 5 000 generated comparisons for ROUNDS_SHORT and ROUNDS_LONG rounds under
// `valgrind --tool=cachegrind --cache-sim=no` with V8 in one thread (`--single-threaded`: no background
// compilation or collection, so the JIT tiers up at the same call every time) and fixed seeds. The difference of the two
// counts, divided by the extra rechecks, leaves out start-up, generation and warm-up.
//
//   npx tsx tests/bench/recheck-instructions.ts            this working tree
//   npx tsx tests/bench/recheck-instructions.ts REV        this working tree against git revision REV
//
// Needs valgrind (`apt-get install valgrind`); about a minute per version.
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { build } from "esbuild";

const ROOT = fileURLToPath(new URL("../..", import.meta.url));
const COMPARISONS = 5000;
const ROUNDS_SHORT = 4;
const ROUNDS_LONG = 8;
const SEED = 20240601;

const DRIVER = `
const engine = await import(process.argv[2]);
const rounds = Number(process.argv[3]);
const inputs = engine.generateComparisons({ count: ${COMPARISONS}, seed: ${SEED} });
let findings = 0;
for (let r = 0; r < rounds; r++) for (const input of inputs) { const outcome = engine.recheck(input); if (outcome.ok) findings += outcome.result.findings.length; }
console.log(findings);
`;

/** Bundles lib/recheck and the generator of the tree at `root` into `outfile`. */
async function bundle(root: string, outfile: string): Promise<void> {
  await build({
    stdin: {
      contents: 'export { recheck } from "./lib/recheck";\nexport { generateComparisons } from "./tests/support/generate-comparisons";\n',
      resolveDir: root,
      loader: "ts",
    },
    absWorkingDir: root,
    tsconfig: join(root, "tsconfig.json"),
    bundle: true,
    platform: "node",
    format: "esm",
    target: "node20",
    outfile,
    logLevel: "silent",
  });
}

/**
 * Instructions valgrind counts for one run of the driver. What is left of the spread comes from the
 * garbage collector, whose timing follows addresses and random seeds: fixed V8 seeds and, where setarch
 * is there, no address randomisation bring repeated counts within about ±100 of each other.
 */
function instructions(driver: string, bundleFile: string, rounds: number): number {
  const node = [process.execPath, "--single-threaded", "--random-seed=1", "--hash-seed=1", driver, bundleFile, String(rounds)];
  const valgrind = ["valgrind", "--tool=cachegrind", "--cache-sim=no", "--cachegrind-out-file=/dev/null", ...node];
  const command = existsSync("/usr/bin/setarch") ? ["/usr/bin/setarch", "-R", ...valgrind] : valgrind;
  const run = spawnSync(command[0], command.slice(1), { encoding: "utf8", maxBuffer: 1 << 24 });
  if (run.error) throw new Error(`cannot run valgrind (${run.error.message}); install it with apt-get install valgrind`);
  const match = /I\s+refs:\s+([\d,]+)/.exec(run.stderr);
  if (run.status !== 0 || !match) throw new Error(`valgrind run failed (status ${run.status}): ${run.stderr.split("\n").slice(-5).join(" ")}`);
  return Number(match[1].replaceAll(",", ""));
}

function perRecheck(driver: string, bundleFile: string): number {
  const short = instructions(driver, bundleFile, ROUNDS_SHORT);
  const long = instructions(driver, bundleFile, ROUNDS_LONG);
  return (long - short) / ((ROUNDS_LONG - ROUNDS_SHORT) * COMPARISONS);
}

/** The tree of git revision `rev`, unpacked into `dir`, with this checkout's node_modules. */
function checkout(rev: string, dir: string): void {
  const archive = spawnSync("git", ["archive", "--format=tar", rev], { cwd: ROOT, maxBuffer: 1 << 30 });
  if (archive.status !== 0) throw new Error(`git archive ${rev} failed: ${archive.stderr.toString().trim()}`);
  const untar = spawnSync("tar", ["-x", "-C", dir], { input: archive.stdout });
  if (untar.status !== 0) throw new Error(`cannot unpack ${rev}: ${untar.stderr.toString().trim()}`);
  symlinkSync(join(ROOT, "node_modules"), join(dir, "node_modules"));
}

async function main(): Promise<void> {
  const rev = process.argv[2];
  const scratch = mkdtempSync(join(tmpdir(), "fitledger-instructions-"));
  try {
    const driver = join(scratch, "driver.mjs");
    writeFileSync(driver, DRIVER);
    const here = join(scratch, "here.mjs");
    await bundle(ROOT, here);
    console.log(`recheck instructions (valgrind; ${COMPARISONS} generated comparisons, rounds ${ROUNDS_SHORT} and ${ROUNDS_LONG}, seed ${SEED})`);
    const mine = perRecheck(driver, here);
    console.log(`  this tree: ${Math.round(mine).toLocaleString("en-US")} instructions per recheck`);
    if (rev === undefined) return;
    const tree = join(scratch, "tree");
    mkdirSync(tree);
    checkout(rev, tree);
    const theirs = join(scratch, "theirs.mjs");
    await bundle(tree, theirs);
    const other = perRecheck(driver, theirs);
    console.log(`  ${rev}: ${Math.round(other).toLocaleString("en-US")} instructions per recheck`);
    console.log(`  this tree / ${rev}: ${(mine / other).toFixed(3)}`);
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}

main().catch((error: unknown) => {
  console.error(`recheck-instructions: ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 1;
});
