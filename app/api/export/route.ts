// GET /api/export?format=csv|json|bibtex|ris (README "HTTP API"): the results of a search, with the same
// filters as /api/comparisons, as the comparison sheet (DESIGN §5), JSON, BibTeX or RIS. The search is
// resolved to comparison and paper ids here and handed to the export library (lib/export), which
// streams the file. Verified entries only, or with `mine=1` a signed-in contributor's own entries in
// any state (through the guard, in lib/search/scope).
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { exportResponse, type ExportSelection } from "@/lib/export";
import { respond } from "@/lib/http/respond";
import { resolveSearchIds } from "@/lib/search";
import { readSearchRequest, scopeFor } from "@/lib/search/scope";
import { EXPORT_FORMATS } from "@/lib/validation/import";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const formatSchema = z.enum(EXPORT_FORMATS, { error: `must be one of ${EXPORT_FORMATS.join(", ")}` });

export async function GET(request: Request): Promise<Response> {
  return respond(async () => {
    const { filters, rest } = readSearchRequest(request, { extra: ["format"] });
    const format = formatSchema.safeParse(rest.format ?? "csv");
    if (!format.success) throw new AppError("validation_failed", `Invalid parameter format: ${format.error.issues[0].message}`, { fields: { format: [format.error.issues[0].message] } });
    if (!filters.mine && filters.state.some((state) => state !== "verified")) {
      throw new AppError("validation_failed", "Invalid parameter state: exports hold verified entries only (or your own entries with mine=1)", { fields: { state: ["exports hold verified entries only (or your own with mine=1)"] } });
    }
    const searchScope = await scopeFor(request, filters);
    // staff search more widely, but an export is either public or one's own (the export library's scopes)
    const scope = searchScope.kind === "owner" ? searchScope : ({ kind: "public" } as const);
    const { comparisonIds, paperIds, complete } = await resolveSearchIds({ filters, scope });
    const selection: ExportSelection = {
      scope: scope.kind === "owner" ? { ownerId: scope.userId } : "public",
      paperIds,
      // only the matching comparisons of those papers, unless every one of their comparisons matches
      ...(complete ? {} : { comparisonWhere: { id: comparisonIds } }),
    };
    const day = new Date().toISOString().slice(0, 10);
    return exportResponse(format.data, selection, `fitledger-${filters.mine ? "my-entries" : "comparisons"}-${day}`);
  });
}
