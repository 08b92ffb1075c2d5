// Live progress of the imports running in this process. A commit holds the database's write lock until
// it ends, so its progress cannot be written to the import's row while it runs; the counts live here and
// the batch row gets them at each phase's end. (With several app instances, only the one running the
// import sees its live counts; the others see the phase from the batch's status.)

export type ImportPhase = "reading" | "validating" | "storing" | "done";

export interface ImportProgress {
  phase: ImportPhase;
  /** data rows read so far (the first pass counts them all) */
  read: number;
  /** rows judged so far (second pass) */
  validated: number;
  /** accepted rows written (commit only) */
  stored: number;
  /** data rows in the sheet, once the first pass has counted them */
  total: number | null;
}

const globalForProgress = globalThis as typeof globalThis & { __fitledgerImportProgress?: Map<number, ImportProgress> };
const live = (globalForProgress.__fitledgerImportProgress ??= new Map());

export function startProgress(batchId: number): ImportProgress {
  const progress: ImportProgress = { phase: "reading", read: 0, validated: 0, stored: 0, total: null };
  live.set(batchId, progress);
  return progress;
}

export function liveProgress(batchId: number): ImportProgress | undefined {
  return live.get(batchId);
}

export function endProgress(batchId: number): void {
  live.delete(batchId);
}
