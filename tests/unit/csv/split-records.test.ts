// splitPlainRecords (lib/csv/read-sheet.ts) reads the plain records of a chunk itself and leaves
// everything else to papaparse's Parser. Where it answers, it must answer exactly what papaparse does
// (cells, cursor, and no error papaparse would have raised); where papaparse would report a quote
// problem, it must not answer at all. Checked on random texts built from the characters that matter.
import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { splitPlainRecords } from "@/lib/csv/read-sheet";
import { mulberry32 as random } from "@/tests/support/mulberry32";

type Delimiter = "," | ";";
type Newline = "\n" | "\r\n" | "\r";

const PLAIN = ["a", "9", ".", " ", "χ", "'", "-"];

/** Text that looks like a sheet (cells, quoted cells, line breaks), with every kind of slip mixed in. */
function someText(next: () => number, delimiter: Delimiter, newline: Newline): string {
  const pick = <T,>(list: readonly T[]) => list[Math.floor(next() * list.length)];
  let text = "";
  const records = 1 + Math.floor(next() * 4);
  for (let r = 0; r < records; r++) {
    const cells = Math.floor(next() * 5);
    for (let c = 0; c < cells; c++) {
      if (c > 0) text += delimiter;
      const kind = next();
      if (kind < 0.15) continue; // empty cell
      if (kind < 0.55) {
        for (let i = Math.floor(next() * 4); i >= 0; i--) text += pick(PLAIN);
      } else if (kind < 0.9) {
        // a quoted cell, sometimes with the other delimiter, a line break or an escaped quote inside
        text += '"';
        for (let i = Math.floor(next() * 5); i >= 0; i--) text += pick([...PLAIN, ",", ";", '""', "\n", "\r\n", "\r"]);
        text += '"';
      } else {
        // slips: a stray quote, text or spaces after a closing quote, a quote that never closes, a lone \r
        text += pick(['a"b', '"a" ', '"a"b', '"open', '""', '"a"""', "\r", "\n", '"', " "]);
      }
    }
    if (r < records - 1 || next() < 0.5) text += next() < 0.9 ? newline : pick(["\n", "\r\n", "\r"]);
  }
  return text;
}

interface Parsed {
  data: string[][];
  errors: unknown[];
  meta: { cursor: number };
}

describe("splitPlainRecords", () => {
  it("answers what papaparse's Parser does, or leaves the text to it, on 150 000 random texts", () => {
    const next = random(5150);
    let answered = 0;
    let leftToPapaparse = 0;
    for (let i = 0; i < 150_000; i++) {
      const delimiter: Delimiter = next() < 0.5 ? "," : ";";
      const newline = (["\n", "\r\n", "\r"] as const)[Math.floor(next() * 3)];
      const text = i % 1000 === 0 ? "" : someText(next, delimiter, newline);
      const ignoreLastRow = next() < 0.5;
      const expected = new Papa.Parser({ delimiter, newline, quoteChar: '"' }).parse(text, 0, ignoreLastRow) as Parsed;
      const actual = splitPlainRecords(text, delimiter, newline, ignoreLastRow);
      if (actual === null) {
        leftToPapaparse++;
        continue;
      }
      answered++;
      const where = JSON.stringify({ text, delimiter, newline, ignoreLastRow });
      // papaparse reports quote problems only for rows it returns; a text it complains about is not plain
      expect(expected.errors, where).toEqual([]);
      expect(actual.data, where).toEqual(expected.data);
      expect(actual.meta.cursor, where).toBe(expected.meta.cursor);
    }
    // both ways are taken often, so neither half of the comparison is empty
    expect(answered).toBeGreaterThan(50_000);
    expect(leftToPapaparse).toBeGreaterThan(5_000);
  }, 120_000);

  it("leaves to papaparse every text on which it reports a quote problem", () => {
    const next = random(99);
    let problems = 0;
    for (let i = 0; i < 100_000; i++) {
      const newline = (["\n", "\r\n", "\r"] as const)[i % 3];
      const text = someText(next, ",", newline);
      const expected = new Papa.Parser({ delimiter: ",", newline, quoteChar: '"' }).parse(text, 0, false) as Parsed;
      if (expected.errors.length === 0) continue;
      problems++;
      expect(splitPlainRecords(text, ",", newline, false), JSON.stringify(text)).toBeNull();
    }
    expect(problems).toBeGreaterThan(1000);
  }, 120_000);

  it("reads the quoted cells of a sheet row, with the delimiter, quotes and line breaks inside", () => {
    const text = 'doi,title,n\r\n10.5555/x,"A title, with a comma and ""quotes""",120\r\n10.5555/y,"two\r\nlines",\r\n10.5555/z';
    expect(splitPlainRecords(text, ",", "\r\n", true)).toEqual({
      data: [
        ["doi", "title", "n"],
        ["10.5555/x", 'A title, with a comma and "quotes"', "120"],
        ["10.5555/y", "two\r\nlines", ""],
      ],
      errors: [],
      meta: { cursor: text.indexOf("10.5555/z") },
    });
  });
});
