// The import pipeline over a staged sheet, shared by the dry run and the commit: one streamed pass that
// reads, validates and plans every row against what is stored, handing accepted rows to the writer when
// there is one. The sheet is never held in memory whole.
import type { Transaction } from "sequelize";
import { readSheetBatches, type ByteSource, type SheetRow } from "@/lib/csv";
import { recheck } from "@/lib/recheck";
import type { Finding, RecheckSettings } from "@/lib/recheck/types";
import { Comparison, FitModel, Paper, Sample } from "@/models";
import type { ImportRowError } from "@/models/import-batch";
import { readEntry, storedComparisonInput, type RowEntry } from "./entry";
import { emptyExisting, loadExisting } from "./existing";
import { ImportPlanner, type IdCounters, type RowOutcome, type RowPlan } from "./planner";
import type { ImportProgress } from "./progress";
import type { ImportWriter } from "./writer";

export interface RowVerdict {
  row: number;
  outcome: RowOutcome | "rejected";
  paper: string | null;
  sample: string | null;
  comparison: string | null;
  errors?: { column: string | null; message: string }[];
  findings?: Pick<Finding, "code" | "severity" | "message">[];
  notes?: string[];
}

export interface SheetSummary {
  total: number;
  new: number;
  updated: number;
  unchanged: number;
  rejected: number;
  rowErrors: ImportRowError[];
  /** findings the accepted rows would get, by code */
  findingCounts: Record<string, number>;
}

export interface ProcessOptions {
  /** opens the staged sheet from its start */
  open: () => ByteSource;
  uploaderId: number;
  settings: RecheckSettings;
  progress: ImportProgress;
  transaction?: Transaction;
  /** present in a commit: receives every accepted row */
  writer?: ImportWriter;
  /** every row's verdict, in sheet order (the dry run's preview) */
  onVerdict?: (verdict: RowVerdict) => void | Promise<void>;
}

async function nextIds(transaction?: Transaction): Promise<IdCounters> {
  const next = async (model: { max(column: string, options: object): Promise<unknown> }) => Number((await model.max("id", { transaction })) ?? 0) + 1;
  const [paper, sample, model, comparison] = await Promise.all([next(Paper), next(Sample), next(FitModel), next(Comparison)]);
  return { paper, sample, model, comparison };
}

function keyOf(entry: RowEntry | null, raw: { doi?: string; paperRef?: string }): string | null {
  if (entry) return entry.paper.doi ?? entry.paper.ref;
  return raw.doi?.trim() || raw.paperRef?.trim() || null;
}

/** Rows judged together: the stored state of their papers is loaded in one go (a few queries per group). */
const GROUP_ROWS = 2000;

/** The reader's batches (one per input piece, a few hundred rows) joined into groups of about GROUP_ROWS. */
async function* groups(batches: AsyncGenerator<SheetRow[]>, progress: ImportProgress): AsyncGenerator<SheetRow[]> {
  let group: SheetRow[] = [];
  for await (const batch of batches) {
    progress.read += batch.length;
    group = group.length === 0 ? batch : group.concat(batch);
    if (group.length >= GROUP_ROWS) {
      yield group;
      group = [];
    }
  }
  if (group.length > 0) yield group;
}

export async function processSheet(options: ProcessOptions): Promise<SheetSummary> {
  const { progress, transaction, writer } = options;
  const existing = emptyExisting();
  const lookedUp = new Set<string>();
  const planner = new ImportPlanner(existing, options.uploaderId, await nextIds(transaction));
  const summary: SheetSummary = { total: 0, new: 0, updated: 0, unchanged: 0, rejected: 0, rowErrors: [], findingCounts: {} };
  progress.phase = writer ? "storing" : "validating";

  // One streamed pass. Each group of rows is read and validated first; the stored state
  // of the papers it names that were not met before is then loaded in bulk, and only then is each row
  // judged — so identity lookups cost a few queries per batch, never one per row.
  for await (const batch of groups(readSheetBatches(options.open()), progress)) {
    const readings = batch.map(readEntry);
    const dois: string[] = [];
    const refs: string[] = [];
    for (const reading of readings) {
      if (!reading.ok) continue;
      const { doi, ref } = reading.entry.paper;
      if (doi !== null && !lookedUp.has(`d${doi}`)) {
        lookedUp.add(`d${doi}`);
        dois.push(doi);
      }
      if (ref !== null && !lookedUp.has(`r${ref}`)) {
        lookedUp.add(`r${ref}`);
        refs.push(ref);
      }
    }
    if (dois.length > 0 || refs.length > 0) await loadExisting({ dois, refs }, transaction, existing);

    for (let i = 0; i < batch.length; i++) {
      const row = batch[i];
      const reading = readings[i];
      summary.total += 1;
      let verdict: RowVerdict;
      const label = { paper: keyOf(reading.ok ? reading.entry : null, row.paper), sample: row.sample.label ?? null, comparison: row.comparison.label ?? null };
      const judgement = reading.ok ? planner.judge(reading.entry) : null;
      if (!reading.ok || !judgement!.ok) {
        const errors = !reading.ok ? reading.errors : (judgement as { ok: false; errors: { column: string; message: string }[] }).errors;
        summary.rejected += 1;
        for (const error of errors) summary.rowErrors.push({ row: row.row, column: error.column, message: error.message });
        verdict = { row: row.row, outcome: "rejected", ...label, errors };
      } else {
        const plan: RowPlan = judgement!.plan;
        summary[plan.outcome] += 1;
        verdict = { row: row.row, outcome: plan.outcome, ...label };
        if (reading.notes.length > 0) verdict.notes = reading.notes;
        if (!writer) {
          const outcome = recheck(storedComparisonInput(reading.entry), options.settings);
          if (outcome.ok) {
            if (options.onVerdict) verdict.findings = outcome.result.findings.map((f) => ({ code: f.code, severity: f.severity, message: f.message }));
            for (const finding of outcome.result.findings) summary.findingCounts[finding.code] = (summary.findingCounts[finding.code] ?? 0) + 1;
          }
        } else {
          await writer.add(reading.entry, plan);
          progress.stored += 1;
        }
      }
      if (options.onVerdict) await options.onVerdict(verdict);
    }
    progress.validated += batch.length;
  }
  progress.total = summary.total;
  if (writer) await writer.finish(planner.plannedPapers());
  progress.phase = "done";
  return summary;
}
