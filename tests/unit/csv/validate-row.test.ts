// Per-row validation: the sheet's own rules, and the engine's reading of every figure named by its column.
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { WHOLE_ROW, checkSheetRow, normaliseDoi, suggestColumn, toComparisonInput, validateSheetRow } from "@/lib/csv";
import { MINIMAL_HEADER, readAll } from "./sheet-input";

const TODAY = new Date("2026-06-01T00:00:00Z");

async function only(line: string, header = MINIMAL_HEADER) {
  const [row] = await readAll(`${header}\n${line}\n`);
  return row;
}

describe("sheet-level checks", () => {
  it("asks for a DOI or a paper_ref when a row has neither", async () => {
    const row = await only(",,C1,lrt,A,B", "doi,paper_ref,comparison,method,a_label,b_label");
    expect(checkSheetRow(row, TODAY)).toEqual([{ column: "doi", message: "the paper needs a DOI, or a paper_ref when it has none" }]);
  });

  it("refuses a DOI that is not 10.NNNN/suffix", async () => {
    const row = await only("doi:11.5555/x,C1,lrt,A,B");
    expect(checkSheetRow(row, TODAY)).toEqual([
      { column: "doi", message: '"doi:11.5555/x" is not a DOI (expected 10.NNNN/…, such as 10.5555/demo.17)' },
    ]);
  });

  it("normalises the resolver prefixes people paste (doi.org URLs, dx.doi.org, doi:) and lower-cases", () => {
    expect(normaliseDoi("https://doi.org/10.5555/AbC")).toBe("10.5555/abc");
    expect(normaliseDoi("http://dx.doi.org/10.5555/x.1")).toBe("10.5555/x.1");
    expect(normaliseDoi(" doi: 10.5555/X ")).toBe("10.5555/x");
    expect(normaliseDoi("10.12/x")).toBeUndefined();
    expect(normaliseDoi("10.5555/has space")).toBeUndefined();
  });

  it("accepts a four-digit year from 1900 to next year and refuses anything else", async () => {
    const header = `${MINIMAL_HEADER},year`;
    expect(checkSheetRow(await only("10.5555/t.1,C1,lrt,A,B,2027", header), TODAY)).toEqual([]);
    for (const year of ["2028", "1899", "20.5", "'99", "2019a"]) {
      const errors = checkSheetRow(await only(`10.5555/t.1,C1,lrt,A,B,${year}`, header), TODAY);
      expect(errors.map((e) => e.column)).toEqual(["year"]);
    }
  });

  it("requires the comparison label and both model labels in every row", async () => {
    const errors = checkSheetRow(await only("10.5555/t.1,, lrt ,,"), TODAY);
    expect(errors.map((e) => e.column)).toEqual(["comparison", "a_label", "b_label"]);
  });

  it("refuses two models with the same label, which would import as one model", async () => {
    const errors = checkSheetRow(await only("10.5555/t.1,C1,lrt,Metric,Metric"), TODAY);
    expect(errors).toEqual([{ column: "b_label", message: 'both models are labelled "Metric"; each model needs its own label' }]);
  });

  it("reports only the structural problem of a row with the wrong number of cells", async () => {
    const row = await only("10.5555/t.1,C1,lrt,A,B,surplus");
    expect(validateSheetRow(row, TODAY)).toEqual([{ column: WHOLE_ROW, message: "has 6 cells but the header has 5 columns" }]);
  });
});

describe("figures are judged by the engine and named by their sheet column", () => {
  it("reports bad cells with their row and column while the other rows still come through", async () => {
    const file = new URL("../../fixtures/sheets/with-bad-cells.csv", import.meta.url);
    const rows = await readAll(readFileSync(file));
    expect(rows.map((r) => r.row)).toEqual([1, 2, 3]);
    const errors = rows.map((r) => validateSheetRow(r, TODAY));
    expect(errors[0]).toEqual([]);
    expect(errors[2]).toEqual([]);
    expect(errors[1].map((e) => e.column).sort()).toEqual(["a_chisq", "a_df"]);
  });

  it("does not repeat the engine's error on a column the sheet check already named", async () => {
    const errors = validateSheetRow(await only("10.5555/t.1,C1,,A,B"), TODAY);
    expect(errors.filter((e) => e.column === "method")).toHaveLength(1);
  });
});

describe("toComparisonInput", () => {
  it("hands the engine the comparison's figures, the sample and both models, without location and notes", async () => {
    const row = await only(
      "10.5555/t.1,C1,lrt,A,B,Table 2,checked twice,301,27,24",
      `${MINIMAL_HEADER},location,notes,n,a_df,b_df`,
    );
    const input = toComparisonInput(row);
    expect(input).toMatchObject({ label: "C1", method: "lrt", sample: { n: "301", label: "Sample 1", groups: "1" } });
    expect(input.restricted).toEqual({ label: "A", df: "27" });
    expect(input.free).toEqual({ label: "B", df: "24" });
    expect(Object.keys(input)).not.toContain("location");
    expect(Object.keys(input)).not.toContain("notes");
  });
});

describe("column suggestions", () => {
  it("reads spaces and hyphens as underscores and finds the column within a few edits", () => {
    expect(suggestColumn("A Chisq")).toBe("a_chisq");
    expect(suggestColumn("b-rmsea-lo")).toBe("b_rmsea_lo");
    expect(suggestColumn("d_chsq")).toBe("d_chisq");
    expect(suggestColumn("methd")).toBe("method");
    // a swap of two neighbouring letters counts as one edit (Damerau 1964)
    expect(suggestColumn("a_rmsae")).toBe("a_rmsea");
  });

  it("suggests nothing when no column is within a third of the name's length in edits", () => {
    expect(suggestColumn("zzzz")).toBeUndefined();
    // "invariance" is 8 edits from "invariance_claimed": too far to guess
    expect(suggestColumn("invariance")).toBeUndefined();
  });
});
