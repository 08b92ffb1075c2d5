import "server-only";
import { fn, col, Op, type WhereOptions } from "sequelize";
import { db } from "@/lib/db";
import type { Paper } from "@/models";
import { readPaperHistory, type HistoryEvent } from "./papers";

// The curator's queue: submitted entries, oldest submission first, with filters; and what changed in an
// entry since it was last verified (from its audit trail).

export interface QueueRow {
  id: number;
  title: string;
  doi: string | null;
  ref: string | null;
  journal: string | null;
  year: number | null;
  field: string | null;
  coderName: string | null;
  createdBy: number;
  submittedAt: string | null;
  comparisons: number;
  errors: number;
  warnings: number;
}

export interface QueueFilters {
  /** free text over title, DOI, journal */
  q?: string;
  field?: string;
  /** "others": entries someone else coded (the ones this curator may verify) */
  coder?: "all" | "others";
}

export async function listReviewQueue({ filters = {}, viewerId, page, pageSize }: { filters?: QueueFilters; viewerId: number; page: number; pageSize: number }): Promise<{ rows: QueueRow[]; total: number; fields: string[] }> {
  const { models } = await db();
  const where: WhereOptions<Paper> & Record<string | symbol, unknown> = { state: "submitted" };
  if (filters.field) where.field = filters.field;
  if (filters.coder === "others") where.createdBy = { [Op.ne]: viewerId };
  if (filters.q) {
    const like = `%${filters.q.replace(/[%_]/g, (c) => `\\${c}`)}%`;
    where[Op.or] = [{ title: { [Op.like]: like } }, { doi: { [Op.like]: like } }, { journal: { [Op.like]: like } }];
  }
  const { rows, count } = await models.Paper.findAndCountAll({
    where,
    attributes: ["id", "title", "doi", "ref", "journal", "year", "field", "createdBy", "submittedAt"],
    include: [{ model: models.User, as: "coder", attributes: ["name"] }],
    order: [["submittedAt", "ASC"], ["id", "ASC"]],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  const ids = rows.map((row) => row.id);
  const [comparisonCounts, flagCounts, fieldRows] = await Promise.all([
    ids.length ? models.Comparison.findAll({ where: { paperId: ids }, attributes: ["paperId", [fn("COUNT", col("id")), "count"]], group: ["paperId"], raw: true }) : [],
    ids.length ? models.Flag.findAll({ where: { paperId: ids, severity: ["error", "warning"] }, attributes: ["paperId", "severity", [fn("COUNT", col("id")), "count"]], group: ["paperId", "severity"], raw: true }) : [],
    models.Paper.findAll({ where: { state: "submitted", field: { [Op.ne]: null } }, attributes: [[fn("DISTINCT", col("field")), "field"]], raw: true }),
  ]);
  const countOf = (list: unknown[], paperId: number, severity?: string) =>
    Number((list as { paperId: number; severity?: string; count: number }[]).find((row) => row.paperId === paperId && (severity === undefined || row.severity === severity))?.count ?? 0);
  return {
    total: count,
    fields: (fieldRows as unknown as { field: string }[]).map((row) => row.field).sort(),
    rows: rows.map((row) => ({
      id: row.id,
      title: row.title,
      doi: row.doi,
      ref: row.ref,
      journal: row.journal,
      year: row.year,
      field: row.field,
      coderName: (row.get("coder") as { name: string } | null)?.name ?? null,
      createdBy: row.createdBy,
      submittedAt: row.submittedAt ? row.submittedAt.toISOString() : null,
      comparisons: countOf(comparisonCounts, row.id),
      errors: countOf(flagCounts, row.id, "error"),
      warnings: countOf(flagCounts, row.id, "warning"),
    })),
  };
}

export interface ChangesSinceVerification {
  /** when the entry was last verified, or null when it never was (then every change is listed) */
  lastVerifiedAt: string | null;
  events: HistoryEvent[];
}

/** The entry's audit events after its most recent verification. */
export async function readChangesSinceVerification({ paperId }: { paperId: number }): Promise<ChangesSinceVerification> {
  const { models } = await db();
  const lastVerify = await models.AuditEvent.findOne({ where: { entity: "Paper", entityId: String(paperId), action: "verify" }, attributes: ["createdAt"], order: [["createdAt", "DESC"], ["id", "DESC"]] });
  const events = await readPaperHistory({ paperId, since: lastVerify?.createdAt, limit: 500 });
  return { lastVerifiedAt: lastVerify ? lastVerify.createdAt.toISOString() : null, events };
}
