// Background DOI metadata for the papers an import created (issue 6). Each new DOI gets a lookup job in
// the commit's transaction; after the commit, this process works through the pending jobs a few at a
// time. A failure (unknown DOI, timeout, malformed reply, registry unreachable) is kept with its reason
// and can be retried; it never blocks or undoes the import. Metadata fills only what the sheet left
// empty (and the DOI standing in for a missing title); the CSL record is kept whole.

import { Transaction } from "sequelize";
import { updateAudited } from "@/lib/db/audit";
import { db } from "@/lib/db";
import { resolveDoi, type DoiResolution } from "@/lib/doi";
import type { CslItem } from "@/lib/citations/csl";
import { AppError } from "@/lib/errors";
import { DoiLookup, ImportBatch, Paper } from "@/models";
import type { CslName } from "@/models/paper";

export type DoiResolver = (doi: string) => Promise<DoiResolution>;

const CONCURRENCY = 4;

function text(value: unknown): string | null {
  if (Array.isArray(value)) return text(value[0]);
  if (typeof value === "number") return String(value);
  return typeof value === "string" && value.trim() !== "" ? value.trim() : null;
}

function yearOf(csl: CslItem): number | null {
  const part = csl.issued?.["date-parts"]?.[0]?.[0];
  const year = Number(part);
  return Number.isInteger(year) && year >= 1900 && year <= 2100 ? year : null;
}

/** The paper's fields the registry may fill: only those still empty (a title still showing the DOI counts as empty). */
export function metadataChanges(paper: Paper, csl: CslItem): Partial<Paper["_attributes"]> {
  const changes: Partial<Paper["_attributes"]> = { csl: csl as Record<string, unknown> };
  const title = text(csl.title);
  if (title && (paper.title === paper.doi || paper.title.trim() === "")) changes.title = title.slice(0, 2000);
  if ((paper.authors ?? []).length === 0 && Array.isArray(csl.author) && csl.author.length > 0) changes.authors = csl.author as CslName[];
  const journal = text(csl["container-title"]);
  if (!paper.journal && journal) changes.journal = journal.slice(0, 300);
  const year = yearOf(csl);
  if (paper.year === null && year !== null) changes.year = year;
  const volume = text(csl.volume);
  if (!paper.volume && volume) changes.volume = volume.slice(0, 40);
  const issue = text(csl.issue);
  if (!paper.issue && issue) changes.issue = issue.slice(0, 40);
  const pages = text(csl.page);
  if (!paper.pages && pages) changes.pages = pages.slice(0, 40);
  return changes;
}

async function runLookup(job: DoiLookup, resolve: DoiResolver): Promise<void> {
  let outcome: DoiResolution;
  try {
    outcome = await resolve(job.doi);
  } catch (error) {
    console.error("[import] DOI lookup threw", error);
    outcome = { ok: false, reason: "unreachable", message: "The lookup failed unexpectedly." };
  }
  const { sequelize } = await db();
  // IMMEDIATE: several lookups finish at once; a deferred transaction upgrading to a write would get SQLITE_BUSY
  await sequelize.transaction({ type: Transaction.TYPES.IMMEDIATE }, async (transaction) => {
    if (!outcome.ok) {
      await job.update({ status: "failed", reason: outcome.reason, message: outcome.message, attempts: job.attempts + 1 }, { transaction });
      return;
    }
    const paper = await Paper.findByPk(job.paperId, { transaction });
    if (paper) await updateAudited(paper, metadataChanges(paper, outcome.csl), { actorId: null, transaction, action: "doi-metadata" });
    await job.update({ status: "resolved", reason: null, message: null, attempts: job.attempts + 1 }, { transaction });
  });
}

/** Resolves every pending lookup (of one batch, or all), a few at a time. */
export async function resolvePendingLookups({ batchId, resolve = (doi) => resolveDoi(doi) }: { batchId?: number; resolve?: DoiResolver } = {}): Promise<{ resolved: number; failed: number }> {
  await db();
  const counts = { resolved: 0, failed: 0 };
  for (;;) {
    const jobs = await DoiLookup.findAll({ where: { status: "pending", ...(batchId === undefined ? {} : { batchId }) }, order: [["id", "ASC"]], limit: CONCURRENCY * 4 });
    if (jobs.length === 0) return counts;
    for (let at = 0; at < jobs.length; at += CONCURRENCY) {
      await Promise.all(jobs.slice(at, at + CONCURRENCY).map((job) => runLookup(job, resolve)));
    }
    for (const job of jobs) counts[job.status === "resolved" ? "resolved" : "failed"] += 1;
  }
}

const globalForJobs = globalThis as typeof globalThis & { __fitledgerDoiRunner?: Promise<unknown> | null };

/** Starts the background resolution unless it is already running in this process; never awaited by a request. */
export function startDoiResolution(): void {
  if (globalForJobs.__fitledgerDoiRunner) return;
  globalForJobs.__fitledgerDoiRunner = resolvePendingLookups()
    .catch((error: unknown) => console.error("[import] DOI resolution stopped", error))
    .finally(() => {
      globalForJobs.__fitledgerDoiRunner = null;
    });
}

/** Puts a batch's failed lookups back in the queue. Only the uploader may. */
export async function retryFailedLookups({ batchId, uploaderId }: { batchId: number; uploaderId: number }): Promise<number> {
  await db();
  const batch = await ImportBatch.findOne({ where: { id: batchId, uploaderId }, attributes: ["id"] });
  if (!batch) throw new AppError("not_found", "There is no such import of yours.");
  const [count] = await DoiLookup.update({ status: "pending", reason: null, message: null }, { where: { batchId, status: "failed" } });
  return count;
}

export interface LookupCounts {
  pending: number;
  resolved: number;
  failed: number;
  failures: { doi: string; reason: string | null; message: string | null; attempts: number }[];
}

export async function lookupCounts(batchId: number): Promise<LookupCounts> {
  const rows = await DoiLookup.findAll({ where: { batchId }, attributes: ["doi", "status", "reason", "message", "attempts"], order: [["id", "ASC"]], raw: true });
  const counts: LookupCounts = { pending: 0, resolved: 0, failed: 0, failures: [] };
  for (const row of rows) {
    counts[row.status as "pending" | "resolved" | "failed"] += 1;
    if (row.status === "failed") counts.failures.push({ doi: row.doi, reason: row.reason, message: row.message, attempts: row.attempts });
  }
  return counts;
}

