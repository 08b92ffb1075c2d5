import { describe, expect, it } from "vitest";
import { detectCitationFormat, formatCitation, parseCitations } from "@/lib/citations/cite";
import { cslToMetadata, formatName, parseAuthorLines, parseName } from "@/lib/citations/csl";

// BibTeX and RIS through citation-js (plugin-bibtex, plugin-ris 0.7), as the new-paper form uses them.
// The records are invented; the expected names follow the BibTeX name rules ("von Last, First": a
// lower-case particle stays apart from the family name) and the RIS AU tag ("Last, First").

const BIBTEX = String.raw`@article{vanderberg2019,
  author    = {van der Berg, Anna and M{\"u}ller, J{\"o}rg and de la Cruz, Mar{\'i}a and Nguy{\~\ecircumflex}n, Van},
  title     = {Measurement invariance of the {Big Five} across three cohorts},
  journal   = {Journal of Imaginary Methods},
  year      = {2019},
  volume    = {12},
  number    = {3},
  pages     = {401--419},
  doi       = {10.5555/JIM.2019.12}
}`;

const RIS = `TY  - JOUR
AU  - Øvergaard, Siri
AU  - von Trapp, Maria
AU  - Nguyễn, Văn An
TI  - Scaled difference tests in practice
JO  - Methods Quarterly
PY  - 2021
VL  - 7
IS  - 2
SP  - 11
EP  - 29
DO  - 10.5555/mq.2021.7
ER  - 
`;

describe("BibTeX", () => {
  it("reads particles, diacritics written as TeX accents and several authors", async () => {
    const outcome = await parseCitations(BIBTEX);
    expect(outcome.ok).toBe(true);
    if (!outcome.ok) return;
    const [item] = outcome.items;
    expect(item.author?.slice(0, 3)).toEqual([
      { given: "Anna", family: "Berg", "non-dropping-particle": "van der" },
      { given: "Jörg", family: "Müller" },
      { given: "María", family: "Cruz", "non-dropping-particle": "de la" },
    ]);
    const metadata = cslToMetadata(item);
    expect(metadata).toMatchObject({ doi: "10.5555/jim.2019.12", title: "Measurement invariance of the Big Five across three cohorts", journal: "Journal of Imaginary Methods", year: "2019", volume: "12", issue: "3", pages: "401–419" });
    expect(metadata.authors.split("\n").slice(0, 3)).toEqual(["van der Berg, Anna", "Müller, Jörg", "de la Cruz, María"]);
  });

  it("refuses text that does not parse, with a message", async () => {
    const outcome = await parseCitations("@article{broken, title = {An unclosed brace");
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) expect(outcome.message).toMatch(/BibTeX text could not be read/);
  });

  it("refuses text that is neither format", async () => {
    const outcome = await parseCitations("Just a title, pasted on its own");
    expect(outcome).toMatchObject({ ok: false });
  });
});

describe("RIS", () => {
  it("reads several authors with non-ASCII letters and a particle", async () => {
    const outcome = await parseCitations(RIS);
    expect(outcome.ok).toBe(true);
    if (!outcome.ok) return;
    const metadata = cslToMetadata(outcome.items[0]);
    expect(metadata.authors.split("\n")).toEqual(["Øvergaard, Siri", "von Trapp, Maria", "Nguyễn, Văn An"]);
    expect(metadata).toMatchObject({ doi: "10.5555/mq.2021.7", title: "Scaled difference tests in practice", journal: "Methods Quarterly", year: "2021", pages: "11–29" });
  });

  it("is recognised by its TY tag", () => {
    expect(detectCitationFormat(RIS)).toBe("ris");
    expect(detectCitationFormat(BIBTEX)).toBe("bibtex");
  });
});

describe("author lines", () => {
  it("read back what formatName writes, particles included", () => {
    const names = [{ family: "Berg", given: "Anna", "non-dropping-particle": "van der" }, { family: "Øvergaard", given: "Siri" }, { literal: "Fitledger Consortium" }];
    expect(parseAuthorLines(names.map(formatName).join("\n"))).toEqual(names);
  });

  it("take 'Given Family' too", () => {
    expect(parseName("Ludwig van Beethoven")).toEqual({ given: "Ludwig", family: "Beethoven", "non-dropping-particle": "van" });
  });
});

describe("APA formatting", () => {
  it("formats a journal article with its DOI link (citation-js APA template)", () => {
    const text = formatCitation({ id: "x", type: "article-journal", title: "Scaled difference tests in practice", author: [{ family: "Øvergaard", given: "Siri" }, { family: "Trapp", given: "Maria", "non-dropping-particle": "von" }], "container-title": "Methods Quarterly", issued: { "date-parts": [[2021]] }, volume: "7", issue: "2", page: "11-29", DOI: "10.5555/mq.2021.7" });
    expect(text).toBe("Øvergaard, S., & von Trapp, M. (2021). Scaled difference tests in practice. Methods Quarterly, 7(2), 11–29. https://doi.org/10.5555/mq.2021.7");
  });
});
