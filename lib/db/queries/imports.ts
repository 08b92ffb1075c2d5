import "server-only";
import { Op } from "sequelize";
import { db } from "@/lib/db";
import { liveProgress, type ImportProgress } from "@/lib/import/progress";
import type { ImportRowError, ImportStatus } from "@/models/import-batch";
import type { ImportRowDetails, ImportRowOutcome } from "@/models/import-row";

// Reads about a contributor's imports: always by id AND uploader, so nobody sees another's batch.

export interface BatchView {
  id: number;
  fileName: string;
  status: ImportStatus;
  /** a dry run or commit that stopped with the process (a restart): it will not finish by itself */
  interrupted: boolean;
  totalRows: number;
  acceptedRows: number;
  rejectedRows: number;
  counts: { new: number; updated: number; unchanged: number; rejected: number };
  findingCounts: { code: string; count: number }[];
  live: ImportProgress | null;
  stored: number | null;
  failure: string | null;
  createdAt: Date;
  updatedAt: Date;
  lookups: { pending: number; resolved: number; failed: number; failures: { doi: string; reason: string | null; message: string | null; attempts: number }[] };
}

const RUNNING: ImportStatus[] = ["validating", "committing"];
/**
 * A running status with no live progress is only taken for an interrupted run once it is this old: the
 * status is written a moment before the run registers its progress (and an upload being staged has
 * none yet), and a page read in that moment must keep polling rather than give up on the import.
 */
const STARTING_GRACE_MS = 15_000;

export async function readBatch({ batchId, uploaderId }: { batchId: number; uploaderId: number }): Promise<BatchView | null> {
  const { models } = await db();
  const batch = await models.ImportBatch.findOne({
    where: { id: batchId, uploaderId },
    attributes: ["id", "fileName", "status", "totalRows", "acceptedRows", "rejectedRows", "progress", "failure", "createdAt", "updatedAt"],
  });
  if (!batch) return null;
  const lookups = await models.DoiLookup.findAll({ where: { batchId }, attributes: ["doi", "status", "reason", "message", "attempts"], order: [["id", "ASC"]], raw: true });
  const progress = (batch.progress ?? {}) as Record<string, number>;
  const live = liveProgress(batchId) ?? null;
  const view: BatchView = {
    id: batch.id,
    fileName: batch.fileName,
    status: batch.status,
    interrupted: RUNNING.includes(batch.status) && !live && Date.now() - batch.updatedAt.getTime() > STARTING_GRACE_MS,
    totalRows: batch.totalRows,
    acceptedRows: batch.acceptedRows,
    rejectedRows: batch.rejectedRows,
    counts: { new: progress.new ?? 0, updated: progress.updated ?? 0, unchanged: progress.unchanged ?? 0, rejected: progress.rejected ?? 0 },
    findingCounts: Object.entries(progress)
      .filter(([key]) => key.startsWith("finding:"))
      .map(([key, count]) => ({ code: key.slice("finding:".length), count }))
      .sort((a, b) => b.count - a.count),
    live,
    stored: progress.stored ?? null,
    failure: batch.failure,
    createdAt: batch.createdAt,
    updatedAt: batch.updatedAt,
    lookups: { pending: 0, resolved: 0, failed: 0, failures: [] },
  };
  for (const lookup of lookups) {
    const status = lookup.status as "pending" | "resolved" | "failed";
    view.lookups[status] += 1;
    if (status === "failed") view.lookups.failures.push({ doi: lookup.doi, reason: lookup.reason, message: lookup.message, attempts: lookup.attempts });
  }
  return view;
}

export interface BatchListRow {
  id: number;
  fileName: string;
  status: ImportStatus;
  totalRows: number;
  acceptedRows: number;
  rejectedRows: number;
  failure: string | null;
  createdAt: Date;
}

export async function listBatches({ uploaderId, page, pageSize }: { uploaderId: number; page: number; pageSize: number }): Promise<{ rows: BatchListRow[]; total: number }> {
  const { models } = await db();
  const { rows, count } = await models.ImportBatch.findAndCountAll({
    where: { uploaderId },
    attributes: ["id", "fileName", "status", "totalRows", "acceptedRows", "rejectedRows", "failure", "createdAt"],
    order: [["id", "DESC"]],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  return { rows: rows.map((row) => row.get({ plain: true }) as BatchListRow), total: count };
}

export interface PreviewRow {
  row: number;
  outcome: ImportRowOutcome;
  paper: string | null;
  sample: string | null;
  comparison: string | null;
  details: ImportRowDetails;
}

/** One page of a batch's preview rows: the rejected ones, or the accepted ones (with their findings). */
export async function listPreviewRows({ batchId, uploaderId, rejected, page, pageSize }: { batchId: number; uploaderId: number; rejected: boolean; page: number; pageSize: number }): Promise<{ rows: PreviewRow[]; total: number }> {
  const { models } = await db();
  const owned = await models.ImportBatch.findOne({ where: { id: batchId, uploaderId }, attributes: ["id"] });
  if (!owned) return { rows: [], total: 0 };
  const { rows, count } = await models.ImportRow.findAndCountAll({
    where: { batchId, outcome: rejected ? "rejected" : { [Op.ne]: "rejected" } },
    attributes: ["row", "outcome", "paper", "sample", "comparison", "details"],
    order: [["row", "ASC"]],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  return { rows: rows.map((row) => row.get({ plain: true }) as PreviewRow), total: count };
}

export type { ImportRowError };
