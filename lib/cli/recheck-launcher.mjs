// Starts `recheck` (lib/cli/recheck.ts) from a bundled build instead of through tsx: tsx compiles every
// module on each start (about half a second of a 100 000-row run) and runs them as CommonJS, where each
// call of an imported function goes through an export getter. The bundle is one plain ES module (with a
// second, small one for the thread that prints JSON lines), built with esbuild (which tsx itself runs
// on) into node_modules/.cache/fitledger/ and rebuilt only when one of the files it was built from has
// changed since, so a start normally costs a few file stats.
//
// Plain JavaScript on purpose: this file must run on bare `node`, before anything is compiled.
import { mkdir, readFile, rename, stat, writeFile } from "node:fs/promises";
import { dirname, join, relative, resolve } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), "..", "..");
const CACHE = join(ROOT, "node_modules", ".cache", "fitledger");
/** The command, and the printer thread it starts for JSON lines (loaded from beside the command's bundle). */
const ENTRIES = ["recheck", "json-printer-thread"];
const BUNDLES = ENTRIES.map((name) => join(CACHE, `${name}.mjs`));
const BUNDLE = BUNDLES[0];
/** The inputs of the last build (paths relative to the project), to know when it is stale. */
const INPUTS = join(CACHE, "recheck.inputs.json");

async function mtime(file) {
  try {
    return (await stat(file)).mtimeMs;
  } catch {
    return null;
  }
}

/** The bundles exist and none of the files they were built from (nor this launcher) is newer. */
async function isFresh() {
  const builtTimes = await Promise.all(BUNDLES.map(mtime));
  if (builtTimes.includes(null)) return false;
  const built = Math.min(...builtTimes);
  let inputs;
  try {
    inputs = JSON.parse(await readFile(INPUTS, "utf8"));
  } catch {
    return false;
  }
  if (!Array.isArray(inputs)) return false;
  const files = [fileURLToPath(import.meta.url), join(ROOT, "tsconfig.json"), ...inputs.map((file) => join(ROOT, file))];
  const times = await Promise.all(files.map(mtime));
  return times.every((t) => t !== null && t <= built);
}

async function rebuild() {
  const { build } = await import("esbuild");
  const result = await build({
    entryPoints: ENTRIES.map((name) => join(ROOT, "lib", "cli", `${name}.ts`)),
    absWorkingDir: ROOT,
    bundle: true,
    platform: "node",
    format: "esm",
    target: "node20",
    // tsconfig.json's "@/…" paths are read by esbuild itself
    tsconfig: join(ROOT, "tsconfig.json"),
    write: false,
    metafile: true,
    logLevel: "silent",
    legalComments: "none",
    banner: { js: "// Built by lib/cli/recheck-launcher.mjs from lib/cli/; do not edit." },
    outdir: CACHE,
    outExtension: { ".js": ".mjs" },
  });
  await mkdir(CACHE, { recursive: true });
  // Written under a private name and renamed into place: two commands starting at once never see half a bundle.
  const suffix = `.${process.pid}.tmp`;
  const built = BUNDLES.map((bundle) => {
    const output = result.outputFiles.find((file) => resolve(file.path) === bundle);
    if (!output) throw new Error(`esbuild gave no ${relative(ROOT, bundle)}`);
    return output.contents;
  });
  await Promise.all(BUNDLES.map((bundle, i) => writeFile(bundle + suffix, built[i])));
  const inputs = Object.keys(result.metafile.inputs).map((file) => relative(ROOT, resolve(ROOT, file)));
  await writeFile(INPUTS + suffix, JSON.stringify(inputs));
  await rename(INPUTS + suffix, INPUTS);
  // the printer first: a command that sees the new command bundle finds the new printer beside it
  for (const bundle of [...BUNDLES].reverse()) await rename(bundle + suffix, bundle);
}

try {
  if (!(await isFresh())) await rebuild();
} catch (error) {
  const message = (error instanceof Error ? error.message : String(error)).split("\n")[0].trim();
  process.stderr.write(`recheck failed unexpectedly: cannot build the command (${message || "unknown error"})\n`);
  process.exit(1);
}
await import(pathToFileURL(BUNDLE).href);
