// GET /api/doi?doi=… (contributors): the new-paper form's DOI lookup. A DOI already in the corpus answers
// the existing paper (no duplicate); otherwise the configured registry is asked through citation-js. An
// unknown DOI, a timeout or a malformed reply is an answer too (`found: false` with the reason), so the
// form can say so and let the contributor type the metadata.
import { withRole } from "@/lib/auth/guard";
import { canRead } from "@/lib/curation/rules";
import { cslToMetadata } from "@/lib/citations/csl";
import { findPaperByDoi } from "@/lib/db/queries/workbench";
import { normaliseDoi, resolveDoi } from "@/lib/doi";
import { doiLookupSchema } from "@/lib/validation/curation";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

export const GET = withRole("contributor", doiLookupSchema, async (input, user) => {
  const doi = normaliseDoi(input.doi)!;
  const existing = await findPaperByDoi({ doi });
  if (existing) {
    const mayOpen = canRead(existing, user);
    return Response.json({
      doi,
      existing: {
        id: existing.id,
        title: mayOpen ? existing.title : null,
        href: mayOpen ? (existing.state === "verified" ? `/papers/${existing.id}` : `/workbench/papers/${existing.id}`) : null,
        state: mayOpen ? existing.state : null,
      },
    });
  }
  const resolution = await resolveDoi(doi);
  if (!resolution.ok) return Response.json({ doi, found: false, reason: resolution.reason, message: resolution.message });
  const { _graph, ...csl } = resolution.csl as Record<string, unknown>;
  void _graph;
  return Response.json({ doi, found: true, metadata: { ...cslToMetadata(resolution.csl), doi }, csl });
});
