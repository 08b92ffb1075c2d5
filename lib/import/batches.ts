// An import batch from upload to commit: the upload is staged in the database as it streams in (refused
// past the size limit before it is read whole), the dry run judges every row and keeps the preview, and
// the commit writes every accepted row in one transaction — a failure part-way leaves the database as it
// was, and the batch says why.
import { Transaction } from "sequelize";
import { csvLine, formatCell, isSheetError, readSheetBatches, sheetHeaderLine, sheetRecordLine, type ByteSource } from "@/lib/csv";
import { db } from "@/lib/db";
import { recordEvent } from "@/lib/db/audit";
import { readRecheckSettings } from "@/lib/db/flags";
import { AppError } from "@/lib/errors";
import { MAX_UPLOAD_BYTES } from "@/lib/validation/import";
import { ImportBatch, ImportChunk, ImportRow } from "@/models";
import type { ImportRowDetails } from "@/models/import-row";
import { withoutErrorColumn } from "./error-column";
import { processSheet, type RowVerdict, type SheetSummary } from "./process";
import { endProgress, startProgress, type ImportProgress } from "./progress";
import { ImportWriter, type WriteTotals } from "./writer";

/** Accepted rows shown in the preview (every rejected row is kept, whatever the count). */
export const PREVIEW_ACCEPTED_ROWS = 2000;
/** Staged pieces of an upload; 256 KB keeps the row count small and each read short. */
const STAGE_CHUNK_BYTES = 256 * 1024;

export function uploadTooLarge(bytes?: number): AppError {
  const size = bytes ? ` (${(bytes / 1024 / 1024).toFixed(0)} MB)` : "";
  return new AppError("payload_too_large", `The file is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MB${size}. Split the sheet into several files and import them one after the other.`);
}

export async function createBatch({ uploaderId, fileName }: { uploaderId: number; fileName: string }): Promise<number> {
  await db();
  const batch = await ImportBatch.create({ uploaderId, fileName, status: "validating", rowErrors: [], progress: {}, failure: null });
  return batch.id;
}

/**
 * Stores the upload in pieces as it arrives and stops as soon as it passes `limit` bytes, so a huge
 * body is never read to its end. Returns the byte count.
 */
export async function stageUpload(batchId: number, body: AsyncIterable<Uint8Array>, limit = MAX_UPLOAD_BYTES): Promise<number> {
  let received = 0;
  let seq = 0;
  let pending: Uint8Array[] = [];
  let pendingBytes = 0;
  const store = async () => {
    if (pendingBytes === 0) return;
    await ImportChunk.create({ batchId, seq: seq++, bytes: Buffer.concat(pending) });
    pending = [];
    pendingBytes = 0;
  };
  for await (const piece of body) {
    received += piece.byteLength;
    if (received > limit) {
      await ImportChunk.destroy({ where: { batchId } });
      await ImportBatch.update({ status: "failed", failure: uploadTooLarge().message }, { where: { id: batchId } });
      throw uploadTooLarge();
    }
    pending.push(piece);
    pendingBytes += piece.byteLength;
    if (pendingBytes >= STAGE_CHUNK_BYTES) await store();
  }
  await store();
  return received;
}

/** The staged upload from its first byte, a few pieces per query, with a rejected-rows `error` column dropped. */
export function stagedSource(batchId: number): ByteSource {
  async function* pieces(): AsyncGenerator<Uint8Array> {
    let seq = 0;
    for (;;) {
      const rows = await ImportChunk.findAll({ where: { batchId }, attributes: ["seq", "bytes"], order: [["seq", "ASC"]], offset: seq, limit: 8, raw: true });
      for (const row of rows) yield new Uint8Array(row.bytes as Buffer);
      if (rows.length < 8) return;
      seq += rows.length;
    }
  }
  return withoutErrorColumn(pieces());
}

function batchFailure(error: unknown): string {
  if (isSheetError(error)) return `The file cannot be read as a comparison sheet: ${error.message}.`;
  if (error instanceof AppError) return error.message;
  return "The import failed on our side and nothing was changed. The error has been logged.";
}

function summaryProgress(summary: SheetSummary): Record<string, number> {
  const progress: Record<string, number> = { read: summary.total, validated: summary.total, new: summary.new, updated: summary.updated, unchanged: summary.unchanged, rejected: summary.rejected };
  for (const [code, count] of Object.entries(summary.findingCounts)) progress[`finding:${code}`] = count;
  return progress;
}

function detailsOf(verdict: RowVerdict): ImportRowDetails {
  const details: ImportRowDetails = {};
  if (verdict.errors) details.errors = verdict.errors;
  if (verdict.findings) details.findings = verdict.findings;
  if (verdict.notes) details.notes = verdict.notes;
  return details;
}

async function loadBatch(batchId: number, uploaderId?: number): Promise<ImportBatch> {
  const batch = await ImportBatch.findOne({ where: uploaderId === undefined ? { id: batchId } : { id: batchId, uploaderId } });
  if (!batch) throw new AppError("not_found", "There is no such import of yours.");
  return batch;
}

/** Judges every row without writing an entry; keeps the counts, the row errors and the preview. */
export async function runDryRun(batchId: number): Promise<SheetSummary | null> {
  // registered before the first await: a page read while the run starts sees it running, not interrupted
  const progress = startProgress(batchId);
  let buffer: Record<string, unknown>[] = [];
  let acceptedShown = 0;
  const flush = async () => {
    if (buffer.length === 0) return;
    await ImportRow.bulkCreate(buffer as never[], { validate: false, hooks: false });
    buffer = [];
  };
  try {
    await db();
    const batch = await loadBatch(batchId);
    await ImportRow.destroy({ where: { batchId } });
    const settings = await readRecheckSettings();
    const summary = await processSheet({
      open: () => stagedSource(batchId),
      uploaderId: batch.uploaderId,
      settings,
      progress,
      onVerdict: async (verdict) => {
        if (verdict.outcome !== "rejected" && acceptedShown >= PREVIEW_ACCEPTED_ROWS) return;
        if (verdict.outcome !== "rejected") acceptedShown += 1;
        buffer.push({ batchId, row: verdict.row, outcome: verdict.outcome, paper: verdict.paper?.slice(0, 300) ?? null, sample: verdict.sample?.slice(0, 200) ?? null, comparison: verdict.comparison?.slice(0, 200) ?? null, details: detailsOf(verdict) });
        if (buffer.length >= 1000) await flush();
      },
    });
    await flush();
    if (summary.total === 0) {
      await batch.update({ status: "failed", failure: "The sheet has a header row but no data rows: there is nothing to import." });
      return summary;
    }
    await batch.update({
      status: "previewed",
      totalRows: summary.total,
      acceptedRows: summary.total - summary.rejected,
      rejectedRows: summary.rejected,
      rowErrors: summary.rowErrors,
      progress: { ...summaryProgress(summary), previewed: 1 },
      failure: null,
    });
    return summary;
  } catch (error) {
    if (!isSheetError(error) && !(error instanceof AppError)) console.error("[import] dry run failed", error);
    await ImportBatch.update({ status: "failed", failure: batchFailure(error), progress: { read: progress.read, validated: progress.validated } }, { where: { id: batchId } });
    return null;
  } finally {
    endProgress(batchId);
  }
}

export interface CommitResult {
  summary: SheetSummary;
  totals: WriteTotals;
}

/** A batch claimed for its commit: its status is "committing" and its live progress is registered. */
export interface CommitClaim {
  batchId: number;
  uploaderId: number;
  /** the dry run's counts, kept beside the commit's */
  dryRun: Record<string, number>;
  progress: ImportProgress;
}

/** Writes every accepted row in one transaction; on any failure nothing of it stays. */
export async function runCommit(batchId: number, uploaderId: number): Promise<CommitResult | null> {
  return commitClaimed(await claimCommit(batchId, uploaderId));
}

/**
 * Checks that the uploader's batch can be committed and claims it (status "committing", live progress
 * registered), or throws the reason as an AppError. The commit route waits for this before answering, so
 * a page read right after the answer already sees the commit running.
 */
export async function claimCommit(batchId: number, uploaderId: number): Promise<CommitClaim> {
  await db();
  const batch = await loadBatch(batchId, uploaderId);
  if (!(batch.status === "previewed" || (batch.status === "failed" && batch.progress?.previewed === 1))) {
    throw new AppError("conflict", batch.status === "committed" ? "This import has already been committed." : "Only a previewed import can be committed; wait for its dry run to finish.");
  }
  if (batch.acceptedRows === 0) throw new AppError("conflict", "No row of this sheet was accepted: there is nothing to commit.");
  const dryRun = batch.progress;
  // claim the batch atomically: a second press of the button finds it committing and stops here
  const [claimed] = await ImportBatch.update({ status: "committing" }, { where: { id: batchId, status: batch.status } });
  if (claimed === 0) throw new AppError("conflict", "This import is already being committed.");
  return { batchId, uploaderId, dryRun: dryRun as Record<string, number>, progress: startProgress(batchId) };
}

/** The commit of a claimed batch: every accepted row in one transaction, the outcome recorded on the batch. */
export async function commitClaimed(claim: CommitClaim): Promise<CommitResult | null> {
  const { batchId, uploaderId, dryRun, progress } = claim;
  try {
    const { sequelize } = await db();
    const settings = await readRecheckSettings();
    // IMMEDIATE: take the write lock now, so the ids counted from max(id) stay free until the commit
    const result = await sequelize.transaction({ type: Transaction.TYPES.IMMEDIATE }, async (transaction) => {
      const writer = new ImportWriter({ transaction, actorId: uploaderId, batchId, settings });
      let summary: SheetSummary;
      try {
        summary = await processSheet({ open: () => stagedSource(batchId), uploaderId, settings, progress, transaction, writer });
      } finally {
        // a failure while the writer's last statement still runs: let it end before the rollback
        await writer.quiesce();
      }
      await ImportBatch.update(
        {
          status: "committed",
          totalRows: summary.total,
          acceptedRows: summary.total - summary.rejected,
          rejectedRows: summary.rejected,
          rowErrors: summary.rowErrors,
          progress: { ...dryRun, ...summaryProgress(summary), stored: summary.total - summary.rejected, previewed: 1, papersCreated: writer.totals.papersCreated, doiLookups: writer.totals.doiLookups },
          failure: null,
        },
        { where: { id: batchId }, transaction },
      );
      await recordEvent({ entity: "ImportBatch", entityId: batchId, action: "commit", after: { ...summaryProgress(summary), ...writer.totals } }, { actorId: uploaderId, transaction });
      return { summary, totals: writer.totals };
    });
    return result;
  } catch (error) {
    // name and message only: a failed bulk statement carries megabytes of SQL
    console.error("[import] commit failed and was rolled back:", error instanceof Error ? `${error.name}: ${error.message}` : error);
    const message = isSheetError(error) || error instanceof AppError ? batchFailure(error) : "The commit failed part-way and was rolled back: nothing of this sheet was stored. The error has been logged; try again, or ask an admin.";
    await ImportBatch.update({ status: "failed", failure: message }, { where: { id: batchId } });
    return null;
  } finally {
    endProgress(batchId);
  }
}

/** The rejected rows as a sheet with one more column, `error`, to fix and upload again on their own. */
export async function* rejectedRowsCsv(batchId: number, uploaderId: number): AsyncGenerator<string> {
  const batch = await loadBatch(batchId, uploaderId);
  const messages = new Map<number, string[]>();
  for (const error of batch.rowErrors) {
    const list = messages.get(error.row) ?? [];
    list.push(error.column ? `${error.column}: ${error.message}` : error.message);
    messages.set(error.row, list);
  }
  yield sheetHeaderLine().replace(/\r\n$/, "") + "," + formatCell("error") + "\r\n";
  if (messages.size === 0) return;
  for await (const rows of readSheetBatches(stagedSource(batchId))) {
    let text = "";
    for (const row of rows) {
      const problems = messages.get(row.row);
      if (!problems) continue;
      text += sheetRecordLine(row).replace(/\r\n$/, "") + "," + formatCell(`row ${row.row}: ${problems.join(" | ")}`) + "\r\n";
    }
    if (text) yield text;
  }
}

export { csvLine };
