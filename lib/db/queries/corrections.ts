import "server-only";
import { db } from "@/lib/db";
import type { CorrectionStatus } from "@/models/correction";

export interface CorrectionListItem {
  id: number;
  paperId: number;
  paperTitle: string;
  name: string;
  email: string;
  message: string;
  status: CorrectionStatus;
  createdAt: Date;
}

/** Corrections sent from public paper pages, oldest open ones first (curators only; the page checks). */
export async function listCorrections({ status, page, pageSize }: { status: CorrectionStatus; page: number; pageSize: number }): Promise<{ items: CorrectionListItem[]; total: number }> {
  const { models } = await db();
  const { rows, count } = await models.Correction.findAndCountAll({
    where: { status },
    attributes: ["id", "paperId", "name", "email", "message", "status", "createdAt"],
    include: [{ model: models.Paper, as: "paper", attributes: ["title"], required: true }],
    order: status === "open" ? [["createdAt", "ASC"], ["id", "ASC"]] : [["updatedAt", "DESC"], ["id", "DESC"]],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  return {
    total: count,
    items: rows.map((row) => ({
      id: row.id,
      paperId: row.paperId,
      paperTitle: (row.get("paper") as { title: string }).title,
      name: row.name,
      email: row.email,
      message: row.message,
      status: row.status,
      createdAt: row.createdAt,
    })),
  };
}

export async function countOpenCorrections(): Promise<number> {
  const { models } = await db();
  return models.Correction.count({ where: { status: "open" } });
}
