import "server-only";
import { db } from "@/lib/db";
import { formatName } from "@/lib/citations/csl";
import type { CodingDocument } from "@/lib/validation/curation";
import { COMPARISON_FIGURES, MODEL_FIGURES, textAttribute } from "@/models/figures";
import type { CslName, EntryState } from "@/models/paper";

// Reads for the contributor's side: a paper's coding as the entry form edits it, and DOI look-ups
// against the corpus. Plain objects only.

export interface EntryHeader {
  id: number;
  title: string;
  doi: string | null;
  ref: string | null;
  state: EntryState;
  createdBy: number;
  coderName: string | null;
  curatorComment: string | null;
  version: number;
  submittedAt: Date | null;
  updatedAt: Date;
}

export const sampleKey = (id: number) => `s${id}`;
export const modelKey = (id: number) => `m${id}`;
export const comparisonKey = (id: number) => `c${id}`;

/** A stored row's id from its key ("m34" → 34), or null for a new row's key. */
export function storedId(key: string, prefix: "s" | "m" | "c"): number | null {
  const match = new RegExp(`^${prefix}(\\d+)$`).exec(key);
  return match ? Number(match[1]) : null;
}

const textOf = (row: object, figure: string) => ((row as Record<string, unknown>)[textAttribute(figure)] as string | null) ?? "";

export async function readEntryHeader({ paperId }: { paperId: number }): Promise<EntryHeader | null> {
  const { models } = await db();
  const paper = await models.Paper.findOne({
    where: { id: paperId },
    attributes: ["id", "title", "doi", "ref", "state", "createdBy", "curatorComment", "version", "submittedAt", "updatedAt"],
    include: [{ model: models.User, as: "coder", attributes: ["name"] }],
  });
  if (!paper) return null;
  const coder = paper.get("coder") as { name: string } | null;
  return {
    id: paper.id,
    title: paper.title,
    doi: paper.doi,
    ref: paper.ref,
    state: paper.state,
    createdBy: paper.createdBy,
    coderName: coder?.name ?? null,
    curatorComment: paper.curatorComment,
    version: paper.version,
    submittedAt: paper.submittedAt,
    updatedAt: paper.updatedAt,
  };
}

/** The paper's coding in the shape of the entry form (every figure as its printed text). */
export async function readCodingDocument({ paperId }: { paperId: number }): Promise<CodingDocument | null> {
  const { models } = await db();
  const paper = await models.Paper.findOne({ where: { id: paperId }, attributes: ["id", "doi", "ref", "title", "authors", "journal", "year", "volume", "issue", "pages", "field", "version"] });
  if (!paper) return null;
  const [samples, fitModels, comparisons] = await Promise.all([
    models.Sample.findAll({ where: { paperId }, order: [["id", "ASC"]] }),
    models.FitModel.findAll({ where: { paperId }, order: [["id", "ASC"]] }),
    models.Comparison.findAll({ where: { paperId }, order: [["id", "ASC"]] }),
  ]);
  return {
    version: paper.version,
    metadata: {
      doi: paper.doi ?? "",
      ref: paper.ref ?? "",
      title: paper.title,
      authors: ((paper.authors ?? []) as CslName[]).map(formatName).join("\n"),
      journal: paper.journal ?? "",
      year: paper.year ? String(paper.year) : "",
      volume: paper.volume ?? "",
      issue: paper.issue ?? "",
      pages: paper.pages ?? "",
      field: paper.field ?? "",
    },
    samples: samples.map((sample) => ({
      key: sampleKey(sample.id),
      label: sample.label,
      n: sample.n === null ? "" : String(sample.n),
      groups: String(sample.groups),
      groupNs: sample.groupNs ? sample.groupNs.join(", ") : "",
    })),
    models: fitModels.map((model) => ({
      key: modelKey(model.id),
      sampleKey: sampleKey(model.sampleId),
      label: model.label,
      estimator: model.estimator ?? "",
      meanStructure: model.meanStructure === null || model.meanStructure === undefined ? "" : model.meanStructure ? "yes" : "no",
      ...(Object.fromEntries(MODEL_FIGURES.map((figure) => [figure, textOf(model, figure)])) as Record<(typeof MODEL_FIGURES)[number], string>),
    })),
    comparisons: comparisons.map((comparison) => ({
      key: comparisonKey(comparison.id),
      label: comparison.label,
      restrictedKey: modelKey(comparison.restrictedModelId),
      freeKey: modelKey(comparison.freeModelId),
      method: comparison.method,
      nested: comparison.nested,
      alpha: comparison.alphaText ?? "",
      location: comparison.location ?? "",
      ...(Object.fromEntries(COMPARISON_FIGURES.map((figure) => [figure, textOf(comparison, figure)])) as Record<(typeof COMPARISON_FIGURES)[number], string>),
      preferred: comparison.preferred ?? "",
      invarianceClaimed: comparison.invarianceClaimed,
      notes: comparison.notes ?? "",
    })),
  };
}

export interface PaperByDoi {
  id: number;
  title: string;
  state: EntryState;
  createdBy: number;
}

/** The paper already in the corpus under this (normalised) DOI, whatever its state. */
export async function findPaperByDoi({ doi }: { doi: string }): Promise<PaperByDoi | null> {
  const { models } = await db();
  const paper = await models.Paper.findOne({ where: { doi }, attributes: ["id", "title", "state", "createdBy"] });
  return paper ? { id: paper.id, title: paper.title, state: paper.state, createdBy: paper.createdBy } : null;
}
