// GET /api/imports/own-entries?format=csv|json|bibtex|ris — the signed-in contributor's own entries, in
// any state (drafts included), through the export library. The corpus-wide export is GET /api/export.
import { withRole } from "@/lib/auth/guard";
import { exportResponse } from "@/lib/export";
import { ownExportQuerySchema } from "@/lib/validation/import";

export const runtime = "nodejs";

export const GET = withRole("contributor", ownExportQuerySchema, async (input, user) =>
  exportResponse(input.format, { scope: { ownerId: user.id } }, `fitledger-my-entries-${new Date().toISOString().slice(0, 10)}`),
);
