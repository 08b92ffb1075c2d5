import "server-only";
import { ENGINE_VERSION } from "@/lib/recheck/settings";
import { indexFor, evaluate, type SearchScope } from "@/lib/search";
import { NONE, type CorpusIndex } from "@/lib/search/corpus-index";
import { computePrevalence, type Prevalence } from "@/lib/stats/prevalence";
import { SEARCH_STATES, type SearchFilters } from "@/lib/validation/search";

// Corpus statistics for /insights and GET /api/stats: the prevalence figures of a search (the whole
// verified corpus when no filter is set) and the snapshot line that lets a reader cite them.

export interface CorpusSnapshot {
  /** when the figures were computed (ISO 8601) */
  computedAt: string;
  /** the latest verification in the corpus (ISO 8601), or null for an empty corpus */
  lastVerifiedAt: string | null;
  verifiedPapers: number;
  verifiedComparisons: number;
  /** the engine of this server */
  engineVersion: string;
  /** the engine versions that wrote the stored findings */
  findingEngineVersions: string[];
}

export interface CorpusStats {
  snapshot: CorpusSnapshot;
  prevalence: Prevalence;
}

export function snapshotOf(index: CorpusIndex): CorpusSnapshot {
  const verified = SEARCH_STATES.indexOf("verified");
  let verifiedPapers = 0;
  let verifiedComparisons = 0;
  let latest = -Infinity;
  for (let p = 0; p < index.papers.length; p += 1) {
    if (index.paperState[p] !== verified || index.paperState[p] === NONE) continue;
    verifiedPapers += 1;
    verifiedComparisons += index.paperRowStart[p + 1] - index.paperRowStart[p];
    if (index.paperVerifiedAt[p] > latest) latest = index.paperVerifiedAt[p];
  }
  return {
    computedAt: new Date().toISOString(),
    lastVerifiedAt: Number.isFinite(latest) ? new Date(latest).toISOString() : null,
    verifiedPapers,
    verifiedComparisons,
    engineVersion: ENGINE_VERSION,
    findingEngineVersions: index.engineVersions,
  };
}

export async function readCorpusStats({ filters, scope }: { filters: SearchFilters; scope: SearchScope }): Promise<CorpusStats> {
  const index = await indexFor(scope);
  const { matched } = evaluate(index, { filters, scope });
  return { snapshot: snapshotOf(index), prevalence: computePrevalence(index, matched) };
}
