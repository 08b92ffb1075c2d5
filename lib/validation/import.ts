// Inputs of the sheet importer (issue 6), shared by the upload form and the route handlers.
import { z } from "zod";
import type { FieldError } from "@/lib/recheck/types";

/** DESIGN/issue 6: an upload is refused past 50 MB, before the body is read in full. */
export const MAX_UPLOAD_BYTES = 50 * 1024 * 1024;

export const uploadQuerySchema = z.object({
  name: z
    .string({ error: "Say which file this is (?name=…)." })
    .trim()
    .min(1, "Say which file this is (?name=…).")
    .max(300, "The file name is longer than 300 characters.")
    .refine((name) => /\.csv$/i.test(name), "Only comparison sheets in CSV format can be imported (the file name must end in .csv)."),
});

export const batchParamsSchema = z.object({ id: z.coerce.number().int().positive() });

export const rejectedQuerySchema = z.object({});

export const EXPORT_FORMATS = ["csv", "json", "bibtex", "ris"] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];
export const ownExportQuerySchema = z.object({
  format: z.enum(EXPORT_FORMATS, { error: "format must be csv, json, bibtex or ris" }).default("csv"),
});

/**
 * Column widths of the stored entry (models/*.ts): longer text would be cut by PostgreSQL and is
 * refused by the models, so the importer names the cell instead of failing the whole commit.
 */
export const TEXT_LIMITS = {
  doi: 300,
  paper_ref: 100,
  title: 2000,
  journal: 300,
  field: 100,
  sample: 200,
  comparison: 200,
  location: 300,
  a_label: 200,
  b_label: 200,
  alpha: 20,
} as const;

/** Figure text is stored in 40-character columns (models/fit-model.ts figureAttributes). */
export const MAX_FIGURE_TEXT = 40;

export function tooLong(column: string, value: string, max: number): FieldError {
  return { column, message: `is ${value.length} characters long; at most ${max} fit` };
}
