// Figures that can stand in for unprinted ones: the scaled χ² from χ²/c and the scaling factor from
// χ²/χ²_scaled (DESIGN §4.3: "scaling factors reported (or derivable as c = χ²_ML / χ²_scaled)").
// Interval arithmetic: a quotient's interval comes from the ends of its operands.
import type { ParsedModel } from "../parse";
import type { Interval } from "../types";

export interface Derived {
  interval: Interval;
  value: number;
  /** printed, or computed from other printed figures */
  source: "printed" | "derived";
}

/** The scaled (robust) χ²: printed, or χ²_ML / c. */
export function scaledStatistic(m: ParsedModel): Derived | null {
  if (m.chisqScaled !== null) return { interval: { lo: m.chisqScaled.lo, hi: m.chisqScaled.hi }, value: m.chisqScaled.value, source: "printed" };
  if (m.chisq !== null && m.scaling !== null && m.scaling.lo > 0) {
    return {
      interval: { lo: m.chisq.lo / m.scaling.hi, hi: m.chisq.hi / m.scaling.lo },
      value: m.chisq.value / m.scaling.value,
      source: "derived",
    };
  }
  return null;
}

/** The χ² scaling correction factor c: printed, or χ²_ML / χ²_scaled. */
export function scalingFactor(m: ParsedModel): Derived | null {
  if (m.scaling !== null) return { interval: { lo: m.scaling.lo, hi: m.scaling.hi }, value: m.scaling.value, source: "printed" };
  if (m.chisq !== null && m.chisqScaled !== null && m.chisqScaled.lo > 0 && m.chisq.value > 0) {
    return {
      interval: { lo: m.chisq.lo / m.chisqScaled.hi, hi: m.chisq.hi / m.chisqScaled.lo },
      value: m.chisq.value / m.chisqScaled.value,
      source: "derived",
    };
  }
  return null;
}
