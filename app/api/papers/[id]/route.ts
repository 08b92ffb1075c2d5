// GET /api/papers/[id] (public): a verified paper with its samples, models, comparisons, findings and
// their dispositions — the same read as the paper page. Unverified or unknown: a JSON 404.
import { readPublicPaper } from "@/lib/db/queries/papers";
import { AppError } from "@/lib/errors";
import { respond } from "@/lib/http/respond";
import { CAUTION_TEXT } from "@/components/caution-notice";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

export async function GET(_request: Request, context: { params: Promise<Record<string, string | string[] | undefined>> }) {
  return respond(async () => {
    const id = Number((await context.params).id);
    const paper = Number.isInteger(id) && id > 0 ? await readPublicPaper({ paperId: id }) : null;
    if (!paper) throw new AppError("not_found", "There is no verified paper with this id.");
    // who coded and verified: names only, never an e-mail address or an account id
    const { createdBy, csl, ...shown } = paper;
    void createdBy;
    void csl;
    return Response.json({ paper: shown, caution: CAUTION_TEXT });
  });
}
