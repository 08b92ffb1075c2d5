// The streaming sheet reader (DESIGN §5): cells stay text, the format variants it accepts, and the files
// it refuses with a message naming the problem.
import { describe, expect, it } from "vitest";
import { SheetError, WHOLE_ROW, readSheet } from "@/lib/csv";
import { MINIMAL_HEADER, inChunks, readAll, refusal, utf8 } from "./sheet-input";

describe("cells are read as the text that was printed", () => {
  it("keeps 9.20, 0012, .000 and < .001 exactly as written, never as numbers", async () => {
    const [row] = await readAll(`${MINIMAL_HEADER},a_chisq,n,a_p,d_p\n10.5555/t.1,C1,lrt,A,B,9.20,0012,.000,< .001\n`);
    expect(row.restricted.chisq).toBe("9.20");
    expect(row.sample.n).toBe("0012");
    expect(row.restricted.p).toBe(".000");
    expect(row.comparison.dP).toBe("< .001");
  });

  it("leaves an empty cell out of the record instead of turning it into an empty string or zero", async () => {
    const [row] = await readAll(`${MINIMAL_HEADER},a_chisq\n10.5555/t.1,C1,lrt,A,B,\n`);
    expect(row.restricted).toEqual({ label: "A" });
  });

  it("fills the §5 defaults: sample label Sample 1 and one group", async () => {
    const [row] = await readAll(`${MINIMAL_HEADER}\n10.5555/t.1,C1,lrt,A,B\n`);
    expect(row.sample).toEqual({ label: "Sample 1", groups: "1" });
  });

  it("puts each column in its part: a_ into the restricted model, b_ into the free one, d_ into the comparison", async () => {
    const [row] = await readAll(`${MINIMAL_HEADER},a_df,b_df,d_df,title,n_groups\n10.5555/t.1,C1,lrt,A,B,27,24,3,On fit,2\n`);
    expect(row.restricted.df).toBe("27");
    expect(row.free.df).toBe("24");
    expect(row.comparison.dDf).toBe("3");
    expect(row.paper.title).toBe("On fit");
    expect(row.sample.groups).toBe("2");
  });

  it("normalises a DOI to lower case without its resolver prefix", async () => {
    const [row] = await readAll(`${MINIMAL_HEADER}\nhttps://doi.org/10.5555/ABC.Def,C1,lrt,A,B\n`);
    expect(row.paper.doi).toBe("10.5555/abc.def");
  });

  it("removes the writer's apostrophe before =, +, -, @ but keeps an apostrophe before anything else", async () => {
    const [row] = await readAll(`${MINIMAL_HEADER},notes,location\n10.5555/t.1,'=SUM(A1),lrt,'@home,'-b,'ok,'+1\n`);
    expect(row.comparison.label).toBe("=SUM(A1)");
    expect(row.restricted.label).toBe("@home");
    expect(row.free.label).toBe("-b");
    expect(row.comparison.notes).toBe("'ok");
    expect(row.comparison.location).toBe("+1");
  });
});

describe("format variants the reader accepts", () => {
  it("reads a file that starts with a UTF-8 byte order mark", async () => {
    const rows = await readAll(`\uFEFF${MINIMAL_HEADER}\n10.5555/t.1,C1,lrt,A,B\n`);
    expect(rows).toHaveLength(1);
    expect(rows[0].paper.doi).toBe("10.5555/t.1");
  });

  it("takes ; as the delimiter when the header uses it, and keeps a decimal comma inside a cell as text", async () => {
    const [row] = await readAll(`doi;comparison;method;a_label;b_label;a_chisq\n10.5555/t.1;C1;lrt;A;B;85,31\n`);
    expect(row.comparison.method).toBe("lrt");
    expect(row.restricted.chisq).toBe("85,31");
  });

  it("reads CRLF line breaks without leaving a carriage return in the last cell", async () => {
    const rows = await readAll(`${MINIMAL_HEADER}\r\n10.5555/t.1,C1,lrt,A,B\r\n10.5555/t.2,C2,ic,X,Y\r\n`);
    expect(rows.map((r) => r.free.label)).toEqual(["B", "Y"]);
  });

  it("reads old-style CR-only line breaks", async () => {
    const rows = await readAll(`${MINIMAL_HEADER}\r10.5555/t.1,C1,lrt,A,B\r`);
    expect(rows.map((r) => r.free.label)).toEqual(["B"]);
  });

  it("reads quoted cells holding commas, line breaks and doubled quotes (RFC 4180)", async () => {
    const rows = await readAll(`${MINIMAL_HEADER},notes\n10.5555/t.1,"Table 2, left","lrt",A,B,"line one\nline two ""quoted"""\n10.5555/t.2,C2,lrt,A,B,\n`);
    expect(rows[0].comparison.label).toBe("Table 2, left");
    expect(rows[0].comparison.notes).toBe('line one\nline two "quoted"');
    expect(rows.map((r) => r.row)).toEqual([1, 2]);
  });

  it("matches header names whatever their case and surrounding spaces", async () => {
    const [row] = await readAll(` DOI ,Comparison,METHOD,  a_Label,B_LABEL \n10.5555/t.1,C1,lrt,A,B\n`);
    expect(row.comparison.label).toBe("C1");
    expect(row.free.label).toBe("B");
  });

  it("reads columns in any order and accepts paper_ref in place of doi", async () => {
    const [row] = await readAll(`b_label,a_label,method,comparison,paper_ref\nB,A,lrt,C1,smith-2020\n`);
    expect(row.paper).toEqual({ paperRef: "smith-2020" });
    expect(row.restricted.label).toBe("A");
  });

  it("yields zero rows for a header-only file, with or without a final line break", async () => {
    expect(await readAll(`${MINIMAL_HEADER}\n`)).toEqual([]);
    expect(await readAll(MINIMAL_HEADER)).toEqual([]);
  });

  it("reads a last row that has no final line break", async () => {
    const rows = await readAll(`${MINIMAL_HEADER}\n10.5555/t.1,C1,lrt,A,B`);
    expect(rows.map((r) => r.free.label)).toEqual(["B"]);
  });
});

describe("row numbers", () => {
  it("numbers data rows from 1 (the header is not counted) and counts blank rows without yielding them", async () => {
    const rows = await readAll(`${MINIMAL_HEADER}\n10.5555/t.1,C1,lrt,A,B\n\n,,,,\n10.5555/t.2,C2,lrt,A,B\n`);
    expect(rows.map((r) => [r.row, r.comparison.label])).toEqual([
      [1, "C1"],
      [4, "C2"],
    ]);
  });

  it("counts a row whose quoted cell spans several lines as one row", async () => {
    const rows = await readAll(`${MINIMAL_HEADER},notes\n10.5555/t.1,C1,lrt,A,B,"a\nb\nc"\n10.5555/t.2,C2,lrt,A,B,\n`);
    expect(rows.map((r) => r.row)).toEqual([1, 2]);
  });
});

describe("streaming", () => {
  it("gives the same rows whether the file arrives in one chunk or one byte at a time", async () => {
    const sheet = `\uFEFF${MINIMAL_HEADER},title,notes\r\n10.5555/t.1,C1,lrt,A,B,"Δχ² für Größen, née",x\r\n10.5555/t.2,"C\r\n2",lrt,A,B,"""q""",\r\n`;
    const whole = await readAll(sheet);
    expect(whole).toHaveLength(2);
    expect(whole[0].paper.title).toBe("Δχ² für Größen, née");
    for (const size of [1, 2, 3, 7]) expect(await readAll(sheet, size)).toEqual(whole);
  });
});

describe("problems confined to one row travel with that row", () => {
  it("reports a row with too many cells on that row and still reads the rows around it", async () => {
    const rows = await readAll(`${MINIMAL_HEADER}\n10.5555/t.1,C1,lrt,A,B\n10.5555/t.2,C2,lrt,A,B,extra\n10.5555/t.3,C3,lrt,A,B\n`);
    expect(rows.map((r) => r.row)).toEqual([1, 2, 3]);
    expect(rows[1].problems).toEqual([{ column: WHOLE_ROW, message: "has 6 cells but the header has 5 columns" }]);
    expect(rows[0].problems).toEqual([]);
    expect(rows[2].problems).toEqual([]);
  });

  it("reports a row with too few cells", async () => {
    const rows = await readAll(`${MINIMAL_HEADER}\n10.5555/t.1,C1,lrt\n`);
    expect(rows[0].problems).toEqual([{ column: WHOLE_ROW, message: "has 3 cells but the header has 5 columns" }]);
  });

  it("reports a quoted cell that never closes on the row where it opens", async () => {
    const rows = await readAll(`${MINIMAL_HEADER}\n10.5555/t.1,C1,lrt,A,B\n10.5555/t.2,"C2,lrt,A,B\n10.5555/t.3,C3,lrt,A,B\n`);
    expect(rows).toHaveLength(2);
    expect(rows[0].problems).toEqual([]);
    expect(rows[1].row).toBe(2);
    expect(rows[1].problems.map((p) => p.message)).toContain("a quoted cell opens but never closes, so the rest of the file was read into it");
  });
});

describe("files refused as a whole", () => {
  it("refuses an empty file", async () => {
    for (const empty of ["", "\uFEFF", "\n\n  \n"]) {
      const error = await refusal(empty);
      expect(error.code).toBe("empty_file");
      expect(error.message).toBe("the file is empty (no header row)");
    }
  });

  it("refuses a file whose first line is blank, because the header must come first", async () => {
    const error = await refusal(`\n${MINIMAL_HEADER}\n`);
    expect(error.message).toBe("the first line is empty; the header row must come first");
  });

  it("refuses an unknown column, naming it and the nearest known column", async () => {
    const error = await refusal(`${MINIMAL_HEADER},a_chisqq\n`);
    expect(error.code).toBe("unknown_column");
    expect(error.message).toBe('unknown column "a_chisqq" (did you mean "a_chisq"?)');
  });

  it("names every unknown column at once, with a suggestion only where one is close", async () => {
    const error = await refusal(`${MINIMAL_HEADER},Methd,colour\n`);
    expect(error.message).toBe('2 unknown columns: unknown column "Methd" (did you mean "method"?), unknown column "colour"');
  });

  it("refuses a sheet without a required column, naming it", async () => {
    const error = await refusal("doi,comparison,a_label,b_label\n");
    expect(error.code).toBe("missing_column");
    expect(error.message).toBe('required column "method" missing from the header');
  });

  it("refuses a sheet with neither doi nor paper_ref", async () => {
    const error = await refusal("comparison,method,a_label,b_label\n");
    expect(error.message).toBe('required column "doi" (or "paper_ref" when a paper has no DOI) missing from the header');
  });

  it("refuses a column given twice, also when the two differ only in case", async () => {
    const error = await refusal(`${MINIMAL_HEADER},n,N\n`);
    expect(error.code).toBe("duplicate_column");
    expect(error.message).toBe('column "n" appears more than once in the header');
  });

  it("refuses a header with an unnamed column", async () => {
    const error = await refusal(`${MINIMAL_HEADER},\n`);
    expect(error.message).toBe("header cell 6 is empty; every column needs a name");
  });

  it("refuses a sheet where a stray quote swallows more than 1 MB, after yielding the rows before it", async () => {
    const good = "10.5555/t.1,C1,lrt,A,B\n";
    const rest = "10.5555/t.3,C3,lrt,A,B\n".repeat(60_000); // 1.4 MB that would all fall into one cell
    const rows: number[] = [];
    const sheet = `${MINIMAL_HEADER}\n${good}10.5555/t.2,"C2,lrt,A,B\n${rest}`;
    let refusal: unknown;
    try {
      for await (const row of readSheet(inChunks(utf8(sheet), 1 << 16))) rows.push(row.row);
    } catch (error) {
      refusal = error;
    }
    expect(rows).toEqual([1]);
    expect(refusal).toBeInstanceOf(SheetError);
    expect((refusal as SheetError).message).toBe("row 2 runs on for more than 1 MB: probably a quoted cell that never closes");
  });

  it("refuses a binary file, naming the NUL byte's offset", async () => {
    const bytes = new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x08]); // the start of a ZIP archive
    const error = await refusal(bytes);
    expect(error.code).toBe("not_utf8");
    expect(error.message).toBe("not UTF-8 text (NUL byte at offset 4; a binary file or UTF-16?)");
  });

  it("refuses a Latin-1 file, naming the first byte that is not UTF-8 and its offset", async () => {
    const prefix = utf8(`${MINIMAL_HEADER}\n10.5555/t.1,Caf`);
    const bytes = new Uint8Array([...prefix, 0xe9, ...utf8(",lrt,A,B\n")]); // "Café" with é as Latin-1 0xE9
    const error = await refusal(bytes);
    expect(error.message).toBe(`not UTF-8 text (byte 0xE9 at offset ${prefix.length}; Latin-1?)`);
  });

  it("gives the same offset when the bad byte arrives in a later chunk or right after a split character", async () => {
    const prefix = utf8(`${MINIMAL_HEADER}\n10.5555/t.1,Größe`);
    const bytes = new Uint8Array([...prefix, 0xe9, ...utf8(",lrt,A,B\n")]);
    for (const size of [1, 3, 16]) {
      expect((await refusal(bytes, size)).message).toBe(`not UTF-8 text (byte 0xE9 at offset ${prefix.length}; Latin-1?)`);
    }
  });

  it("suggests Windows-1252 for a byte only that code page uses, such as 0x96 (en dash)", async () => {
    const prefix = utf8(`${MINIMAL_HEADER}\n10.5555/t.1,A `);
    const error = await refusal(new Uint8Array([...prefix, 0x96, ...utf8(" B,lrt,A,B\n")]));
    expect(error.message).toBe(`not UTF-8 text (byte 0x96 at offset ${prefix.length}; Windows-1252?)`);
  });

  it("refuses UTF-16 text by its byte order mark", async () => {
    const error = await refusal(new Uint8Array([0xff, 0xfe, 0x64, 0x00, 0x6f, 0x00]));
    expect(error.message).toBe("not UTF-8 text (it starts with a UTF-16 byte order mark; save it as UTF-8)");
  });

  it("refuses a file that ends in the middle of a multi-byte character", async () => {
    const prefix = utf8(`${MINIMAL_HEADER}\n10.5555/t.1,C1,lrt,A,B`);
    const error = await refusal(new Uint8Array([...prefix, 0xe2, 0x88]));
    expect(error.message).toBe(`not UTF-8 text (the file ends inside a character that starts at offset ${prefix.length})`);
  });
});
