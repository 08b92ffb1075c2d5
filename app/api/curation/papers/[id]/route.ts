// PUT /api/curation/papers/[id] (contributors and up): saves a paper's whole coding from the entry form
// with the version it was read at. The guard checks session, status and role; the document is then
// validated with the same schema the form uses, so every error names its field ("models.2.chisq").
// 409 when someone else saved first; the form keeps what was typed. A success answers the stored coding.
import { withRole } from "@/lib/auth/guard";
import { saveCoding } from "@/lib/curation/save";
import { readCodingDocument } from "@/lib/db/queries/workbench";
import { AppError } from "@/lib/errors";
import { codingDocumentSchema, pathFieldErrors } from "@/lib/validation/curation";
import { z } from "zod";

export const runtime = "nodejs";

const envelope = z.object({ document: z.record(z.string(), z.unknown(), { error: "Send the coding as {document: …}." }) });

export const PUT = withRole("contributor", envelope, async (input, user, _request, context) => {
  const paperId = Number((await context.params).id);
  if (!Number.isInteger(paperId) || paperId <= 0) throw new AppError("not_found", "There is no such paper.");
  const parsed = codingDocumentSchema.safeParse(input.document);
  if (!parsed.success) throw new AppError("validation_failed", "Some fields need attention; nothing was saved.", { fields: pathFieldErrors(parsed.error) });
  const outcome = await saveCoding({ paperId, document: parsed.data, actor: user });
  // the saved coding comes back with the keys of the rows it created, so the form carries on from it
  const document = await readCodingDocument({ paperId });
  return Response.json({ version: outcome.version, flags: outcome.flags.flags, changes: outcome.changes, document });
});
