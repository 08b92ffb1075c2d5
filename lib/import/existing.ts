// What the database already holds for the papers a sheet names, loaded in bulk (a few queries per 500
// papers, never one per row). Papers come as model instances (their JSON author lists parsed); the many
// samples, models and comparisons as raw rows, reduced to what identity and change detection need, keyed by the identity keys of DESIGN §5.
import { DataTypes, Op, type Model, type ModelStatic, type Transaction } from "sequelize";
import { Comparison, FitModel, Paper, Sample } from "@/models";
import type { EntryState } from "@/models/paper";
import { COMPARISON_FIGURES, MODEL_FIGURES, textAttribute } from "@/models/figures";
import { SIGNATURE_NULL, SIGNATURE_SEPARATOR } from "./entry";

export interface ExistingPaper {
  id: number;
  doi: string | null;
  ref: string | null;
  state: EntryState;
  createdBy: number;
  values: Record<string, unknown>;
}

export interface ExistingSample {
  id: number;
  n: number | null;
  groups: number;
  values: Record<string, unknown>;
}

export interface ExistingModel {
  id: number;
  /** encodeSignature of the model's coding (see valuesModelSignature), built by the database (signatureSql) */
  signature: string;
}

export interface ExistingComparison {
  id: number;
  /** encodeSignature of the comparison's coding (see valuesComparisonSignature), built as in loadExisting */
  signature: string;
}

export interface ExistingState {
  paperByDoi: Map<string, ExistingPaper>;
  paperByRef: Map<string, ExistingPaper>;
  paperById: Map<number, ExistingPaper>;
  /** `${paperId}\0${label}` */
  samples: Map<string, ExistingSample>;
  /** `${sampleId}\0${label}` */
  models: Map<string, ExistingModel>;
  /** `${sampleId}\0${label}` */
  comparisons: Map<string, ExistingComparison>;
}

export const childKey = (parentId: number, label: string) => `${parentId}\u0000${label}`;

const CHUNK = 500;

function chunks<T>(items: readonly T[]): T[][] {
  const out: T[][] = [];
  for (let at = 0; at < items.length; at += CHUNK) out.push(items.slice(at, at + CHUNK));
  return out;
}

/**
 * SQL for a stored row's signature: its parts joined by SIGNATURE_SEPARATOR, SIGNATURE_NULL for an empty
 * one, a boolean as "yes"/"no" — the string encodeSignature gives for the same coding read from a sheet, built by the
 * database (|| and COALESCE: SQLite and PostgreSQL alike). One short string per stored row instead of a
 * row object of some thirty columns: loading those was most of a re-imported sheet's dry run.
 */
function signatureSql(model: ModelStatic<Model>, attributes: readonly string[]) {
  const sequelize = model.sequelize!;
  const definitions = model.getAttributes();
  const empty = sequelize.escape(SIGNATURE_NULL);
  const parts = attributes.map((attribute) => {
    const definition = definitions[attribute];
    if (!definition) throw new Error(`${model.name} has no attribute ${attribute}`);
    const column = sequelize.getQueryInterface().quoteIdentifier(definition.field ?? attribute);
    if (definition.type instanceof DataTypes.BOOLEAN) return `CASE WHEN ${column} IS NULL THEN ${empty} WHEN ${column} THEN 'yes' ELSE 'no' END`;
    return `COALESCE(${column}, ${empty})`;
  });
  return sequelize.literal(parts.join(` || ${sequelize.escape(SIGNATURE_SEPARATOR)} || `));
}

/** A model signature's parts, in valuesModelSignature's order. */
const MODEL_SIGNATURE = ["estimator", "meanStructure", ...MODEL_FIGURES.map(textAttribute)];
/** A comparison signature's parts before the two model labels, and after them (valuesComparisonSignature's order). */
const COMPARISON_SIGNATURE_HEAD = ["method", "nested", "alphaText", "location", "preferred", "invarianceClaimed", "notes"];
const COMPARISON_SIGNATURE_TAIL = COMPARISON_FIGURES.map(textAttribute);

export function emptyExisting(): ExistingState {
  return { paperByDoi: new Map(), paperByRef: new Map(), paperById: new Map(), samples: new Map(), models: new Map(), comparisons: new Map() };
}

/** Adds to `state` what is stored for papers with these DOIs or references (those not loaded before). */
export async function loadExisting(keys: { dois: Iterable<string>; refs: Iterable<string> }, transaction?: Transaction, state: ExistingState = emptyExisting()): Promise<ExistingState> {
  const papers = new Map<number, ExistingPaper>();
  const remember = (row: Record<string, unknown>) => {
    // a paper met before (by its DOI, now by its reference) stays the same object: the planner compares identities
    if (state.paperById.has(row.id as number)) return;
    const paper: ExistingPaper = {
      id: row.id as number,
      doi: (row.doi as string | null) ?? null,
      ref: (row.ref as string | null) ?? null,
      state: row.state as EntryState,
      createdBy: row.createdBy as number,
      values: row,
    };
    papers.set(paper.id, paper);
    state.paperById.set(paper.id, paper);
    if (paper.doi) state.paperByDoi.set(paper.doi, paper);
    if (paper.ref) state.paperByRef.set(paper.ref, paper);
  };
  for (const part of chunks([...keys.dois])) {
    for (const row of await Paper.findAll({ where: { doi: { [Op.in]: part } }, transaction })) remember(row.get({ plain: true }) as Record<string, unknown>);
  }
  for (const part of chunks([...keys.refs])) {
    for (const row of await Paper.findAll({ where: { ref: { [Op.in]: part } }, transaction })) remember(row.get({ plain: true }) as Record<string, unknown>);
  }

  const sampleLabel = new Map<number, string>();
  const modelLabel = new Map<number, string>();
  for (const part of chunks([...papers.keys()])) {
    const where = { paperId: { [Op.in]: part } };
    const samples = await Sample.findAll({ where, attributes: ["id", "paperId", "label", "n", "groups"], raw: true, transaction });
    for (const sample of samples) {
      sampleLabel.set(sample.id, sample.label);
      state.samples.set(childKey(sample.paperId as number, sample.label), { id: sample.id, n: sample.n, groups: sample.groups, values: sample as unknown as Record<string, unknown> });
    }
    const models = (await FitModel.findAll({
      where,
      attributes: ["id", "sampleId", "label", [signatureSql(FitModel, MODEL_SIGNATURE), "signature"]],
      raw: true,
      transaction,
    })) as unknown as Array<{ id: number; sampleId: number; label: string; signature: string }>;
    for (const model of models) {
      modelLabel.set(model.id, model.label);
      state.models.set(childKey(model.sampleId, model.label), { id: model.id, signature: model.signature });
    }
    const comparisons = (await Comparison.findAll({
      where,
      attributes: [
        "id", "sampleId", "label", "restrictedModelId", "freeModelId",
        [signatureSql(Comparison, COMPARISON_SIGNATURE_HEAD), "head"],
        [signatureSql(Comparison, COMPARISON_SIGNATURE_TAIL), "tail"],
      ],
      raw: true,
      transaction,
    })) as unknown as Array<{ id: number; sampleId: number; label: string; restrictedModelId: number; freeModelId: number; head: string; tail: string }>;
    for (const comparison of comparisons) {
      // head, the two model labels, tail: valuesComparisonSignature's order, encoded
      const labels = (modelLabel.get(comparison.restrictedModelId) ?? "") + SIGNATURE_SEPARATOR + (modelLabel.get(comparison.freeModelId) ?? "");
      const signature = comparison.head + SIGNATURE_SEPARATOR + labels + SIGNATURE_SEPARATOR + comparison.tail;
      state.comparisons.set(childKey(comparison.sampleId, comparison.label), { id: comparison.id, signature });
    }
  }
  return state;
}
