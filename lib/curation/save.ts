import "server-only";
import type { CreationAttributes, Transaction } from "sequelize";
import { db, createAudited, destroyAudited, recordEvent, updateAudited } from "@/lib/db";
import { rewriteFlagsForPaper, type RewriteResult } from "@/lib/db/flags";
import { storedId } from "@/lib/db/queries/workbench";
import { AppError, type FieldErrors } from "@/lib/errors";
import type { CodingDocument } from "@/lib/validation/curation";
import type { Comparison, FitModel, Paper, Sample } from "@/models";
import { COMPARISON_FIGURES, MODEL_FIGURES } from "@/models/figures";
import { explainDatabaseError } from "./errors";
import { figureColumns } from "./figure-columns";
import { metadataColumns } from "./metadata";
import { canEditCoding, type Actor } from "./rules";

// Saving a paper's coding (issue 5, Integrity): one transaction holds the version check, every row
// change (each audited), the recheck of the whole paper and a summary event on the paper, so stored flags
// always match the stored entry and a failed save changes nothing. Rows are updated in place, not
// replaced, so their ids — and the curator's dispositions keyed by them — survive an edit.

export interface SaveOutcome {
  version: number;
  flags: RewriteResult;
  changes: number;
}

export interface RowChange {
  entity: "Paper" | "Sample" | "FitModel" | "Comparison";
  label: string;
  action: "create" | "update" | "delete";
  /** field → [before, after] */
  fields?: Record<string, [unknown, unknown]>;
}

function conflict(stored: number, sent: number): AppError {
  return new AppError(
    "conflict",
    `Someone else saved this paper while you were editing it (you started from version ${sent}; it is now at version ${stored}). Your changes are still in the form: copy what you need, then reload to see the saved version.`,
  );
}

/** Applies `changes` to `row` (audited), and notes what changed for the paper's history. */
async function updateRow<M extends Paper | Sample | FitModel | Comparison>(row: M, changes: Record<string, unknown>, change: Omit<RowChange, "action" | "fields">, log: RowChange[], context: { actorId: number; transaction: Transaction }) {
  const fields: Record<string, [unknown, unknown]> = {};
  for (const [key, value] of Object.entries(changes)) {
    const before = row.get(key);
    if (JSON.stringify(before ?? null) !== JSON.stringify(value ?? null)) fields[key] = [before ?? null, value ?? null];
  }
  if (Object.keys(fields).length === 0) return;
  await updateAudited(row, changes as Partial<M["_attributes"]>, context);
  log.push({ ...change, action: "update", fields });
}

function rowValues<F extends string>(row: Record<string, unknown>, figures: readonly F[]) {
  return figureColumns(Object.fromEntries(figures.map((figure) => [figure, String(row[figure] ?? "")])), figures);
}

export async function saveCoding({ paperId, document, actor }: { paperId: number; document: CodingDocument; actor: Actor }): Promise<SaveOutcome> {
  const { models, sequelize } = await db();
  try {
    return await sequelize.transaction(async (transaction) => {
      const context = { actorId: actor.id, transaction };
      const paper = await models.Paper.findOne({ where: { id: paperId }, transaction });
      if (!paper) throw new AppError("not_found", "There is no such paper.");
      if (!canEditCoding(paper, actor)) {
        throw new AppError("forbidden", paper.state === "verified" ? "This entry is verified; its coding can no longer be changed here." : "You cannot change this entry's coding in its present state.");
      }
      if (paper.version !== document.version) throw conflict(paper.version, document.version);
      // The check above and this bump are one step for any other writer: the update only matches the
      // version that was read, so two saves from the same version can never both succeed.
      const [bumped] = await models.Paper.update({ version: document.version + 1 }, { where: { id: paperId, version: document.version }, transaction, validate: false });
      if (bumped !== 1) {
        const now = await models.Paper.findOne({ where: { id: paperId }, attributes: ["version"], transaction });
        throw conflict(now?.version ?? document.version + 1, document.version);
      }
      await paper.reload({ transaction });

      const log: RowChange[] = [];
      const fieldErrors: FieldErrors = {};
      const columns = metadataColumns(document.metadata);
      if (columns.doi) {
        const other = await models.Paper.findOne({ where: { doi: columns.doi }, attributes: ["id"], transaction });
        if (other && other.id !== paperId) fieldErrors["metadata.doi"] = ["Another paper in the corpus has this DOI."];
      }
      if (!columns.doi && !columns.ref) columns.ref = paper.ref ?? (paper.doi ? `doi-${paper.doi}`.slice(0, 100) : `paper-${paper.id}`);

      const [samples, fitModels, comparisons] = await Promise.all([
        models.Sample.findAll({ where: { paperId }, transaction }),
        models.FitModel.findAll({ where: { paperId }, transaction }),
        models.Comparison.findAll({ where: { paperId }, transaction }),
      ]);
      const storedSamples = new Map(samples.map((row) => [row.id, row]));
      const storedModels = new Map(fitModels.map((row) => [row.id, row]));
      const storedComparisons = new Map(comparisons.map((row) => [row.id, row]));

      // Keys naming stored rows must name rows of this paper: a model of another paper never slips in.
      const foreign = (key: string, prefix: "s" | "m" | "c", stored: Map<number, unknown>) => {
        const id = storedId(key, prefix);
        return id !== null && !stored.has(id);
      };
      document.samples.forEach((row, index) => {
        if (foreign(row.key, "s", storedSamples)) fieldErrors[`samples.${index}.key`] = ["This sample is not part of this paper."];
      });
      document.models.forEach((row, index) => {
        if (foreign(row.key, "m", storedModels)) fieldErrors[`models.${index}.key`] = ["This model is not part of this paper."];
      });
      document.comparisons.forEach((row, index) => {
        if (foreign(row.key, "c", storedComparisons)) fieldErrors[`comparisons.${index}.key`] = ["This comparison is not part of this paper."];
        const known = (key: string) => document.models.some((model) => model.key === key);
        if (!known(row.restrictedKey) || foreign(row.restrictedKey, "m", storedModels)) fieldErrors[`comparisons.${index}.restrictedKey`] = ["Choose a model of this paper."];
        if (!known(row.freeKey) || foreign(row.freeKey, "m", storedModels)) fieldErrors[`comparisons.${index}.freeKey`] = ["Choose a model of this paper."];
      });
      if (Object.keys(fieldErrors).length > 0) throw new AppError("validation_failed", "Some fields need attention; nothing was saved.", { fields: fieldErrors });

      await updateRow(paper, columns as unknown as Record<string, unknown>, { entity: "Paper", label: columns.title }, log, context);

      // Deletions: removed comparisons first (they point at models). A removed model or sample that a kept
      // row still points at in the database goes after the upserts have moved those rows away; the others
      // go now, so a new row may take a removed row's name.
      const keep = (rows: { key: string }[], prefix: "s" | "m" | "c") => new Set(rows.map((row) => storedId(row.key, prefix)).filter((id): id is number => id !== null));
      const keptComparisons = keep(document.comparisons, "c");
      const keptModels = keep(document.models, "m");
      const keptSamples = keep(document.samples, "s");
      for (const row of comparisons) if (!keptComparisons.has(row.id)) {
        await destroyAudited(row, context);
        log.push({ entity: "Comparison", label: row.label, action: "delete" });
      }
      const stillReferenced = new Set(comparisons.filter((row) => keptComparisons.has(row.id)).flatMap((row) => [row.restrictedModelId, row.freeModelId]));
      const stillHoldsKept = new Set(fitModels.filter((row) => keptModels.has(row.id)).map((row) => row.sampleId));
      const lateModels: FitModel[] = [];
      const lateSamples: Sample[] = [];
      const removeModel = async (row: FitModel) => {
        await destroyAudited(row, context);
        log.push({ entity: "FitModel", label: row.label, action: "delete" });
      };
      const removeSample = async (row: Sample) => {
        await destroyAudited(row, context);
        log.push({ entity: "Sample", label: row.label, action: "delete" });
      };
      for (const row of fitModels) if (!keptModels.has(row.id)) {
        if (stillReferenced.has(row.id)) lateModels.push(row);
        else await removeModel(row);
      }
      for (const row of samples) if (!keptSamples.has(row.id)) {
        if (stillHoldsKept.has(row.id) || lateModels.some((model) => model.sampleId === row.id)) lateSamples.push(row);
        else await removeSample(row);
      }

      const sampleIds = new Map<string, number>();
      for (const row of document.samples) {
        const values = {
          label: row.label,
          n: row.n ? Number(row.n) : null,
          groups: Number(row.groups || "1"),
          groupNs: row.groupNs ? row.groupNs.split(/[,;]/).map((part) => Number(part.trim())) : null,
        };
        const id = storedId(row.key, "s");
        if (id !== null) {
          await updateRow(storedSamples.get(id)!, values, { entity: "Sample", label: row.label }, log, context);
          sampleIds.set(row.key, id);
        } else {
          const created = await createAudited(models.Sample, { paperId, ...values }, context);
          log.push({ entity: "Sample", label: row.label, action: "create" });
          sampleIds.set(row.key, created.id);
        }
      }

      const modelIds = new Map<string, number>();
      for (const row of document.models) {
        const values = {
          sampleId: sampleIds.get(row.sampleKey)!,
          paperId,
          label: row.label,
          estimator: (row.estimator || null) as FitModel["estimator"],
          meanStructure: row.meanStructure === "" ? null : row.meanStructure === "yes",
          ...rowValues(row as unknown as Record<string, unknown>, MODEL_FIGURES),
        };
        const id = storedId(row.key, "m");
        if (id !== null) {
          await updateRow(storedModels.get(id)!, values, { entity: "FitModel", label: row.label }, log, context);
          modelIds.set(row.key, id);
        } else {
          const created = await createAudited(models.FitModel, values as CreationAttributes<FitModel>, context);
          log.push({ entity: "FitModel", label: row.label, action: "create" });
          modelIds.set(row.key, created.id);
        }
      }

      for (const row of document.comparisons) {
        const restrictedModelId = modelIds.get(row.restrictedKey)!;
        const values = {
          sampleId: storedModels.get(restrictedModelId)?.sampleId ?? sampleIds.get(document.models.find((model) => model.key === row.restrictedKey)!.sampleKey)!,
          paperId,
          label: row.label,
          restrictedModelId,
          freeModelId: modelIds.get(row.freeKey)!,
          method: row.method,
          nested: row.nested,
          alphaText: row.alpha || null,
          alpha: row.alpha ? Number(figureColumns({ alpha: row.alpha }, ["alpha"]).alpha) : null,
          location: row.location || null,
          preferred: (row.preferred || null) as Comparison["preferred"],
          invarianceClaimed: row.invarianceClaimed,
          notes: row.notes || null,
          ...rowValues(row as unknown as Record<string, unknown>, COMPARISON_FIGURES),
        };
        // a model moved to another sample in the same save: follow it
        const restrictedSample = document.models.find((model) => model.key === row.restrictedKey)!.sampleKey;
        values.sampleId = sampleIds.get(restrictedSample)!;
        const id = storedId(row.key, "c");
        if (id !== null) {
          await updateRow(storedComparisons.get(id)!, values, { entity: "Comparison", label: row.label }, log, context);
        } else {
          await createAudited(models.Comparison, values as CreationAttributes<Comparison>, context);
          log.push({ entity: "Comparison", label: row.label, action: "create" });
        }
      }

      for (const row of lateModels) await removeModel(row);
      for (const row of lateSamples) await removeSample(row);

      const flags = await rewriteFlagsForPaper(paperId, { transaction, actorId: actor.id });
      await recordEvent({ entity: "Paper", entityId: paperId, action: "coding-saved", before: { version: document.version }, after: { version: document.version + 1, changes: log } }, context);
      return { version: document.version + 1, flags, changes: log.length };
    });
  } catch (error) {
    if (error instanceof AppError) throw error;
    explainDatabaseError(error, { doiField: "metadata.doi" });
  }
}
