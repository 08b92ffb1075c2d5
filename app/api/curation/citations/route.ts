// POST /api/curation/citations (contributors): BibTeX or RIS text → the metadata of each record, for the
// new-paper form. Reads and writes nothing stored.
import { withRole } from "@/lib/auth/guard";
import { parseCitations } from "@/lib/citations/cite";
import { cslToMetadata } from "@/lib/citations/csl";
import { AppError } from "@/lib/errors";
import { citationTextSchema } from "@/lib/validation/curation";

export const runtime = "nodejs";

export const POST = withRole("contributor", citationTextSchema, async (input) => {
  const outcome = await parseCitations(input.text, input.format === "auto" ? undefined : input.format);
  if (!outcome.ok) throw new AppError("validation_failed", outcome.message, { fields: { text: [outcome.message] } });
  return Response.json({
    records: outcome.items.slice(0, 50).map((item) => {
      const { _graph, ...csl } = item as Record<string, unknown>;
      void _graph;
      return { metadata: cslToMetadata(item), csl };
    }),
  });
});
