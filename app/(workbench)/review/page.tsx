import type { Metadata } from "next";
import Link from "next/link";
import { Notice } from "@/components/ui/notice";
import { Pager } from "@/components/ui/pager";
import { requireRole } from "@/lib/auth/current-user";
import { countOpenCorrections } from "@/lib/db/queries/corrections";
import { listReviewQueue, type QueueFilters } from "@/lib/db/queries/review";

export const metadata: Metadata = { title: "Review queue" };
export const dynamic = "force-dynamic";

const PAGE_SIZE = 25;

export default async function ReviewQueuePage({ searchParams }: { searchParams: Promise<{ q?: string; field?: string; coder?: string; page?: string }> }) {
  const { user, allowed } = await requireRole("curator", "/review");
  if (!allowed) {
    return (
      <Notice tone="error" title="The review queue is for curators">
        Curators verify or return the entries contributors submit. Ask an admin if you should be one.
      </Notice>
    );
  }
  const query = await searchParams;
  const filters: QueueFilters = {
    q: query.q?.trim().slice(0, 200) || undefined,
    field: query.field?.trim().slice(0, 100) || undefined,
    coder: query.coder === "others" ? "others" : "all",
  };
  const requested = Number(query.page ?? "1");
  const page = Number.isInteger(requested) && requested > 0 ? requested : 1;
  const [queue, openCorrections] = await Promise.all([listReviewQueue({ filters, viewerId: user.id, page, pageSize: PAGE_SIZE }), countOpenCorrections()]);
  const hrefFor = (next: number) => `/review?${new URLSearchParams({ ...(filters.q ? { q: filters.q } : {}), ...(filters.field ? { field: filters.field } : {}), ...(filters.coder === "others" ? { coder: "others" } : {}), page: String(next) })}`;

  return (
    <div className="space-y-4">
      <header>
        <h1 className="text-xl font-semibold tracking-tight">Review queue</h1>
        <p className="text-ink-soft">Submitted entries, the longest-waiting first. Open one to see what changed, record a verdict on each finding, and verify or return it.</p>
        <p className="text-xs">
          <Link href="/review/corrections">Corrections sent from paper pages: {openCorrections} open</Link>
        </p>
      </header>
      <form method="get" className="flex flex-wrap items-end gap-3" role="search" aria-label="Filter the queue">
        <div>
          <label htmlFor="queue-q" className="block text-xs font-medium">Title, DOI or journal</label>
          <input id="queue-q" name="q" defaultValue={filters.q} maxLength={200} className="rounded border border-rule-strong bg-paper-raised px-2 py-1 text-sm" />
        </div>
        <div>
          <label htmlFor="queue-field" className="block text-xs font-medium">Field</label>
          <select id="queue-field" name="field" defaultValue={filters.field ?? ""} className="rounded border border-rule-strong bg-paper-raised px-2 py-1 text-sm">
            <option value="">all fields</option>
            {queue.fields.map((field) => (
              <option key={field} value={field}>{field}</option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="queue-coder" className="block text-xs font-medium">Coded by</label>
          <select id="queue-coder" name="coder" defaultValue={filters.coder} className="rounded border border-rule-strong bg-paper-raised px-2 py-1 text-sm">
            <option value="all">anyone</option>
            <option value="others">someone else (I may verify)</option>
          </select>
        </div>
        <button type="submit" className="rounded border border-rule-strong bg-paper-raised px-3 py-1 text-sm font-medium hover:bg-paper-sunk">Filter</button>
      </form>
      {queue.total === 0 ? (
        <p className="rounded border border-dashed border-rule-strong bg-paper-raised px-4 py-6 text-ink-soft">No submitted entries match. The queue is clear.</p>
      ) : (
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">Submitted entries, oldest submission first</caption>
          <thead className="border-b border-rule-strong text-xs uppercase tracking-wide text-ink-faint">
            <tr>
              <th scope="col" className="py-1.5 pr-3 font-medium">Paper</th>
              <th scope="col" className="py-1.5 pr-3 font-medium">Coded by</th>
              <th scope="col" className="py-1.5 pr-3 font-medium">Submitted</th>
              <th scope="col" className="py-1.5 pr-3 text-right font-medium">Comparisons</th>
              <th scope="col" className="py-1.5 text-right font-medium">Errors / warnings</th>
            </tr>
          </thead>
          <tbody>
            {queue.rows.map((row) => (
              <tr key={row.id} className="border-b border-rule align-top">
                <td className="py-2 pr-3">
                  <Link href={`/review/${row.id}`} className="font-medium">{row.title}</Link>
                  <span className="block text-xs text-ink-soft">{[row.journal, row.year, row.field, row.doi ? `doi:${row.doi}` : row.ref].filter(Boolean).join(" · ")}</span>
                </td>
                <td className="py-2 pr-3">
                  {row.coderName ?? "—"}
                  {row.createdBy === user.id ? <span className="block text-xs text-ink-faint">you (another curator verifies)</span> : null}
                </td>
                <td className="figures py-2 pr-3 whitespace-nowrap">{row.submittedAt?.slice(0, 10) ?? "—"}</td>
                <td className="figures py-2 pr-3 text-right">{row.comparisons}</td>
                <td className="figures py-2 text-right">{row.errors} / {row.warnings}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <Pager page={page} pageSize={PAGE_SIZE} total={queue.total} hrefFor={hrefFor} label="Queue pages" />
    </div>
  );
}
