import type { Proportion } from "./wilson";

/** "12.5 % (95 % CI 10.1–15.3 %)" — or "–" when nothing was counted */
export function formatProportion(value: Proportion, digits = 1): string {
  if (value.share === null || value.low === null || value.high === null) return "–";
  const percent = (share: number) => (100 * share).toFixed(digits);
  return `${percent(value.share)} % (95 % CI ${percent(value.low)}–${percent(value.high)} %)`;
}

export function formatShareOnly(value: Proportion, digits = 1): string {
  return value.share === null ? "–" : `${(100 * value.share).toFixed(digits)} %`;
}
