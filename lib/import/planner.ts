// The importer's judgement on each accepted row: which paper, sample, models and comparison it names (the
// identity keys of DESIGN §5), whether each is new, changed or as stored, and whether the uploader may
// change it. Rows are judged in sheet order; within one sheet the first accepted row that names a model
// (or sample, or comparison) fixes it, and a later row that disagrees is refused with both row numbers.
import type { FieldError } from "@/lib/recheck/types";
import type { CslName } from "@/models/paper";
import { MODEL_FIGURES, COMPARISON_FIGURES, textAttribute } from "@/models/figures";
import { MODEL_SIGNATURE_COLUMNS, decodeSignature, encodeSignature, valuesComparisonSignature, valuesModelSignature, type ModelValues, type RowEntry } from "./entry";
import { childKey, type ExistingPaper, type ExistingState } from "./existing";

export type Change = "new" | "changed" | "same";
export type RowOutcome = "new" | "updated" | "unchanged";

export const MODEL_SIGNATURE_ATTRIBUTES = ["estimator", "meanStructure", ...MODEL_FIGURES.map(textAttribute)];
export const COMPARISON_SIGNATURE_ATTRIBUTES = ["method", "nested", "alphaText", "location", "preferred", "invarianceClaimed", "notes", "restrictedModel", "freeModel", ...COMPARISON_FIGURES.map(textAttribute)];

const PAPER_FIELDS = ["title", "year", "journal", "authors", "field", "ref"] as const;
type PaperField = (typeof PAPER_FIELDS)[number];
const PAPER_COLUMN: Record<PaperField, string> = { title: "title", year: "year", journal: "journal", authors: "authors", field: "field", ref: "paper_ref" };

export interface PlannedPaper {
  key: string;
  id: number;
  isNew: boolean;
  existing: ExistingPaper | null;
  doi: string | null;
  /** the paper's metadata from the sheet: the first non-empty value of each field */
  sheet: Partial<Record<PaperField, unknown>>;
  sheetRow: Partial<Record<PaperField, number>>;
  /** an existing paper some row changes (metadata or any sample, model or comparison) */
  touched: boolean;
  /** a new paper whose metadata a later row completed after it was first written */
  amended: boolean;
  written: boolean;
}

interface PlannedSample {
  id: number;
  row: number;
  n: number | null;
  groups: number;
}

interface PlannedModel {
  id: number;
  row: number;
  signature: string;
}

export interface PlannedWrite<V> {
  id: number;
  change: "new" | "changed";
  values: V;
  /** changed attributes before and after (updates only) */
  before?: Record<string, unknown>;
  after?: Record<string, unknown>;
}

export interface RowPlan {
  outcome: RowOutcome;
  paper: PlannedPaper;
  sampleId: number;
  restrictedId: number;
  freeId: number;
  comparisonId: number;
  /** first-time writes this row brings (a model shared by several rows is written once) */
  sample?: PlannedWrite<RowEntry["sample"]>;
  models: PlannedWrite<ModelValues>[];
  comparison?: PlannedWrite<RowEntry["comparison"]>;
  /** a new paper to insert now (its first accepted row) */
  insertPaper: boolean;
}

export type Judgement = { ok: true; plan: RowPlan } | { ok: false; errors: FieldError[] };

export interface IdCounters {
  paper: number;
  sample: number;
  model: number;
  comparison: number;
}

function same(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== "object" || typeof b !== "object") return (a ?? null) === (b ?? null);
  return JSON.stringify(a ?? null) === JSON.stringify(b ?? null);
}

function firstDifference(a: readonly (string | null)[], b: readonly (string | null)[]): number {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return i;
  return -1;
}

function quoted(value: string | null | undefined): string {
  return value === null || value === undefined ? "empty" : `"${value}"`;
}

function changes(names: readonly string[], before: readonly (string | null)[], after: readonly (string | null)[]) {
  const was: Record<string, unknown> = {};
  const now: Record<string, unknown> = {};
  names.forEach((name, i) => {
    if (before[i] !== after[i]) {
      was[name] = before[i];
      now[name] = after[i];
    }
  });
  return { before: was, after: now };
}

function describePaper(key: string): string {
  return key.startsWith("doi:") ? `paper ${key.slice(4)}` : `paper "${key.slice(4)}"`;
}

/** Why the uploader may not change an existing paper, or null when they may (own draft or returned entry). */
export function editRefusal(paper: ExistingPaper, uploaderId: number): { message: string; hidden: boolean } | null {
  if (paper.createdBy !== uploaderId) {
    return { message: "is coded by another contributor; an import changes only your own entries (ask them, or a curator, to make the change)", hidden: true };
  }
  if (paper.state === "verified") return { message: "is verified; a verified entry changes only through a curator, who can return it to you for changes", hidden: false };
  if (paper.state === "submitted") return { message: "is submitted and waiting for a curator; it can change again once it is returned to you", hidden: false };
  return null;
}

export class ImportPlanner {
  private readonly papers = new Map<string, PlannedPaper>();
  private readonly refOwner = new Map<string, { key: string; row: number }>();
  private readonly samples = new Map<string, PlannedSample>();
  private readonly models = new Map<string, PlannedModel>();
  private readonly comparisons = new Map<string, { row: number; signature: string }>();

  constructor(
    private readonly existing: ExistingState,
    private readonly uploaderId: number,
    private readonly next: IdCounters,
  ) {}

  /** Papers met so far (for the end of a commit: amendments, flag rewrites, DOI lookups). */
  plannedPapers(): Iterable<PlannedPaper> {
    return this.papers.values();
  }

  judge(entry: RowEntry): Judgement {
    const errors: FieldError[] = [];
    const key = entry.paperKey;
    const cells = entry.paper;
    let paper = this.papers.get(key);
    let existingPaper: ExistingPaper | null = paper ? paper.existing : null;
    if (!paper) {
      existingPaper = (cells.doi !== null ? this.existing.paperByDoi.get(cells.doi) : this.existing.paperByRef.get(cells.ref!)) ?? null;
    }

    // paper_ref is unique: it may not name a paper other than this one
    if (cells.ref !== null) {
      const holder = this.existing.paperByRef.get(cells.ref);
      if (holder && holder !== existingPaper) errors.push({ column: "paper_ref", message: `"${cells.ref}" is already the reference of another paper${holder.doi ? ` (${holder.doi})` : ""}` });
      const claimed = this.refOwner.get(cells.ref);
      if (claimed && claimed.key !== key) errors.push({ column: "paper_ref", message: `"${cells.ref}" already names another paper in row ${claimed.row}` });
      if (existingPaper?.ref && existingPaper.ref !== cells.ref) errors.push({ column: "paper_ref", message: `"${cells.ref}" differs from this paper's stored reference "${existingPaper.ref}"` });
    }
    if (!existingPaper && cells.doi === null && cells.title === undefined && !paper?.sheet.title) {
      errors.push({ column: "title", message: "a new paper without a DOI needs its title (there is nothing to look its metadata up by)" });
    }

    // metadata: the first row that gives a field fixes it for the sheet
    const sheetValues: Partial<Record<PaperField, unknown>> = { title: cells.title, year: cells.year, journal: cells.journal, authors: cells.authors, field: cells.field, ref: cells.ref ?? undefined };
    let metadataChanged = false;
    for (const field of PAPER_FIELDS) {
      const value = sheetValues[field];
      if (value === undefined) continue;
      if (paper && paper.sheet[field] !== undefined && !same(paper.sheet[field], value)) {
        errors.push({ column: PAPER_COLUMN[field], message: `${describeValue(field, value)} differs from row ${paper.sheetRow[field]} for the same paper (${describeValue(field, paper.sheet[field])})` });
      }
      if (existingPaper && !same(existingPaper.values[field], value)) metadataChanged = true;
    }

    // sample, models and comparison, by label within the paper
    const sampleKey = `${key}\u0000${entry.sample.label}`;
    const fileSample = this.samples.get(sampleKey);
    if (fileSample) {
      if (fileSample.n !== entry.sample.n) errors.push({ column: "n", message: `sample "${entry.sample.label}" has N ${entry.sample.n ?? "empty"} here but ${fileSample.n ?? "empty"} in row ${fileSample.row}` });
      else if (fileSample.groups !== entry.sample.groups) errors.push({ column: "n_groups", message: `sample "${entry.sample.label}" has ${entry.sample.groups} groups here but ${fileSample.groups} in row ${fileSample.row}` });
    }
    const modelSignatures = [valuesModelSignature(entry.restricted), valuesModelSignature(entry.free)];
    const modelCodes = modelSignatures.map(encodeSignature);
    [entry.restricted, entry.free].forEach((model, index) => {
      const prefix = index === 0 ? "a_" : "b_";
      const earlier = this.models.get(`${sampleKey}\u0000${model.label}`);
      if (!earlier || earlier.signature === modelCodes[index]) return;
      const earlierParts = decodeSignature(earlier.signature);
      const at = firstDifference(modelSignatures[index], earlierParts);
      if (at >= 0) {
        const column = prefix + MODEL_SIGNATURE_COLUMNS[at];
        errors.push({
          column,
          message: `model "${model.label}" has ${MODEL_SIGNATURE_COLUMNS[at]} ${quoted(modelSignatures[index][at])} here but ${quoted(earlierParts[at])} in row ${earlier.row}; a model's figures must agree in every row that names it`,
        });
      }
    });
    const comparisonKey = `${sampleKey}\u0000${entry.comparison.label}`;
    const comparisonParts = valuesComparisonSignature(entry.comparison, entry.restricted.label, entry.free.label);
    let comparisonSig = encodeSignature(comparisonParts);
    const earlierComparison = this.comparisons.get(comparisonKey);
    if (earlierComparison) {
      const identical = comparisonSig === earlierComparison.signature;
      errors.push({
        column: "comparison",
        message: `comparison "${entry.comparison.label}" of sample "${entry.sample.label}" is already in row ${earlierComparison.row}${identical ? "" : " with other figures"}; each comparison belongs in one row per sheet`,
      });
    }
    if (errors.length > 0) return { ok: false, errors };

    // what this row would change in the database
    const paperId = paper?.id ?? existingPaper?.id ?? 0;
    const storedSample = existingPaper ? this.existing.samples.get(childKey(paperId, entry.sample.label)) : undefined;
    const sampleChange: Change = fileSample ? "same" : !storedSample ? "new" : storedSample.n !== entry.sample.n || storedSample.groups !== entry.sample.groups ? "changed" : "same";
    const modelChanges = [entry.restricted, entry.free].map((model, index): { change: Change; storedId?: number; before?: (string | null)[] } => {
      if (this.models.has(`${sampleKey}\u0000${model.label}`)) return { change: "same" };
      const stored = storedSample ? this.existing.models.get(childKey(storedSample.id, model.label)) : undefined;
      if (!stored) return { change: "new" };
      // as stored: keep the stored string (equal content) so this row's copy can go; decode only a change
      if (stored.signature === modelCodes[index]) {
        modelCodes[index] = stored.signature;
        return { change: "same", storedId: stored.id };
      }
      return { change: "changed", storedId: stored.id, before: decodeSignature(stored.signature) };
    });
    const storedComparison = storedSample ? this.existing.comparisons.get(childKey(storedSample.id, entry.comparison.label)) : undefined;
    const comparisonChange: Change = !storedComparison ? "new" : comparisonSig === storedComparison.signature ? "same" : "changed";
    if (comparisonChange === "same") comparisonSig = storedComparison!.signature;
    const anyChange = metadataChanged || sampleChange !== "same" || modelChanges.some((m) => m.change !== "same") || comparisonChange !== "same";
    const outcome: RowOutcome = comparisonChange === "new" ? "new" : anyChange ? "updated" : "unchanged";

    if (existingPaper) {
      const refusal = editRefusal(existingPaper, this.uploaderId);
      if (refusal && (refusal.hidden || anyChange)) return { ok: false, errors: [{ column: cells.doi !== null ? "doi" : "paper_ref", message: `${describePaper(key)} ${refusal.message}` }] };
    }

    // accepted: register what the row fixes for the rest of the sheet, and assign ids to new entities
    let insertPaper = false;
    if (!paper) {
      paper = {
        key,
        id: existingPaper?.id ?? this.next.paper++,
        isNew: !existingPaper,
        existing: existingPaper,
        doi: cells.doi,
        sheet: {},
        sheetRow: {},
        touched: false,
        amended: false,
        written: false,
      };
      this.papers.set(key, paper);
      insertPaper = paper.isNew;
    }
    for (const field of PAPER_FIELDS) {
      const value = sheetValues[field];
      if (value === undefined || paper.sheet[field] !== undefined) continue;
      paper.sheet[field] = value;
      paper.sheetRow[field] = entry.row;
      if (paper.isNew && !insertPaper) paper.amended = true;
    }
    if (cells.ref !== null && !this.refOwner.has(cells.ref)) this.refOwner.set(cells.ref, { key, row: entry.row });
    if (!paper.isNew && anyChange) paper.touched = true;

    const plan: RowPlan = { outcome, paper, sampleId: 0, restrictedId: 0, freeId: 0, comparisonId: 0, models: [], insertPaper };
    if (fileSample) {
      plan.sampleId = fileSample.id;
    } else {
      const id = storedSample?.id ?? this.next.sample++;
      this.samples.set(sampleKey, { id, row: entry.row, n: entry.sample.n, groups: entry.sample.groups });
      plan.sampleId = id;
      if (sampleChange !== "same") {
        plan.sample = { id, change: sampleChange, values: entry.sample };
        if (sampleChange === "changed") plan.sample = { ...plan.sample, before: { n: storedSample!.n, groups: storedSample!.groups }, after: { n: entry.sample.n, groups: entry.sample.groups } };
      }
    }
    [entry.restricted, entry.free].forEach((model, index) => {
      const modelKey = `${sampleKey}\u0000${model.label}`;
      const known = this.models.get(modelKey);
      let id: number;
      if (known) {
        id = known.id;
      } else {
        const change = modelChanges[index];
        id = change.storedId ?? this.next.model++;
        this.models.set(modelKey, { id, row: entry.row, signature: modelCodes[index] });
        if (change.change !== "same") {
          const write: PlannedWrite<ModelValues> = { id, change: change.change, values: model };
          if (change.change === "changed") Object.assign(write, changes(MODEL_SIGNATURE_ATTRIBUTES, change.before!, modelSignatures[index]));
          plan.models.push(write);
        }
      }
      if (index === 0) plan.restrictedId = id;
      else plan.freeId = id;
    });
    const comparisonId = storedComparison?.id ?? this.next.comparison++;
    this.comparisons.set(comparisonKey, { row: entry.row, signature: comparisonSig });
    plan.comparisonId = comparisonId;
    if (comparisonChange !== "same") {
      plan.comparison = { id: comparisonId, change: comparisonChange, values: entry.comparison };
      if (comparisonChange === "changed") Object.assign(plan.comparison, changes(COMPARISON_SIGNATURE_ATTRIBUTES, decodeSignature(storedComparison!.signature), comparisonParts));
    }
    return { ok: true, plan };
  }
}

function describeValue(field: PaperField, value: unknown): string {
  if (field === "authors") return `authors "${(value as CslName[]).map((n) => n.literal ?? [n.family, n.given].filter(Boolean).join(", ")).join("; ")}"`;
  return `${PAPER_COLUMN[field]} "${String(value)}"`;
}
