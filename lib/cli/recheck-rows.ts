// The result lines of the recheck command line (DESIGN §4.5) for one sheet row: shared by the command's
// main thread (small sheets, one core) and its worker threads (lib/cli/recheck-pool.ts).
import { checkSheetRow, csvLine, mergeFieldErrors, toComparisonInput, type SheetRow } from "@/lib/csv";
import { recheck } from "@/lib/recheck";

export type Format = "jsonl" | "csv";

export const CSV_HEADER = csvLine(["row", "comparison", "outcome", "code", "severity", "subject", "column", "message", "engine_version"]);

/** The result lines of one row. The sheet's own checks run first; the engine validates the figures once. */
export function resultLines(row: SheetRow, format: Format): string {
  const comparison = row.comparison.label ?? null;
  const sheetErrors = checkSheetRow(row);
  const outcome = row.problems.length > 0 ? null : recheck(toComparisonInput(row));
  const errors = outcome && !outcome.ok ? mergeFieldErrors(sheetErrors, outcome.errors) : sheetErrors;

  if (errors.length > 0 || !outcome?.ok) {
    if (format === "jsonl") return JSON.stringify({ row: row.row, comparison, errors }) + "\n";
    return errors.map((e) => csvLine([String(row.row), comparison ?? "", "error", "", "", "", e.column, e.message, ""])).join("");
  }

  const { findings, skipped, recomputed, engineVersion } = outcome.result;
  if (format === "jsonl") {
    const brief = findings.map((f) => ({ code: f.code, severity: f.severity, message: f.message }));
    return JSON.stringify({ row: row.row, comparison, findings: brief, skipped, recomputed, engineVersion }) + "\n";
  }
  if (findings.length === 0) return csvLine([String(row.row), comparison ?? "", "clean", "", "", "", "", "", engineVersion]);
  return findings
    .map((f) => csvLine([String(row.row), comparison ?? "", "finding", f.code, f.severity, f.subject, "", f.message, engineVersion]))
    .join("");
}

/** The result lines of a batch of rows, in order. */
export function batchLines(rows: readonly SheetRow[], format: Format): string {
  let text = "";
  for (const row of rows) text += resultLines(row, format);
  return text;
}
