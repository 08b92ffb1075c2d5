import "server-only";
import { Op } from "sequelize";
import { db } from "@/lib/db";
import type { Models } from "@/models";

export interface CorpusFigures {
  papers: number;
  verifiedPapers: number;
  verifiedComparisons: number;
  /** verified comparisons with at least one error- or warning-level finding */
  flaggedComparisons: number;
}

/** The headline figures of the landing page; only verified entries count as corpus. */
export async function readCorpusFigures(): Promise<CorpusFigures> {
  const { models } = await db();
  return readCorpusFiguresFrom(models);
}

/** The same figures from any database handle (tests count them on the e2e database directly). */
export async function readCorpusFiguresFrom(models: Models): Promise<CorpusFigures> {
  const verified = { model: models.Paper, as: "paper", attributes: [], where: { state: "verified" }, required: true };
  const [papers, verifiedPapers, verifiedComparisons, flaggedComparisons] = await Promise.all([
    models.Paper.count(),
    models.Paper.count({ where: { state: "verified" } }),
    models.Comparison.count({ include: [verified] }),
    models.Flag.count({
      distinct: true,
      col: "comparison_id", // count() takes the column name, not the attribute
      where: { severity: { [Op.in]: ["error", "warning"] }, comparisonId: { [Op.ne]: null } },
      include: [verified],
    }),
  ]);
  return { papers, verifiedPapers, verifiedComparisons, flaggedComparisons };
}

export interface FrequentFinding {
  code: string;
  severity: string;
  /** verified comparisons raising this code */
  comparisons: number;
}

/** The codes raised on most verified comparisons, for the landing page. */
export async function readFrequentFindings({ limit }: { limit: number }): Promise<FrequentFinding[]> {
  const { models, sequelize } = await db();
  const rows = (await models.Flag.findAll({
    attributes: ["code", "severity", [sequelize.fn("COUNT", sequelize.fn("DISTINCT", sequelize.col("comparison_id"))), "comparisons"]],
    where: { comparisonId: { [Op.ne]: null } },
    include: [{ model: models.Paper, as: "paper", attributes: [], where: { state: "verified" }, required: true }],
    group: ["code", "severity"],
    order: [[sequelize.literal("comparisons"), "DESC"], ["code", "ASC"]],
    limit,
    raw: true,
  })) as unknown as { code: string; severity: string; comparisons: number | string }[];
  return rows.map((row) => ({ code: row.code, severity: row.severity, comparisons: Number(row.comparisons) }));
}
