import { ESTIMATORS, METHODS, SEVERITIES } from "@/lib/recheck/types";
import { DISPOSITION_VALUES, SEARCH_STATES, type Paging, type SearchFilters } from "@/lib/validation/search";
import { NONE, sortOrder, type CorpusIndex } from "./corpus-index";
import { queryTerms } from "./text";

// Runs one search over the index: which rows match, the facet counts, one sorted page. Facet counts
// follow the usual faceted-search rule: a value's count is the number of results the search would have
// if that value were the only one chosen in its facet, every other facet kept as it is.
//
// Findings are matched finding by finding: with code, severity and disposition chosen, a comparison
// matches when one of its findings has all three (an error-level just-identified-model finding that a
// curator confirmed), not when three different findings have one each.

/** Who is searching: the public sees verified entries; staff may choose entry states; an owner sees their own. */
export type SearchScope = { kind: "public" } | { kind: "staff" } | { kind: "owner"; userId: number };

export interface SearchOptions {
  filters: SearchFilters;
  scope: SearchScope;
  /** only comparisons of papers verified after this moment (the saved-search digest) */
  verifiedAfter?: Date;
  /** …and not after this one */
  verifiedBefore?: Date;
}

export interface FacetValue<V = string> {
  value: V;
  count: number;
}

export interface Facets {
  code: FacetValue[];
  severity: FacetValue[];
  disposition: FacetValue[];
  method: FacetValue[];
  estimator: FacetValue[];
  groups: FacetValue<number>[];
  year: FacetValue<number>[];
  journal: FacetValue[];
  field: FacetValue[];
  /** entry states: only for staff and for an owner's own entries */
  state?: FacetValue[];
}

export interface Evaluation {
  /** matched[row] = 1 when the row is a result */
  matched: Uint8Array;
  total: number;
  papers: number;
  facets: Facets;
  /** finding codes chosen in the filter (row links point at the first of these a row has) */
  codeSet: Set<number> | null;
}

// one bit per row-level facet
const METHOD = 1;
const ESTIMATOR = 2;
const GROUPS = 4;
const YEAR = 8;
const JOURNAL = 16;
const FIELD = 32;
const STATE = 64;

/** a lookup table over `size` ids with the chosen ones set, or null when nothing is chosen */
function chosen(values: string[], list: readonly string[], size = list.length): Uint8Array | null {
  if (values.length === 0) return null;
  const table = new Uint8Array(size);
  for (const value of values) {
    const id = list.indexOf(value);
    if (id >= 0) table[id] = 1;
  }
  return table;
}

/** rows that contain every query term (each term: the word, words it begins, or near spellings) */
export function textMatches(index: CorpusIndex, query: string): Uint8Array | null {
  const { terms, doi } = queryTerms(query);
  if (terms.length === 0 && !doi) return null;
  let result: Uint8Array | null = null;
  const intersect = (mask: Uint8Array) => {
    if (!result) result = mask;
    else for (let row = 0; row < index.size; row += 1) result[row] &= mask[row];
  };
  if (doi) {
    const mask = new Uint8Array(index.size);
    index.papers.forEach((paper, p) => {
      if (paper.doi && paper.doi.toLowerCase().startsWith(doi)) mask.fill(1, index.paperRowStart[p], index.paperRowStart[p + 1]);
    });
    intersect(mask);
  }
  for (const term of terms) {
    const mask = new Uint8Array(index.size);
    for (const word of index.vocabulary.expand(term).words) {
      for (const p of index.paperPostings[word]) mask.fill(1, index.paperRowStart[p], index.paperRowStart[p + 1]);
      for (const row of index.rowPostings[word]) mask[row] = 1;
    }
    intersect(mask);
  }
  return result;
}

// Group counts above this are counted together with it (a facet of hundreds of values helps nobody).
const GROUPS_CAP = 1000;
const YEAR_BASE = 1900;
const YEAR_SPAN = 201;

export function evaluate(index: CorpusIndex, options: SearchOptions): Evaluation {
  const { filters, scope } = options;
  const methods = chosen(filters.method, METHODS);
  let estimatorMask = 0;
  for (const estimator of filters.estimator) estimatorMask |= 1 << ESTIMATORS.indexOf(estimator as (typeof ESTIMATORS)[number]);
  const groups = filters.groups.length ? new Uint8Array(GROUPS_CAP + 1) : null;
  for (const value of filters.groups) if (groups && value <= GROUPS_CAP) groups[value] = 1;
  const years = filters.yearFrom !== undefined || filters.yearTo !== undefined;
  const yearFrom = filters.yearFrom ?? -Infinity;
  const yearTo = filters.yearTo ?? Infinity;
  const journals = chosen(filters.journal, index.journals);
  const fields = chosen(filters.field, index.fields);
  const verifiedState = SEARCH_STATES.indexOf("verified");
  // The public is limited to verified entries outright; for staff and owners the state is a facet.
  const stateFacet = scope.kind !== "public";
  const states = scope.kind === "staff" ? (chosen(filters.state, SEARCH_STATES) ?? chosen(["verified"], SEARCH_STATES)) : scope.kind === "owner" ? chosen(filters.state, SEARCH_STATES) : null;
  const codes = chosen(filters.code, index.codes);
  const severities = chosen(filters.severity, SEVERITIES);
  const dispositions = chosen(filters.disposition, DISPOSITION_VALUES);
  const flagFiltered = codes !== null || severities !== null || dispositions !== null;
  const text = filters.q ? textMatches(index, filters.q) : null;
  const verifiedAfter = options.verifiedAfter?.getTime();
  const verifiedBefore = options.verifiedBefore?.getTime() ?? Infinity;

  const codeCounts = new Float64Array(index.codes.length);
  const severityCounts = new Float64Array(SEVERITIES.length);
  const dispositionCounts = new Float64Array(DISPOSITION_VALUES.length);
  const methodCounts = new Float64Array(METHODS.length);
  const estimatorCounts = new Float64Array(ESTIMATORS.length);
  const groupCounts = new Float64Array(GROUPS_CAP + 1);
  const yearCounts = new Float64Array(YEAR_SPAN);
  const journalCounts = new Float64Array(index.journals.length);
  const fieldCounts = new Float64Array(index.fields.length);
  const stateCounts = new Float64Array(SEARCH_STATES.length);
  const seenCode = new Int32Array(index.codes.length).fill(-1);
  const seenSeverity = new Int32Array(SEVERITIES.length).fill(-1);
  const seenDisposition = new Int32Array(DISPOSITION_VALUES.length).fill(-1);
  const matched = new Uint8Array(index.size);
  let total = 0;
  let papers = 0;

  for (let p = 0; p < index.papers.length; p += 1) {
    const state = index.paperState[p];
    // scope first: rows outside it are counted nowhere
    if (scope.kind === "public" && state !== verifiedState) continue;
    if (scope.kind === "owner" && index.paperCreatedBy[p] !== scope.userId) continue;
    if (verifiedAfter !== undefined && !(state === verifiedState && index.paperVerifiedAt[p] > verifiedAfter && index.paperVerifiedAt[p] <= verifiedBefore)) continue;
    // the paper's own facets, once per paper
    const year = index.paperYear[p];
    const journal = index.paperJournal[p];
    const field = index.paperField[p];
    let paperFails = 0;
    if (years && (year === NONE || year < yearFrom || year > yearTo)) paperFails |= YEAR;
    if (journals && (journal === NONE || journals[journal] === 0)) paperFails |= JOURNAL;
    if (fields && (field === NONE || fields[field] === 0)) paperFails |= FIELD;
    if (states && (state === NONE || states[state] === 0)) paperFails |= STATE;
    if ((paperFails & (paperFails - 1)) !== 0) continue; // fails two facets: counted nowhere
    let paperMatched = false;

    for (let row = index.paperRowStart[p]; row < index.paperRowStart[p + 1]; row += 1) {
      if (text !== null && text[row] === 0) continue;
      let fails = paperFails;
      const method = index.method[row];
      if (methods && (method === NONE || methods[method] === 0)) fails |= METHOD;
      const rowEstimators = index.estimators[row];
      if (estimatorMask && (rowEstimators & estimatorMask) === 0) fails |= ESTIMATOR;
      const groupValue = Math.min(index.groups[row], GROUPS_CAP);
      if (groups && groups[groupValue] === 0) fails |= GROUPS;
      if ((fails & (fails - 1)) !== 0) continue;

      const start = index.flagStart[row];
      const end = index.flagStart[row + 1];
      let flagsPass = !flagFiltered;
      for (let f = start; f < end && !flagsPass; f += 1) {
        flagsPass = (codes === null || codes[index.flagCode[f]] === 1) && (severities === null || severities[index.flagSeverity[f]] === 1) && (dispositions === null || dispositions[index.flagDisposition[f]] === 1);
      }

      if (flagsPass) {
        if (fails === 0) {
          matched[row] = 1;
          total += 1;
          paperMatched = true;
        }
        // row-level facets: a row counts for a facet when it fails nothing but (at most) that facet
        if ((fails === 0 || fails === METHOD) && method !== NONE) methodCounts[method] += 1;
        if (fails === 0 || fails === ESTIMATOR) {
          for (let bits = rowEstimators; bits !== 0; bits &= bits - 1) estimatorCounts[31 - Math.clz32(bits & -bits)] += 1;
        }
        if (fails === 0 || fails === GROUPS) groupCounts[groupValue] += 1;
        if ((fails === 0 || fails === YEAR) && year !== NONE && year >= YEAR_BASE && year < YEAR_BASE + YEAR_SPAN) yearCounts[year - YEAR_BASE] += 1;
        if ((fails === 0 || fails === JOURNAL) && journal !== NONE) journalCounts[journal] += 1;
        if ((fails === 0 || fails === FIELD) && field !== NONE) fieldCounts[field] += 1;
        if (stateFacet && (fails === 0 || fails === STATE) && state !== NONE) stateCounts[state] += 1;
      }

      // finding-level facets: for each value, would a finding with it (and the other two choices) exist?
      if (fails === 0) {
        for (let f = start; f < end; f += 1) {
          const code = index.flagCode[f];
          const severity = index.flagSeverity[f];
          const disposition = index.flagDisposition[f];
          const codeOk = codes === null || codes[code] === 1;
          const severityOk = severities === null || severities[severity] === 1;
          const dispositionOk = dispositions === null || dispositions[disposition] === 1;
          if (severityOk && dispositionOk && seenCode[code] !== row) {
            seenCode[code] = row;
            codeCounts[code] += 1;
          }
          if (codeOk && dispositionOk && seenSeverity[severity] !== row) {
            seenSeverity[severity] = row;
            severityCounts[severity] += 1;
          }
          if (codeOk && severityOk && seenDisposition[disposition] !== row) {
            seenDisposition[disposition] = row;
            dispositionCounts[disposition] += 1;
          }
        }
      }
    }
    if (paperMatched) papers += 1;
  }

  const listed = (names: readonly string[], values: ArrayLike<number>, picked: string[], byCount = false): FacetValue[] => {
    const list: FacetValue[] = [];
    for (let id = 0; id < names.length; id += 1) if (values[id] > 0 || picked.includes(names[id])) list.push({ value: names[id], count: values[id] ?? 0 });
    if (byCount) list.sort((a, b) => b.count - a.count || a.value.localeCompare(b.value));
    return list;
  };
  const numeric = (values: Float64Array, base: number, picked: number[]): FacetValue<number>[] => {
    const list: FacetValue<number>[] = [];
    for (let at = 0; at < values.length; at += 1) if (values[at] > 0 || picked.includes(at + base)) list.push({ value: at + base, count: values[at] });
    return list;
  };
  const facets: Facets = {
    code: listed(index.codes, codeCounts, filters.code),
    severity: listed(SEVERITIES, severityCounts, filters.severity),
    disposition: listed(DISPOSITION_VALUES, dispositionCounts, filters.disposition),
    method: listed(METHODS, methodCounts, filters.method),
    estimator: listed(ESTIMATORS, estimatorCounts, filters.estimator),
    groups: numeric(groupCounts, 0, filters.groups),
    year: numeric(yearCounts, YEAR_BASE, []),
    journal: listed(index.journals, journalCounts, filters.journal, true),
    field: listed(index.fields, fieldCounts, filters.field, true),
  };
  if (stateFacet) facets.state = listed(SEARCH_STATES, stateCounts, filters.state.length || scope.kind !== "staff" ? filters.state : ["verified"]);
  return { matched, total, papers, facets, codeSet: codes ? new Set(filters.code.map((code) => index.codes.indexOf(code))) : null };
}

export interface ComparisonHit {
  id: number;
  label: string;
  method: string | null;
  sample: { label: string; n: number | null; groups: number };
  restricted: { label: string; estimator: string | null };
  free: { label: string; estimator: string | null };
  paper: { id: number; title: string; authors: string; year: number | null; journal: string | null; field: string | null; doi: string | null; state: string };
  findings: { code: string; severity: string; disposition: string }[];
  /** the paper page, at this comparison, with the finding of interest highlighted */
  href: string;
}

const SEVERITY_RANK = (severity: number) => severity; // SEVERITIES is ordered error, warning, note

export function hitAt(index: CorpusIndex, row: number, codeSet: Set<number> | null): ComparisonHit {
  const p = index.paper[row];
  const paper = index.papers[p];
  const findings: ComparisonHit["findings"] = [];
  let focus = -1;
  let focusSeverity = Infinity;
  for (let f = index.flagStart[row]; f < index.flagStart[row + 1]; f += 1) {
    findings.push({ code: index.codes[index.flagCode[f]], severity: SEVERITIES[index.flagSeverity[f]], disposition: DISPOSITION_VALUES[index.flagDisposition[f]] });
    const chosen = codeSet ? codeSet.has(index.flagCode[f]) : true;
    if (chosen && (focus === -1 || SEVERITY_RANK(index.flagSeverity[f]) < focusSeverity)) {
      focus = index.flagCode[f];
      focusSeverity = SEVERITY_RANK(index.flagSeverity[f]);
    }
  }
  const id = index.comparisonId[row];
  const finding = focus >= 0 ? `?finding=${encodeURIComponent(index.codes[focus])}` : "";
  return {
    id,
    label: index.comparisonLabel[row],
    method: index.method[row] === NONE ? null : METHODS[index.method[row]],
    sample: { label: index.sampleLabel[row], n: Number.isNaN(index.sampleN[row]) ? null : index.sampleN[row], groups: index.groups[row] },
    restricted: { label: index.restrictedLabel[row], estimator: index.restrictedEstimator[row] },
    free: { label: index.freeLabel[row], estimator: index.freeEstimator[row] },
    paper: { id: paper.id, title: paper.title, authors: paper.authors, year: paper.year, journal: paper.journal, field: paper.field, doi: paper.doi, state: paper.state },
    findings,
    href: `/papers/${paper.id}${finding}#comparison-${id}`,
  };
}

/** The rows of one page, in the chosen order (ties by comparison id). */
export function pageRows(index: CorpusIndex, matched: Uint8Array, paging: Paging): number[] {
  const order = sortOrder(index, paging.sort);
  const skip = (paging.page - 1) * paging.perPage;
  const rows: number[] = [];
  let seen = 0;
  for (let k = 0; k < order.length && rows.length < paging.perPage; k += 1) {
    const row = order[k];
    if (matched[row] === 0) continue;
    if (seen >= skip) rows.push(row);
    seen += 1;
  }
  return rows;
}

export interface SearchResult {
  items: ComparisonHit[];
  total: number;
  papers: number;
  page: number;
  perPage: number;
  pages: number;
  sort: string;
  facets: Facets;
}

export function search(index: CorpusIndex, options: SearchOptions & { paging: Paging }): SearchResult {
  const evaluation = evaluate(index, options);
  const rows = pageRows(index, evaluation.matched, options.paging);
  return {
    items: rows.map((row) => hitAt(index, row, evaluation.codeSet)),
    total: evaluation.total,
    papers: evaluation.papers,
    page: options.paging.page,
    perPage: options.paging.perPage,
    pages: Math.max(1, Math.ceil(evaluation.total / options.paging.perPage)),
    sort: options.paging.sort,
    facets: evaluation.facets,
  };
}

/**
 * The comparison and paper ids of every result (for exports), in id order; `complete` is true when the
 * results hold every comparison of those papers (an export can then select by paper alone).
 */
export function matchedIds(index: CorpusIndex, options: SearchOptions): { comparisonIds: number[]; paperIds: number[]; complete: boolean } {
  const { matched } = evaluate(index, options);
  const comparisonIds: number[] = [];
  const paperIds: number[] = [];
  let complete = true;
  for (let p = 0; p < index.papers.length; p += 1) {
    let some = false;
    let all = true;
    for (let row = index.paperRowStart[p]; row < index.paperRowStart[p + 1]; row += 1) {
      if (matched[row] === 1) {
        some = true;
        comparisonIds.push(index.comparisonId[row]);
      } else all = false;
    }
    if (some) paperIds.push(index.papers[p].id);
    if (some && !all) complete = false;
  }
  return { comparisonIds: comparisonIds.sort((a, b) => a - b), paperIds, complete };
}
