import type { Metadata } from "next";
import Link from "next/link";
import { Pager } from "@/components/ui/pager";
import { getCurrentUser } from "@/lib/auth/current-user";
import { listPapersCodedBy } from "@/lib/db/queries/users";
import type { EntryState } from "@/models/paper";

export const metadata: Metadata = { title: "Workbench" };
export const dynamic = "force-dynamic";

const PAGE_SIZE = 25;

const STATES: Record<EntryState, { label: string; className: string; explain: string }> = {
  draft: { label: "Draft", className: "border-rule-strong text-ink-soft", explain: "only you can see it" },
  submitted: { label: "Submitted", className: "border-ledger text-ledger-deep", explain: "waiting for a curator" },
  returned: { label: "Returned", className: "border-finding-warning bg-finding-warning-tint text-finding-warning", explain: "a curator asks for changes" },
  verified: { label: "Verified", className: "border-ledger bg-ledger-tint text-ledger-deep", explain: "public in the corpus" },
};

export default async function WorkbenchPage({ searchParams }: { searchParams: Promise<{ page?: string }> }) {
  const user = await getCurrentUser();
  if (!user) return null; // the layout has already sent anyone signed out to /signin
  const requested = Number((await searchParams).page ?? "1");
  const page = Number.isInteger(requested) && requested > 0 ? requested : 1;
  const papers = await listPapersCodedBy({ userId: user.id, page, pageSize: PAGE_SIZE });
  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-xl font-semibold tracking-tight">Your workbench</h1>
          <p className="text-ink-soft">Signed in as {user.name}. The papers you code, and where each entry stands.</p>
        </div>
        <Link href="/workbench/new" className="inline-flex items-center rounded border border-ledger bg-ledger px-3 py-1.5 text-sm font-medium text-paper-raised hover:bg-ledger-deep hover:no-underline">
          New paper
        </Link>
      </header>
      {papers.total === 0 ? (
        <div className="rounded border border-dashed border-rule-strong bg-paper-raised px-4 py-6">
          <p className="font-medium">You have not coded a paper yet.</p>
          <p className="mt-1 text-ink-soft">
            A paper&apos;s entry starts as a draft that only you see. When you submit it, a curator checks it against the
            paper and either verifies it — it then joins the public corpus — or returns it with a comment.
          </p>
        </div>
      ) : (
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">Your papers, most recently changed first</caption>
          <thead className="border-b border-rule-strong text-xs uppercase tracking-wide text-ink-faint">
            <tr>
              <th scope="col" className="py-1.5 pr-3 font-medium">Paper</th>
              <th scope="col" className="py-1.5 pr-3 font-medium">Entry</th>
              <th scope="col" className="py-1.5 font-medium">Changed</th>
            </tr>
          </thead>
          <tbody>
            {papers.rows.map((paper) => {
              const state = STATES[paper.state] ?? STATES.draft;
              return (
                <tr key={paper.id} className="border-b border-rule align-top">
                  <td className="py-2 pr-3">
                    <Link href={`/workbench/papers/${paper.id}`} className="block font-medium">
                      {paper.title}
                    </Link>
                    <span className="block text-xs text-ink-soft">
                      {[paper.journal, paper.year, paper.doi ? `doi:${paper.doi}` : paper.ref].filter(Boolean).join(" · ")}
                    </span>
                    {paper.state === "returned" && paper.curatorComment ? (
                      <p className="mt-1 border-l-2 border-finding-warning pl-2 text-xs whitespace-pre-line text-ink-soft">{paper.curatorComment}</p>
                    ) : null}
                  </td>
                  <td className="py-2 pr-3">
                    <span className={`inline-block rounded border px-1.5 text-xs font-medium ${state.className}`}>{state.label}</span>
                    <span className="block text-xs text-ink-faint">{state.explain}</span>
                  </td>
                  <td className="figures py-2 whitespace-nowrap">{paper.updatedAt.toISOString().slice(0, 10)}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
      <Pager page={page} pageSize={PAGE_SIZE} total={papers.total} hrefFor={(next) => `/workbench?page=${next}`} label="Workbench pages" />
    </div>
  );
}
