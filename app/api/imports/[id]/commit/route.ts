// POST /api/imports/{id}/commit — writes the accepted rows of a previewed import in one transaction, in
// the background; poll GET /api/imports/{id}. Answers 202.
import { withRole } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { claimCommit, commitClaimed } from "@/lib/import/batches";
import { startDoiResolution } from "@/lib/import/doi-jobs";
import { batchParamsSchema } from "@/lib/validation/import";

export const runtime = "nodejs";

export const POST = withRole("contributor", null, async (_input, user, _request, context) => {
  const params = batchParamsSchema.safeParse(await context.params);
  if (!params.success) throw new AppError("not_found", "There is no such import of yours.");
  // claimed before the answer (a refusal — not yours, not previewed, already committing — is the answer),
  // so the page the browser reads next already shows the commit running
  const claim = await claimCommit(params.data.id, user.id);
  // the writing itself in the background; a failure is recorded on the batch, never thrown away unseen
  void commitClaimed(claim)
    .then((result) => {
      if (result && result.totals.doiLookups > 0) startDoiResolution();
    })
    .catch((error: unknown) => console.error("[import] commit not started:", error instanceof Error ? error.message : error));
  return Response.json({ id: claim.batchId, status: "committing" }, { status: 202 });
});
