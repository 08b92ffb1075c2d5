import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { Notice } from "@/components/ui/notice";
import { getCurrentUser } from "@/lib/auth/current-user";
import { canEditCoding, canRead, isOwner } from "@/lib/curation/rules";
import { readCodingDocument, readEntryHeader } from "@/lib/db/queries/workbench";
import { CodingEditor } from "./coding-editor";

export const metadata: Metadata = { title: "Code a paper" };
export const dynamic = "force-dynamic";

const STATE_WORDS = { draft: "Draft — only you and curators see it", submitted: "Submitted — waiting for a curator", returned: "Returned — a curator asks for changes", verified: "Verified — public in the corpus" } as const;

export default async function CodePaperPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ existing?: string }> }) {
  const [{ id }, query] = await Promise.all([params, searchParams]);
  const user = await getCurrentUser();
  if (!user || !/^\d+$/.test(id)) notFound();
  const paperId = Number(id);
  const header = await readEntryHeader({ paperId });
  if (!header || !canRead(header, user)) notFound();
  const document = (await readCodingDocument({ paperId }))!;
  const editable = canEditCoding(header, user);
  const maySubmit = (header.state === "draft" || header.state === "returned") && (isOwner(header, user) || user.role === "curator" || user.role === "admin");

  return (
    <div className="space-y-4">
      <header className="space-y-1">
        <p className="text-xs text-ink-faint">
          <Link href="/workbench" className="underline">
            Workbench
          </Link>{" "}
          · entry {header.id} · version {header.version}
        </p>
        <h1 className="text-xl font-semibold tracking-tight">{header.title}</h1>
        <p className="text-sm text-ink-soft">
          <span data-testid="entry-state">{STATE_WORDS[header.state]}</span>. Coded by {header.coderName ?? "—"}.{" "}
          <Link href={`/papers/${header.id}`} className="underline">
            Paper page and history
          </Link>
        </p>
      </header>
      {query.existing ? (
        <Notice tone="info" title="This paper is already in the corpus">
          Its DOI matched an existing entry, so no duplicate was made; this is that entry.
        </Notice>
      ) : null}
      {header.state === "returned" && header.curatorComment ? (
        <Notice tone="error" title="Returned by a curator">
          <p className="whitespace-pre-line" data-testid="curator-comment">
            {header.curatorComment}
          </p>
          <p className="mt-1 text-xs">Fix what the comment asks for, save, and submit again.</p>
        </Notice>
      ) : null}
      {!editable ? (
        <Notice tone="info">
          {header.state === "submitted" ? "The entry is with the curators; it cannot be changed until it is verified or returned." : header.state === "verified" ? "The entry is verified; its coding is shown read-only." : "You can read this entry but not change it."}
        </Notice>
      ) : null}
      <CodingEditor paperId={header.id} initial={document} editable={editable} submitLabel={maySubmit ? (header.state === "returned" ? "Submit again for verification" : "Submit for verification") : undefined} />
    </div>
  );
}
