import type { Metadata } from "next";
import Link from "next/link";
import { Notice } from "@/components/ui/notice";
import { Pager } from "@/components/ui/pager";
import { requireRole } from "@/lib/auth/current-user";
import { listCorrections } from "@/lib/db/queries/corrections";
import { CorrectionStatusForm } from "./status-form";

export const metadata: Metadata = { title: "Corrections" };
export const dynamic = "force-dynamic";

const PAGE_SIZE = 20;

/** Corrections sent from public paper pages (DESIGN §9), for curators to check against the paper. */
export default async function CorrectionsPage({ searchParams }: { searchParams: Promise<{ status?: string; page?: string }> }) {
  const { allowed } = await requireRole("curator", "/review/corrections");
  if (!allowed) {
    return (
      <Notice tone="error" title="Corrections are read by curators">
        Curators check each correction sent from a paper page against the paper.
      </Notice>
    );
  }
  const query = await searchParams;
  const status = query.status === "closed" ? "closed" : "open";
  const requested = Number(query.page ?? "1");
  const page = Number.isInteger(requested) && requested > 0 ? requested : 1;
  const { items, total } = await listCorrections({ status, page, pageSize: PAGE_SIZE });
  const tab = (value: "open" | "closed", label: string) => (
    <Link
      href={`/review/corrections?status=${value}`}
      aria-current={status === value ? "page" : undefined}
      className={`rounded-t border-b-2 px-3 py-1.5 hover:no-underline ${status === value ? "border-ledger font-medium text-ink" : "border-transparent text-ink-soft"}`}
    >
      {label}
    </Link>
  );

  return (
    <div className="space-y-4">
      <header className="space-y-1">
        <p className="text-xs text-ink-faint">
          <Link href="/review">Review queue</Link> ›
        </p>
        <h1 className="text-xl font-semibold tracking-tight">Corrections</h1>
        <p className="text-ink-soft">Sent by authors and readers from public paper pages. Check each against the paper, fix the entry if needed, then mark it as dealt with.</p>
      </header>
      <nav aria-label="Correction status" className="flex gap-1 border-b border-rule">
        {tab("open", "Open")}
        {tab("closed", "Dealt with")}
      </nav>
      <p className="figures text-xs text-ink-soft">{total === 1 ? "1 correction" : `${total} corrections`}</p>
      {items.length === 0 ? (
        <p className="rounded border border-rule bg-paper-raised p-4 text-ink-soft">{status === "open" ? "No open corrections." : "No correction has been dealt with yet."}</p>
      ) : (
        <ol className="space-y-3">
          {items.map((item) => (
            <li key={item.id} className="space-y-2 rounded border border-rule bg-paper-raised p-3">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <Link href={`/papers/${item.paperId}`} className="font-medium">
                  {item.paperTitle}
                </Link>
                <span className="text-xs text-ink-faint">{item.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC</span>
              </div>
              <p className="text-xs text-ink-soft">
                From {item.name} · <a href={`mailto:${item.email}`}>{item.email}</a> · <Link href={`/review/${item.paperId}`}>Open the entry in review</Link> (to return it to its contributor for the correction)
              </p>
              <p className="whitespace-pre-wrap">{item.message}</p>
              <CorrectionStatusForm correctionId={item.id} next={status === "open" ? "closed" : "open"} />
            </li>
          ))}
        </ol>
      )}
      <Pager page={page} pageSize={PAGE_SIZE} total={total} hrefFor={(next) => `/review/corrections?status=${status}&page=${next}`} label="Correction pages" />
    </div>
  );
}
