// buildRow (lib/csv/sheet-row.ts) writes each part as an object literal that names every field, and
// takes each field's cell by an index worked out from the header: the literals must list the catalogue's
// fields in its order, and every column must land in its own field, whatever order the header has.
import { describe, expect, it } from "vitest";
import { SHEET_COLUMNS, checkSheetRow, normaliseDoi, recordPart, resolveHeader, type SheetRow } from "@/lib/csv";
import { PART_ORDER } from "@/lib/csv/columns";
import { PART_FIELDS, buildRow } from "@/lib/csv/sheet-row";
import { readAll } from "./sheet-input";

const NO_PROBLEMS: never[] = [];

describe("buildRow", () => {
  it("gives every part all of its catalogue fields, in catalogue order, whichever columns the sheet has", () => {
    const layout = resolveHeader(["doi", "comparison", "method", "a_label", "b_label"]);
    const row = buildRow(layout, ["10.5555/x", "C1", "lrt", "A", "B"], 1, NO_PROBLEMS);
    for (const part of PART_ORDER) {
      const catalogue = SHEET_COLUMNS.filter((c) => c.part === part).map((c) => c.key);
      expect(PART_FIELDS[part]).toEqual(catalogue);
      expect(Object.keys(recordPart(row, part))).toEqual(catalogue);
    }
    expect(Object.keys(row)).toEqual(["row", "problems", "paper", "sample", "comparison", "restricted", "free"]);
  });

  it("puts each column's cell into its own field, with the header in reverse catalogue order", () => {
    // every cell holds its own column's name, so a cell in the wrong field shows at once
    const columns = [...SHEET_COLUMNS].reverse();
    const layout = resolveHeader(columns.map((c) => c.name));
    const row = buildRow(layout, columns.map((c) => `v_${c.name}`), 7, NO_PROBLEMS);
    for (const column of SHEET_COLUMNS) {
      const value = recordPart(row, column.part)[column.key];
      // the DOI cell is normalised (not a DOI here, so kept as it is)
      expect(value, column.name).toBe(`v_${column.name}`);
    }
    expect(row.row).toBe(7);
  });

  it("leaves the fields of missing, empty and cut-off cells undefined, and fills the §5 defaults", async () => {
    const layout = resolveHeader(["doi", "comparison", "method", "a_label", "b_label", "a_chisq", "n", "sample"]);
    const row: SheetRow = buildRow(layout, ["10.5555/x", "C1", "lrt", "A", "", "'=1"], 2, NO_PROBLEMS);
    expect(row.free.label).toBeUndefined();
    expect(row.restricted.chisq).toBe("=1");
    expect(row.sample).toEqual({ label: "Sample 1", n: undefined, groups: "1" });
    expect(row.restricted.df).toBeUndefined();
    const [read] = await readAll("doi,comparison,method,a_label,b_label\nhttps://doi.org/10.5555/ABC,C1,lrt,A,B\n");
    expect(read.paper.doi).toBe("10.5555/abc");
  });

  it("normalises and checks each row's own DOI when rows repeat or change it (the last one is remembered)", () => {
    const layout = resolveHeader(["doi", "comparison", "method", "a_label", "b_label"]);
    const cells = ["10.5555/A", "10.5555/A", "https://doi.org/10.5555/A", "not a doi", "not a doi", "10.5555/b", "not a doi", " 10.5555/B ", "10.5555/A"];
    for (const [i, doi] of cells.entries()) {
      const row = buildRow(layout, [doi, "C1", "lrt", "A", "B"], i + 1, NO_PROBLEMS);
      expect(row.paper.doi, doi).toBe(normaliseDoi(doi) ?? doi);
      const doiErrors = checkSheetRow(row).filter((e) => e.column === "doi");
      expect(doiErrors.length, doi).toBe(normaliseDoi(doi) === undefined ? 1 : 0);
    }
  });
});
