// POST /api/imports/{id}/doi-retry — queues the failed DOI lookups of an import again and restarts the
// background resolution. Answers {queued}.
import { withRole } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { retryFailedLookups, startDoiResolution } from "@/lib/import/doi-jobs";
import { batchParamsSchema } from "@/lib/validation/import";

export const runtime = "nodejs";

export const POST = withRole("contributor", null, async (_input, user, _request, context) => {
  const params = batchParamsSchema.safeParse(await context.params);
  if (!params.success) throw new AppError("not_found", "There is no such import of yours.");
  const queued = await retryFailedLookups({ batchId: params.data.id, uploaderId: user.id });
  if (queued > 0) startDoiResolution();
  return Response.json({ queued });
});
