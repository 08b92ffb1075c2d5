// The body of POST /api/recheck: one comparison, either flat — the sheet's own columns (DESIGN §5) as
// JSON keys, {"method":"lrt","a_chisq":"85.31",...} — or structured like the engine's ComparisonInput,
// {method, sample:{n}, restricted:{chisq,...}, free:{...}}. Figures should be sent as the printed text
// ("9.20" keeps its two decimals); a JSON number is accepted and turned into text with JavaScript's
// shortest form (9.20 arrives as 9.2 and counts as printed with one decimal). null means "not reported".
import { z } from "zod";
// The catalogue modules only, not lib/csv's index: the entry form imports this schema in the browser and
// has no use for the streaming reader.
import { SHEET_COLUMNS } from "@/lib/csv/columns";
import { nearestName, unknownColumnMessage } from "@/lib/csv/header";
import { emptyRecord, recordPart, toComparisonInput } from "@/lib/csv/sheet-row";
import type { FieldErrors } from "@/lib/errors";
import type { ComparisonInput } from "@/lib/recheck/types";

const printedCell = z
  .union([z.string(), z.number()], { error: "must be the figure as printed (text) or a number" })
  .nullish()
  .transform((value) => (value === null || value === undefined ? undefined : String(value)));

type CellSchema = typeof printedCell;

function cells(keys: readonly string[]): Record<string, CellSchema> {
  return Object.fromEntries(keys.map((key) => [key, printedCell]));
}

// The comparison columns the engine reads; location and notes describe the paper, not the figures.
const COMPARISON_KEYS = SHEET_COLUMNS.filter((c) => c.part === "comparison" && c.key !== "location" && c.key !== "notes").map((c) => c.key);
const MODEL_KEYS = SHEET_COLUMNS.filter((c) => c.part === "a").map((c) => c.key);
const SAMPLE_KEYS = SHEET_COLUMNS.filter((c) => c.part === "sample").map((c) => c.key);

/** Flat: every §5 column is allowed (a row copied from a sheet works); paper columns are ignored. */
export const flatRecheckBodySchema = z.strictObject(cells(SHEET_COLUMNS.map((c) => c.name))).transform((flat): ComparisonInput => {
  const record = emptyRecord();
  for (const column of SHEET_COLUMNS) {
    const value = flat[column.name];
    if (value !== undefined && value !== "") recordPart(record, column.part)[column.key] = value;
  }
  return toComparisonInput(record);
});

const modelSchema = z.strictObject(cells(MODEL_KEYS));

export const structuredRecheckBodySchema = z
  .strictObject({
    ...cells(COMPARISON_KEYS),
    sample: z.strictObject(cells(SAMPLE_KEYS)).optional(),
    restricted: modelSchema,
    free: modelSchema,
  })
  // The shapes are built from the column catalogue, whose keys are ComparisonInput's own, so the parsed
  // object is a ComparisonInput; zod cannot see that through Object.fromEntries.
  .transform((body) => ({ ...body, sample: body.sample ?? {} }) as ComparisonInput);

/** Either form; parseRecheckBody picks the branch by shape first so that its errors name one form only. */
export const recheckBodySchema = z.union([structuredRecheckBodySchema, flatRecheckBodySchema]);

export type RecheckBodyResult = { ok: true; input: ComparisonInput } | { ok: false; message: string; fields: FieldErrors };

function isStructured(body: Record<string, unknown>): boolean {
  return ["restricted", "free", "sample"].some((key) => typeof body[key] === "object" && body[key] !== null);
}

/** The sheet column a structured path stands for ("restricted.chisq" → "a_chisq"), else the dotted path. */
function columnOf(path: readonly PropertyKey[]): string {
  const [head, key] = path.map(String);
  const part = head === "restricted" ? "a" : head === "free" ? "b" : head === "sample" ? "sample" : "comparison";
  const leaf = part === "comparison" ? head : key;
  const column = SHEET_COLUMNS.find((c) => c.part === part && c.key === leaf);
  return column?.name ?? path.map(String).join(".");
}

function unknownKeyMessage(key: string, structured: boolean, path: readonly PropertyKey[]): string {
  if (!structured) return unknownColumnMessage(key);
  const head = path.length > 0 ? String(path[0]) : "";
  const known = head === "restricted" || head === "free" ? MODEL_KEYS : head === "sample" ? SAMPLE_KEYS : [...COMPARISON_KEYS, "sample", "restricted", "free"];
  const suggestion = nearestName(key, known);
  return suggestion ? `unknown field "${key}" (did you mean "${suggestion}"?)` : `unknown field "${key}"`;
}

/** Validates a parsed JSON body into the engine's input, with errors keyed by sheet column. */
export function parseRecheckBody(body: unknown): RecheckBodyResult {
  if (typeof body !== "object" || body === null || Array.isArray(body)) {
    return { ok: false, message: "The body must be a JSON object describing one comparison.", fields: {} };
  }
  const structured = isStructured(body as Record<string, unknown>);
  const parsed = (structured ? structuredRecheckBodySchema : flatRecheckBodySchema).safeParse(body);
  if (parsed.success) return { ok: true, input: parsed.data };

  const fields: FieldErrors = {};
  const add = (column: string, message: string) => (fields[column] ??= []).push(message);
  for (const issue of parsed.error.issues) {
    if (issue.code === "unrecognized_keys") {
      for (const key of issue.keys) {
        const path = [...issue.path, key];
        add(structured ? path.map(String).join(".") : key, unknownKeyMessage(key, structured, issue.path));
      }
    } else {
      add(columnOf(issue.path), issue.message);
    }
  }
  return { ok: false, message: "Some fields of the comparison could not be read.", fields };
}
