// The sheet writer: catalogue-order header, RFC 4180 quoting, the formula escape, and export → import
// giving back exactly the cells that went out.
import { describe, expect, it } from "vitest";
import { SHEET_COLUMNS, csvLine, emptyRecord, escapeFormula, formatCell, sheetHeaderLine, writeSheet, type SheetRecord } from "@/lib/csv";
import { readAll } from "./sheet-input";

function record(parts: Partial<SheetRecord>): SheetRecord {
  return { ...emptyRecord(), ...parts };
}

describe("the sheet writer", () => {
  it("writes the header in catalogue order with every §5 column once", () => {
    const names = sheetHeaderLine().trimEnd().split(",");
    expect(names).toEqual(SHEET_COLUMNS.map((c) => c.name));
    expect(names.slice(0, 3)).toEqual(["doi", "paper_ref", "title"]);
    expect(new Set(names).size).toBe(names.length);
  });

  it("ends every line with CRLF and quotes only cells that hold a quote, delimiter or line break (RFC 4180 §2)", () => {
    expect(csvLine(["plain", "a,b", 'say "hi"', "two\nlines", "x;y", ""])).toBe('plain,"a,b","say ""hi""","two\nlines","x;y",\r\n');
  });

  it("prefixes an apostrophe to cells starting with =, +, -, @, tab or carriage return (OWASP CSV injection)", () => {
    expect(["=SUM(A1)", "+cmd", "-x", "@A1", "\tx", "\rx"].map(escapeFormula)).toEqual(["'=SUM(A1)", "'+cmd", "'-x", "'@A1", "'\tx", "'\rx"]);
  });

  it("leaves plain decimal numbers such as -0.012 alone, because a number cannot be a formula", () => {
    expect(["-0.012", "+.5", "-1.2e-3", "-3", "0.05"].map(escapeFormula)).toEqual(["-0.012", "+.5", "-1.2e-3", "-3", "0.05"]);
    expect(escapeFormula("-1+2")).toBe("'-1+2");
  });

  it("escapes a cell that already starts with apostrophes before a trigger once more, so it reads back unchanged", () => {
    expect(escapeFormula("'=x")).toBe("''=x");
    expect(formatCell("'ok")).toBe("'ok");
  });

  it("escapes before quoting, so the apostrophe sits inside the quotes", () => {
    expect(formatCell("=HYPERLINK(\"x\")")).toBe('"\'=HYPERLINK(""x"")"');
  });
});

describe("export → import round trip", () => {
  const tricky: SheetRecord[] = [
    record({
      paper: { doi: "10.5555/round.trip", title: 'Fit, "misfit" and\nmore', year: "2020", authors: "Quill, Ada; Marsh, Tobias" },
      sample: { label: "Wave 1", n: "0301", groups: "1" },
      comparison: { label: "=1+1", method: "lrt", dChisq: "-0.012", dP: "< .001", notes: "@mention\r\nsecond line", location: "+Table 2" },
      restricted: { label: "-A", chisq: "9.20", df: "27", p: ".000", rmsea: "'-x" },
      free: { label: "\tB", chisq: "-2.1e-45", cfi: "'=kept", estimator: "MLR" },
    }),
    record({
      paper: { paperRef: "quill-2020;a" },
      sample: { label: "Sample 1", groups: "2" },
      comparison: { label: "C2", method: "invariance", dCfi: "-.010" },
      restricted: { label: "Metric" },
      free: { label: "Configural" },
    }),
  ];

  it("reads back exactly the cells that were written, formula escapes and all", async () => {
    const text = [...writeSheet(tricky)].join("");
    const rows = await readAll(text);
    expect(rows.map(({ row: _row, problems, ...rest }) => ({ row: _row, problems, record: rest }))).toEqual(
      tricky.map((r, i) => ({ row: i + 1, problems: [], record: r })),
    );
  });

  it("reads back the same cells when the written sheet arrives in small chunks", async () => {
    const text = [...writeSheet(tricky)].join("");
    const whole = await readAll(text);
    expect(await readAll(text, 5)).toEqual(whole);
  });
});
