import type { Metadata } from "next";
import Link from "next/link";
import { Pager } from "@/components/ui/pager";
import { getCurrentUser } from "@/lib/auth/current-user";
import { listBatches } from "@/lib/db/queries/imports";

export const metadata: Metadata = { title: "Import history" };
export const dynamic = "force-dynamic";

const PAGE_SIZE = 25;
const OUTCOME: Record<string, string> = { validating: "dry run running", previewed: "previewed, not committed", committing: "committing", committed: "committed", failed: "not imported" };

export default async function ImportHistoryPage({ searchParams }: { searchParams: Promise<{ page?: string }> }) {
  const user = await getCurrentUser();
  if (!user) return null;
  const requested = Number((await searchParams).page ?? "1");
  const page = Number.isInteger(requested) && requested > 0 ? requested : 1;
  const batches = await listBatches({ uploaderId: user.id, page, pageSize: PAGE_SIZE });
  return (
    <div className="space-y-4">
      <header>
        <p className="text-sm">
          <Link href="/workbench/import">Import a sheet</Link>
        </p>
        <h1 className="text-xl font-semibold tracking-tight">Import history</h1>
      </header>
      {batches.total === 0 ? (
        <p className="text-ink-soft">You have not uploaded a sheet yet.</p>
      ) : (
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">Your uploads, newest first</caption>
          <thead className="border-b border-rule-strong text-xs uppercase tracking-wide text-ink-faint">
            <tr>
              <th scope="col" className="py-1 pr-3 font-medium">File</th>
              <th scope="col" className="py-1 pr-3 font-medium">Uploaded</th>
              <th scope="col" className="py-1 pr-3 font-medium">Outcome</th>
              <th scope="col" className="py-1 pr-3 text-right font-medium">Rows</th>
              <th scope="col" className="py-1 pr-3 text-right font-medium">Accepted</th>
              <th scope="col" className="py-1 text-right font-medium">Rejected</th>
            </tr>
          </thead>
          <tbody>
            {batches.rows.map((batch) => (
              <tr key={batch.id} className="border-b border-rule align-top">
                <td className="py-1 pr-3">
                  <Link href={`/workbench/import/${batch.id}`}>{batch.fileName}</Link>
                  {batch.failure ? <span className="block text-xs text-finding-error">{batch.failure}</span> : null}
                </td>
                <td className="figures py-1 pr-3 whitespace-nowrap">{batch.createdAt.toISOString().slice(0, 16).replace("T", " ")}</td>
                <td className="py-1 pr-3">{OUTCOME[batch.status] ?? batch.status}</td>
                <td className="figures py-1 pr-3 text-right">{batch.totalRows}</td>
                <td className="figures py-1 pr-3 text-right">{batch.acceptedRows}</td>
                <td className="figures py-1 text-right">{batch.rejectedRows}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <Pager page={page} pageSize={PAGE_SIZE} total={batches.total} hrefFor={(next) => `/workbench/import/history?page=${next}`} label="History pages" />
    </div>
  );
}
