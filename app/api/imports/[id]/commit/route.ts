// POST /api/imports/{id}/commit — writes the accepted rows of a previewed import in one transaction, in
// the background; poll GET /api/imports/{id}. Answers 202.
import { withRole } from "@/lib/auth/guard";
import { readBatch } from "@/lib/db/queries/imports";
import { AppError } from "@/lib/errors";
import { runCommit } from "@/lib/import/batches";
import { startDoiResolution } from "@/lib/import/doi-jobs";
import { batchParamsSchema } from "@/lib/validation/import";

export const runtime = "nodejs";

export const POST = withRole("contributor", null, async (_input, user, _request, context) => {
  const params = batchParamsSchema.safeParse(await context.params);
  if (!params.success) throw new AppError("not_found", "There is no such import of yours.");
  const batch = await readBatch({ batchId: params.data.id, uploaderId: user.id });
  if (!batch) throw new AppError("not_found", "There is no such import of yours.");
  if (batch.status === "committed") throw new AppError("conflict", "This import has already been committed.");
  if (batch.status !== "previewed" && batch.status !== "failed") throw new AppError("conflict", "Wait for the dry run to finish before committing.");
  if (batch.acceptedRows === 0) throw new AppError("conflict", "No row of this sheet was accepted: there is nothing to commit.");
  // in the background; a refusal (a second press) or a failure is recorded on the batch, never thrown away unseen
  void runCommit(batch.id, user.id)
    .then((result) => {
      if (result && result.totals.doiLookups > 0) startDoiResolution();
    })
    .catch((error: unknown) => console.error("[import] commit not started:", error instanceof Error ? error.message : error));
  return Response.json({ id: batch.id, status: "committing" }, { status: 202 });
});
