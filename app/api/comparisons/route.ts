// GET /api/comparisons (README "HTTP API"): the Explore search as JSON — filters as query parameters,
// `page`, `per_page` (≤ 200), `sort` → {items, total, papers, page, per_page, pages, sort, facets}.
// Read-only and public: verified entries for everyone; wider scopes go through the guard (lib/search/scope).
import { respond } from "@/lib/http/respond";
import { searchComparisons } from "@/lib/search";
import { readSearchRequest, scopeFor } from "@/lib/search/scope";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

export async function GET(request: Request): Promise<Response> {
  return respond(async () => {
    const { filters, paging } = readSearchRequest(request, { paging: true });
    const scope = await scopeFor(request, filters);
    const result = await searchComparisons({ filters, scope, paging });
    return Response.json(
      { items: result.items, total: result.total, papers: result.papers, page: result.page, per_page: result.perPage, pages: result.pages, sort: result.sort, facets: result.facets },
      { headers: { "cache-control": scope.kind === "public" ? "public, max-age=0, must-revalidate" : "private, no-store" } },
    );
  });
}
