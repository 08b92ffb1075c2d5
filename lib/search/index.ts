import "server-only";
import { db } from "@/lib/db";
import { readSearchSignature, readSearchSource, withdrawalsOf } from "@/lib/db/queries/search";
import type { Paging } from "@/lib/validation/search";
import { buildCorpusIndex, type CorpusIndex } from "./corpus-index";
import { matchedIds, search, type SearchOptions, type SearchResult, type SearchScope } from "./engine";

export { type SearchScope, type SearchOptions, type SearchResult, type ComparisonHit, type Facets, type FacetValue } from "./engine";
export { evaluate } from "./engine";
export type { CorpusIndex } from "./corpus-index";

// The process's search index, kept on globalThis (Next.js may load this module in several chunks). Each
// search first reads the data signature (one small query). When it differs from the index's, the index
// is rebuilt from the tables, one build at a time: a change that arrives during a build queues one more
// build of the newest data, however many changes arrive (an import commits many times a second).
//
// Curators and contributors wait for the fresh index, so their own edits show at once. Public readers
// are answered from the previous index while a rebuild runs, as long as no verified entry has been
// returned to its coder since that index was built: a verified entry cannot be edited, and its only way
// out of the public corpus (a curator returning it for a correction, lib/curation/workflow.ts) moves a
// counter in the signature (withdrawalsOf). So a stale public index can only lack the newest
// verifications and findings — it never shows an entry that is not verified. Several app instances each
// keep their own index and each checks the same signature, so they stay correct behind a load balancer.

interface IndexHolder {
  index?: CorpusIndex;
  building?: Promise<CorpusIndex>;
  buildingSignature?: string;
  queued?: Promise<CorpusIndex>;
  /** the database the index was read from: another instance (tests switch files) starts afresh */
  owner?: object;
  /** milliseconds the last rebuild took, for the benchmark's report */
  lastBuildMs?: number;
}

const holder = ((globalThis as typeof globalThis & { __fitledgerSearch?: IndexHolder }).__fitledgerSearch ??= {});

function rebuild(signature: string): Promise<CorpusIndex> {
  if (holder.building) {
    if (holder.buildingSignature === signature) return holder.building;
    // one build at a time: after the running one, build once more from whatever the data is then
    holder.queued ??= holder.building
      .catch(() => undefined)
      .then(async () => {
        holder.queued = undefined;
        const latest = await readSearchSignature();
        return holder.index?.signature === latest ? holder.index : rebuild(latest);
      });
    return holder.queued;
  }
  const started = performance.now();
  const owner = holder.owner;
  const building = readSearchSource().then((source) => {
    const index = buildCorpusIndex(source, signature);
    holder.lastBuildMs = performance.now() - started;
    if (holder.owner === owner) holder.index = index;
    return index;
  });
  holder.building = building;
  holder.buildingSignature = signature;
  const clear = () => {
    if (holder.building === building) {
      holder.building = undefined;
      holder.buildingSignature = undefined;
    }
  };
  building.then(clear, clear);
  return building;
}

/**
 * The index for the current data. With `allowStale` (public readers only), the previous index is
 * returned at once while a newer one is being built.
 */
export async function getCorpusIndex({ allowStale = false }: { allowStale?: boolean } = {}): Promise<CorpusIndex> {
  const { sequelize } = await db();
  if (holder.owner !== sequelize) {
    holder.owner = sequelize;
    holder.index = undefined;
    holder.building = holder.queued = holder.buildingSignature = undefined;
  }
  const signature = await readSearchSignature();
  if (holder.index?.signature === signature) return holder.index;
  const fresh = rebuild(signature);
  if (allowStale && holder.index && withdrawalsOf(holder.index.signature) === withdrawalsOf(signature)) {
    fresh.catch((error: unknown) => console.error("[search] index rebuild failed", error));
    return holder.index;
  }
  return fresh;
}

/** Forgets the index (tests that rewrite the database under the same signature). */
export function forgetCorpusIndex(): void {
  holder.index = undefined;
}

export function lastIndexBuildMs(): number | undefined {
  return holder.lastBuildMs;
}

/** The index a search in this scope may use: the public may be answered from the previous one. */
export function indexFor(scope: SearchScope): Promise<CorpusIndex> {
  return getCorpusIndex({ allowStale: scope.kind === "public" });
}

export async function searchComparisons(options: SearchOptions & { paging: Paging }): Promise<SearchResult> {
  return search(await indexFor(options.scope), options);
}

/** Every matching comparison and paper id (exports resolve a search to ids). */
export async function resolveSearchIds(options: SearchOptions): Promise<{ comparisonIds: number[]; paperIds: number[]; complete: boolean }> {
  return matchedIds(await indexFor(options.scope), options);
}
