"use client";

import { useActionState, useState, type ChangeEvent } from "react";
import Link from "next/link";
import { Button, SubmitButton } from "@/components/ui/button";
import { ActionMessage, Notice } from "@/components/ui/notice";
import { IDLE_STATE } from "@/lib/auth/action-state";
import type { PaperMetadata } from "@/lib/citations/csl";
import { DOI_HINT, normaliseDoi } from "@/lib/doi/normalise";
import { newPaperSchema, pathFieldErrors } from "@/lib/validation/curation";
import { createPaperFromForm } from "../actions";

// A new paper: look its DOI up (the registry fills the metadata), paste or upload BibTeX/RIS, or type it.
// Whatever the registry says, the metadata stays editable and saving never waits for it.

type Source = "doi" | "citation" | "hand";
type Lookup =
  | { kind: "idle" }
  | { kind: "busy" }
  | { kind: "found"; message: string }
  | { kind: "existing"; href: string | null; title: string | null }
  | { kind: "failed"; message: string };

const EMPTY: PaperMetadata & { ref: string; field: string } = { doi: "", title: "", authors: "", journal: "", year: "", volume: "", issue: "", pages: "", ref: "", field: "" };
const CONTROL = "w-full rounded border bg-paper-raised px-2.5 py-1.5 text-sm focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-ledger";

const LABELS: Record<keyof typeof EMPTY, string> = { doi: "DOI", title: "Title", authors: "Authors, one a line (Family, Given)", journal: "Journal", year: "Year", volume: "Volume", issue: "Issue", pages: "Pages", ref: "Reference (only without DOI)", field: "Field (discipline)" };

export function NewPaperForm() {
  const [state, action] = useActionState(createPaperFromForm, IDLE_STATE);
  const [source, setSource] = useState<Source>("doi");
  const [metadata, setMetadata] = useState(EMPTY);
  const [csl, setCsl] = useState("");
  const [doiQuery, setDoiQuery] = useState("");
  const [doiError, setDoiError] = useState<string | null>(null);
  const [lookup, setLookup] = useState<Lookup>({ kind: "idle" });
  const [citationText, setCitationText] = useState("");
  const [citationError, setCitationError] = useState<string | null>(null);
  const [records, setRecords] = useState<{ metadata: PaperMetadata; csl: Record<string, unknown> }[]>([]);
  // the server's schema, run here first so a slip is shown next to its field before the form is sent
  const [clientErrors, setClientErrors] = useState<Record<string, string[]>>({});
  const errorsFor = (field: string) => clientErrors[field] ?? state.fieldErrors[field];

  const fill = (next: PaperMetadata, record: Record<string, unknown> | null) => {
    setMetadata((current) => ({ ...current, ...next }));
    setCsl(record ? JSON.stringify(record) : "");
  };

  async function lookUp() {
    setDoiError(null);
    const doi = normaliseDoi(doiQuery);
    if (!doi) {
      setDoiError(`This is not a DOI. ${DOI_HINT}`);
      return;
    }
    setLookup({ kind: "busy" });
    try {
      const response = await fetch(`/api/doi?doi=${encodeURIComponent(doi)}`);
      const body = await response.json();
      if (!response.ok) {
        setLookup({ kind: "failed", message: body.error?.message ?? "The lookup failed; type the metadata below." });
        return;
      }
      if (body.existing) {
        setLookup({ kind: "existing", href: body.existing.href, title: body.existing.title });
        return;
      }
      if (!body.found) {
        setMetadata((current) => ({ ...current, doi }));
        setLookup({ kind: "failed", message: `${body.message} Type the metadata below; you can save without the registry.` });
        return;
      }
      fill(body.metadata, body.csl);
      setLookup({ kind: "found", message: "Found. Check the metadata below, then create the paper." });
    } catch {
      setMetadata((current) => ({ ...current, doi }));
      setLookup({ kind: "failed", message: "The lookup could not reach the server. Type the metadata below." });
    }
  }

  async function readCitation() {
    setCitationError(null);
    setRecords([]);
    const response = await fetch("/api/curation/citations", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ text: citationText, format: "auto" }) });
    const body = await response.json();
    if (!response.ok) {
      setCitationError(body.error?.fields?.text?.[0] ?? body.error?.message ?? "The record could not be read.");
      return;
    }
    setRecords(body.records);
    if (body.records.length >= 1) fill(body.records[0].metadata, body.records[0].csl);
  }

  function onFile(event: ChangeEvent<HTMLInputElement>) {
    const file = event.target.files?.[0];
    if (!file) return;
    if (file.size > 200_000) {
      setCitationError("That file is larger than 200 KB; paste the one record instead.");
      return;
    }
    void file.text().then(setCitationText);
  }

  const tab = (value: Source, label: string) => (
    <button type="button" role="tab" aria-selected={source === value} aria-controls={`source-${value}`} id={`tab-${value}`} onClick={() => setSource(value)} className={`rounded-t border border-b-0 px-3 py-1 text-sm ${source === value ? "border-rule-strong bg-paper-raised font-medium" : "border-transparent text-ink-soft hover:text-ink"}`}>
      {label}
    </button>
  );

  return (
    <div className="max-w-3xl space-y-4">
      <div role="tablist" aria-label="Where the metadata comes from" className="flex gap-1 border-b border-rule-strong">
        {tab("doi", "By DOI")}
        {tab("citation", "BibTeX or RIS")}
        {tab("hand", "By hand")}
      </div>

      {source === "doi" ? (
        <div role="tabpanel" id="source-doi" aria-labelledby="tab-doi" className="space-y-2">
          <label htmlFor="doi-query" className="block text-xs font-medium">
            DOI
          </label>
          <div className="flex gap-2">
            <input id="doi-query" value={doiQuery} onChange={(event) => setDoiQuery(event.target.value)} onKeyDown={(event) => event.key === "Enter" && (event.preventDefault(), void lookUp())} aria-invalid={doiError ? true : undefined} aria-describedby={doiError ? "doi-query-error" : "doi-query-hint"} placeholder="10.5555/…" className={`${CONTROL} ${doiError ? "border-finding-error" : "border-rule-strong"}`} />
            <Button onClick={() => void lookUp()} disabled={lookup.kind === "busy"}>
              {lookup.kind === "busy" ? "Looking up…" : "Look up"}
            </Button>
          </div>
          <p id="doi-query-hint" className="text-xs text-ink-soft">
            {DOI_HINT}
          </p>
          {doiError ? (
            <p id="doi-query-error" className="text-xs text-finding-error">
              {doiError}
            </p>
          ) : null}
          {lookup.kind === "found" ? <Notice tone="success">{lookup.message}</Notice> : null}
          {lookup.kind === "failed" ? <Notice tone="error">{lookup.message}</Notice> : null}
          {lookup.kind === "existing" ? (
            <Notice tone="info" title="This paper is already in the corpus">
              {lookup.href ? (
                <Link href={lookup.href} className="underline">
                  Open “{lookup.title}”
                </Link>
              ) : (
                "Another contributor is coding it; a curator can tell you more."
              )}
            </Notice>
          ) : null}
        </div>
      ) : null}

      {source === "citation" ? (
        <div role="tabpanel" id="source-citation" aria-labelledby="tab-citation" className="space-y-2">
          <label htmlFor="citation-text" className="block text-xs font-medium">
            Paste a BibTeX entry or a RIS record
          </label>
          <textarea id="citation-text" rows={8} value={citationText} onChange={(event) => setCitationText(event.target.value)} aria-invalid={citationError ? true : undefined} aria-describedby={citationError ? "citation-text-error" : undefined} className={`${CONTROL} font-mono text-xs ${citationError ? "border-finding-error" : "border-rule-strong"}`} />
          {citationError ? (
            <p id="citation-text-error" className="text-xs text-finding-error">
              {citationError}
            </p>
          ) : null}
          <div className="flex flex-wrap items-center gap-3">
            <label className="text-xs">
              <span className="mr-1">or upload a .bib / .ris file</span>
              <input type="file" accept=".bib,.ris,.txt,text/plain" onChange={onFile} className="text-xs" />
            </label>
            <Button onClick={() => void readCitation()} disabled={citationText.trim() === ""}>
              Read the record
            </Button>
          </div>
          {records.length > 1 ? (
            <div className="space-y-1">
              <p className="text-xs text-ink-soft">{records.length} records were read; choose the paper to create:</p>
              <ul className="space-y-1 text-sm">
                {records.map((record, index) => (
                  <li key={index}>
                    <button type="button" className="text-left underline" onClick={() => fill(record.metadata, record.csl)}>
                      {record.metadata.title} ({record.metadata.year || "no year"})
                    </button>
                  </li>
                ))}
              </ul>
            </div>
          ) : null}
        </div>
      ) : null}

      <form
        action={action}
        className="space-y-3"
        aria-label="Paper metadata"
        onSubmit={(event) => {
          const parsed = newPaperSchema.safeParse({ ...metadata, csl });
          const problems = parsed.success ? {} : pathFieldErrors(parsed.error);
          setClientErrors(problems);
          if (!parsed.success) event.preventDefault();
        }}
      >
        <input type="hidden" name="csl" value={csl} />
        <div className="grid grid-cols-2 gap-3">
          {(Object.keys(EMPTY) as (keyof typeof EMPTY)[]).map((field) => {
            const id = `paper-${field}`;
            const problem = errorsFor(field);
            const value = metadata[field];
            const common = {
              id,
              name: field,
              value,
              onChange: (event: ChangeEvent<HTMLInputElement | HTMLTextAreaElement>) => {
                setMetadata((current) => ({ ...current, [field]: event.target.value }));
                setClientErrors((current) => Object.fromEntries(Object.entries(current).filter(([name]) => name !== field)));
              },
              "aria-invalid": problem ? true : undefined,
              "aria-describedby": problem ? `${id}-error` : undefined,
              className: `${CONTROL} ${problem ? "border-finding-error" : "border-rule-strong"}`,
            };
            return (
              <div key={field} className={field === "title" || field === "authors" || field === "journal" ? "col-span-2" : ""}>
                <label htmlFor={id} className="block text-xs font-medium">
                  {LABELS[field]}
                  {field === "title" ? null : <span className="font-normal text-ink-faint"> (optional)</span>}
                </label>
                {field === "authors" ? <textarea rows={4} {...common} /> : <input {...common} required={field === "title"} />}
                {problem ? (
                  <p id={`${id}-error`} className="text-xs text-finding-error">
                    {problem.join(" ")}
                  </p>
                ) : null}
              </div>
            );
          })}
        </div>
        <ActionMessage state={state} />
        <SubmitButton pendingLabel="Creating…">Create the paper and start coding</SubmitButton>
      </form>
    </div>
  );
}
