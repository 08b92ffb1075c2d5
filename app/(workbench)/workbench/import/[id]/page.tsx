import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { SeverityBadge } from "@/components/severity-badge";
import { Notice } from "@/components/ui/notice";
import { Pager } from "@/components/ui/pager";
import { getCurrentUser } from "@/lib/auth/current-user";
import { listPreviewRows, readBatch, type BatchView, type PreviewRow } from "@/lib/db/queries/imports";
import { PREVIEW_ACCEPTED_ROWS } from "@/lib/import/batches";
import type { Severity } from "@/lib/recheck/types";
import { AutoRefresh, PostButton } from "../batch-controls";

export const metadata: Metadata = { title: "Import" };
export const dynamic = "force-dynamic";

const PAGE_SIZE = 50;

const STATUS_TEXT: Record<BatchView["status"], string> = {
  validating: "Dry run in progress",
  previewed: "Dry run done — nothing stored yet",
  committing: "Storing the accepted rows",
  committed: "Committed",
  failed: "Not imported",
};

function Progress({ batch }: { batch: BatchView }) {
  const live = batch.live;
  if (!live) return null;
  return (
    <p role="status" className="text-sm">
      Rows read: <span className="figures">{live.read}</span> · validated: <span className="figures">{live.validated}</span>
      {batch.status === "committing" ? (
        <>
          {" "}
          · stored: <span className="figures">{live.stored}</span>
        </>
      ) : null}
    </p>
  );
}

function Counts({ batch }: { batch: BatchView }) {
  const items: [string, number][] = [
    ["new", batch.counts.new],
    ["updated", batch.counts.updated],
    ["unchanged", batch.counts.unchanged],
    ["rejected", batch.counts.rejected],
  ];
  return (
    <dl className="grid grid-cols-4 gap-2 text-center" aria-label="Row counts">
      {items.map(([label, count]) => (
        <div key={label} className="rounded border border-rule bg-paper-raised px-2 py-2" data-count={label}>
          <dt className="text-xs uppercase tracking-wide text-ink-faint">{label}</dt>
          <dd className="figures text-lg font-semibold">{count}</dd>
        </div>
      ))}
    </dl>
  );
}

function RejectedTable({ rows }: { rows: PreviewRow[] }) {
  return (
    <table className="w-full border-collapse text-left text-sm" aria-label="Rejected rows">
      <thead className="border-b border-rule-strong text-xs uppercase tracking-wide text-ink-faint">
        <tr>
          <th scope="col" className="py-1 pr-3 font-medium">Row</th>
          <th scope="col" className="py-1 pr-3 font-medium">Column</th>
          <th scope="col" className="py-1 font-medium">Problem</th>
        </tr>
      </thead>
      <tbody>
        {rows.flatMap((row) =>
          (row.details.errors ?? []).map((error, index) => (
            <tr key={`${row.row}-${index}`} className="border-b border-rule align-top" data-rejected-row={row.row}>
              <td className="figures py-1 pr-3">{row.row}</td>
              <td className="py-1 pr-3 font-mono text-xs">{error.column ?? "—"}</td>
              <td className="py-1">{error.message}</td>
            </tr>
          )),
        )}
      </tbody>
    </table>
  );
}

function AcceptedTable({ rows }: { rows: PreviewRow[] }) {
  return (
    <table className="w-full border-collapse text-left text-sm" aria-label="Accepted rows">
      <thead className="border-b border-rule-strong text-xs uppercase tracking-wide text-ink-faint">
        <tr>
          <th scope="col" className="py-1 pr-3 font-medium">Row</th>
          <th scope="col" className="py-1 pr-3 font-medium">Entry</th>
          <th scope="col" className="py-1 pr-3 font-medium">Outcome</th>
          <th scope="col" className="py-1 font-medium">Findings it would get</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((row) => (
          <tr key={row.row} className="border-b border-rule align-top">
            <td className="figures py-1 pr-3">{row.row}</td>
            <td className="py-1 pr-3">
              <span className="block">{row.comparison}</span>
              <span className="block text-xs text-ink-soft">
                {row.paper} · {row.sample}
              </span>
            </td>
            <td className="py-1 pr-3">{row.outcome}</td>
            <td className="py-1">
              {(row.details.findings ?? []).length === 0 ? <span className="text-ink-faint">none</span> : null}
              <ul className="space-y-0.5">
                {(row.details.findings ?? []).map((finding, index) => (
                  <li key={index}>
                    <SeverityBadge severity={finding.severity as Severity} /> <span className="font-mono text-xs">{finding.code}</span> — {finding.message}
                  </li>
                ))}
                {(row.details.notes ?? []).map((note, index) => (
                  <li key={`n${index}`} className="text-xs text-ink-soft">
                    {note}
                  </li>
                ))}
              </ul>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export default async function ImportBatchPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ rejected?: string; accepted?: string }> }) {
  const user = await getCurrentUser();
  if (!user) return null;
  const batchId = Number((await params).id);
  if (!Number.isInteger(batchId) || batchId <= 0) notFound();
  const query = await searchParams;
  const pageOf = (text?: string) => (Number.isInteger(Number(text)) && Number(text) > 0 ? Number(text) : 1);
  const rejectedPage = pageOf(query.rejected);
  const acceptedPage = pageOf(query.accepted);
  const [batch, rejected, accepted] = await Promise.all([
    readBatch({ batchId, uploaderId: user.id }),
    listPreviewRows({ batchId, uploaderId: user.id, rejected: true, page: rejectedPage, pageSize: PAGE_SIZE }),
    listPreviewRows({ batchId, uploaderId: user.id, rejected: false, page: acceptedPage, pageSize: PAGE_SIZE }),
  ]);
  if (!batch) notFound();
  const running = (batch.status === "validating" || batch.status === "committing") && !batch.interrupted;
  const href = (key: "rejected" | "accepted", page: number) => `/workbench/import/${batch.id}?${new URLSearchParams({ rejected: String(key === "rejected" ? page : rejectedPage), accepted: String(key === "accepted" ? page : acceptedPage) })}`;
  const hasPreview = batch.status === "previewed" || batch.status === "committed" || (batch.status === "failed" && batch.totalRows > 0);

  return (
    <div className="space-y-5">
      <AutoRefresh active={running || batch.lookups.pending > 0} />
      <header>
        <p className="text-sm">
          <Link href="/workbench/import">Import</Link> · <Link href="/workbench/import/history">History</Link>
        </p>
        <h1 className="text-xl font-semibold tracking-tight">{batch.fileName}</h1>
        <p className="text-ink-soft" data-batch-status={batch.status}>
          {STATUS_TEXT[batch.status]}
          {batch.interrupted ? " — interrupted when the server restarted; upload the sheet again" : ""}
        </p>
      </header>
      <Progress batch={batch} />
      {batch.failure ? <Notice tone="error" title="Nothing of this sheet was stored">{batch.failure}</Notice> : null}
      {batch.status === "committed" ? (
        <Notice tone="success" title="Stored">
          {batch.acceptedRows} rows are now drafts of yours (new {batch.counts.new}, updated {batch.counts.updated}, unchanged {batch.counts.unchanged}). <Link href="/workbench">See them on your workbench</Link>.
        </Notice>
      ) : null}
      {hasPreview ? <Counts batch={batch} /> : null}
      {batch.status === "previewed" || (batch.status === "failed" && batch.acceptedRows > 0) ? (
        <div className="flex flex-wrap items-start gap-3">
          {batch.acceptedRows > 0 ? <PostButton url={`/api/imports/${batch.id}/commit`} label={`Commit ${batch.acceptedRows} accepted rows`} busyLabel="Starting…" /> : <p>No row was accepted: fix the rejected rows and upload them again.</p>}
        </div>
      ) : null}
      {batch.lookups.pending + batch.lookups.resolved + batch.lookups.failed > 0 ? (
        <section aria-labelledby="doi-heading" className="space-y-1">
          <h2 id="doi-heading" className="font-medium">DOI metadata</h2>
          <p className="text-sm" role="status">
            Resolved <span className="figures">{batch.lookups.resolved}</span> of <span className="figures">{batch.lookups.pending + batch.lookups.resolved + batch.lookups.failed}</span> new DOIs
            {batch.lookups.failed > 0 ? `; ${batch.lookups.failed} failed` : ""}. The entries are stored either way.
          </p>
          {batch.lookups.failures.length > 0 ? (
            <>
              <ul className="list-disc pl-5 text-sm">
                {batch.lookups.failures.map((failure) => (
                  <li key={failure.doi}>
                    <span className="font-mono text-xs">{failure.doi}</span>: {failure.message} ({failure.attempts} {failure.attempts === 1 ? "attempt" : "attempts"})
                  </li>
                ))}
              </ul>
              <PostButton url={`/api/imports/${batch.id}/doi-retry`} label="Retry the failed lookups" busyLabel="Queueing…" tone="secondary" />
            </>
          ) : null}
        </section>
      ) : null}
      {rejected.total > 0 ? (
        <section aria-labelledby="rejected-heading" className="space-y-2">
          <h2 id="rejected-heading" className="font-medium">
            Rejected rows ({batch.rejectedRows})
          </h2>
          <p className="text-sm">
            <a href={`/api/imports/${batch.id}/rejected`} download>
              Download the rejected rows
            </a>{" "}
            — a sheet with one more column, <code>error</code>. Fix the cells and upload that file as it is.
          </p>
          <RejectedTable rows={rejected.rows} />
          <Pager page={rejectedPage} pageSize={PAGE_SIZE} total={rejected.total} hrefFor={(page) => href("rejected", page)} label="Rejected rows pages" />
        </section>
      ) : null}
      {accepted.total > 0 ? (
        <section aria-labelledby="accepted-heading" className="space-y-2">
          <h2 id="accepted-heading" className="font-medium">Accepted rows</h2>
          {batch.acceptedRows > accepted.total ? (
            <p className="text-sm text-ink-soft">The first {PREVIEW_ACCEPTED_ROWS} of {batch.acceptedRows} accepted rows are listed; the counts cover every row.</p>
          ) : null}
          {batch.findingCounts.length > 0 ? (
            <p className="text-sm">
              Findings over all accepted rows: {batch.findingCounts.map((f) => `${f.code} × ${f.count}`).join(", ")}.
            </p>
          ) : null}
          <AcceptedTable rows={accepted.rows} />
          <Pager page={acceptedPage} pageSize={PAGE_SIZE} total={accepted.total} hrefFor={(page) => href("accepted", page)} label="Accepted rows pages" />
        </section>
      ) : null}
    </div>
  );
}
