// GET /api/imports/{id} — an import's status, counts and live progress (rows read, validated, stored),
// and its DOI lookups; the uploader's own imports only.
import { withRole } from "@/lib/auth/guard";
import { readBatch } from "@/lib/db/queries/imports";
import { AppError } from "@/lib/errors";
import { batchParamsSchema } from "@/lib/validation/import";

export const runtime = "nodejs";

export const GET = withRole("contributor", null, async (_input, user, _request, context) => {
  const params = batchParamsSchema.safeParse(await context.params);
  if (!params.success) throw new AppError("not_found", "There is no such import of yours.");
  const batch = await readBatch({ batchId: params.data.id, uploaderId: user.id });
  if (!batch) throw new AppError("not_found", "There is no such import of yours.");
  return Response.json(batch, { headers: { "Cache-Control": "no-store" } });
});
