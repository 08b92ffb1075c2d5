import { describe, expect, it } from "vitest";
import { splitPastedTable } from "@/components/model-grid";
import { figureColumns } from "@/lib/curation/figure-columns";
import { liveRecheck } from "@/lib/curation/live";
import { makeRef, metadataColumns } from "@/lib/curation/metadata";
import { paperMetadataSchema } from "@/lib/validation/curation";

// The entry form's pure parts: the live recheck on rows as typed, the paste splitter of the model grid,
// printed text → stored columns, and form metadata → Paper columns.

const sample = { key: "s1", label: "Sample 1", n: "412", groups: "1" };
const metric = { key: "m1", sampleKey: "s1", label: "Metric", chisq: "61.30", df: "24" };
const configural = { key: "m2", sampleKey: "s1", label: "Configural", chisq: "48.20", df: "20" };

describe("liveRecheck", () => {
  it("raises df-difference-mismatch for a Δdf of 3 between df 24 and 20 (24 − 20 = 4)", () => {
    const [result] = liveRecheck({ samples: [sample], models: [metric, configural], comparisons: [{ key: "c1", label: "Metric vs configural", restrictedKey: "m1", freeKey: "m2", method: "lrt", nested: "yes", dChisq: "13.10", dDf: "3" }] });
    expect(result.owner).toBe("c:c1");
    expect(result.findings.map((finding) => finding.code)).toContain("df-difference-mismatch");
  });

  it("raises nothing about Δdf once it is 4", () => {
    const [result] = liveRecheck({ samples: [sample], models: [metric, configural], comparisons: [{ key: "c1", label: "Metric vs configural", restrictedKey: "m1", freeKey: "m2", method: "lrt", nested: "yes", dChisq: "13.10", dDf: "4" }] });
    expect(result.findings.map((finding) => finding.code)).not.toContain("df-difference-mismatch");
  });

  it("reports unreadable cells instead of findings, and rechecks models outside comparisons on their own", () => {
    const results = liveRecheck({ samples: [sample], models: [{ ...metric, chisq: "lots" }, configural], comparisons: [] });
    expect(results.map((result) => result.owner)).toEqual(["m:m1", "m:m2"]);
    expect(results[0].unreadable.length).toBe(1);
    expect(results[1].unreadable).toEqual([]);
  });

  it("skips a comparison until both of its models are chosen", () => {
    expect(liveRecheck({ samples: [sample], models: [metric], comparisons: [{ key: "c1", restrictedKey: "m1", freeKey: "" }] }).map((result) => result.owner)).toEqual(["m:m1"]);
  });
});

describe("splitPastedTable", () => {
  it("splits tab-separated cells (a spreadsheet copy) and keeps decimals as text", () => {
    expect(splitPastedTable("Configural\t48.20\t20\r\nMetric\t61.30\t24\r\n")).toEqual([
      ["Configural", "48.20", "20"],
      ["Metric", "61.30", "24"],
    ]);
  });

  it("splits on runs of spaces when there is no tab (a PDF copy)", () => {
    expect(splitPastedTable("  61.30   24  .000 ")).toEqual([["61.30", "24", ".000"]]);
  });
});

describe("figureColumns", () => {
  it("stores the printed text and its value; a printed relation keeps its text", () => {
    expect(figureColumns({ chisq: "9.20", p: "< .001", df: "" }, ["chisq", "p", "df"])).toEqual({ chisqText: "9.20", chisq: 9.2, pText: "< .001", p: 0.001, dfText: null, df: null });
  });
});

describe("metadataColumns and makeRef", () => {
  it("turns the form's author lines into CSL names and blanks into nulls", () => {
    const columns = metadataColumns(paperMetadataSchema.parse({ title: " A paper ", authors: "van der Berg, Anna\nØvergaard, Siri", year: "2019", doi: "https://doi.org/10.5555/ABC" }));
    expect(columns).toMatchObject({ title: "A paper", doi: "10.5555/abc", year: 2019, journal: null, authors: [{ family: "Berg", given: "Anna", "non-dropping-particle": "van der" }, { family: "Øvergaard", given: "Siri" }] });
  });

  it("makes a curator reference from the first author and year", () => {
    expect(makeRef({ authors: [{ family: "Øvergaard", given: "Siri" }], year: 2019 }, () => 0.5)).toMatch(/^overgaard2019-[0-9a-z]{4}$/);
    expect(makeRef({ authors: [], year: null }, () => 0)).toBe("paper-0000");
  });
});
