// Readers for numbers as papers print them (DESIGN §4.1). A value printed with k decimals stands for
// the interval [x − ½·10^−k, x + ½·10^−k]; the number of printed decimals is the whole point, so the
// text is scanned by hand (no parseFloat on the raw cell, no regular expressions in the hot path).

/** A printed decimal number and the interval it stands for. */
export interface PrintedNumber {
  readonly text: string;
  readonly value: number;
  readonly lo: number;
  readonly hi: number;
  /** decimals after the point (negative for "1e3"-style prints, where the last digit is in the thousands) */
  readonly decimals: number;
}

/** How a p-value was printed: "= .032", "< .001", "> .05", "ns". */
export type PRelation = "=" | "<" | "<=" | ">" | ">=" | "ns";

/** A printed p-value and the interval of p it allows. */
export interface PrintedP {
  text: string;
  relation: PRelation;
  lo: number;
  hi: number;
  /** "< .05" excludes .05 itself: matters when deciding which side of alpha an interval lies on */
  hiOpen: boolean;
  loOpen: boolean;
  /** the printed figure (the bound for "<" / ">"); null for "ns" */
  value: number | null;
  decimals: number;
  /** printed as exactly zero (".000"): a p-value is never zero */
  printedZero: boolean;
}

export type ReadResult<T> = { ok: true; value: T } | { ok: false; message: string };

// 0.5·10^-k for the usual k, so the common case costs a table look-up instead of Math.pow.
const HALF_UNIT = [0.5, 0.05, 0.005, 0.0005, 0.00005, 0.000005, 5e-7, 5e-8, 5e-9, 5e-10, 5e-11, 5e-12, 5e-13];

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15];

function halfUnit(decimals: number): number {
  return decimals >= 0 && decimals < HALF_UNIT.length ? HALF_UNIT[decimals] : 0.5 * Math.pow(10, -decimals);
}

/** Which ends of a figure's rounding interval are clipped: none, below at 0, or to [0, 1]. */
export type Clip = 0 | 1 | 2;
export const CLIP_NONE: Clip = 0;
/** a statistic that cannot be negative: "0.00" stands for [0, .005] */
export const CLIP_AT_ZERO: Clip = 1;
/** a proportion (CFI): also "1.000" stands for [.9995, 1] */
export const CLIP_TO_UNIT: Clip = 2;

/** The PrintedNumber for value and decimals, its interval clipped as `clip` says. */
function figure(text: string, value: number, decimals: number, clip: Clip): PrintedNumber {
  return bounded(text, value, halfUnit(decimals), decimals, clip);
}

/**
 * figure() with the half rounding unit already known. Every reader builds its PrintedNumber here, so
 * that the checks' reads of it see a single object shape.
 */
function bounded(text: string, value: number, half: number, decimals: number, clip: Clip): PrintedNumber {
  const lo = value - half;
  const hi = value + half;
  return { text, value, lo: clip !== CLIP_NONE && lo < 0 ? 0 : lo, hi: clip === CLIP_TO_UNIT && hi > 1 ? 1 : hi, decimals };
}

/**
 * Reads a printed decimal ("9.20", ".032", "-3.5", "−3.5" with a typographic minus, "2.1e-45") into its
 * value and rounding interval. Returns null for anything else (thousands separators, decimal commas and
 * words are rejected rather than guessed: "1,234" could be 1234 or 1.234).
 */
export function readPrintedNumber(raw: string): PrintedNumber | null {
  return readPrintedFigure(raw, CLIP_NONE);
}

/**
 * readPrintedNumber with the interval clipped as `clip` says (the sheet readers know which figures
 * cannot be negative). This is the path for what papers nearly always print, a plain decimal of at most
 * 15 digits with nothing around it ("247.57", "-3.5", ".032"), kept short enough for the optimiser to
 * inline it into its callers; anything else (surrounding spaces, an exponent, more digits, a malformed
 * or blank cell) is read again from the start by readTrimmed, which gives the same result for the plain
 * decimals too. The cell is read once: no separate blank test or trim first.
 */
export function readPrintedFigure(raw: string, clip: Clip): PrintedNumber | null {
  // One loop over the characters, the decimal point found by its position: the digit test is a single
  // unsigned comparison, and the counts of digits and decimals come from positions instead of counters
  // kept per character. Each character is read once (a charCodeAt compiles to a dispatch on the
  // string's representation), the first one too. Tried: integer and fraction part in two loops, no gain.
  const end = raw.length;
  if (end === 0) return null;
  let c = raw.charCodeAt(0);
  let i = 0;
  if (c === 45 /* - */) {
    if (end === 1) return null; // "-" alone
    c = raw.charCodeAt(1);
    i = 1;
  }
  const first = i;
  let mantissa = 0;
  let point = -1;
  for (;;) {
    const d = c - 48; // 0–9 for a digit; -2 for "."
    if (d >>> 0 <= 9) mantissa = mantissa * 10 + d;
    else if (d === -2 && point < 0) point = i;
    else break;
    if (++i >= end) break;
    c = raw.charCodeAt(i);
  }
  const digits = point < 0 ? end - first : end - first - 1;
  if (i < end || digits <= 0 || digits > 15) return readTrimmed(raw, clip);
  const decimals = point < 0 ? 0 : end - point - 1;
  // mantissa / 10^k is one correctly rounded IEEE division, i.e. exactly what Number() returns; so is
  // 0.5 / 10^k, the double nearest ½·10^−k: what halfUnit gives for these k ≤ 15 (its table to k = 12,
  // 0.5·10^−k above, which equals it for k = 13, 14, 15), without a second table look-up.
  const scale = POW10[decimals];
  let value = mantissa / scale;
  if (first === 1) value = -value;
  if (value === 0) value = 0; // no negative zero in outputs
  return bounded(raw, value, 0.5 / scale, decimals, clip);
}

/** Every form readPrintedNumber accepts, with the spaces around it. */
function readTrimmed(raw: string, clip: Clip): PrintedNumber | null {
  let start = 0;
  let end = raw.length;
  while (start < end && raw.charCodeAt(start) <= 32) start++;
  while (end > start && raw.charCodeAt(end - 1) <= 32) end--;
  const value = scanInFull(raw, start, end);
  if (value !== value) return null; // NaN: not a number
  return figure(start === 0 && end === raw.length ? raw : raw.slice(start, end), value, scannedDecimals, clip);
}

// The decimals of the number scanInFull or scanValue last read. Handed back beside the returned value
// rather than in an object, so that the p-value and integer readers build no PrintedNumber only to take
// two fields out of it.
let scannedDecimals = 0;

/**
 * The value of the decimal printed on raw[start, end) (no substring is made), NaN when there is none;
 * its decimals in scannedDecimals. The same short path as readPrintedFigure first, then scanInFull.
 */
function scanValue(raw: string, start: number, end: number): number {
  const first = start < end && raw.charCodeAt(start) === 45 /* - */ ? start + 1 : start;
  let mantissa = 0;
  let point = -1;
  let i = first;
  for (; i < end; i++) {
    const d = raw.charCodeAt(i) - 48;
    if (d >>> 0 <= 9) mantissa = mantissa * 10 + d;
    else if (d === -2 && point < 0) point = i;
    else break;
  }
  const digits = point < 0 ? end - first : end - first - 1;
  if (i !== end || digits <= 0 || digits > 15) return scanInFull(raw, start, end);
  const decimals = point < 0 ? 0 : end - point - 1;
  let value = mantissa / POW10[decimals];
  if (first !== start) value = -value;
  if (value === 0) value = 0;
  scannedDecimals = decimals;
  return value;
}

/**
 * Every form readPrintedNumber accepts, on raw[start, end): signs, typographic minus, exponents, long
 * mantissas. Returns the value (decimals in scannedDecimals), or NaN.
 */
function scanInFull(raw: string, start: number, end: number): number {
  let i = start;
  let negative = false;
  if (i < end) {
    const c = raw.charCodeAt(i);
    if (c === 45 /* - */ || c === 0x2212 /* − */) {
      negative = true;
      i++;
    } else if (c === 43 /* + */) {
      i++;
    }
  }
  let mantissa = 0;
  let digits = 0;
  let decimals = 0;
  let c = i < end ? raw.charCodeAt(i) : 0;
  while (c >= 48 && c <= 57) {
    mantissa = mantissa * 10 + (c - 48);
    digits++;
    c = ++i < end ? raw.charCodeAt(i) : 0;
  }
  if (c === 46 /* . */) {
    c = ++i < end ? raw.charCodeAt(i) : 0;
    while (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
      decimals++;
      c = ++i < end ? raw.charCodeAt(i) : 0;
    }
  }
  if (digits === 0) return NaN;
  let exponent = 0;
  if (c === 101 || c === 69 /* e E */) {
    c = ++i < end ? raw.charCodeAt(i) : 0;
    let expNegative = false;
    if (c === 45 || c === 43 || c === 0x2212) {
      expNegative = c !== 43;
      c = ++i < end ? raw.charCodeAt(i) : 0;
    }
    let expDigits = 0;
    while (c >= 48 && c <= 57) {
      exponent = exponent * 10 + (c - 48);
      expDigits++;
      c = ++i < end ? raw.charCodeAt(i) : 0;
    }
    if (expDigits === 0) return NaN;
    if (expNegative) exponent = -exponent;
  }
  if (i !== end) return NaN;
  // For up to 15 digits and no exponent, mantissa / 10^k is one correctly rounded IEEE division, i.e.
  // exactly what Number() returns; longer or exponent forms go through Number() itself.
  let value: number;
  if (digits <= 15 && exponent === 0 && decimals < POW10.length) {
    value = mantissa / POW10[decimals];
  } else {
    const signed = raw.charCodeAt(start) === 45 || raw.charCodeAt(start) === 43 || raw.charCodeAt(start) === 0x2212;
    value = Number(raw.slice(signed ? start + 1 : start, end).replace("\u2212", "-"));
  }
  if (negative) value = -value;
  if (!Number.isFinite(value)) return NaN;
  if (value === 0) value = 0; // no negative zero in outputs
  scannedDecimals = decimals - exponent;
  return value;
}

/** Reads an exact integer count ("24", "-3"; "24.0" is accepted as 24). Null when not an integer. */
export function readPrintedInteger(raw: string): number | null {
  // Fast path for what counts nearly always look like, 1–15 plain ASCII digits: the value is exact, and
  // no PrintedNumber is built only to be thrown away (a comparison has up to eleven such cells).
  const length = raw.length;
  if (length > 0 && length <= 15) {
    let value = 0;
    let i = 0;
    for (; i < length; i++) {
      const c = raw.charCodeAt(i);
      if (c < 48 || c > 57) break;
      value = value * 10 + (c - 48);
    }
    if (i === length) return value;
  }
  let start = 0;
  let end = length;
  while (start < end && raw.charCodeAt(start) <= 32) start++;
  while (end > start && raw.charCodeAt(end - 1) <= 32) end--;
  const value = scanInFull(raw, start, end);
  return Number.isInteger(value) ? value : null; // NaN (not a number) is no integer either
}

function isSpace(code: number): boolean {
  return code === 32 || code === 9 || code === 0xa0;
}

const NS_FORMS = new Set(["ns", "n.s.", "n.s", "ns.", "n. s.", "not significant"]);

/**
 * Reads a printed p-value into the interval it allows (DESIGN §4.1): "= .032", ".032", "p = .032",
 * "p=.032" → [.0315, .0325]; "< .001" → [0, .001]; "<.05"; "> .05" → [.05, 1]; ".000" → [0, .0005];
 * "ns" / "n.s." → [alpha, 1]. Trailing significance stars ("< .001***") are ignored.
 */
export function readPrintedP(raw: string, alpha = 0.05): ReadResult<PrintedP> {
  const result = scanP(raw, alpha);
  return typeof result === "string" ? { ok: false, message: result } : { ok: true, value: result };
}

/** readPrintedP without the result wrapper: the PrintedP, or the error message. */
export function scanP(raw: string, alpha: number): PrintedP | string {
  // Each character before the number is read once: c holds raw[i] (0 past the end) as the scan moves.
  let start = 0;
  let end = raw.length;
  let c = end > 0 ? raw.charCodeAt(0) : 0;
  while (c <= 32 && start < end) c = ++start < end ? raw.charCodeAt(start) : 0;
  while (end > start) {
    const e = raw.charCodeAt(end - 1);
    if (e > 32 && e !== 42 /* * */) break;
    end--;
  }
  const first = c | 32; // ASCII lower case
  if (first === 110 /* n */) {
    const text = raw.slice(start, end);
    if (NS_FORMS.has(text.toLowerCase())) {
      return { text, relation: "ns", lo: alpha, hi: 1, hiOpen: false, loOpen: false, value: null, decimals: 0, printedZero: false };
    }
    return `"${text}" is not a p-value (write e.g. .032, = .032, < .001, > .05 or ns)`;
  }
  let i = start;
  if (first === 112 /* p */) {
    c = ++i < end ? raw.charCodeAt(i) : 0;
    while (isSpace(c)) c = ++i < end ? raw.charCodeAt(i) : 0;
  }
  let relation: PRelation = "=";
  if (c === 61 /* = */) {
    c = ++i < end ? raw.charCodeAt(i) : 0;
  } else if (c === 60 /* < */ || c === 0x2264 /* ≤ */) {
    relation = c === 0x2264 ? "<=" : "<";
    const ascii = c === 60;
    c = ++i < end ? raw.charCodeAt(i) : 0;
    if (ascii && c === 61) {
      relation = "<=";
      c = ++i < end ? raw.charCodeAt(i) : 0;
    }
  } else if (c === 62 /* > */ || c === 0x2265 /* ≥ */) {
    relation = c === 0x2265 ? ">=" : ">";
    const ascii = c === 62;
    c = ++i < end ? raw.charCodeAt(i) : 0;
    if (ascii && c === 61) {
      relation = ">=";
      c = ++i < end ? raw.charCodeAt(i) : 0;
    }
  }
  while (isSpace(c)) c = ++i < end ? raw.charCodeAt(i) : 0;
  const numberStart = i;
  const value = scanValue(raw, numberStart, end);
  const decimals = scannedDecimals;
  const text = start === 0 && end === raw.length ? raw : raw.slice(start, end);
  if (value !== value) return `"${text}" is not a p-value (write e.g. .032, = .032, < .001, > .05 or ns)`;
  if (value < 0 || value > 1) return `p = ${raw.slice(numberStart, end)} lies outside [0, 1]`;
  let lo: number;
  let hi: number;
  if (relation === "=") {
    const half = halfUnit(decimals);
    lo = value - half < 0 ? 0 : value - half;
    hi = value + half > 1 ? 1 : value + half;
  } else if (relation === "<" || relation === "<=") {
    if (value === 0) return `p ${relation} 0 is impossible: a p-value is never below zero`;
    lo = 0;
    hi = value;
  } else {
    if (value === 1 && relation === ">") return "p > 1 is impossible";
    lo = value;
    hi = 1;
  }
  return {
    text,
    relation,
    lo,
    hi,
    hiOpen: relation === "<",
    loOpen: relation === ">",
    value,
    decimals,
    printedZero: relation === "=" && value === 0,
  };
}

/** The text is empty or missing: "not reported" (DESIGN §4.1). */
export function isBlank(text: string | undefined | null): text is undefined | null | "" {
  if (text === undefined || text === null) return true;
  for (let i = 0; i < text.length; i++) if (!isSpace(text.charCodeAt(i))) return false;
  return true;
}
