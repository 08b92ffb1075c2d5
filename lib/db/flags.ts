import "server-only";
import { createHash } from "node:crypto";
import type { InferCreationAttributes, Transaction } from "sequelize";
import { recheck, recheckModel, DEFAULT_SETTINGS, ENGINE_VERSION } from "@/lib/recheck";
import type { ComparisonInput, Finding, ModelInput, RecheckSettings, SampleInput } from "@/lib/recheck/types";
import type { Comparison, FitModel, Sample } from "@/models";
import { COMPARISON_FIGURES, MODEL_FIGURES, textAttribute } from "@/models/figures";
import type { FlagSubject } from "@/models/flag";
import { recordEvent } from "./audit";
import { getDatabase } from "./connection";

// Stored flags always match the stored entry: they are rewritten from the stored printed text, in the
// caller's transaction, whenever a paper's coding or the engine changes.

const text = (row: object, figure: string) => ((row as Record<string, unknown>)[textAttribute(figure)] as string | null) ?? undefined;

export function modelInput(model: FitModel): ModelInput {
  const input: ModelInput = { label: model.label, estimator: model.estimator ?? undefined };
  for (const figure of MODEL_FIGURES) input[figure] = text(model, figure);
  if (model.meanStructure !== null && model.meanStructure !== undefined) input.meanStructure = model.meanStructure ? "yes" : "no";
  return input;
}

export function sampleInput(sample: Sample): SampleInput {
  return { label: sample.label, n: sample.n === null ? undefined : String(sample.n), groups: String(sample.groups) };
}

export function comparisonInput(comparison: Comparison, restricted: FitModel, free: FitModel, sample: Sample): ComparisonInput {
  const input: ComparisonInput = {
    label: comparison.label,
    method: comparison.method,
    nested: comparison.nested,
    alpha: comparison.alphaText ?? undefined,
    preferred: comparison.preferred ?? undefined,
    invarianceClaimed: comparison.invarianceClaimed,
    sample: sampleInput(sample),
    restricted: modelInput(restricted),
    free: modelInput(free),
  };
  for (const figure of COMPARISON_FIGURES) input[figure] = text(comparison, figure);
  return input;
}

function stableJson(value: unknown): string {
  if (value === null || typeof value !== "object") return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map(stableJson).join(",")}]`;
  const entries = Object.entries(value as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : 1));
  return `{${entries.map(([key, item]) => `${JSON.stringify(key)}:${stableJson(item)}`).join(",")}}`;
}

/** Same finding (code, subject, figures, and which comparison or model) → same fingerprint. */
export function fingerprint(finding: Pick<Finding, "code" | "subject" | "values">, owner: string): string {
  return createHash("sha256").update(`${owner}|${finding.code}|${finding.subject}|${stableJson(finding.values)}`).digest("hex");
}

export const RECHECK_SETTINGS_KEY = "recheck";

/** The admin-configured alpha and cutoffs, over the engine defaults. */
export async function readRecheckSettings(transaction?: Transaction): Promise<RecheckSettings> {
  const row = await getDatabase().models.Setting.findByPk(RECHECK_SETTINGS_KEY, { transaction });
  return { ...DEFAULT_SETTINGS, ...((row?.value as Partial<RecheckSettings> | undefined) ?? {}) };
}

export interface RewriteResult {
  flags: number;
  /** comparisons whose cells the engine could not read (stored data should never have these) */
  unreadable: number;
}

/** Rewrites every flag of one paper from its stored samples, models and comparisons. */
export async function rewriteFlagsForPaper(
  paperId: number,
  options: { transaction?: Transaction; actorId: number | null; settings?: RecheckSettings },
): Promise<RewriteResult> {
  const { transaction } = options;
  const { Comparison, FitModel, Flag, Sample } = getDatabase().models;
  const settings = options.settings ?? (await readRecheckSettings(transaction));
  const [samples, models, comparisons] = await Promise.all([
    Sample.findAll({ where: { paperId }, transaction }),
    FitModel.findAll({ where: { paperId }, transaction }),
    Comparison.findAll({ where: { paperId }, transaction }),
  ]);
  const sampleById = new Map(samples.map((sample) => [sample.id, sample]));
  const modelById = new Map(models.map((model) => [model.id, model]));
  const rows: Omit<InferCreationAttributes<InstanceType<typeof Flag>>, "id" | "createdAt">[] = [];
  const covered = new Set<number>();
  let unreadable = 0;

  const push = (finding: Finding, owner: { comparisonId: number | null; modelId: number | null }, subject: FlagSubject) => {
    rows.push({
      paperId,
      comparisonId: owner.comparisonId,
      modelId: owner.modelId,
      subject,
      code: finding.code,
      severity: finding.severity,
      message: finding.message,
      values: finding.values,
      fingerprint: fingerprint(finding, owner.comparisonId !== null ? `c${owner.comparisonId}` : `m${owner.modelId}`),
      engineVersion: ENGINE_VERSION,
    });
  };

  for (const comparison of comparisons) {
    const restricted = modelById.get(comparison.restrictedModelId);
    const free = modelById.get(comparison.freeModelId);
    const sample = sampleById.get(comparison.sampleId);
    if (!restricted || !free || !sample) continue;
    covered.add(restricted.id).add(free.id);
    const outcome = recheck(comparisonInput(comparison, restricted, free, sample), settings);
    if (!outcome.ok) {
      unreadable += 1;
      continue;
    }
    for (const finding of outcome.result.findings) {
      const modelId = finding.subject === "a" ? restricted.id : finding.subject === "b" ? free.id : null;
      push(finding, { comparisonId: comparison.id, modelId }, finding.subject);
    }
  }
  for (const model of models) {
    if (covered.has(model.id)) continue;
    const sample = sampleById.get(model.sampleId);
    if (!sample) continue;
    const outcome = recheckModel(modelInput(model), sampleInput(sample), settings);
    if (!outcome.ok) {
      unreadable += 1;
      continue;
    }
    for (const finding of outcome.result.findings) push(finding, { comparisonId: null, modelId: model.id }, "model");
  }

  await Flag.destroy({ where: { paperId }, transaction });
  if (rows.length > 0) await Flag.bulkCreate(rows, { transaction });
  await recordEvent(
    { entity: "Paper", entityId: paperId, action: "recheck", after: { flags: rows.length, unreadable, engineVersion: ENGINE_VERSION } },
    { actorId: options.actorId, transaction },
  );
  return { flags: rows.length, unreadable };
}
