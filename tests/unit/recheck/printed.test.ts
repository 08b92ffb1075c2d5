import { describe, expect, it } from "vitest";
import { readPrintedInteger, readPrintedNumber, readPrintedP } from "@/lib/recheck";
import { CLIP_AT_ZERO, CLIP_NONE, CLIP_TO_UNIT, readPrintedFigure, type Clip } from "@/lib/recheck/printed";

// Source for every expectation here: DESIGN §4.1 (a value printed with k decimals stands for
// [x − ½·10^−k, x + ½·10^−k]; the p forms listed there).
describe("readPrintedNumber", () => {
  it("reads 9.20 as 9.2 standing for [9.195, 9.205]", () => {
    const n = readPrintedNumber("9.20");
    expect(n?.value).toBe(9.2);
    expect(n?.decimals).toBe(2);
    expect(n?.lo).toBeCloseTo(9.195, 12);
    expect(n?.hi).toBeCloseTo(9.205, 12);
  });

  it("reads a leading-dot decimal and a typographic minus", () => {
    expect(readPrintedNumber(".032")?.value).toBe(0.032);
    expect(readPrintedNumber("\u22123.5")?.value).toBe(-3.5);
    expect(readPrintedNumber("-0.010")?.lo).toBeCloseTo(-0.0105, 12);
  });

  it("gives an integer print the interval ±0.5", () => {
    const n = readPrintedNumber("7517");
    expect(n?.lo).toBe(7516.5);
    expect(n?.hi).toBe(7517.5);
  });

  it("reads scientific notation with the last mantissa digit as the rounding unit", () => {
    const n = readPrintedNumber("2.1e-45");
    expect(n?.value).toBe(2.1e-45);
    expect(n?.lo).toBeCloseTo(2.05e-45, 55);
    expect(n?.hi).toBeCloseTo(2.15e-45, 55);
  });

  it("rejects thousands separators, decimal commas, words and empty text", () => {
    for (const text of ["1,234", "0,032", "abc", "", " ", "9.2x", "--3", "."]) expect(readPrintedNumber(text)).toBeNull();
  });

  it("reads long prints exactly like Number()", () => {
    expect(readPrintedNumber("85.3055217699727")?.value).toBe(85.3055217699727);
    expect(readPrintedNumber("0.12345678901234567")?.value).toBe(0.12345678901234567);
  });

  it("reads plain decimals and the other printed forms alike, at every length around 15 digits", () => {
    // Plain decimals of up to 15 digits take a short path; signs, exponents and longer prints the full one.
    const texts = ["5.", "-.5", "+5", "+.5", "-0.000", "0.000", "\u22120.50", "-5e0", "1.50E+1", "123456789012345", "1234567890123456", "-12345678.9012345", "-12345678.90123456", "0.000000000000001", "00012.3400", "9.\u00002"];
    for (const text of texts) {
      const n = readPrintedNumber(text);
      const expected = Number(text.replace("\u2212", "-"));
      if (Number.isNaN(expected)) {
        expect(n, text).toBeNull();
        continue;
      }
      expect(n?.value, text).toBe(expected === 0 ? 0 : expected);
      expect(Object.is(n?.value, -0), text).toBe(false);
      expect(n?.text, text).toBe(text);
    }
    expect(readPrintedNumber("-12345678.9012345")?.decimals).toBe(7);
    expect(readPrintedNumber("1.50E+1")?.decimals).toBe(1);
    expect(readPrintedNumber("-.5")?.lo).toBe(-0.55);
  });
});

describe("readPrintedNumber on cells with spaces around them", () => {
  it("reads ' 9.20\t' exactly as '9.20', with the text trimmed", () => {
    for (const text of [" 9.20", "9.20 ", "\t9.20\t", "  -3.5e1  "]) {
      const n = readPrintedNumber(text);
      const bare = readPrintedNumber(text.trim());
      expect(n, text).not.toBeNull();
      expect([n?.text, n?.value, n?.lo, n?.hi, n?.decimals], text).toEqual([bare?.text, bare?.value, bare?.lo, bare?.hi, bare?.decimals]);
    }
    expect(readPrintedNumber(" 9.20 ")?.text).toBe("9.20");
  });

  it("still rejects text with a space inside or only spaces", () => {
    for (const text of ["9 .20", "- 3", " \t ", "\u00a09.20"]) expect(readPrintedNumber(text), text).toBeNull();
  });

  it("serialises all five fields to JSON", () => {
    expect(JSON.parse(JSON.stringify(readPrintedNumber("7517")))).toEqual({ text: "7517", value: 7517, lo: 7516.5, hi: 7517.5, decimals: 0 });
  });
});

describe("readPrintedFigure clips the interval where the figure cannot go (DESIGN §4.1)", () => {
  it("'0.00' of a statistic that cannot be negative stands for [0, .005]", () => {
    const n = readPrintedFigure("0.00", CLIP_AT_ZERO);
    expect(n?.lo).toBe(0);
    expect(n?.hi).toBeCloseTo(0.005, 15);
    expect(readPrintedFigure("0.00", CLIP_NONE)?.lo).toBeCloseTo(-0.005, 15);
  });

  it("'1.000' of a proportion stands for [.9995, 1], and '0.000' for [0, .0005]", () => {
    const one = readPrintedFigure("1.000", CLIP_TO_UNIT);
    expect(one?.lo).toBeCloseTo(0.9995, 15);
    expect(one?.hi).toBe(1);
    expect(readPrintedFigure("1.000", CLIP_AT_ZERO)?.hi).toBeCloseTo(1.0005, 15);
    expect(readPrintedFigure("0.000", CLIP_TO_UNIT)?.lo).toBe(0);
  });

  it("leaves intervals inside the bounds as readPrintedNumber gives them", () => {
    const cases: Array<[string, Clip]> = [["0.954", CLIP_TO_UNIT], [" .032 ", CLIP_TO_UNIT], ["247.572", CLIP_AT_ZERO], ["2.1e-45", CLIP_AT_ZERO]];
    for (const [text, clip] of cases) {
      const plain = readPrintedNumber(text);
      const clipped = readPrintedFigure(text, clip);
      expect([clipped?.lo, clipped?.hi], text).toEqual([plain?.lo, plain?.hi]);
    }
  });
});

describe("readPrintedInteger", () => {
  it("accepts whole numbers, also printed with a zero decimal", () => {
    expect(readPrintedInteger("24")).toBe(24);
    expect(readPrintedInteger("-3")).toBe(-3);
    expect(readPrintedInteger("24.0")).toBe(24);
  });

  it("rejects fractional values", () => {
    expect(readPrintedInteger("23.47")).toBeNull();
  });

  it("reads the other printed forms of a whole number and rejects what is no number", () => {
    expect(readPrintedInteger(" 24 ")).toBe(24);
    expect(readPrintedInteger("+24")).toBe(24);
    expect(readPrintedInteger("\u22123")).toBe(-3);
    expect(readPrintedInteger("2.4e1")).toBe(24);
    expect(readPrintedInteger("1234567890123456")).toBe(1234567890123456);
    for (const text of ["", " ", "24x", "2,4", "2.5e0", "e3"]) expect(readPrintedInteger(text), text).toBeNull();
  });
});

describe("readPrintedP", () => {
  const p = (text: string, alpha?: number) => {
    const result = readPrintedP(text, alpha);
    if (!result.ok) throw new Error(result.message);
    return result.value;
  };

  it("reads '= .032', '.032', 'p = .032' and 'p=.032' as [.0315, .0325]", () => {
    for (const text of ["= .032", ".032", "p = .032", "p=.032", "P = 0.032"]) {
      const value = p(text);
      expect(value.lo).toBeCloseTo(0.0315, 12);
      expect(value.hi).toBeCloseTo(0.0325, 12);
      expect(value.relation).toBe("=");
    }
  });

  it("reads '< .001' as [0, .001] open at the top, and '<.05' likewise", () => {
    const value = p("< .001");
    expect([value.lo, value.hi, value.hiOpen]).toEqual([0, 0.001, true]);
    expect(p("<.05").hi).toBe(0.05);
    expect(p("p < .001***").hi).toBe(0.001);
  });

  it("reads '> .05' as [.05, 1]", () => {
    const value = p("> .05");
    expect([value.lo, value.hi, value.loOpen]).toEqual([0.05, 1, true]);
  });

  it("reads '.000' as [0, .0005] and marks it as printed zero", () => {
    const value = p(".000");
    expect(value.lo).toBe(0);
    expect(value.hi).toBeCloseTo(0.0005, 15);
    expect(value.printedZero).toBe(true);
  });

  it("reads 'ns' and 'n.s.' as [alpha, 1]", () => {
    expect([p("ns").lo, p("ns").hi]).toEqual([0.05, 1]);
    expect(p("n.s.", 0.01).lo).toBe(0.01);
  });

  it("reads '1.00' as [.995, 1], clipped at 1", () => {
    const value = p("1.00");
    expect(value.lo).toBeCloseTo(0.995, 12);
    expect(value.hi).toBe(1);
  });

  it("names the printed figure when p lies outside [0, 1]", () => {
    expect(readPrintedP("p = 1.20")).toEqual({ ok: false, message: "p = 1.20 lies outside [0, 1]" });
    expect(readPrintedP("-.01")).toEqual({ ok: false, message: "p = -.01 lies outside [0, 1]" });
  });

  it("rejects p outside [0, 1], p < 0 and text that is not a p-value", () => {
    for (const text of ["1.2", "-.01", "< 0", "significant", "p"]) expect(readPrintedP(text).ok).toBe(false);
  });
});
