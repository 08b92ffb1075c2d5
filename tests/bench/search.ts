// Search benchmark (DESIGN §8): server time of GET /api/comparisons and GET /api/stats on the
// 100 000-comparison benchmark corpus, measured by calling the route handlers in this process against
// the benchmark database (no HTTP, no browser). Prints p50/p95 per kind of request; asserts nothing.
// Run by `npm run bench:search`; builds data/bench-search.sqlite with `seed:bench` the first time.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { createDatabase, setDatabase } from "../../lib/db/connection";
import { migrateUp } from "../../lib/db/migrate";

const root = fileURLToPath(new URL("../..", import.meta.url));
const file = path.join(root, "data", "bench-search.sqlite");
const COMPARISONS = 100_000;
const ROUNDS = 40;

function ensureBenchDatabase(): void {
  if (fs.existsSync(file)) return;
  console.log(`bench:search: building ${path.relative(root, file)} (${COMPARISONS} comparisons, about a minute)…`);
  const result = spawnSync("npm", ["run", "--silent", "seed:bench", "--", "--comparisons", String(COMPARISONS), "--database", `sqlite:${file}`], { cwd: root, stdio: "inherit" });
  if (result.status !== 0) throw new Error("seed:bench failed");
}

function quantile(sorted: number[], q: number): number {
  const at = (sorted.length - 1) * q;
  const low = Math.floor(at);
  return sorted[low] + (sorted[Math.min(low + 1, sorted.length - 1)] - sorted[low]) * (at - low);
}

/** one slip in a word: swap two neighbouring letters, drop one, or double one (seeded) */
function typo(word: string, seed: number): string {
  const at = 1 + (seed % Math.max(1, word.length - 2));
  switch (seed % 3) {
    case 0:
      return word.slice(0, at) + word[at + 1] + word[at] + word.slice(at + 2);
    case 1:
      return word.slice(0, at) + word.slice(at + 1);
    default:
      return word.slice(0, at) + word[at] + word.slice(at);
  }
}

async function main() {
  ensureBenchDatabase();
  const database = createDatabase(`sqlite:${file}`);
  await database.ready;
  await migrateUp(database.sequelize);
  setDatabase(database);
  const { GET: comparisons } = await import("../../app/api/comparisons/route");
  const { GET: stats } = await import("../../app/api/stats/route");
  const { getCorpusIndex, lastIndexBuildMs } = await import("../../lib/search");
  const { readSearchSignature } = await import("../../lib/db/queries/search");

  const call = async (handler: (request: Request) => Promise<Response>, query: string) => {
    const started = performance.now();
    const response = await handler(new Request(`http://bench.local${query}`));
    const body = await response.text();
    const elapsed = performance.now() - started;
    if (response.status !== 200) throw new Error(`${query} answered ${response.status}: ${body.slice(0, 200)}`);
    return { elapsed, body };
  };

  const coldStarted = performance.now();
  await call(comparisons, "/api/comparisons");
  const cold = performance.now() - coldStarted;
  const coldBuild = lastIndexBuildMs();
  const index = await getCorpusIndex();
  const journal = index.journals[0];
  const field = index.fields[0];
  // two words of one paper's title (and, every third query, its first author), so queries find something
  const titleWords = (seed: number) => {
    const paper = index.papers[(seed * 7919) % index.papers.length];
    const words = paper.title.toLowerCase().split(/[^a-z]+/).filter((word) => word.length >= 6);
    const author = paper.authors.toLowerCase().split(/[^a-z]+/).find((word) => word.length >= 5);
    return [words[seed % words.length] ?? "factor", seed % 3 === 0 && author ? author : (words[(seed + 1) % words.length] ?? "structure")];
  };

  const facetQueries = [
    "/api/comparisons",
    "/api/comparisons?code=just-identified-model",
    "/api/comparisons?code=just-identified-model&year_from=2005&year_to=2015",
    "/api/comparisons?severity=error&method=lrt,scaled_lrt",
    `/api/comparisons?estimator=MLR,WLSMV&journal=${encodeURIComponent(journal)}&sort=-findings`,
    `/api/comparisons?field=${encodeURIComponent(field)}&groups=2,3&disposition=none&page=3`,
    "/api/comparisons?method=invariance&sort=title&per_page=200",
    "/api/comparisons?severity=warning&sort=journal&page=20",
  ];
  const textQuery = (seed: number, slip: boolean) => {
    const [first, second] = titleWords(seed);
    const q = slip ? `${typo(first, seed)} ${typo(second, seed + 1)}` : `${first} ${second}`;
    return `/api/comparisons?q=${encodeURIComponent(q)}${seed % 2 ? "&severity=error" : ""}`;
  };
  const statsQueries = ["/api/stats", "/api/stats?year_from=2000&year_to=2020", "/api/stats?method=lrt&estimator=ML", `/api/stats?journal=${encodeURIComponent(journal)}`, "/api/stats?code=just-identified-model"];

  // warm-up: sort orders and the JIT
  for (const query of [...facetQueries, ...statsQueries]) await call(query.startsWith("/api/stats") ? stats : comparisons, query);

  const samples: Record<string, number[]> = { facets: [], "text, exact words": [], "text, one slip per word": [], stats: [], signature: [] };
  for (let round = 0; round < ROUNDS; round += 1) {
    for (const query of facetQueries) samples.facets.push((await call(comparisons, query)).elapsed);
    // every round uses words not seen before, so the typo expansions are computed, not remembered
    samples["text, exact words"].push((await call(comparisons, textQuery(round * 3, false))).elapsed);
    samples["text, one slip per word"].push((await call(comparisons, textQuery(round * 3 + 1, true))).elapsed);
    samples["text, one slip per word"].push((await call(comparisons, textQuery(round * 3 + 2, true))).elapsed);
    for (const query of statsQueries) samples.stats.push((await call(stats, query)).elapsed);
    const started = performance.now();
    await readSearchSignature();
    samples.signature.push(performance.now() - started);
  }

  // after a write: the public is answered from the previous index while the new one is built; a
  // curator's search (fresh index) waits for the rebuild
  const { recordEvent } = await import("../../lib/db/audit");
  await recordEvent({ entity: "Benchmark", entityId: "0", action: "touch" }, { actorId: null });
  const staleStarted = performance.now();
  await call(comparisons, "/api/comparisons?code=just-identified-model");
  const staleAnswer = performance.now() - staleStarted;
  const freshStarted = performance.now();
  await getCorpusIndex();
  const freshWait = performance.now() - freshStarted;

  const examples = [7, 8, 9].map((seed) => textQuery(seed, true));
  const found = await Promise.all(examples.map(async (query) => (JSON.parse((await call(comparisons, query)).body) as { total: number }).total));
  console.log(`\nbench:search — ${index.size} comparisons (${index.papers.length} papers, all states), vocabulary ${index.vocabulary.size} words`);
  console.log(`machine: ${os.cpus().length} cores, load average ${os.loadavg().map((value) => value.toFixed(2)).join(" ")}`);
  console.log(`first request (signature + index build + answer): ${cold.toFixed(0)} ms; index build alone ${coldBuild?.toFixed(0)} ms`);
  console.log(`${"request kind".padEnd(28)} ${"n".padStart(5)} ${"p50 ms".padStart(8)} ${"p95 ms".padStart(8)} ${"max ms".padStart(8)}`);
  for (const [kind, values] of Object.entries(samples)) {
    const sorted = [...values].sort((a, b) => a - b);
    console.log(`${kind.padEnd(28)} ${String(sorted.length).padStart(5)} ${quantile(sorted, 0.5).toFixed(1).padStart(8)} ${quantile(sorted, 0.95).toFixed(1).padStart(8)} ${sorted.at(-1)!.toFixed(1).padStart(8)}`);
  }
  console.log(`after a write: public search answered from the previous index in ${staleAnswer.toFixed(1)} ms; a fresh index (curators, contributors) was ready ${freshWait.toFixed(0)} ms later`);
  console.log(`targets: search p95 ≤ 100 ms, stats p95 ≤ 200 ms (DESIGN §8). `);
  examples.forEach((query, at) => console.log(`  e.g. ${decodeURIComponent(query)} → ${found[at]} comparisons`));
  await database.sequelize.close();
}

main().catch((error: unknown) => {
  console.error("bench:search failed:", error);
  process.exit(1);
});
