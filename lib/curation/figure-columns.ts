import { readPrintedNumber } from "@/lib/recheck/printed";
import { textAttribute } from "@/models/figures";

// Printed text and parsed value of each figure, `{chisqText: "9.20", chisq: 9.2, …}` (DESIGN §3): the text
// is the data, the number is for sorting and statistics. Shared by the demo seed and the curation saves.

/** A printed relation ("< .001", "= .032") keeps its text; its number is the bound printed after it. */
export function figureColumns(figures: Partial<Record<string, string>>, names: readonly string[]): Record<string, string | number | null> {
  const columns: Record<string, string | number | null> = {};
  for (const name of names) {
    const printed = figures[name]?.trim();
    columns[textAttribute(name)] = printed ? printed : null;
    columns[name] = printed ? (readPrintedNumber(printed.replace(/^[<>=≤≥]\s*/, ""))?.value ?? null) : null;
  }
  return columns;
}
