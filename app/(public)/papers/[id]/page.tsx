import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { CautionNotice } from "@/components/caution-notice";
import { FindingList, type FindingItem } from "@/components/finding-list";
import { PaperCitation } from "@/components/paper-citation";
import { PaperHistory } from "@/components/paper-history";
import { ComparisonsTable, ModelsTable, SamplesTable } from "@/components/paper-tables";
import { Notice } from "@/components/ui/notice";
import { getCurrentUser } from "@/lib/auth/current-user";
import { hasRole } from "@/lib/auth/roles";
import { canEditCoding, canRead } from "@/lib/curation/rules";
import { readPaper, readPaperHistory, type FindingView, type PaperView } from "@/lib/db/queries/papers";
import { CorrectionForm } from "./correction-form";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ id: string }>; searchParams: Promise<{ finding?: string; comparison?: string }> };

/** The paper if this viewer may read it: verified for everyone, unverified for its coder and curators. */
async function load(id: string) {
  const paperId = Number(id);
  if (!/^\d+$/.test(id) || !Number.isSafeInteger(paperId)) return null;
  const user = await getCurrentUser();
  const paper = await readPaper({ paperId, includeUnverified: user !== null });
  if (!paper || !canRead(paper, user)) return null;
  return { paper, user };
}

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const loaded = await load((await params).id);
  return { title: loaded ? loaded.paper.title : "Paper not found" };
}

const date = (iso: string | null) => (iso ? iso.slice(0, 10) : null);

function counts(findings: FindingView[]) {
  const out: Record<number, { error: number; warning: number; note: number }> = {};
  for (const finding of findings) {
    if (finding.comparisonId === null) continue;
    const entry = (out[finding.comparisonId] ??= { error: 0, warning: 0, note: 0 });
    entry[finding.severity] += 1;
  }
  return out;
}

function Findings({ paper, highlightCode }: { paper: PaperView; highlightCode?: string }) {
  const groups: { id: string; heading: string; findings: FindingItem[] }[] = [];
  const sampleLabel = new Map(paper.samples.map((sample) => [sample.id, sample.label]));
  for (const comparison of paper.comparisons) {
    const findings = paper.findings.filter((finding) => finding.comparisonId === comparison.id);
    const models = `${comparison.restrictedLabel} vs ${comparison.freeLabel}`;
    const name = comparison.label === models ? comparison.label : `${comparison.label} (${models})`;
    // the same comparison is often reported for several samples: say which one
    const heading = paper.samples.length > 1 ? `${sampleLabel.get(comparison.sampleId) ?? "Sample"}: ${name}` : name;
    groups.push({ id: `findings-comparison-${comparison.id}`, heading, findings });
  }
  const modelOnly = paper.findings.filter((finding) => finding.comparisonId === null);
  if (modelOnly.length > 0) groups.push({ id: "findings-models", heading: "Models outside any comparison", findings: modelOnly });
  return (
    <div className="space-y-4">
      {groups.map((group) => (
        <section key={group.id} id={group.id} aria-label={`Findings: ${group.heading}`} className="scroll-mt-20 space-y-1.5">
          <h3 className="text-sm font-medium">{group.heading}</h3>
          <FindingList findings={group.findings} highlightCode={highlightCode} empty={<p className="text-sm text-ink-soft">The recheck found nothing to report here.</p>} />
        </section>
      ))}
    </div>
  );
}

export default async function PaperPage({ params, searchParams }: Props) {
  const [{ id }, query] = await Promise.all([params, searchParams]);
  const loaded = await load(id);
  if (!loaded) notFound();
  const { paper, user } = loaded;
  // the history is for contributors and curators (DESIGN §3); an unverified entry reaches only its coder and curators at all
  const insider = user !== null && hasRole(user.role, "contributor");
  const history = insider ? await readPaperHistory({ paperId: paper.id }) : [];
  const highlightCode = typeof query.finding === "string" && /^[a-z-]{3,60}$/.test(query.finding) ? query.finding : undefined;
  const highlightComparison = query.comparison && /^\d+$/.test(query.comparison) ? Number(query.comparison) : undefined;
  const errors = paper.findings.filter((finding) => finding.severity === "error").length;

  return (
    <article className="space-y-6">
      <header className="space-y-2">
        <p className="text-xs uppercase tracking-wide text-ink-faint">{[paper.journal, paper.year].filter(Boolean).join(" · ")}</p>
        <h1 className="text-xl font-semibold tracking-tight">{paper.title}</h1>
        <PaperCitation paper={paper} />
        {paper.state !== "verified" ? (
          <Notice tone="info" title={`This entry is ${paper.state}, not public yet`}>
            Only its coder and curators can open this page until a curator verifies the entry.
            {user && canEditCoding(paper, user) ? (
              <>
                {" "}
                <Link href={`/workbench/papers/${paper.id}`} className="underline">
                  Edit the coding
                </Link>
              </>
            ) : null}
          </Notice>
        ) : null}
        <dl className="flex flex-wrap gap-x-6 gap-y-1 text-sm">
          <div>
            <dt className="inline text-ink-faint">Coded by </dt>
            <dd className="inline">{paper.coderName ?? "—"}</dd>
            {paper.submittedAt ? <dd className="inline text-ink-soft">, submitted {date(paper.submittedAt)}</dd> : null}
          </div>
          <div>
            <dt className="inline text-ink-faint">Verified by </dt>
            <dd className="inline">{paper.verifierName ? `${paper.verifierName}, ${date(paper.verifiedAt)}` : "not yet verified"}</dd>
          </div>
          <div>
            <dt className="inline text-ink-faint">Findings </dt>
            <dd className="inline figures">
              {paper.findings.length} ({errors} error{errors === 1 ? "" : "s"})
            </dd>
          </div>
        </dl>
        <CautionNotice />
      </header>

      <section aria-labelledby="samples-heading" className="space-y-2">
        <h2 id="samples-heading" className="text-sm font-semibold">Samples</h2>
        <SamplesTable samples={paper.samples} />
      </section>
      <section aria-labelledby="models-heading" className="space-y-2">
        <h2 id="models-heading" className="text-sm font-semibold">Models</h2>
        <p className="text-xs text-ink-soft">Every figure as printed in the paper; its decimals set the rounding tolerance of the recheck.</p>
        <ModelsTable models={paper.models} samples={paper.samples} />
      </section>
      <section aria-labelledby="comparisons-heading" className="space-y-2">
        <h2 id="comparisons-heading" className="text-sm font-semibold">Comparisons</h2>
        <ComparisonsTable comparisons={paper.comparisons} samples={paper.samples} findingCounts={counts(paper.findings)} highlightComparison={highlightComparison} />
      </section>
      <section aria-labelledby="findings-heading" className="space-y-2">
        <h2 id="findings-heading" className="text-sm font-semibold">What the recheck found</h2>
        <Findings paper={paper} highlightCode={highlightCode} />
      </section>

      {insider ? <PaperHistory events={history} /> : null}

      {paper.state === "verified" ? (
        <section aria-labelledby="correction-heading" className="space-y-2 border-t border-rule pt-4">
          <h2 id="correction-heading" className="text-sm font-semibold">Send a correction</h2>
          <p className="text-sm text-ink-soft">Are you an author of this paper, or did you spot a coding mistake? Tell the curators; they check every correction against the paper.</p>
          <CorrectionForm paperId={paper.id} />
        </section>
      ) : null}
    </article>
  );
}
