import type { Metadata } from "next";
import Link from "next/link";
import { IMPORT_FILES } from "@/lib/import/files";
import { UploadForm } from "./upload-form";

export const metadata: Metadata = { title: "Import a sheet" };
export const dynamic = "force-dynamic";

export default function ImportPage() {
  return (
    <div className="space-y-5">
      <header>
        <h1 className="text-xl font-semibold tracking-tight">Import a comparison sheet</h1>
        <p className="text-ink-soft">
          Bring a whole coding sheet in at once: one row per reported comparison, figures typed as printed. Rows land as drafts of
          yours; importing the same sheet again changes only what differs.
        </p>
      </header>
      <section aria-labelledby="files-heading" className="space-y-1">
        <h2 id="files-heading" className="font-medium">Start from the template</h2>
        <ul className="list-disc pl-5 text-sm">
          {IMPORT_FILES.map((file) => (
            <li key={file.name}>
              <a href={`/api/imports/files/${file.name}`} download>
                {file.label}
              </a>
            </li>
          ))}
        </ul>
      </section>
      <UploadForm />
      <section aria-labelledby="more-heading" className="space-y-1 text-sm">
        <h2 id="more-heading" className="font-medium">Your imports and entries</h2>
        <p>
          <Link href="/workbench/import/history">Import history</Link> — every upload with its outcome.
        </p>
        <p>
          Download your own entries (drafts included): <a href="/api/imports/own-entries?format=csv">sheet (CSV)</a> ·{" "}
          <a href="/api/imports/own-entries?format=json">JSON</a> · <a href="/api/imports/own-entries?format=bibtex">BibTeX</a> ·{" "}
          <a href="/api/imports/own-entries?format=ris">RIS</a>
        </p>
      </section>
    </div>
  );
}
