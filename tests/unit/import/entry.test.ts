import { describe, expect, it } from "vitest";
import { readSheet } from "@/lib/csv";
import { comparisonInput } from "@/lib/db/flags";
import { formatAuthors, parseAuthors } from "@/lib/import/authors";
import { comparisonRecord, modelRecord, readEntry, storedComparisonInput } from "@/lib/import/entry";
import { withoutErrorColumn } from "@/lib/import/error-column";
import type { Comparison, FitModel, Sample } from "@/models";

const encode = (text: string) => new TextEncoder().encode(text);

async function rowsOf(text: string) {
  const rows = [];
  for await (const row of readSheet([encode(text)])) rows.push(row);
  return rows;
}

async function text(source: AsyncIterable<Uint8Array>, ): Promise<string> {
  const parts: Uint8Array[] = [];
  for await (const part of source) parts.push(part);
  return new TextDecoder().decode(Buffer.concat(parts));
}

async function* pieces(value: string, size: number) {
  const bytes = encode(value);
  for (let at = 0; at < bytes.length; at += size) yield bytes.subarray(at, at + size);
}

const HEADER = "doi,sample,n,comparison,method,d_chisq,d_df,a_label,a_estimator,a_chisq,a_df,a_mean_structure,b_label,b_estimator,b_chisq,b_df";

describe("a sheet row's stored values", () => {
  it("keep each figure as printed (trimmed) and the choice cells in the engine's spelling", async () => {
    const [row] = await rowsOf(`${HEADER}\n10.5555/X.1,S,301,C1,LRT, 9.20 ,2,A,mlr,181.30,26,Yes,B,MLR,172.10,24\n`);
    const reading = readEntry(row);
    expect(reading.ok).toBe(true);
    if (!reading.ok) return;
    expect(reading.entry.paperKey).toBe("doi:10.5555/x.1");
    expect(reading.entry.comparison.method).toBe("lrt");
    expect(reading.entry.restricted.estimator).toBe("MLR");
    expect(reading.entry.restricted.meanStructure).toBe(true);
    const record = comparisonRecord(reading.entry.comparison) as Record<string, unknown>;
    expect(record.dChisqText).toBe("9.20");
    expect(record.dChisq).toBe(9.2);
    expect((modelRecord(reading.entry.restricted) as Record<string, unknown>).chisqText).toBe("181.30");
  });

  it("give the engine the same input a later flag rewrite builds from the stored rows (lib/db/flags)", async () => {
    const [row] = await rowsOf(`${HEADER}\n10.5555/x.1,S,301,C1,lrt,9.20,2,A,ML,181.30,26,no,B,ML,172.10,24\n`);
    const reading = readEntry(row);
    if (!reading.ok) throw new Error("row refused");
    const { entry } = reading;
    const fromStored = comparisonInput(
      comparisonRecord(entry.comparison) as unknown as Comparison,
      modelRecord(entry.restricted) as unknown as FitModel,
      modelRecord(entry.free) as unknown as FitModel,
      entry.sample as unknown as Sample,
    );
    expect(storedComparisonInput(entry)).toEqual(fromStored);
  });

  it("name every unreadable cell by its column and refuse the row", async () => {
    const [row] = await rowsOf(`${HEADER}\n10.5555/x.1,S,many,C1,lrt,nine,2,A,ML,181.30,26,no,B,ML,172.10,24\n`);
    const reading = readEntry(row);
    expect(reading.ok).toBe(false);
    if (reading.ok) return;
    expect(reading.errors.map((e) => e.column).sort()).toEqual(["d_chisq", "n"]);
  });

  it("note text cells that start like a spreadsheet formula, and keep them", async () => {
    const [row] = await rowsOf(`doi,comparison,method,notes,a_label,b_label\n10.5555/x.1,"=HYPERLINK(""http://example.test"")",lrt,-0.5,A,B\n`);
    const reading = readEntry(row);
    if (!reading.ok) throw new Error("row refused");
    expect(reading.notes).toHaveLength(1);
    expect(reading.notes[0]).toMatch(/^comparison starts with "="/);
    expect(reading.entry.comparison.label).toBe('=HYPERLINK("http://example.test")');
  });
});

describe("authors", () => {
  it("read 'Family, Given; …' and organisations, and write back the same text", () => {
    const names = parseAuthors("Quill, Ada; Marsh, Tobias J.; Invented Study Group");
    expect(names).toEqual([{ family: "Quill", given: "Ada" }, { family: "Marsh", given: "Tobias J." }, { literal: "Invented Study Group" }]);
    expect(formatAuthors(names)).toBe("Quill, Ada; Marsh, Tobias J.; Invented Study Group");
  });
});

describe("the rejected-rows error column", () => {
  const sheet = 'doi,comparison,method,a_label,b_label,error\r\n10.5555/x.1,"C, one",lrt,A,B,"row 1: a_chisq: ""x"" is not a number"\r\n10.5555/x.2,"multi\r\nline",ic,A,B,row 2: bad\r\n';

  it("is dropped from the header and every record, across any piece boundary", async () => {
    const expected = 'doi,comparison,method,a_label,b_label\r\n10.5555/x.1,"C, one",lrt,A,B\r\n10.5555/x.2,"multi\r\nline",ic,A,B\r\n';
    for (const size of [1, 3, 7, 64, 10_000]) expect(await text(withoutErrorColumn(pieces(sheet, size)))).toBe(expected);
  });

  it("leaves a sheet without it untouched, other unknown columns included", async () => {
    const other = "doi,comparison,method,a_label,b_label,eror\n10.5555/x.1,C,lrt,A,B,x\n";
    expect(await text(withoutErrorColumn(pieces(other, 5)))).toBe(other);
  });
});

describe("stored figure values", () => {
  it("follow the same rule as figureColumns (the curation forms and the demo seed)", async () => {
    const { figureColumns } = await import("@/lib/curation/figure-columns");
    const { MODEL_FIGURES } = await import("@/models/figures");
    const texts = ["9.20", "26", "< .001", "= .032", "p = .04", ".000", null, "-12.5", "1,024", "≥ .95", "abc", null, null, null, null, null, null, null, null, null];
    const record = modelRecord({ label: "A", estimator: "ML", meanStructure: null, texts });
    const expected = figureColumns(Object.fromEntries(MODEL_FIGURES.map((f, i) => [f, texts[i] ?? undefined]).filter(([, t]) => t !== undefined)), MODEL_FIGURES);
    for (const [key, value] of Object.entries(expected)) expect([key, record[key]]).toEqual([key, value]);
  });
});
