const integer = new Intl.NumberFormat("en-GB");

export function formatCount(value: number): string {
  return integer.format(value);
}

/** "12.5 %" with one decimal; "–" when the denominator is zero (no share can be computed). */
export function formatShare(part: number, whole: number): string {
  if (whole === 0) return "–";
  return `${((100 * part) / whole).toFixed(1)} %`;
}
