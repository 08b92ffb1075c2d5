// Reading a sheet's header row against the column catalogue: names are trimmed and case-insensitive; an
// unknown name is refused with the nearest known column, because a typo must never silently lose data.
import { COLUMNS_BY_NAME, PART_ORDER, SHEET_COLUMNS, type ColumnSpec } from "@/lib/csv/columns";
import { SheetError } from "@/lib/csv/sheet-error";

/** The header resolved: the catalogue column behind each position of a row. */
export interface SheetLayout {
  columns: readonly ColumnSpec[];
  /** per position: the index in PART_ORDER of the part the column fills, and the field's key */
  partSlots: readonly number[];
  keys: readonly string[];
}

export function normaliseColumnName(raw: string): string {
  return raw.trim().toLowerCase();
}

/**
 * Edit distance counting an adjacent transposition as one edit ("rmsae" → "rmsea"), the commonest typo:
 * the optimal-string-alignment variant of Damerau (1964) over Levenshtein (1966), three table rows.
 */
function editDistance(a: string, b: string): number {
  let before: number[] = [];
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      let best = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) best = Math.min(best, before[j - 2] + 1);
      current.push(best);
    }
    before = previous;
    previous = current;
  }
  return previous[b.length];
}

/**
 * The candidate nearest to a mistyped name, or undefined when nothing is close: "close" is at most a
 * third of the name's length in edits (at least 1, at most 3) — a judgement call, not a published rule.
 */
export function nearestName(name: string, candidates: Iterable<string>): string | undefined {
  const limit = Math.min(3, Math.max(1, Math.floor(name.length / 3)));
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    const distance = editDistance(name, candidate);
    if (distance < bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return bestDistance <= limit ? best : undefined;
}

/** The known column a mistyped header most likely meant; spaces and hyphens are read as underscores first. */
export function suggestColumn(name: string): string | undefined {
  const cleaned = normaliseColumnName(name).replace(/[\s-]+/g, "_");
  if (COLUMNS_BY_NAME.has(cleaned)) return cleaned;
  return nearestName(cleaned, COLUMNS_BY_NAME.keys());
}

export function unknownColumnMessage(name: string): string {
  const suggestion = suggestColumn(name);
  return suggestion ? `unknown column "${name}" (did you mean "${suggestion}"?)` : `unknown column "${name}"`;
}

/** Checks the header row and maps each position to its column; throws a SheetError naming every problem. */
export function resolveHeader(cells: readonly string[]): SheetLayout {
  const columns: ColumnSpec[] = [];
  const unknown: string[] = [];
  const unnamed: number[] = [];
  const seen = new Set<string>();
  const duplicates = new Set<string>();

  cells.forEach((cell, index) => {
    const name = normaliseColumnName(cell);
    if (name === "") {
      unnamed.push(index + 1);
      return;
    }
    const spec = COLUMNS_BY_NAME.get(name);
    if (!spec) {
      unknown.push(cell.trim());
      return;
    }
    if (seen.has(name)) duplicates.add(name);
    seen.add(name);
    columns.push(spec);
  });

  if (unknown.length > 0) {
    const what = unknown.length === 1 ? "" : `${unknown.length} unknown columns: `;
    throw new SheetError("unknown_column", what + unknown.map(unknownColumnMessage).join(", "));
  }
  if (unnamed.length > 0) {
    throw new SheetError("unnamed_column", `header cell ${unnamed.join(", ")} is empty; every column needs a name`);
  }
  if (duplicates.size > 0) {
    const names = [...duplicates].map((n) => `"${n}"`).join(", ");
    throw new SheetError("duplicate_column", `column ${names} appears more than once in the header`);
  }

  const missing = SHEET_COLUMNS.filter((c) => c.requirement === "required" && !seen.has(c.name)).map((c) => `"${c.name}"`);
  if (missing.length > 0) {
    const noun = missing.length === 1 ? "column" : "columns";
    throw new SheetError("missing_column", `required ${noun} ${missing.join(", ")} missing from the header`);
  }
  if (!seen.has("doi") && !seen.has("paper_ref")) {
    throw new SheetError("missing_column", `required column "doi" (or "paper_ref" when a paper has no DOI) missing from the header`);
  }
  return { columns, partSlots: columns.map((c) => PART_ORDER.indexOf(c.part)), keys: columns.map((c) => c.key) };
}
