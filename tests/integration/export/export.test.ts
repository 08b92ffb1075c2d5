import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";
import { papersToBibtex, papersToRis, streamBibtexExport, streamJsonExport, streamRisExport, streamSheetExport, type ExportSelection } from "@/lib/export";
import { Comparison, FitModel, Paper, Sample } from "@/models";
import { createAccount, importSheet } from "../import/support";

// The export library against a real database: visibility by scope, the sheet's round trip through the
// importer (every printed figure back as it was), formula escaping, JSON, BibTeX and RIS.
const several = fs.readFileSync(new URL("../../../imports/example-several-papers.csv", import.meta.url), "utf8");
const invariance = fs.readFileSync(new URL("../../../imports/example-invariance-steps.csv", import.meta.url), "utf8");

async function collect(lines: AsyncGenerator<string>): Promise<string> {
  let text = "";
  for await (const line of lines) text += line;
  return text;
}

/** Every stored entry in a form that does not depend on ids or times. */
async function snapshot() {
  const papers = await Paper.findAll({ order: [["doi", "ASC"], ["ref", "ASC"]] });
  const out = [];
  for (const paper of papers) {
    const samples = await Sample.findAll({ where: { paperId: paper.id }, order: [["label", "ASC"]], raw: true });
    const models = await FitModel.findAll({ where: { paperId: paper.id }, order: [["label", "ASC"]], raw: true });
    const comparisons = await Comparison.findAll({ where: { paperId: paper.id }, order: [["label", "ASC"]], raw: true });
    const label = new Map(models.map((m) => [m.id, m.label]));
    // ids and times differ between two databases; model references are compared by label
    const strip = (row: Record<string, unknown>) => {
      const rest: Record<string, unknown> = {};
      for (const [key, value] of Object.entries(row)) if (!["id", "paperId", "sampleId", "createdAt", "updatedAt", "restrictedModelId", "freeModelId"].includes(key)) rest[key] = value;
      if (row.restrictedModelId !== undefined) return { ...rest, restricted: label.get(row.restrictedModelId as number), free: label.get(row.freeModelId as number) };
      return rest;
    };
    out.push({
      paper: { doi: paper.doi, ref: paper.ref, title: paper.title, authors: paper.authors, journal: paper.journal, year: paper.year, field: paper.field },
      samples: samples.map((s) => strip(s as unknown as Record<string, unknown>)),
      models: models.map((m) => strip(m as unknown as Record<string, unknown>)),
      comparisons: comparisons.map((c) => strip(c as unknown as Record<string, unknown>)),
    });
  }
  return out;
}

let database: TestDatabase;
let coder: number;
let other: number;
let exported = "";
let before: Awaited<ReturnType<typeof snapshot>>;

beforeAll(async () => {
  database = await createTestDatabase();
  coder = await createAccount("exporter@export.test");
  other = await createAccount("other@export.test");
  await importSheet(coder, several);
  // a title a spreadsheet would run as a formula, to see the writer escape it and the reader undo it
  await importSheet(other, invariance.replaceAll("Measurement invariance of an invented wellbeing scale across three regions", "=HYPERLINK(\"x\")"));
  await Paper.update({ state: "verified" }, { where: { doi: "10.5555/fitledger-import.inv2022" }, validate: false });
});
afterAll(async () => {
  await database.destroy();
});

describe("scope", () => {
  it("public: verified entries only", async () => {
    const csv = await collect(streamSheetExport({ scope: "public" }));
    const rows = csv.split("\r\n").filter(Boolean);
    expect(rows).toHaveLength(1 + 3);
    expect(rows.slice(1).every((row) => row.startsWith("10.5555/fitledger-import.inv2022,"))).toBe(true);
  });

  it("an owner: that contributor's own entries, drafts included, and no one else's", async () => {
    const csv = await collect(streamSheetExport({ scope: { ownerId: coder } }));
    expect(csv.split("\r\n").filter(Boolean)).toHaveLength(1 + 4);
    expect(csv).not.toContain("inv2022");
  });

  it("a filter narrows the selection, and the page size does not change the output", async () => {
    const selection: ExportSelection = { scope: { ownerId: coder }, comparisonWhere: { method: "lrt" } };
    const csv = await collect(streamSheetExport(selection));
    expect(csv.split("\r\n").filter(Boolean)).toHaveLength(1 + 2);
    expect(await collect(streamSheetExport({ scope: { ownerId: coder }, pageSize: 1 }))).toBe(await collect(streamSheetExport({ scope: { ownerId: coder } })));
  });
});

describe("sheet", () => {
  it("escapes a cell that starts like a formula", async () => {
    const csv = await collect(streamSheetExport({ scope: "public" }));
    expect(csv).toContain(`"'=HYPERLINK(""x"")"`);
  });

  it("imports back into an empty database as the same entries, every printed figure as it was", async () => {
    exported = await collect(streamSheetExport({ scope: { ownerId: coder } }));
    exported += (await collect(streamSheetExport({ scope: { ownerId: other } }))).split("\r\n").slice(1).join("\r\n");
    before = await snapshot();
    expect(before.length).toBe(3);
    await database.destroy();
    database = await createTestDatabase();
    const importer = await createAccount("round-trip@export.test");
    const batch = await importSheet(importer, exported);
    expect(batch.status).toBe("committed");
    expect(batch.rejectedRows).toBe(0);
    expect(await snapshot()).toEqual(before);
    // and once more: nothing changes
    const again = await importSheet(importer, exported);
    expect(again.progress).toMatchObject({ new: 0, updated: 0, unchanged: 7 });
  });
});

describe("JSON, BibTeX and RIS", () => {
  it("JSON: the caution, one object per comparison with its flags and who coded it", async () => {
    const json = JSON.parse(await collect(streamJsonExport({ scope: { ownerId: (await Paper.findOne())!.createdBy } })));
    expect(json.caution).toMatch(/not evidence of misconduct/);
    expect(json.comparisons).toHaveLength(7);
    const wlsmv = json.comparisons.find((c: { comparison: { label: string } }) => c.comparison.label === "Correlated vs bifactor");
    expect(wlsmv.paper).toMatchObject({ ref: "quill-2024-preprint", codedBy: "round-trip", state: "draft" });
    expect(wlsmv.restricted).toMatchObject({ label: "Correlated factors", estimator: "WLSMV", chisqScaled: "131.95" });
    expect(wlsmv.flags.map((f: { code: string }) => f.code)).toContain("unscaled-robust-difference");
  });

  it("BibTeX and RIS of the selected papers, through citation-js", async () => {
    const scope = { ownerId: (await Paper.findOne())!.createdBy };
    const bibtex = await collect(streamBibtexExport({ scope }));
    expect(bibtex).toMatch(/@article\{/);
    expect(bibtex).toContain("10.5555/fitledger-import.cfa2019");
    // citation-js protects the capital after a question mark: {An}
    expect(bibtex).toContain("title = {Two or three facets? {An} invented test of reading motivation}");
    const ris = await collect(streamRisExport({ scope }));
    expect(ris).toMatch(/TY {2}- JOUR/);
    expect(ris).toContain("DO  - 10.5555/fitledger-import.inv2022");
    expect((ris.match(/^TY {2}- /gm) ?? []).length).toBe(3);
  });

  it("papersToBibtex and papersToRis format plain paper records", () => {
    const paper = { id: 9, doi: "10.5555/x.9", ref: null, title: "An invented title", authors: [{ family: "Vell", given: "Nora" }], journal: "Invented Review of Assessment", year: 2020, volume: "4", issue: "2", pages: "11-19", csl: null };
    expect(papersToBibtex([paper])).toMatch(/author = \{Vell, Nora\}/);
    expect(papersToRis([paper])).toMatch(/AU {2}- Vell, Nora/);
  });
});
