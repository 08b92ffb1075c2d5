import { describe, expect, it } from "vitest";
import { readPrintedInteger, readPrintedNumber, readPrintedP, type PrintedNumber, type PrintedP } from "@/lib/recheck";
import { CLIP_AT_ZERO, CLIP_NONE, CLIP_TO_UNIT, readPrintedFigure, type Clip } from "@/lib/recheck/printed";
import { generateComparisons } from "@/tests/support/generate-comparisons";
import { mulberry32 } from "@/tests/support/mulberry32";

// The hand-written scanners of lib/recheck/printed.ts against a second reading of the same rules
// (DESIGN §4.1), written the slow and obvious way: regular expressions for the grammar, Number() for
// the value, the decimal literal 5e−(k+1) for half a unit of the k-th decimal. Both must agree on every
// text, the thousands of random ones below included.

const NUMBER_GRAMMAR = /^([-+\u2212]?)(\d*)(?:\.(\d*))?(?:[eE]([-+\u2212]?)(\d+))?$/;

/** The value and rounding decimals of a number printed on exactly `core` (no spaces allowed), or null. */
function referenceValue(core: string): { value: number; decimals: number } | null {
  const m = NUMBER_GRAMMAR.exec(core);
  if (m === null) return null;
  const whole = m[2];
  const fraction = m[3] ?? "";
  if (whole.length + fraction.length === 0) return null;
  const value = Number(core.replaceAll("\u2212", "-"));
  if (!Number.isFinite(value)) return null;
  const exponent = m[5] === undefined ? 0 : (m[4] === "" || m[4] === "+" ? 1 : -1) * Number(m[5]);
  return { value: value === 0 ? 0 : value, decimals: fraction.length - exponent };
}

/** Half a unit of the last printed decimal: the double nearest ½·10^−k (k = 0…12), else 0.5·10^−k. */
function referenceHalf(decimals: number): number {
  return decimals >= 0 && decimals <= 12 ? Number(`5e-${decimals + 1}`) : 0.5 * Math.pow(10, -decimals);
}

/** Strips the characters up to U+0020 at both ends (a no-break space is kept: it is no padding). */
function referenceTrim(raw: string): string {
  return /^[\x00-\x20]*([\s\S]*?)[\x00-\x20]*$/.exec(raw)?.[1] ?? raw;
}

function referenceFigure(raw: string, clip: Clip): PrintedNumber | null {
  const text = referenceTrim(raw);
  const read = referenceValue(text);
  if (read === null) return null;
  const half = referenceHalf(read.decimals);
  const lo = read.value - half;
  const hi = read.value + half;
  return {
    text,
    value: read.value,
    lo: clip !== CLIP_NONE && lo < 0 ? 0 : lo,
    hi: clip === CLIP_TO_UNIT && hi > 1 ? 1 : hi,
    decimals: read.decimals,
  };
}

function referenceInteger(raw: string): number | null {
  const read = referenceValue(referenceTrim(raw));
  return read !== null && Number.isInteger(read.value) ? read.value : null;
}

const NS_SPELLINGS = ["ns", "n.s.", "n.s", "ns.", "n. s.", "not significant"];

function referenceP(raw: string, alpha: number): { ok: true; value: PrintedP } | { ok: false; message: string } {
  // leading characters up to U+0020; trailing ones and significance stars
  const text = /^[\x00-\x20]*([\s\S]*?)[\x00-\x20*]*$/.exec(raw)?.[1] ?? raw;
  const notP = `"${text}" is not a p-value (write e.g. .032, = .032, < .001, > .05 or ns)`;
  if (/^n/i.test(text)) {
    if (!NS_SPELLINGS.includes(text.toLowerCase())) return { ok: false, message: notP };
    return { ok: true, value: { text, relation: "ns", lo: alpha, hi: 1, hiOpen: false, loOpen: false, value: null, decimals: 0, printedZero: false } };
  }
  const m = /^(?:[pP][ \t\u00a0]*)?(<=|>=|=|<|>|\u2264|\u2265)?[ \t\u00a0]*([\s\S]*)$/.exec(text) as RegExpExecArray;
  const relation = m[1] === undefined ? "=" : m[1] === "\u2264" ? "<=" : m[1] === "\u2265" ? ">=" : (m[1] as "=" | "<" | "<=" | ">" | ">=");
  const read = referenceValue(m[2]);
  if (read === null) return { ok: false, message: notP };
  const { value, decimals } = read;
  if (value < 0 || value > 1) return { ok: false, message: `p = ${m[2]} lies outside [0, 1]` };
  let lo: number;
  let hi: number;
  if (relation === "=") {
    const half = referenceHalf(decimals);
    lo = Math.max(0, value - half);
    hi = Math.min(1, value + half);
  } else if (relation === "<" || relation === "<=") {
    if (value === 0) return { ok: false, message: `p ${relation} 0 is impossible: a p-value is never below zero` };
    lo = 0;
    hi = value;
  } else {
    if (value === 1 && relation === ">") return { ok: false, message: "p > 1 is impossible" };
    lo = value;
    hi = 1;
  }
  return { ok: true, value: { text, relation, lo, hi, hiOpen: relation === "<", loOpen: relation === ">", value, decimals, printedZero: relation === "=" && value === 0 } };
}

/** Equal field by field (Object.is: a −0 for a 0 is a difference), nested objects included. */
function same(a: unknown, b: unknown): boolean {
  if (typeof a !== "object" || a === null || typeof b !== "object" || b === null) return Object.is(a, b);
  const keys = Object.keys(a);
  if (keys.join() !== Object.keys(b).join()) return false;
  return keys.every((key) => same((a as Record<string, unknown>)[key], (b as Record<string, unknown>)[key]));
}

/** Texts built from the pieces printed numbers and p-values are made of, well-formed or not. */
function randomTexts(seed: number, count: number, withRelation: boolean): string[] {
  const random = mulberry32(seed);
  const pick = <T>(items: readonly T[]): T => items[Math.floor(random() * items.length)];
  const digits = (max: number) => {
    const length = random() < 0.7 ? Math.floor(random() * 5) : Math.floor(random() * (max + 1));
    let out = "";
    for (let i = 0; i < length; i++) out += String(Math.floor(random() * 10));
    return out;
  };
  const lead = ["", "", "", "", " ", "\t", "  ", "\u00a0", "\n"];
  const prefix = ["", "", "", "p", "P", "p ", "p\u00a0", "p\t", "p="];
  const relation = ["", "", "=", "<", "<=", ">", ">=", "\u2264", "\u2265", "\u2264=", "=="];
  const space = ["", "", " ", "\u00a0", "\t", "  "];
  const sign = ["", "", "", "", "-", "+", "\u2212", "--"];
  const point = ["", ".", ".", ".", ".."];
  const exponent = ["", "", "", "", "", "e3", "e-2", "E+1", "e\u22124", "e", "e400", "e-400"];
  const trail = ["", "", "", "", "*", "***", " ", "\t", "x", " *", "* ", ","];
  const alphabet = "0123456789.-+e \t*<>=pPns\u2212\u00a0";
  const out: string[] = [];
  for (let n = 0; n < count; n++) {
    const style = random();
    if (style < 0.1) {
      let text = "";
      const length = Math.floor(random() * 9);
      for (let i = 0; i < length; i++) text += alphabet[Math.floor(random() * alphabet.length)];
      out.push(text);
    } else if (withRelation && style < 0.15) {
      out.push(pick(lead) + pick(["ns", "n.s.", "N.S.", "n. s.", "not significant", "nope", "n"]) + pick(trail));
    } else {
      const head = withRelation ? pick(prefix) + pick(relation) + pick(space) : "";
      out.push(pick(lead) + head + pick(sign) + digits(17) + pick(point) + digits(17) + pick(exponent) + pick(trail));
    }
  }
  return out;
}

/** Every printed cell of generated comparisons, as the benchmark sheet prints them. */
function generatedCells(): { numbers: string[]; ps: string[] } {
  const numbers: string[] = [];
  const ps: string[] = [];
  for (const c of generateComparisons({ count: 2000, seed: 20240601 })) {
    for (const cells of [c as unknown as Record<string, unknown>, c.restricted as Record<string, unknown>, c.free as Record<string, unknown>, c.sample as Record<string, unknown>]) {
      for (const [key, text] of Object.entries(cells)) {
        if (typeof text !== "string") continue;
        if (key === "p" || key === "dP") ps.push(text);
        else numbers.push(text);
      }
    }
  }
  return { numbers, ps };
}

describe("the cell scanners agree with a regular-expression reading of DESIGN §4.1", () => {
  const generated = generatedCells();
  const numberTexts = [...randomTexts(7, 30000, false), ...randomTexts(8, 10000, true), ...generated.numbers];
  const pTexts = [...randomTexts(9, 30000, true), ...randomTexts(10, 5000, false), ...generated.ps];

  it("has random texts of every kind: read and refused numbers, p-values and errors", () => {
    const readNumbers = numberTexts.filter((text) => referenceFigure(text, CLIP_NONE) !== null).length;
    const readP = pTexts.filter((text) => referenceP(text, 0.05).ok).length;
    expect(readNumbers).toBeGreaterThan(10000);
    expect(numberTexts.length - readNumbers).toBeGreaterThan(10000);
    expect(readP).toBeGreaterThan(5000);
    expect(pTexts.length - readP).toBeGreaterThan(5000);
  });

  it("readPrintedNumber and readPrintedFigure (each clip)", () => {
    const differ: string[] = [];
    for (const text of numberTexts) {
      if (!same(readPrintedNumber(text), referenceFigure(text, CLIP_NONE))) differ.push(text);
      for (const clip of [CLIP_AT_ZERO, CLIP_TO_UNIT]) if (!same(readPrintedFigure(text, clip), referenceFigure(text, clip))) differ.push(`${clip}: ${text}`);
    }
    expect(differ).toEqual([]);
  });

  it("readPrintedInteger", () => {
    const differ = numberTexts.filter((text) => !Object.is(readPrintedInteger(text), referenceInteger(text)));
    expect(differ).toEqual([]);
  });

  it("readPrintedP, at two levels of alpha", () => {
    const differ: string[] = [];
    for (const text of pTexts) for (const alpha of [0.05, 0.01]) if (!same(readPrintedP(text, alpha), referenceP(text, alpha))) differ.push(`${alpha}: ${text}`);
    expect(differ).toEqual([]);
  });

  it("gives half a unit of the last decimal as the nearest double to 5e−(k+1), for k = 0 … 15", () => {
    // around 0, so that the last bit of the half unit shows in lo and hi
    for (let k = 0; k <= 15; k++) {
      const text = k === 0 ? "0" : `0.${"0".repeat(k)}`;
      const n = readPrintedNumber(text) as PrintedNumber;
      expect([n.decimals, n.lo, n.hi], text).toEqual([k, -referenceHalf(k), referenceHalf(k)]);
    }
  });
});
