// Helpers for the import tests: a real migrated SQLite file, real accounts, sheets as text or bytes
// pushed through the same staging, dry run and commit the upload route uses.
import { hashPassword } from "@/lib/auth/password";
import { createBatch, runCommit, runDryRun, stageUpload } from "@/lib/import/batches";
import { ImportBatch, User } from "@/models";
import type { Role } from "@/lib/auth/roles";

export async function createAccount(email: string, role: Role = "contributor"): Promise<number> {
  const user = await User.create({ email, name: email.split("@")[0], affiliation: null, reason: null, passwordHash: await hashPassword("import-test-password"), role, status: "active", statusNote: null });
  return user.id;
}

export function bytesOf(text: string | Uint8Array): Uint8Array {
  return typeof text === "string" ? new TextEncoder().encode(text) : text;
}

async function* inPieces(data: Uint8Array, size = 7000): AsyncGenerator<Uint8Array> {
  for (let at = 0; at < data.length; at += size) yield data.subarray(at, at + size);
}

/** Uploads and dry-runs a sheet; returns the batch after its dry run. */
export async function dryRun(uploaderId: number, sheet: string | Uint8Array, fileName = "sheet.csv"): Promise<ImportBatch> {
  const batchId = await createBatch({ uploaderId, fileName });
  await stageUpload(batchId, inPieces(bytesOf(sheet)));
  await runDryRun(batchId);
  return (await ImportBatch.findByPk(batchId))!;
}

/** Uploads, dry-runs and commits; returns the batch after the commit. */
export async function importSheet(uploaderId: number, sheet: string | Uint8Array): Promise<ImportBatch> {
  const batch = await dryRun(uploaderId, sheet);
  if (batch.status !== "previewed" || batch.acceptedRows === 0) return batch;
  await runCommit(batch.id, uploaderId);
  return (await ImportBatch.findByPk(batch.id))!;
}
