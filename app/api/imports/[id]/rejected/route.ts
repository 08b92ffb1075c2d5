// GET /api/imports/{id}/rejected — the rejected rows as a comparison sheet with one more column,
// `error`, to fix and upload again on their own (the importer drops that column when it reads them).
import { withRole } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { rejectedRowsCsv } from "@/lib/import/batches";
import { textStream } from "@/lib/export/response";
import { ImportBatch } from "@/models";
import { db } from "@/lib/db";
import { batchParamsSchema } from "@/lib/validation/import";

export const runtime = "nodejs";

export const GET = withRole("contributor", null, async (_input, user, _request, context) => {
  const params = batchParamsSchema.safeParse(await context.params);
  if (!params.success) throw new AppError("not_found", "There is no such import of yours.");
  await db();
  const batch = await ImportBatch.findOne({ where: { id: params.data.id, uploaderId: user.id }, attributes: ["id", "fileName"] });
  if (!batch) throw new AppError("not_found", "There is no such import of yours.");
  const base = batch.fileName.replace(/\.csv$/i, "").replace(/[^\w.-]+/g, "-").slice(0, 80) || "sheet";
  return new Response(textStream(rejectedRowsCsv(batch.id, user.id)), {
    headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="${base}-rejected-rows.csv"`, "Cache-Control": "no-store" },
  });
});
