import "server-only";
import { Op } from "sequelize";
import { db } from "@/lib/db";
import { FINDING_CATALOGUE, type FindingCode } from "@/lib/recheck/catalogue";
import type { Severity } from "@/lib/recheck/types";
import { COMPARISON_FIGURES, MODEL_FIGURES, textAttribute, type ComparisonFigure, type ModelFigure } from "@/models/figures";
import type { CslName, EntryState } from "@/models/paper";
import type { Verdict } from "@/models/flag-disposition";
import type { PaperColumns } from "@/lib/curation/metadata";

// One read of a paper with everything its page and GET /api/papers/[id] show: metadata, samples,
// models, comparisons, findings with their catalogue explanation and disposition, and who coded and
// verified it. Only verified papers are public; `includeUnverified` is for the coder and curators, and
// the caller decides who that is (lib/curation/rules.ts canRead).

export interface PaperSampleView {
  id: number;
  label: string;
  n: number | null;
  groups: number;
  groupNs: number[] | null;
}

export interface PaperModelView {
  id: number;
  sampleId: number;
  label: string;
  estimator: string | null;
  /** each reported figure as printed ("9.20"), null when not reported */
  figures: Partial<Record<ModelFigure, string>>;
}

export interface PaperComparisonView {
  id: number;
  sampleId: number;
  label: string;
  method: string;
  nested: string;
  alpha: string | null;
  location: string | null;
  restrictedModelId: number;
  freeModelId: number;
  restrictedLabel: string;
  freeLabel: string;
  figures: Partial<Record<ComparisonFigure, string>>;
  preferred: string | null;
  invarianceClaimed: string;
  notes: string | null;
}

export interface DispositionView {
  verdict: Verdict;
  note: string | null;
  link: string | null;
  curatorName: string | null;
  updatedAt: string;
}

export interface FindingView {
  id: number;
  code: string;
  severity: Severity;
  subject: string;
  comparisonId: number | null;
  modelId: number | null;
  message: string;
  values: Record<string, unknown>;
  engineVersion: string;
  title: string;
  explanation: string;
  source: string;
  disposition: DispositionView | null;
}

/** A paper as its pages show it: its metadata columns (the same as the form writes) and its coding. */
export interface PaperView extends PaperColumns {
  id: number;
  csl: Record<string, unknown> | null;
  state: EntryState;
  createdBy: number;
  coderName: string | null;
  verifierName: string | null;
  submittedAt: string | null;
  verifiedAt: string | null;
  createdAt: string;
  updatedAt: string;
  samples: PaperSampleView[];
  models: PaperModelView[];
  comparisons: PaperComparisonView[];
  findings: FindingView[];
}

const iso = (value: Date | null | undefined) => (value ? value.toISOString() : null);

function printedFigures<F extends string>(row: object, figures: readonly F[]): Partial<Record<F, string>> {
  const out: Partial<Record<F, string>> = {};
  for (const figure of figures) {
    const text = (row as Record<string, unknown>)[textAttribute(figure)];
    if (typeof text === "string" && text !== "") out[figure] = text;
  }
  return out;
}

const SEVERITY_ORDER: Record<Severity, number> = { error: 0, warning: 1, note: 2 };

export async function readPaper({ paperId, includeUnverified = false }: { paperId: number; includeUnverified?: boolean }): Promise<PaperView | null> {
  if (!Number.isInteger(paperId) || paperId <= 0) return null;
  const { models } = await db();
  const paper = await models.Paper.findOne({
    where: includeUnverified ? { id: paperId } : { id: paperId, state: "verified" },
    attributes: ["id", "doi", "ref", "title", "authors", "journal", "year", "volume", "issue", "pages", "field", "csl", "state", "createdBy", "submittedAt", "verifiedAt", "createdAt", "updatedAt"],
    include: [
      { model: models.User, as: "coder", attributes: ["name"] },
      { model: models.User, as: "verifier", attributes: ["name"] },
    ],
  });
  if (!paper) return null;
  const [samples, fitModels, comparisons, flags, dispositions] = await Promise.all([
    models.Sample.findAll({ where: { paperId }, attributes: ["id", "label", "n", "groups", "groupNs"], order: [["id", "ASC"]] }),
    models.FitModel.findAll({ where: { paperId }, order: [["id", "ASC"]] }),
    models.Comparison.findAll({ where: { paperId }, order: [["id", "ASC"]] }),
    models.Flag.findAll({ where: { paperId }, attributes: ["id", "code", "severity", "subject", "comparisonId", "modelId", "message", "values", "fingerprint", "engineVersion"], order: [["id", "ASC"]] }),
    models.FlagDisposition.findAll({
      where: { paperId },
      attributes: ["fingerprint", "verdict", "note", "link", "updatedAt"],
      include: [{ model: models.User, as: "curator", attributes: ["name"] }],
    }),
  ]);
  const modelLabel = new Map(fitModels.map((model) => [model.id, model.label]));
  const byFingerprint = new Map(dispositions.map((row) => [row.fingerprint, row]));
  const findings: FindingView[] = flags.map((flag) => {
    const entry = FINDING_CATALOGUE[flag.code as FindingCode];
    const disposition = byFingerprint.get(flag.fingerprint);
    return {
      id: flag.id,
      code: flag.code,
      severity: flag.severity,
      subject: flag.subject,
      comparisonId: flag.comparisonId,
      modelId: flag.modelId,
      message: flag.message,
      values: flag.values,
      engineVersion: flag.engineVersion,
      title: entry?.title ?? flag.code,
      explanation: entry?.explanation ?? "",
      source: entry?.source ?? "",
      disposition: disposition
        ? { verdict: disposition.verdict, note: disposition.note, link: disposition.link, curatorName: (disposition.get("curator") as { name: string } | null)?.name ?? null, updatedAt: disposition.updatedAt.toISOString() }
        : null,
    };
  });
  findings.sort((a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity] || a.id - b.id);
  return {
    id: paper.id,
    doi: paper.doi,
    ref: paper.ref,
    title: paper.title,
    authors: (paper.authors ?? []) as CslName[],
    journal: paper.journal,
    year: paper.year,
    volume: paper.volume,
    issue: paper.issue,
    pages: paper.pages,
    field: paper.field,
    csl: paper.csl,
    state: paper.state,
    createdBy: paper.createdBy,
    coderName: (paper.get("coder") as { name: string } | null)?.name ?? null,
    verifierName: (paper.get("verifier") as { name: string } | null)?.name ?? null,
    submittedAt: iso(paper.submittedAt),
    verifiedAt: iso(paper.verifiedAt),
    createdAt: paper.createdAt.toISOString(),
    updatedAt: paper.updatedAt.toISOString(),
    samples: samples.map((sample) => ({ id: sample.id, label: sample.label, n: sample.n, groups: sample.groups, groupNs: sample.groupNs })),
    models: fitModels.map((model) => ({ id: model.id, sampleId: model.sampleId, label: model.label, estimator: model.estimator, figures: printedFigures(model, MODEL_FIGURES) })),
    comparisons: comparisons.map((comparison) => ({
      id: comparison.id,
      sampleId: comparison.sampleId,
      label: comparison.label,
      method: comparison.method,
      nested: comparison.nested,
      alpha: comparison.alphaText,
      location: comparison.location,
      restrictedModelId: comparison.restrictedModelId,
      freeModelId: comparison.freeModelId,
      restrictedLabel: modelLabel.get(comparison.restrictedModelId) ?? "?",
      freeLabel: modelLabel.get(comparison.freeModelId) ?? "?",
      figures: printedFigures(comparison, COMPARISON_FIGURES),
      preferred: comparison.preferred,
      invarianceClaimed: comparison.invarianceClaimed,
      notes: comparison.notes,
    })),
    findings,
  };
}

/** The public read: verified papers only. */
export function readPublicPaper({ paperId }: { paperId: number }): Promise<PaperView | null> {
  return readPaper({ paperId, includeUnverified: false });
}

export interface HistoryEvent {
  id: number;
  action: string;
  actorName: string | null;
  at: string;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

/** A paper's own audit trail (coding saves, steps, rechecks, verdicts), newest first. */
export async function readPaperHistory({ paperId, since, limit = 200 }: { paperId: number; since?: Date; limit?: number }): Promise<HistoryEvent[]> {
  const { models } = await db();
  const rows = await models.AuditEvent.findAll({
    where: { entity: "Paper", entityId: String(paperId), ...(since ? { createdAt: { [Op.gt]: since } } : {}) },
    attributes: ["id", "action", "before", "after", "createdAt"],
    include: [{ model: models.User, as: "actor", attributes: ["name"] }],
    order: [["createdAt", "DESC"], ["id", "DESC"]],
    limit,
  });
  return rows.map((row) => ({
    id: row.id,
    action: row.action,
    actorName: (row.get("actor") as { name: string } | null)?.name ?? null,
    at: row.createdAt.toISOString(),
    before: row.before,
    after: row.after,
  }));
}
