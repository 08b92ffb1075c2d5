import { describe, expect, it } from "vitest";
import { DOI_PATTERN, normaliseDoi, stripDoi } from "@/lib/doi/normalise";
import { normaliseDoi as sheetNormaliseDoi } from "@/lib/csv";

// DOI normal form (DESIGN §3): lower-case, without resolver prefix. DOI syntax: "10." + registrant code of
// 4–9 digits + "/" + suffix (DOI Handbook, chapter 2).

describe("normaliseDoi", () => {
  it.each([
    ["https://doi.org/10.5555/AbC", "10.5555/abc"],
    ["http://dx.doi.org/10.5555/x.1", "10.5555/x.1"],
    ["doi.org/10.5555/X", "10.5555/x"],
    [" doi: 10.5555/X ", "10.5555/x"],
    ["10.1000.10/abc(2001)12:3<45::AID>", "10.1000.10/abc(2001)12:3<45::aid>"],
  ])("%s → %s", (text, expected) => {
    expect(normaliseDoi(text)).toBe(expected);
  });

  it.each(["10.12/x", "10.5555/has space", "11.5555/x", "", "https://example.org/10.5555/x"])("%j is not a DOI", (text) => {
    expect(normaliseDoi(text)).toBeUndefined();
  });

  it("the sheet reader uses the same rule (one home in lib/doi)", () => {
    expect(sheetNormaliseDoi).toBe(normaliseDoi);
  });

  it("stripDoi keeps a non-DOI as typed (lower-cased) so validation can name it", () => {
    expect(stripDoi("DOI: Not-A-Doi")).toBe("not-a-doi");
    expect(DOI_PATTERN.test(stripDoi("DOI: Not-A-Doi"))).toBe(false);
  });
});
