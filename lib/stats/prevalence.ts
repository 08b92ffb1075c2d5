import { FINDING_CATALOGUE, type FindingCode } from "@/lib/recheck/catalogue";
import { ESTIMATORS, METHODS, SEVERITIES } from "@/lib/recheck/types";
import { NONE, type CorpusIndex } from "@/lib/search/corpus-index";
import { proportion, type Proportion } from "./wilson";

// Prevalence of findings in a set of comparisons (DESIGN §6 Insights): the share of comparisons with
// each finding code, the share of papers with at least one error-level finding, and the same shares
// broken down by publication year, journal, estimator and method. Every share carries its Wilson 95 %
// interval. Papers count once each: a paper is in the set when at least one of its comparisons is, and
// "has an error" when an error-level finding sits on one of those comparisons. Findings on models that
// belong to no comparison are not counted (they are not comparisons).

export interface CodePrevalence {
  code: string;
  title: string;
  severity: string;
  comparisons: Proportion;
}

export interface GroupPrevalence {
  value: string | number;
  comparisons: number;
  /** comparisons with at least one error-level finding */
  withError: Proportion;
  /** comparisons with at least one error- or warning-level finding */
  flagged: Proportion;
  papers: Proportion;
}

export interface Prevalence {
  comparisons: number;
  papers: number;
  comparisonsWithError: Proportion;
  comparisonsFlagged: Proportion;
  /** k = papers with at least one error-level finding, n = papers */
  papersWithError: Proportion;
  codes: CodePrevalence[];
  byYear: GroupPrevalence[];
  byJournal: GroupPrevalence[];
  byEstimator: GroupPrevalence[];
  byMethod: GroupPrevalence[];
  /** per code, its share of comparisons in each publication year (the years of byYear) */
  trends: { code: string; byYear: { year: number; share: Proportion }[] }[];
}

const ERROR = SEVERITIES.indexOf("error");
const WARNING = SEVERITIES.indexOf("warning");

class Tally {
  comparisons = 0;
  withError = 0;
  flagged = 0;
  private readonly paperSeen = new Map<number, boolean>();
  add(paper: number, error: boolean, flagged: boolean) {
    this.comparisons += 1;
    if (error) this.withError += 1;
    if (flagged) this.flagged += 1;
    this.paperSeen.set(paper, (this.paperSeen.get(paper) ?? false) || error);
  }
  result(value: string | number): GroupPrevalence {
    let papersWithError = 0;
    for (const error of this.paperSeen.values()) if (error) papersWithError += 1;
    return {
      value,
      comparisons: this.comparisons,
      withError: proportion(this.withError, this.comparisons),
      flagged: proportion(this.flagged, this.comparisons),
      papers: proportion(papersWithError, this.paperSeen.size),
    };
  }
}

function tallyGroup<K extends string | number>(groups: Map<K, Tally>, key: K): Tally {
  let tally = groups.get(key);
  if (!tally) {
    tally = new Tally();
    groups.set(key, tally);
  }
  return tally;
}

export function computePrevalence(index: CorpusIndex, matched: Uint8Array): Prevalence {
  const all = new Tally();
  const byYear = new Map<number, Tally>();
  const byJournal = new Map<string, Tally>();
  const byEstimator = new Map<string, Tally>();
  const byMethod = new Map<string, Tally>();
  const codeCounts = new Float64Array(index.codes.length);
  const codeYear = new Map<number, Float64Array>();
  const seen = new Int32Array(index.codes.length).fill(-1);

  for (let row = 0; row < index.size; row += 1) {
    if (matched[row] === 0) continue;
    const p = index.paper[row];
    let error = false;
    let flagged = false;
    const year = index.paperYear[p];
    for (let f = index.flagStart[row]; f < index.flagStart[row + 1]; f += 1) {
      const severity = index.flagSeverity[f];
      if (severity === ERROR) error = true;
      if (severity === ERROR || severity === WARNING) flagged = true;
      const code = index.flagCode[f];
      if (seen[code] === row) continue;
      seen[code] = row;
      codeCounts[code] += 1;
      if (year !== NONE) {
        let perYear = codeYear.get(year);
        if (!perYear) codeYear.set(year, (perYear = new Float64Array(index.codes.length)));
        perYear[code] += 1;
      }
    }
    all.add(p, error, flagged);
    if (year !== NONE) tallyGroup(byYear, year).add(p, error, flagged);
    const journal = index.paperJournal[p];
    tallyGroup(byJournal, journal === NONE ? "(no journal)" : index.journals[journal]).add(p, error, flagged);
    for (let bits = index.estimators[row]; bits !== 0; bits &= bits - 1) tallyGroup(byEstimator, ESTIMATORS[31 - Math.clz32(bits & -bits)]).add(p, error, flagged);
    if (index.estimators[row] === 0) tallyGroup(byEstimator, "(not reported)").add(p, error, flagged);
    tallyGroup(byMethod, index.method[row] === NONE ? "(unknown)" : METHODS[index.method[row]]).add(p, error, flagged);
  }

  const overall = all.result("all");
  const years = [...byYear.keys()].sort((a, b) => a - b);
  const order = (list: readonly string[]) => (a: GroupPrevalence, b: GroupPrevalence) => list.indexOf(String(a.value)) - list.indexOf(String(b.value));
  const codes: CodePrevalence[] = index.codes.map((code, id) => {
    const entry = FINDING_CATALOGUE[code as FindingCode];
    return { code, title: entry?.title ?? code, severity: entry?.severity ?? "note", comparisons: proportion(codeCounts[id], all.comparisons) };
  });
  return {
    comparisons: all.comparisons,
    papers: overall.papers.n,
    comparisonsWithError: overall.withError,
    comparisonsFlagged: overall.flagged,
    papersWithError: overall.papers,
    codes,
    byYear: years.map((year) => byYear.get(year)!.result(year)),
    byJournal: [...byJournal].map(([journal, tally]) => tally.result(journal)).sort((a, b) => b.comparisons - a.comparisons || String(a.value).localeCompare(String(b.value))),
    byEstimator: [...byEstimator].map(([estimator, tally]) => tally.result(estimator)).sort(order([...ESTIMATORS, "(not reported)"])),
    byMethod: [...byMethod].map(([method, tally]) => tally.result(method)).sort(order([...METHODS, "(unknown)"])),
    trends: index.codes
      .map((code, id) => ({ code, id }))
      .filter(({ id }) => codeCounts[id] > 0)
      .map(({ code, id }) => ({ code, byYear: years.map((year) => ({ year, share: proportion(codeYear.get(year)?.[id] ?? 0, byYear.get(year)!.comparisons) })) })),
  };
}
