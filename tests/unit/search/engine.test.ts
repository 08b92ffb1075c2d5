import { describe, expect, it } from "vitest";
import type { SearchSource } from "@/lib/db/queries/search";
import { FINDING_CODES } from "@/lib/recheck/catalogue";
import { ESTIMATORS, METHODS, SEVERITIES } from "@/lib/recheck/types";
import { buildCorpusIndex } from "@/lib/search/corpus-index";
import { evaluate, search, type SearchScope } from "@/lib/search/engine";
import { DISPOSITION_VALUES, EMPTY_FILTERS, SEARCH_STATES, type SearchFilters } from "@/lib/validation/search";

// The engine against a direct count: a small random corpus, many random searches, and for every facet
// value the count is compared with a plain loop over the source records that applies the documented
// rule (all other facets as chosen, this facet set to just that value). The loop shares no code with
// the engine.

function random(seed: number) {
  let state = seed >>> 0;
  return () => {
    state = (state * 1664525 + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

function corpus(seed: number): SearchSource {
  const next = random(seed);
  const pick = <T>(list: readonly T[]) => list[Math.floor(next() * list.length)];
  const source: SearchSource = { papers: [], comparisons: [], flags: [], dispositions: [], engineVersions: ["1.0.0"] };
  let modelId = 1;
  let comparisonId = 1;
  for (let paperId = 1; paperId <= 60; paperId += 1) {
    source.papers.push({
      id: paperId,
      doi: `10.5555/unit.${paperId}`,
      title: `${pick(["Bifactor", "Invariance", "Competing"])} models of ${pick(["wellbeing", "engagement", "trust"])}`,
      authors: [{ family: pick(["Halvorsen", "Okonjo", "Rautio"]), given: "A." }],
      journal: next() < 0.1 ? null : pick(["Journal A", "Journal B", "Journal C"]),
      year: next() < 0.05 ? null : 2000 + Math.floor(next() * 10),
      field: pick(["psychology", "education"]),
      state: pick(SEARCH_STATES),
      createdBy: 1 + Math.floor(next() * 3),
      verifiedAt: new Date(Date.UTC(2026, 0, 1 + paperId)),
    });
    const groups = 1 + Math.floor(next() * 3);
    const count = Math.floor(next() * 4);
    for (let c = 0; c < count; c += 1) {
      const a = modelId++;
      const b = modelId++;
      const cid = comparisonId++;
      source.comparisons.push({
        id: cid, paperId, label: `Comparison ${c + 1}`, method: pick(METHODS), sampleLabel: "Sample 1", n: 300, groups,
        restrictedLabel: `Model ${a}`, restrictedEstimator: next() < 0.1 ? null : pick(ESTIMATORS), freeLabel: `Model ${b}`, freeEstimator: pick(ESTIMATORS),
      });
      const flags = Math.floor(next() * 4);
      for (let f = 0; f < flags; f += 1) {
        const fingerprint = `fp-${cid}-${f}`;
        source.flags.push({ comparisonId: cid, paperId, code: pick(FINDING_CODES.slice(0, 6)), severity: pick(SEVERITIES), fingerprint });
        if (next() < 0.4) source.dispositions.push({ paperId, fingerprint, verdict: pick(DISPOSITION_VALUES.slice(0, 4)) });
      }
    }
  }
  return source;
}

type Facet = "code" | "severity" | "disposition" | "method" | "estimator" | "groups" | "year" | "journal" | "field" | "state";

/** Does comparison c match `filters` (within `scope`)? Written out plainly from the rule in engine.ts. */
function directMatch(source: SearchSource, comparison: SearchSource["comparisons"][number], filters: SearchFilters, scope: SearchScope): boolean {
  const paper = source.papers.find((item) => item.id === comparison.paperId)!;
  if (scope.kind === "public" && paper.state !== "verified") return false;
  if (scope.kind === "owner" && paper.createdBy !== scope.userId) return false;
  const states = scope.kind === "staff" && filters.state.length === 0 ? ["verified"] : filters.state;
  if (scope.kind !== "public" && states.length && !states.includes(paper.state)) return false;
  const estimators = [comparison.restrictedEstimator, comparison.freeEstimator];
  if (filters.method.length && !filters.method.includes(comparison.method)) return false;
  if (filters.estimator.length && !estimators.some((estimator) => estimator !== null && filters.estimator.includes(estimator))) return false;
  if (filters.groups.length && !filters.groups.includes(comparison.groups ?? 1)) return false;
  if (filters.yearFrom !== undefined && (paper.year === null || paper.year < filters.yearFrom)) return false;
  if (filters.yearTo !== undefined && (paper.year === null || paper.year > filters.yearTo)) return false;
  if (filters.journal.length && (paper.journal === null || !filters.journal.includes(paper.journal))) return false;
  if (filters.field.length && (paper.field === null || !filters.field.includes(paper.field))) return false;
  if (filters.code.length || filters.severity.length || filters.disposition.length) {
    const flags = source.flags.filter((flag) => flag.comparisonId === comparison.id);
    const one = flags.some((flag) => {
      const verdict = source.dispositions.find((item) => item.paperId === flag.paperId && item.fingerprint === flag.fingerprint)?.verdict ?? "none";
      return (!filters.code.length || filters.code.includes(flag.code)) && (!filters.severity.length || filters.severity.includes(flag.severity)) && (!filters.disposition.length || filters.disposition.includes(verdict));
    });
    if (!one) return false;
  }
  return true;
}

function directCount(source: SearchSource, filters: SearchFilters, scope: SearchScope): number {
  return source.comparisons.filter((comparison) => directMatch(source, comparison, filters, scope)).length;
}

/** the filters with facet `facet` set to just `value` */
function only(filters: SearchFilters, facet: Facet, value: string | number): SearchFilters {
  if (facet === "year") return { ...filters, yearFrom: value as number, yearTo: value as number };
  return { ...filters, [facet]: [value] };
}

function randomFilters(next: () => number): SearchFilters {
  const some = <T>(list: readonly T[]) => list.filter(() => next() < 0.25);
  const filters: SearchFilters = { ...EMPTY_FILTERS, code: some(FINDING_CODES.slice(0, 6)), severity: some(SEVERITIES), disposition: some(DISPOSITION_VALUES), method: some(METHODS), estimator: some(ESTIMATORS), groups: some([1, 2, 3]), journal: some(["Journal A", "Journal B", "Journal C"]), field: some(["psychology"]) };
  if (next() < 0.3) filters.yearFrom = 2002;
  if (next() < 0.3) filters.yearTo = 2007;
  return filters;
}

describe("the search engine", () => {
  const source = corpus(7);
  const index = buildCorpusIndex(source, "test");

  it.each([{ kind: "public" }, { kind: "staff" }, { kind: "owner", userId: 2 }] as SearchScope[])("gives every facet value the count a direct count gives (%o)", (scope) => {
    const next = random(11);
    let checked = 0;
    for (let round = 0; round < 40; round += 1) {
      const filters = randomFilters(next);
      const evaluation = evaluate(index, { filters, scope });
      expect(evaluation.total).toBe(directCount(source, filters, scope));
      for (const facet of ["code", "severity", "disposition", "method", "estimator", "groups", "journal", "field", "year", "state"] as Facet[]) {
        for (const entry of evaluation.facets[facet] ?? []) {
          const withOnly = only(filters, facet, entry.value);
          expect({ facet, value: entry.value, count: entry.count }).toEqual({ facet, value: entry.value, count: directCount(source, withOnly, scope) });
          checked += 1;
        }
      }
    }
    expect(checked).toBeGreaterThan(200);
  });

  it("never shows the public an entry that is not verified", () => {
    const result = search(index, { filters: EMPTY_FILTERS, scope: { kind: "public" }, paging: { page: 1, perPage: 200, sort: "-year" } });
    const verified = source.comparisons.filter((comparison) => source.papers.find((paper) => paper.id === comparison.paperId)!.state === "verified").length;
    expect(result.total).toBe(verified);
    expect(result.items.every((item) => item.paper.state === "verified")).toBe(true);
    expect(result.facets.state).toBeUndefined();
  });

  it("pages through ties in a stable order: every result once, ties by comparison id", () => {
    for (const sort of ["method", "-groups", "year", "-findings"] as const) {
      const seen: number[] = [];
      for (let page = 1; page <= 20; page += 1) seen.push(...search(index, { filters: EMPTY_FILTERS, scope: { kind: "staff" }, paging: { page, perPage: 7, sort } }).items.map((item) => item.id));
      const all = search(index, { filters: EMPTY_FILTERS, scope: { kind: "staff" }, paging: { page: 1, perPage: 200, sort } }).items.map((item) => item.id);
      expect(seen).toEqual(all);
      expect(new Set(seen).size).toBe(seen.length);
      const method = (id: number) => source.comparisons.find((comparison) => comparison.id === id)!.method;
      if (sort === "method") for (let at = 1; at < all.length; at += 1) if (method(all[at]) === method(all[at - 1])) expect(all[at]).toBeGreaterThan(all[at - 1]);
    }
  });

  it("finds papers by a word with a typo, and links each row to its comparison and finding", () => {
    const exact = search(index, { filters: { ...EMPTY_FILTERS, q: "engagement halvorsen" }, scope: { kind: "staff" }, paging: { page: 1, perPage: 200, sort: "year" } });
    const slipped = search(index, { filters: { ...EMPTY_FILTERS, q: "engagment halvorsn" }, scope: { kind: "staff" }, paging: { page: 1, perPage: 200, sort: "year" } });
    expect(exact.total).toBeGreaterThan(0);
    expect(slipped.items.map((item) => item.id)).toEqual(exact.items.map((item) => item.id));
    const withFinding = search(index, { filters: { ...EMPTY_FILTERS, code: [FINDING_CODES[1]] }, scope: { kind: "public" }, paging: { page: 1, perPage: 5, sort: "year" } }).items[0];
    expect(withFinding).toBeDefined();
    expect(withFinding.href).toBe(`/papers/${withFinding.paper.id}?finding=${FINDING_CODES[1]}#comparison-${withFinding.id}`);
  });
});
