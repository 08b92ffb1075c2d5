// Writes an import's accepted rows inside the caller's one transaction: bulk inserts with explicit ids
// (assigned by the planner), bulk upserts for changed entries, flags computed from the values as stored,
// and one audit event per created or changed entity — all in batches, never a query per row. A batch is
// written while the next one is prepared; the transaction never ends with a statement still running.
import type { Transaction } from "sequelize";
import { auditValues, type AuditRecord } from "@/lib/db/audit";
import { fingerprint, rewriteFlagsForPaper } from "@/lib/db/flags";
import { ENGINE_VERSION, recheck } from "@/lib/recheck";
import type { RecheckSettings } from "@/lib/recheck/types";
import { AuditEvent, Comparison, DoiLookup, FitModel, Flag, Paper, Sample } from "@/models";
import { COMPARISON_FIGURES, MODEL_FIGURES, textAttribute } from "@/models/figures";
import { comparisonRecord, modelRecord, storedComparisonInput, type RowEntry } from "./entry";
import type { PlannedPaper, RowPlan } from "./planner";
import { bulkStatements, bulkWrite, runBulk } from "./bulk";

type Row = Record<string, unknown>;

const FLUSH_AT = 4000;

const figureAttributes = (figures: readonly string[]) => figures.flatMap((f) => [f, textAttribute(f)]);
const SAMPLE_UPDATES = ["n", "groups", "updatedAt"];
const MODEL_UPDATES = ["estimator", "meanStructure", ...figureAttributes(MODEL_FIGURES), "updatedAt"];
const COMPARISON_UPDATES = [
  "restrictedModelId", "freeModelId", "method", "nested", "alphaText", "alpha", "location", "preferred", "invarianceClaimed", "notes",
  ...figureAttributes(COMPARISON_FIGURES), "updatedAt",
];
const PAPER_UPDATES = ["ref", "title", "authors", "journal", "year", "field", "version", "updatedAt"];

/**
 * A created model's or comparison's audit record: every attribute that is set, the figures as printed
 * (their parsed numbers follow from the text), so 100 000 rows do not write every value twice.
 */
function printed(values: Row): Row {
  const kept: Row = {};
  for (const key in values) {
    const value = values[key];
    if (value === null || value === undefined) continue;
    if (typeof value === "number") {
      const twin = TEXT_TWIN.get(key);
      if (twin !== undefined && typeof values[twin] === "string") continue;
    }
    kept[key] = value;
  }
  return kept;
}

/** Each parsed attribute and its printed twin ("chisq" → "chisqText"), built once, not per value. */
const TEXT_TWIN = new Map<string, string>(["alpha", ...MODEL_FIGURES, ...COMPARISON_FIGURES].map((figure) => [figure, textAttribute(figure)]));

export interface WriteTotals {
  papersCreated: number;
  papersChanged: number;
  samplesWritten: number;
  modelsWritten: number;
  comparisonsWritten: number;
  flagsWritten: number;
  auditEvents: number;
  doiLookups: number;
}

export class ImportWriter {
  private papers: Row[] = [];
  private samples: Row[] = [];
  private models: Row[] = [];
  private comparisons: Row[] = [];
  private flags: Row[] = [];
  private audits: AuditRecord[] = [];
  private readonly flagsPerPaper = new Map<number, number>();
  /** the buffers being written while the next rows are prepared (see flush) */
  private inFlight: Promise<void> | null = null;
  readonly totals: WriteTotals = { papersCreated: 0, papersChanged: 0, samplesWritten: 0, modelsWritten: 0, comparisonsWritten: 0, flagsWritten: 0, auditEvents: 0, doiLookups: 0 };

  constructor(
    private readonly options: { transaction: Transaction; actorId: number; batchId: number; settings: RecheckSettings; now?: Date },
  ) {}

  private get now(): Date {
    return this.options.now ?? new Date();
  }

  private newPaperRow(paper: PlannedPaper): Row {
    const sheet = paper.sheet;
    return {
      id: paper.id,
      doi: paper.doi,
      ref: (sheet.ref as string | undefined) ?? null,
      // until DOI metadata arrives a paper without a title in the sheet shows its DOI (lib/import/doi-jobs fills it)
      title: (sheet.title as string | undefined) ?? paper.doi ?? String(sheet.ref),
      authors: sheet.authors ?? [],
      journal: sheet.journal ?? null,
      year: sheet.year ?? null,
      volume: null,
      issue: null,
      pages: null,
      csl: null,
      field: sheet.field ?? null,
      state: "draft",
      curatorComment: null,
      createdBy: this.options.actorId,
      submittedAt: null,
      verifiedBy: null,
      verifiedAt: null,
      version: 1,
    };
  }

  /** Queues what one accepted row writes; flushes when the buffers are full. */
  async add(entry: RowEntry, plan: RowPlan): Promise<void> {
    const paperId = plan.paper.id;
    if (plan.insertPaper) this.papers.push(this.newPaperRow(plan.paper));
    if (plan.sample) {
      const values = { id: plan.sample.id, paperId, label: plan.sample.values.label, n: plan.sample.values.n, groups: plan.sample.values.groups, groupNs: null };
      this.samples.push(values);
      this.audits.push(plan.sample.change === "new" ? { entity: "Sample", entityId: values.id, action: "import", after: values } : { entity: "Sample", entityId: values.id, action: "import-update", before: plan.sample.before, after: plan.sample.after });
    }
    for (const model of plan.models) {
      const values = { id: model.id, sampleId: plan.sampleId, paperId, ...modelRecord(model.values) };
      this.models.push(values);
      this.audits.push(model.change === "new" ? { entity: "FitModel", entityId: model.id, action: "import", after: printed(values) } : { entity: "FitModel", entityId: model.id, action: "import-update", before: model.before, after: model.after });
    }
    if (plan.comparison) {
      const values = { id: plan.comparison.id, sampleId: plan.sampleId, paperId, restrictedModelId: plan.restrictedId, freeModelId: plan.freeId, ...comparisonRecord(plan.comparison.values) };
      this.comparisons.push(values);
      this.audits.push(
        plan.comparison.change === "new"
          ? { entity: "Comparison", entityId: values.id, action: "import", after: printed(values) }
          : { entity: "Comparison", entityId: values.id, action: "import-update", before: plan.comparison.before, after: plan.comparison.after },
      );
    }
    // a new paper's every entry comes from this sheet, so its flags are computed here from the stored
    // values, as rewriteFlagsForPaper would; an existing paper is rewritten whole at the end
    if (plan.paper.isNew) this.flagComparison(entry, plan);
    if (this.comparisons.length + this.models.length >= FLUSH_AT) await this.flush();
  }

  private flagComparison(entry: RowEntry, plan: RowPlan): void {
    const outcome = recheck(storedComparisonInput(entry), this.options.settings);
    if (!outcome.ok) return;
    const paperId = plan.paper.id;
    for (const finding of outcome.result.findings) {
      const modelId = finding.subject === "a" ? plan.restrictedId : finding.subject === "b" ? plan.freeId : null;
      this.flags.push({
        paperId,
        comparisonId: plan.comparisonId,
        modelId,
        subject: finding.subject,
        code: finding.code,
        severity: finding.severity,
        message: finding.message,
        values: finding.values,
        fingerprint: fingerprint(finding, `c${plan.comparisonId}`),
        engineVersion: ENGINE_VERSION,
      });
      this.flagsPerPaper.set(paperId, (this.flagsPerPaper.get(paperId) ?? 0) + 1);
    }
  }

  /**
   * Hands the buffers to the database and returns without waiting for it, so the next rows are read,
   * validated and planned while SQLite writes these (on its own thread: the two cores both work). One
   * write is in flight at a time: this first waits for the previous one, whose failure surfaces here.
   */
  async flush(): Promise<void> {
    await this.settle();
    const buffers = { papers: this.papers, samples: this.samples, models: this.models, comparisons: this.comparisons, flags: this.flags, audits: this.audits };
    if (Object.values(buffers).every((rows) => rows.length === 0)) return;
    this.papers = [];
    this.samples = [];
    this.models = [];
    this.comparisons = [];
    this.flags = [];
    this.audits = [];
    const writing = this.write(buffers);
    writing.catch(() => undefined); // observed by settle(); until then not an unhandled rejection
    this.inFlight = writing;
  }

  /** Waits for the write in flight, if any; throws its failure. */
  async settle(): Promise<void> {
    const writing = this.inFlight;
    this.inFlight = null;
    if (writing) await writing;
  }

  /**
   * Waits for the write in flight and ignores its outcome: the transaction must never end (commit or
   * roll back) while one of its statements still runs, or that statement would land outside it.
   */
  async quiesce(): Promise<void> {
    await this.settle().catch(() => undefined);
  }

  /**
   * Writes one set of buffers: parents before children, so every foreign key already exists. Every
   * statement is built first and then queued at once, so SQLite writes them back to back on its thread.
   */
  private async write(buffers: { papers: Row[]; samples: Row[]; models: Row[]; comparisons: Row[]; flags: Row[]; audits: AuditRecord[] }): Promise<void> {
    const { transaction } = this.options;
    const write = { transaction, now: this.now };
    const { papers, samples, models, comparisons, flags, audits } = buffers;
    const actorId = this.options.actorId;
    const statements = [
      ...bulkStatements(Paper, papers, write),
      ...bulkStatements(Sample, samples, { ...write, update: SAMPLE_UPDATES }),
      ...bulkStatements(FitModel, models, { ...write, update: MODEL_UPDATES }),
      ...bulkStatements(Comparison, comparisons, { ...write, update: COMPARISON_UPDATES }),
      ...bulkStatements(Flag, flags, write),
      // the rows lib/db/audit.ts recordEvents writes, in one statement per few thousand
      ...bulkStatements(
        AuditEvent,
        audits.map((a) => ({ actorId, entity: a.entity, entityId: String(a.entityId), action: a.action, before: a.before ?? null, after: a.after ?? null })),
        write,
      ),
    ];
    await runBulk(Paper.sequelize!, transaction, statements);
    this.totals.papersCreated += papers.length;
    this.totals.samplesWritten += samples.length;
    this.totals.modelsWritten += models.length;
    this.totals.comparisonsWritten += comparisons.length;
    this.totals.flagsWritten += flags.length;
    this.totals.auditEvents += audits.length;
  }

  /** After the last row: paper metadata, flag rewrites of changed existing papers, DOI lookups. */
  async finish(papers: Iterable<PlannedPaper>): Promise<void> {
    await this.flush();
    await this.settle();
    const { transaction, actorId, batchId, settings } = this.options;
    const upserts: Row[] = [];
    const lookups: Row[] = [];
    const rewrite: number[] = [];
    for (const paper of papers) {
      if (paper.isNew) {
        const row = this.newPaperRow(paper);
        if (paper.amended) upserts.push(row);
        this.audits.push({ entity: "Paper", entityId: paper.id, action: "import", after: auditValues(row) });
        this.audits.push({ entity: "Paper", entityId: paper.id, action: "recheck", after: { flags: this.flagsPerPaper.get(paper.id) ?? 0, unreadable: 0, engineVersion: ENGINE_VERSION } });
        if (paper.doi !== null) lookups.push({ batchId, paperId: paper.id, doi: paper.doi, status: "pending", reason: null, message: null, attempts: 0 });
        continue;
      }
      if (!paper.touched || !paper.existing) continue;
      const stored = paper.existing.values;
      const row: Row = { ...stored, updatedAt: this.now, createdAt: stored.createdAt };
      const before: Row = {};
      const after: Row = {};
      for (const [field, value] of Object.entries(paper.sheet)) {
        if (JSON.stringify(stored[field] ?? null) === JSON.stringify(value ?? null)) continue;
        before[field] = stored[field] ?? null;
        after[field] = value;
        row[field] = value;
      }
      row.version = Number(stored.version ?? 1) + 1;
      before.version = stored.version;
      after.version = row.version;
      upserts.push(row);
      this.audits.push({ entity: "Paper", entityId: paper.id, action: "import-update", before, after });
      rewrite.push(paper.id);
      this.totals.papersChanged += 1;
    }
    // new papers (amended) and existing ones carry different attribute sets: one statement kind each
    const write = { transaction, now: this.now };
    await bulkWrite(Paper, upserts.filter((row) => !("createdAt" in row)), { ...write, update: PAPER_UPDATES });
    await bulkWrite(Paper, upserts.filter((row) => "createdAt" in row), { ...write, update: PAPER_UPDATES });
    for (const paperId of rewrite) await rewriteFlagsForPaper(paperId, { transaction, actorId, settings });
    await bulkWrite(DoiLookup, lookups, write);
    this.totals.doiLookups = lookups.length;
    await this.flush();
    await this.settle();
  }
}
