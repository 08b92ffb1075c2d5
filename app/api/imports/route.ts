// POST /api/imports?name=FILE.csv — upload a comparison sheet for a dry run (issue 6).
//
// The body is the raw file (Content-Type text/csv, application/vnd.ms-excel, application/octet-stream or
// none), not multipart: it is staged in the database piece by piece as it streams in. A declared
// Content-Length over 50 MB is refused before any byte is read, and a body that passes 50 MB while
// streaming (no or a wrong Content-Length) is refused at that point, without reading the rest. The dry
// run then runs in the background; poll GET /api/imports/{id} for its progress. Answers 202 {id}.
//
// Why not withRole: the guard's body reader refuses anything over 1 MB (the limit of form and JSON
// bodies). The same guard function runs first here — authorizeCaller: session, account status, role —
// then zod on the query, and the route carries the guard's mark like every guarded handler.
import { GUARD_MARK, authorizeCaller, type GuardMark } from "@/lib/auth/guard";
import { AppError, type FieldErrors } from "@/lib/errors";
import { respond } from "@/lib/http/respond";
import { createBatch, runDryRun, stageUpload, uploadTooLarge } from "@/lib/import/batches";
import { MAX_UPLOAD_BYTES, uploadQuerySchema } from "@/lib/validation/import";
import { z } from "zod";

export const runtime = "nodejs";

const ACCEPTED_TYPES = ["text/csv", "application/csv", "text/plain", "application/vnd.ms-excel", "application/octet-stream", ""];

async function upload(request: Request): Promise<Response> {
  return respond(async () => {
    const user = await authorizeCaller("contributor");
    const parsed = uploadQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
    if (!parsed.success) {
      const flat = z.flattenError(parsed.error);
      throw new AppError("validation_failed", flat.fieldErrors.name?.[0] ?? "Some fields need attention.", { fields: flat.fieldErrors as FieldErrors });
    }
    const type = (request.headers.get("content-type") ?? "").split(";")[0].trim().toLowerCase();
    if (!ACCEPTED_TYPES.includes(type)) {
      throw new AppError("unsupported_media_type", "Send the sheet itself as the request body (a CSV file), not as a form or JSON.");
    }
    const declared = Number(request.headers.get("content-length"));
    if (Number.isFinite(declared) && declared > MAX_UPLOAD_BYTES) throw uploadTooLarge(declared);
    if (!request.body) throw new AppError("validation_failed", "The file is empty: there is nothing to import.");

    const batchId = await createBatch({ uploaderId: user.id, fileName: parsed.data.name });
    const bytes = await stageUpload(batchId, request.body as unknown as AsyncIterable<Uint8Array>);
    if (bytes === 0) {
      await runDryRun(batchId); // records the "empty file" refusal on the batch
    } else {
      // in the background; the page polls its progress (runDryRun records its own failures on the batch)
      void runDryRun(batchId).catch((error: unknown) => console.error("[import] dry run not started:", error));
    }
    return Response.json({ id: batchId, bytes }, { status: 202 });
  });
}

export const POST = upload;
Object.defineProperty(POST, GUARD_MARK, { value: { kind: "route", access: "contributor" } satisfies GuardMark, enumerable: false });
