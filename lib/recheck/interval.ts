// Interval arithmetic for printed figures (DESIGN §4.1). A reported value is consistent with a
// recomputed one when their intervals meet; the comparison allows a relative 1e-9 for floating-point
// noise (9.2 − 0.005 is 9.194999999999999 in binary), far below any printed precision.
import type { Interval } from "./types";

const RELATIVE_SLACK = 1e-9;

/** Do [aLo, aHi] and [bLo, bHi] share a point (up to floating-point noise)? */
export function meets(aLo: number, aHi: number, bLo: number, bHi: number): boolean {
  const slack = RELATIVE_SLACK * Math.max(Math.abs(aLo), Math.abs(aHi), Math.abs(bLo), Math.abs(bHi));
  return aLo <= bHi + slack && bLo <= aHi + slack;
}

export function interval(lo: number, hi: number): Interval {
  return { lo, hi };
}

/** a − b for intervals a = [aLo, aHi], b = [bLo, bHi]. */
export function differenceOf(a: { lo: number; hi: number }, b: { lo: number; hi: number }): Interval {
  return { lo: a.lo - b.hi, hi: a.hi - b.lo };
}

/** Rounds for messages: enough digits to show the disagreement, never "NaN". */
export function show(x: number, digits = 3): string {
  if (!Number.isFinite(x)) return x > 0 ? "∞" : x < 0 ? "−∞" : "undefined";
  if (x === 0) return "0";
  const ax = Math.abs(x);
  if (ax < 1e-3 || ax >= 1e7) return formatMinus(x.toExponential(Math.max(0, digits - 1)));
  if (Number.isInteger(x)) return formatMinus(String(x));
  const fixed = x.toFixed(ax < 1 ? digits + 1 : digits);
  return formatMinus(digits <= 7 ? withoutTrailingZeros(fixed) : String(Number(fixed)));
}

/**
 * "12.340" → "12.34", "3.000" → "3", "-0.0" → "0": the same as String(Number(s)) for a toFixed string of
 * at most 15 significant digits (such a decimal is the shortest form of its own double, so converting it
 * to a number and back only drops the trailing zeros), without that round trip.
 */
function withoutTrailingZeros(s: string): string {
  let end = s.length;
  if (s.indexOf(".") >= 0) {
    while (s.charCodeAt(end - 1) === 48 /* 0 */) end--;
    if (s.charCodeAt(end - 1) === 46 /* . */) end--;
  }
  const out = end === s.length ? s : s.slice(0, end);
  return out === "-0" ? "0" : out;
}

/** A p-value for messages: small ones in scientific notation. */
export function showP(p: number): string {
  if (p === 0) return "0";
  if (p < 1e-3) return formatMinus(p.toExponential(2));
  // a toFixed(4) string of a p ≤ 1 has at most 5 significant digits (see withoutTrailingZeros)
  return withoutTrailingZeros(p.toFixed(4));
}

export function showInterval(lo: number, hi: number, digits = 3): string {
  const a = show(lo, digits);
  const b = show(hi, digits);
  return a === b ? a : `[${a}, ${b}]`;
}

export function showPInterval(lo: number, hi: number): string {
  const a = showP(lo);
  const b = showP(hi);
  return a === b ? a : `[${a}, ${b}]`;
}

function formatMinus(s: string): string {
  return s.replaceAll("-", "−");
}

/** A number for `values`/`recomputed`: never NaN or Infinity in stored JSON. */
export function finite(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}
