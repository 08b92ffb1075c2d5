import "server-only";
import { formatCitation } from "@/lib/citations/cite";
import { paperToCsl } from "@/lib/citations/csl";
import type { CslName } from "@/models/paper";

// The paper's reference in APA style (citation-js, offline template), with its DOI as a link. Server
// only: citation-js is not shipped to the browser.

export function PaperCitation({ paper }: { paper: { id: number; doi: string | null; title: string; authors: CslName[]; journal: string | null; year: number | null; volume: string | null; issue: string | null; pages: string | null; csl?: Record<string, unknown> | null } }) {
  let text: string;
  try {
    text = formatCitation(paperToCsl(paper), "apa");
  } catch {
    text = [paper.title, paper.journal, paper.year].filter(Boolean).join(". ");
  }
  const doiUrl = paper.doi ? `https://doi.org/${paper.doi}` : null;
  // the DOI link is rendered as a link, the rest as text (React escapes it)
  const body = doiUrl && text.endsWith(doiUrl) ? text.slice(0, -doiUrl.length).trimEnd() : text;
  return (
    <p className="text-sm" data-testid="citation">
      {body}
      {doiUrl ? (
        <>
          {" "}
          <a href={doiUrl} className="break-all underline" rel="noopener">
            {doiUrl}
          </a>
        </>
      ) : null}
    </p>
  );
}
