import Fuse from "fuse.js";

// Free text over titles, authors, journals, DOIs and model labels, tolerant of small typos. Fuzzing
// every record with fuse.js cannot meet the search target (STACK.md: ~5 s over 100 000 records), so the
// typo tolerance works on the vocabulary instead: each query term that is not a known word is matched
// with fuse.js against the known words of about its length, each candidate is confirmed by its edit
// distance, and the resulting words are looked up in an inverted index (word → papers, word → rows).

/** Lower-case words of letters and digits, accents folded: "Kettleby-Ørsted, 2019" → kettleby, ørsted→orsted, 2019 */
export function tokenize(text: string): string[] {
  return text
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .replace(/ø/gi, "o")
    .replace(/æ/gi, "ae")
    .replace(/ß/g, "ss")
    .toLowerCase()
    .split(/[^a-z0-9]+/)
    .filter(Boolean);
}

/**
 * Optimal string alignment distance (Levenshtein plus adjacent transpositions; Damerau 1964), giving
 * up as soon as the distance must exceed `limit` (then `limit + 1` is returned).
 */
export function editDistance(a: string, b: string, limit: number): number {
  if (Math.abs(a.length - b.length) > limit) return limit + 1;
  const width = b.length + 1;
  let before = new Array<number>(width).fill(0);
  let previous = Array.from({ length: width }, (_, j) => j);
  let current = new Array<number>(width).fill(0);
  for (let i = 1; i <= a.length; i += 1) {
    current[0] = i;
    let rowMin = current[0];
    for (let j = 1; j <= b.length; j += 1) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let value = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) value = Math.min(value, before[j - 2] + 1);
      current[j] = value;
      if (value < rowMin) rowMin = value;
    }
    if (rowMin > limit) return limit + 1;
    [before, previous, current] = [previous, current, before];
  }
  return previous[b.length];
}

/** How many typing slips a word of this length may carry and still count as that word. */
export function allowedEdits(length: number): number {
  if (length < 4) return 0;
  return length < 8 ? 1 : 2;
}

export interface TermExpansion {
  term: string;
  /** vocabulary word ids the term stands for (itself, longer words it begins, near spellings) */
  words: number[];
  /** true when the term itself is not a known word and near spellings were used */
  fuzzy: boolean;
}

/** The known words, sorted, with fuse.js searchers built per word length on first use. */
export class Vocabulary {
  readonly words: string[];
  private readonly idOf = new Map<string, number>();
  private readonly byLength = new Map<number, number[]>();
  private readonly searchers = new Map<number, Fuse<string>>();
  private readonly cache = new Map<string, TermExpansion>();

  constructor(words: Iterable<string>) {
    this.words = [...new Set(words)].sort();
    this.words.forEach((word, id) => {
      this.idOf.set(word, id);
      const bucket = this.byLength.get(word.length);
      if (bucket) bucket.push(id);
      else this.byLength.set(word.length, [id]);
    });
  }

  get size(): number {
    return this.words.length;
  }

  id(word: string): number | undefined {
    return this.idOf.get(word);
  }

  /** Builds every length's searcher now (index build time) instead of on a reader's first typo. */
  prepare(): void {
    for (const length of this.byLength.keys()) if (length >= 3) this.searcher(length);
  }

  /** ids of the words that begin with `prefix` (the list is sorted, so they are one run) */
  private prefixed(prefix: string): number[] {
    let low = 0;
    let high = this.words.length;
    while (low < high) {
      const middle = (low + high) >>> 1;
      if (this.words[middle] < prefix) low = middle + 1;
      else high = middle;
    }
    const ids: number[] = [];
    for (let id = low; id < this.words.length && this.words[id].startsWith(prefix); id += 1) ids.push(id);
    return ids;
  }

  private searcher(length: number): Fuse<string> | undefined {
    const bucket = this.byLength.get(length);
    if (!bucket) return undefined;
    let searcher = this.searchers.get(length);
    if (!searcher) {
      // ignoreLocation: a slip may sit anywhere in the word; the threshold is generous because the
      // edit distance below has the last word.
      searcher = new Fuse(bucket.map((id) => this.words[id]), { includeScore: false, ignoreLocation: true, threshold: 0.45, shouldSort: false, isCaseSensitive: true });
      this.searchers.set(length, searcher);
    }
    return searcher;
  }

  /** The words a query term stands for; remembered, since the same terms come back. */
  expand(term: string): TermExpansion {
    const remembered = this.cache.get(term);
    if (remembered) return remembered;
    const words = new Set<number>();
    const exact = this.idOf.get(term);
    if (exact !== undefined) words.add(exact);
    // A short term also finds the words it begins ("fact" → factor, factorial); one letter would match too much.
    if (term.length >= 3 || /^\d+$/.test(term)) for (const id of this.prefixed(term)) words.add(id);
    let fuzzy = false;
    const edits = allowedEdits(term.length);
    if (exact === undefined && edits > 0) {
      fuzzy = true;
      for (let length = term.length - edits; length <= term.length + edits; length += 1) {
        const searcher = this.searcher(length);
        if (!searcher) continue;
        const bucket = this.byLength.get(length)!;
        for (const result of searcher.search(term)) {
          const id = bucket[result.refIndex];
          if (editDistance(term, this.words[id], edits) <= edits) words.add(id);
        }
      }
    }
    const expansion = { term, words: [...words], fuzzy };
    if (this.cache.size > 5000) this.cache.clear();
    this.cache.set(term, expansion);
    return expansion;
  }
}

/** A query split into terms; a DOI in the query is kept whole as well, to match a paper's DOI exactly. */
export function queryTerms(query: string): { terms: string[]; doi?: string } {
  const doiMatch = /\b(10\.\d{4,9}\/\S+)/i.exec(query);
  const doi = doiMatch ? doiMatch[1].replace(/[.,;]+$/, "").toLowerCase() : undefined;
  const rest = doi ? query.replace(doiMatch![0], " ") : query;
  return { terms: [...new Set(tokenize(rest))], doi };
}
