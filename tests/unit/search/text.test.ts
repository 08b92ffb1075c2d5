import { describe, expect, it } from "vitest";
import { allowedEdits, editDistance, queryTerms, tokenize, Vocabulary } from "@/lib/search/text";

describe("free-text matching", () => {
  it("splits text into lower-case words, folding accents", () => {
    expect(tokenize("Kettleby-Ørsted, Ängström & Müller (2019): CFA")).toEqual(["kettleby", "orsted", "angstrom", "muller", "2019", "cfa"]);
  });

  it("counts edits with adjacent swaps as one (optimal string alignment, Damerau 1964)", () => {
    expect(editDistance("invariance", "invariance", 2)).toBe(0);
    expect(editDistance("invarience", "invariance", 2)).toBe(1); // one substitution
    expect(editDistance("strcuture", "structure", 2)).toBe(1); // one transposition
    expect(editDistance("mediaton", "mediation", 2)).toBe(1); // one deletion
    expect(editDistance("kitten", "sitting", 3)).toBe(3); // the textbook Levenshtein example
    expect(editDistance("abc", "xyz123", 1)).toBe(2); // gives up past the limit
  });

  it("allows no slip in short words, one up to seven letters, two from eight", () => {
    expect([3, 4, 7, 8, 12].map(allowedEdits)).toEqual([0, 1, 1, 2, 2]);
  });

  it("expands a term to itself, the words it begins, and near spellings confirmed by edit distance", () => {
    const vocabulary = new Vocabulary(["factor", "factorial", "invariance", "variance", "measurement", "bifactor", "fact"]);
    const words = (term: string) => vocabulary.expand(term).words.map((id) => vocabulary.words[id]).sort();
    expect(words("fact")).toEqual(["fact", "factor", "factorial"]);
    expect(words("invarience")).toEqual(["invariance"]);
    expect(words("measurment")).toEqual(["measurement"]);
    expect(words("xyz")).toEqual([]);
    expect(vocabulary.expand("invarience").fuzzy).toBe(true);
    expect(vocabulary.expand("factor").fuzzy).toBe(false);
  });

  it("keeps a DOI in the query whole", () => {
    expect(queryTerms("see 10.5555/Bench.12, factor")).toEqual({ terms: ["see", "factor"], doi: "10.5555/bench.12" });
  });
});
