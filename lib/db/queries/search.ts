import "server-only";
import { QueryTypes } from "sequelize";
import { db } from "@/lib/db";
import type { CslName } from "@/models/paper";

// The reads behind the search index (lib/search/corpus-index.ts): every comparison with what Explore
// filters, sorts and shows, and a cheap signature that changes whenever any of it may have changed.
// Entries of every state are read; lib/search applies the reader's scope (verified only for the public).

export interface PaperRecord {
  id: number;
  doi: string | null;
  title: string;
  authors: CslName[];
  journal: string | null;
  year: number | null;
  field: string | null;
  state: string;
  createdBy: number;
  verifiedAt: Date | null;
}

export interface ComparisonRecord {
  id: number;
  paperId: number;
  sampleId: number;
  label: string;
  method: string;
  restrictedModelId: number;
  freeModelId: number;
}

export interface SampleRecord {
  id: number;
  label: string;
  n: number | null;
  groups: number;
}

export interface ModelRecord {
  id: number;
  label: string;
  estimator: string | null;
}

export interface FlagRecord {
  comparisonId: number;
  paperId: number;
  code: string;
  severity: string;
  fingerprint: string;
}

export interface DispositionRecord {
  paperId: number;
  fingerprint: string;
  verdict: string;
}

export interface SearchSource {
  papers: PaperRecord[];
  comparisons: ComparisonRecord[];
  samples: SampleRecord[];
  models: ModelRecord[];
  flags: FlagRecord[];
  dispositions: DispositionRecord[];
  /** the engine versions that wrote the stored findings (one, unless a full recheck is under way) */
  engineVersions: string[];
}

function parseAuthors(value: unknown): CslName[] {
  if (Array.isArray(value)) return value as CslName[];
  if (typeof value === "string") {
    try {
      const parsed: unknown = JSON.parse(value);
      return Array.isArray(parsed) ? (parsed as CslName[]) : [];
    } catch {
      return [];
    }
  }
  return [];
}

const toDate = (value: unknown): Date | null => (value === null || value === undefined ? null : value instanceof Date ? value : new Date(String(value)));

/** Everything the index needs, in six plain reads (explicit attributes, no instances). */
export async function readSearchSource(): Promise<SearchSource> {
  const { models, sequelize } = await db();
  const [papers, comparisons, samples, fitModels, flags, dispositions, versions] = await Promise.all([
    models.Paper.findAll({ attributes: ["id", "doi", "title", "authors", "journal", "year", "field", "state", "createdBy", "verifiedAt"], raw: true }),
    models.Comparison.findAll({ attributes: ["id", "paperId", "sampleId", "label", "method", "restrictedModelId", "freeModelId"], order: [["id", "ASC"]], raw: true }),
    models.Sample.findAll({ attributes: ["id", "label", "n", "groups"], raw: true }),
    models.FitModel.findAll({ attributes: ["id", "label", "estimator"], raw: true }),
    models.Flag.findAll({ attributes: ["comparisonId", "paperId", "code", "severity", "fingerprint"], raw: true }),
    models.FlagDisposition.findAll({ attributes: ["paperId", "fingerprint", "verdict"], raw: true }),
    models.Flag.findAll({ attributes: [[sequelize.fn("DISTINCT", sequelize.col("engine_version")), "engineVersion"]], raw: true }),
  ]);
  return {
    papers: papers.map((paper) => ({ ...paper, authors: parseAuthors(paper.authors), verifiedAt: toDate(paper.verifiedAt) }) as PaperRecord),
    comparisons: comparisons as unknown as ComparisonRecord[],
    samples: samples as unknown as SampleRecord[],
    models: fitModels as unknown as ModelRecord[],
    flags: (flags as unknown as (FlagRecord & { comparisonId: number | null })[]).filter((flag) => flag.comparisonId !== null),
    dispositions: dispositions as unknown as DispositionRecord[],
    engineVersions: (versions as unknown as { engineVersion: string }[]).map((row) => row.engineVersion).sort(),
  };
}

/**
 * A fingerprint of the data the index is built from, in one round trip. Every write in Fitledger is
 * audited (lib/db/audit.ts), so the newest audit event id moves with any change made through the app;
 * the row counts and newest ids/update times catch bulk writes that bypass it (the benchmark seeder
 * writes one audit event per batch). Portable standard SQL (scalar subqueries, COUNT/MAX), no
 * dialect-specific syntax; table and column names are quoted by Sequelize for the running dialect.
 */
export async function readSearchSignature(): Promise<string> {
  const { sequelize, models } = await db();
  const q = (name: string) => sequelize.getQueryInterface().quoteIdentifier(name);
  const table = (model: { getTableName(): string | { tableName: string } }) => {
    const name = model.getTableName();
    return q(typeof name === "string" ? name : name.tableName);
  };
  // Each part is an index lookup (primary keys, and the updated_at indexes of migration 0005) or a
  // COUNT over a narrow index; together well under a millisecond at 100 000 comparisons.
  const parts: [string, string][] = [
    ["audit", `SELECT MAX(${q("id")}) FROM ${table(models.AuditEvent)}`],
    ["papers", `SELECT COUNT(*) FROM ${table(models.Paper)}`],
    ["paperUpdated", `SELECT MAX(${q("updated_at")}) FROM ${table(models.Paper)}`],
    ["comparisons", `SELECT COUNT(*) FROM ${table(models.Comparison)}`],
    ["comparisonMax", `SELECT MAX(${q("id")}) FROM ${table(models.Comparison)}`],
    ["modelMax", `SELECT MAX(${q("id")}) FROM ${table(models.FitModel)}`],
    ["sampleMax", `SELECT MAX(${q("id")}) FROM ${table(models.Sample)}`],
    ["flags", `SELECT COUNT(*) FROM ${table(models.Flag)}`],
    ["flagMax", `SELECT MAX(${q("id")}) FROM ${table(models.Flag)}`],
    ["dispositions", `SELECT COUNT(*) FROM ${table(models.FlagDisposition)}`],
    ["dispositionUpdated", `SELECT MAX(${q("updated_at")}) FROM ${table(models.FlagDisposition)}`],
  ];
  const sql = `SELECT ${parts.map(([name, part]) => `(${part}) AS ${q(name)}`).join(", ")}`;
  const [row] = await sequelize.query<Record<string, unknown>>(sql, { type: QueryTypes.SELECT });
  return parts.map(([name]) => String(row?.[name] ?? "")).join("|");
}
