// GET /api/stats (README "HTTP API"): corpus statistics for the same filters as /api/comparisons — the
// share of comparisons with each finding code, the share of papers with an error-level finding, and
// breakdowns by year, journal, estimator and method, each with its Wilson 95 % interval.
import { readCorpusStats } from "@/lib/db/queries/stats";
import { respond } from "@/lib/http/respond";
import { readSearchRequest, scopeFor } from "@/lib/search/scope";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

export async function GET(request: Request): Promise<Response> {
  return respond(async () => {
    const { filters } = readSearchRequest(request);
    const scope = await scopeFor(request, filters);
    const stats = await readCorpusStats({ filters, scope });
    return Response.json(stats, { headers: { "cache-control": scope.kind === "public" ? "public, max-age=0, must-revalidate" : "private, no-store" } });
  });
}
