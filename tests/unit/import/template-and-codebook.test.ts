import fs from "node:fs";
import { describe, expect, it } from "vitest";
import { SHEET_COLUMNS, readSheet } from "@/lib/csv";
import { IMPORT_FILES } from "@/lib/import/files";

// The template, the codebook and the example sheets in imports/ must describe the catalogue the reader
// uses (lib/csv/columns.ts), so they cannot drift apart.
const read = (name: string) => fs.readFileSync(new URL(`../../../imports/${name}`, import.meta.url), "utf8");

describe("imports/", () => {
  it("the template's header is the column catalogue, in catalogue order, and nothing else", () => {
    const lines = read("comparison-sheet-template.csv").split("\r\n");
    expect(lines[0].split(",")).toEqual(SHEET_COLUMNS.map((column) => column.name));
    expect(lines.slice(1).filter((line) => line !== "")).toEqual([]);
  });

  it("the codebook names every column of the catalogue", () => {
    const codebook = read("CODEBOOK.md");
    const missing = SHEET_COLUMNS.map((c) => c.name.replace(/^[ab]_/, "")).filter((name) => !codebook.includes(`\`${name}\``));
    expect(missing).toEqual([]);
  });

  it("every example sheet reads without a problem in any row", async () => {
    for (const file of IMPORT_FILES.filter((f) => f.name.startsWith("example-"))) {
      const rows = [];
      for await (const row of readSheet([new TextEncoder().encode(read(file.name))])) rows.push(row);
      expect(rows.length).toBeGreaterThan(2);
      expect(rows.flatMap((row) => row.problems)).toEqual([]);
      // invented scenario: every DOI under the test prefix 10.5555
      expect(rows.every((row) => row.paper.doi === undefined || row.paper.doi.startsWith("10.5555/"))).toBe(true);
    }
  });
});
