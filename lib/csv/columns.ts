// The comparison sheet's column catalogue (DESIGN §5): every column, the part of the record it fills,
// and whether a sheet must have it. The order here is the order the writer uses for its header.
import type { ComparisonInput, FieldError, ModelInput, SampleInput } from "@/lib/recheck/types";

/** The paper a row belongs to, as printed in the sheet (the DOI normalised when it is one). */
export interface SheetPaper {
  doi?: string;
  paperRef?: string;
  title?: string;
  year?: string;
  journal?: string;
  authors?: string;
  field?: string;
}

/** The comparison's own cells: the engine's fields plus where it is printed and the coder's notes. */
export type SheetComparison = Omit<ComparisonInput, "sample" | "restricted" | "free"> & {
  location?: string;
  notes?: string;
};

/** One sheet row's content, every cell as text; an empty cell is undefined (absent or an undefined field). */
export interface SheetRecord {
  paper: SheetPaper;
  sample: SampleInput;
  comparison: SheetComparison;
  /** model A, prefix a_ */
  restricted: ModelInput;
  /** model B, prefix b_ */
  free: ModelInput;
}

/**
 * A data row as read. `row` is 1-based and counts data records only: row 1 is the first record after
 * the header (spreadsheet row 2). Blank records are counted but not yielded, so row numbers stay in step
 * with what a spreadsheet shows even when a quoted cell spans several lines of the file.
 */
export interface SheetRow extends SheetRecord {
  row: number;
  /** problems with the row as a whole (wrong number of cells, broken quoting); column is WHOLE_ROW */
  problems: readonly FieldError[];
}

/** The `column` of a problem that concerns the whole row rather than one cell. */
export const WHOLE_ROW = "(row)";

export type Requirement = "required" | "doi-or-paper-ref" | "optional";

type Spec<Part extends string, Target> = {
  name: string;
  part: Part;
  key: keyof Target & string;
  requirement: Requirement;
};

export type ColumnSpec =
  | Spec<"paper", SheetPaper>
  | Spec<"sample", SampleInput>
  | Spec<"comparison", SheetComparison>
  | Spec<"a" | "b", ModelInput>;

export type ColumnPart = ColumnSpec["part"];

/** The record parts in a fixed order, so a row builder can address them by number. */
export const PART_ORDER: readonly ColumnPart[] = ["paper", "sample", "comparison", "a", "b"];

function paper(name: string, key: keyof SheetPaper, requirement: Requirement = "optional"): ColumnSpec {
  return { name, part: "paper", key, requirement };
}
function sample(name: string, key: keyof SampleInput): ColumnSpec {
  return { name, part: "sample", key, requirement: "optional" };
}
function comparison(name: string, key: keyof SheetComparison, requirement: Requirement = "optional"): ColumnSpec {
  return { name, part: "comparison", key, requirement };
}

// Model columns without their a_/b_ prefix, in §5 order.
const MODEL_COLUMNS: ReadonlyArray<readonly [string, keyof ModelInput]> = [
  ["label", "label"],
  ["estimator", "estimator"],
  ["chisq", "chisq"],
  ["df", "df"],
  ["p", "p"],
  ["chisq_scaled", "chisqScaled"],
  ["scaling", "scaling"],
  ["cfi", "cfi"],
  ["tli", "tli"],
  ["rmsea", "rmsea"],
  ["rmsea_lo", "rmseaLo"],
  ["rmsea_hi", "rmseaHi"],
  ["srmr", "srmr"],
  ["aic", "aic"],
  ["bic", "bic"],
  ["loglik", "loglik"],
  ["loglik_scaling", "loglikScaling"],
  ["npar", "npar"],
  ["n_observed", "nObserved"],
  ["n_fixed_x", "nFixedX"],
  ["mean_structure", "meanStructure"],
  ["baseline_chisq", "baselineChisq"],
  ["baseline_df", "baselineDf"],
];

function modelColumns(part: "a" | "b"): ColumnSpec[] {
  return MODEL_COLUMNS.map(([suffix, key]) => ({
    name: `${part}_${suffix}`,
    part,
    key,
    // a model is identified by its label within the sample (DESIGN §5, import identity)
    requirement: suffix === "label" ? "required" : "optional",
  }));
}

export const SHEET_COLUMNS: readonly ColumnSpec[] = [
  paper("doi", "doi", "doi-or-paper-ref"),
  paper("paper_ref", "paperRef", "doi-or-paper-ref"),
  paper("title", "title"),
  paper("year", "year"),
  paper("journal", "journal"),
  paper("authors", "authors"),
  paper("field", "field"),
  sample("sample", "label"),
  sample("n", "n"),
  sample("n_groups", "groups"),
  comparison("comparison", "label", "required"),
  comparison("method", "method", "required"),
  comparison("nested", "nested"),
  comparison("alpha", "alpha"),
  comparison("location", "location"),
  comparison("d_chisq", "dChisq"),
  comparison("d_df", "dDf"),
  comparison("d_p", "dP"),
  comparison("d_cfi", "dCfi"),
  comparison("d_rmsea", "dRmsea"),
  comparison("d_aic", "dAic"),
  comparison("d_bic", "dBic"),
  comparison("preferred", "preferred"),
  comparison("invariance_claimed", "invarianceClaimed"),
  comparison("notes", "notes"),
  ...modelColumns("a"),
  ...modelColumns("b"),
];

export const COLUMNS_BY_NAME: ReadonlyMap<string, ColumnSpec> = new Map(SHEET_COLUMNS.map((c) => [c.name, c]));

/** §5 defaults, applied by the reader when the cell is empty or the column absent. */
export const DEFAULT_SAMPLE_LABEL = "Sample 1";
export const DEFAULT_GROUP_COUNT = "1";
