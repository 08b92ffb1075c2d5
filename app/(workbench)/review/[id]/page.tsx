import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { FindingList } from "@/components/finding-list";
import { PaperHistory } from "@/components/paper-history";
import { Notice } from "@/components/ui/notice";
import { requireRole } from "@/lib/auth/current-user";
import { readPaper } from "@/lib/db/queries/papers";
import { readChangesSinceVerification } from "@/lib/db/queries/review";
import { DispositionForm, ReturnForm, VerifyForm } from "./review-forms";

export const metadata: Metadata = { title: "Review an entry" };
export const dynamic = "force-dynamic";

export default async function ReviewEntryPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { user, allowed } = await requireRole("curator", `/review/${id}`);
  if (!allowed) return <Notice tone="error" title="Curators only">Reviewing entries is for curators.</Notice>;
  if (!/^\d+$/.test(id)) notFound();
  const paperId = Number(id);
  const [paper, changes] = await Promise.all([readPaper({ paperId, includeUnverified: true }), readChangesSinceVerification({ paperId })]);
  if (!paper) notFound();
  const ownEntry = paper.createdBy === user.id;
  const comparisonLabel = new Map(paper.comparisons.map((comparison) => [comparison.id, comparison.label]));

  return (
    <div className="space-y-6">
      <header className="space-y-1">
        <p className="text-xs text-ink-faint">
          <Link href="/review" className="underline">Review queue</Link> · entry {paper.id} · {paper.state}
        </p>
        <h1 className="text-xl font-semibold tracking-tight">{paper.title}</h1>
        <p className="text-sm text-ink-soft">
          Coded by {paper.coderName ?? "—"}{paper.submittedAt ? `, submitted ${paper.submittedAt.slice(0, 10)}` : ""}.{" "}
          <Link href={`/papers/${paper.id}`} className="underline">Full entry</Link> ·{" "}
          <Link href={`/workbench/papers/${paper.id}`} className="underline">Fix the coding</Link>
        </p>
      </header>

      <PaperHistory events={changes.events} title={changes.lastVerifiedAt ? `Changes since the last verification (${changes.lastVerifiedAt.slice(0, 10)})` : "Changes since the entry was created (never verified)"} />

      <section aria-labelledby="review-findings" className="space-y-2">
        <h2 id="review-findings" className="text-sm font-semibold">Findings and your verdicts</h2>
        <p className="text-xs text-ink-soft">A verdict stays with a finding through every recheck as long as the finding itself is unchanged.</p>
        <FindingList
          findings={paper.findings.map((finding) => ({ ...finding, title: `${finding.title}${finding.comparisonId ? ` — ${comparisonLabel.get(finding.comparisonId) ?? ""}` : ""}` }))}
          empty={<p className="text-sm text-ink-soft">The recheck found nothing in this entry.</p>}
          renderExtra={(finding) => <DispositionForm paperId={paper.id} flagId={Number(finding.id)} current={finding.disposition ?? null} />}
        />
      </section>

      {paper.state === "submitted" ? (
        <section aria-labelledby="decision" className="grid gap-6 border-t border-rule pt-4 md:grid-cols-2">
          <h2 id="decision" className="sr-only">Decision</h2>
          <div className="space-y-2">
            <h3 className="text-sm font-semibold">Verify</h3>
            {ownEntry ? (
              <Notice tone="info">You coded this entry yourself, so another curator has to verify it (four-eyes rule). You can still return it.</Notice>
            ) : (
              <>
                <p className="text-sm text-ink-soft">You checked the coding against the paper; the entry joins the public corpus.</p>
                <VerifyForm paperId={paper.id} />
              </>
            )}
          </div>
          <div className="space-y-2">
            <h3 className="text-sm font-semibold">Return</h3>
            <ReturnForm paperId={paper.id} />
          </div>
        </section>
      ) : paper.state === "verified" ? (
        <section aria-labelledby="correction" className="space-y-3 border-t border-rule pt-4">
          <Notice tone="success" title="Verified">
            <span data-testid="review-outcome">{`Verified by ${paper.verifierName ?? "a curator"} on ${paper.verifiedAt?.slice(0, 10) ?? ""}; the entry is public.`}</span>
          </Notice>
          <div className="max-w-xl space-y-2">
            <h2 id="correction" className="text-sm font-semibold">Return for a correction</h2>
            <p className="text-sm text-ink-soft">
              When a correction (see <Link href="/review/corrections">Corrections</Link>) or your own reading shows the coding is wrong, return the entry to its contributor. It leaves the public corpus until a curator verifies it again.
            </p>
            <ReturnForm paperId={paper.id} button="Return for a correction" hint="Say what the correction is and where in the paper. The contributor is e-mailed this comment; the entry is hidden from the public until it is verified again." />
          </div>
        </section>
      ) : (
        <Notice tone="info" title={paper.state === "returned" ? "Returned to the contributor" : "Not submitted"}>
          <span data-testid="review-outcome">
            {paper.state === "returned" ? "The contributor has the comment and can fix and resubmit the entry." : "This entry is a draft; only submitted entries can be verified or returned."}
          </span>
        </Notice>
      )}
    </div>
  );
}
