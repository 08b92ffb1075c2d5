import "server-only";
import { readSearchSignature, readSearchSource } from "@/lib/db/queries/search";
import type { Paging } from "@/lib/validation/search";
import { buildCorpusIndex, type CorpusIndex } from "./corpus-index";
import { matchedIds, search, type SearchOptions, type SearchResult } from "./engine";

export { type SearchScope, type SearchOptions, type SearchResult, type ComparisonHit, type Facets, type FacetValue } from "./engine";
export { evaluate } from "./engine";
export type { CorpusIndex } from "./corpus-index";

// The process's search index, kept on globalThis (Next.js may load this module in several chunks). Each
// search first reads the data signature (one small query); when it differs from the index's, the index
// is rebuilt from the tables before answering, so a search never shows a state older than its own
// request. Concurrent requests share one rebuild. Several app instances each keep their own index and
// each checks the same signature, so they stay correct behind a load balancer.

interface IndexHolder {
  index?: CorpusIndex;
  building?: Promise<CorpusIndex>;
  buildingSignature?: string;
  /** milliseconds the last rebuild took, for the benchmark's report */
  lastBuildMs?: number;
}

const holder = ((globalThis as typeof globalThis & { __fitledgerSearch?: IndexHolder }).__fitledgerSearch ??= {});

async function build(signature: string): Promise<CorpusIndex> {
  const started = performance.now();
  const source = await readSearchSource();
  const index = buildCorpusIndex(source, signature);
  holder.lastBuildMs = performance.now() - started;
  return index;
}

/** The index, fresh for the current data. */
export async function getCorpusIndex(): Promise<CorpusIndex> {
  const signature = await readSearchSignature();
  if (holder.index?.signature === signature) return holder.index;
  if (holder.building && holder.buildingSignature === signature) return holder.building;
  const building = build(signature);
  holder.building = building;
  holder.buildingSignature = signature;
  try {
    const index = await building;
    // a slower, older rebuild must not replace a newer index
    if (holder.buildingSignature === signature) holder.index = index;
    return index;
  } finally {
    if (holder.building === building) {
      holder.building = undefined;
      holder.buildingSignature = undefined;
    }
  }
}

/** Forgets the index (tests that rewrite the database under the same signature). */
export function forgetCorpusIndex(): void {
  holder.index = undefined;
  holder.building = undefined;
  holder.buildingSignature = undefined;
}

export function lastIndexBuildMs(): number | undefined {
  return holder.lastBuildMs;
}

export async function searchComparisons(options: SearchOptions & { paging: Paging }): Promise<SearchResult> {
  return search(await getCorpusIndex(), options);
}

/** Every matching comparison and paper id (exports resolve a search to ids). */
export async function resolveSearchIds(options: SearchOptions): Promise<{ comparisonIds: number[]; paperIds: number[]; complete: boolean }> {
  return matchedIds(await getCorpusIndex(), options);
}
