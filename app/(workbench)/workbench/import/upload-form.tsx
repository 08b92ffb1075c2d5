"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { MAX_UPLOAD_BYTES } from "@/lib/validation/import";

/** Sends the chosen file as the raw request body (the server checks the same limit before reading it). */
export function UploadForm() {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setError(null);
    const file = (new FormData(event.currentTarget).get("sheet") as File | null) ?? null;
    if (!file || file.size === 0) {
      setError(file ? "The file is empty: there is nothing to import." : "Choose a CSV file first.");
      return;
    }
    if (!/\.csv$/i.test(file.name)) {
      setError("Only comparison sheets in CSV format can be imported (the file name must end in .csv).");
      return;
    }
    if (file.size > MAX_UPLOAD_BYTES) {
      setError(`The file is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MB. Split the sheet into several files.`);
      return;
    }
    setBusy(true);
    try {
      const response = await fetch(`/api/imports?name=${encodeURIComponent(file.name)}`, { method: "POST", headers: { "Content-Type": "text/csv" }, body: file });
      const body = (await response.json().catch(() => null)) as { id?: number; error?: { message: string } } | null;
      if (!response.ok || !body?.id) {
        setError(body?.error?.message ?? "The upload failed. Try again.");
        setBusy(false);
        return;
      }
      router.push(`/workbench/import/${body.id}`);
    } catch {
      setError("The upload was interrupted. Check the connection and try again.");
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="space-y-3 rounded border border-rule bg-paper-raised p-4" aria-describedby={error ? "upload-error" : undefined}>
      <div>
        <label htmlFor="sheet" className="block font-medium">
          Comparison sheet (CSV, UTF-8, at most 50 MB)
        </label>
        <input id="sheet" name="sheet" type="file" accept=".csv,text/csv" className="mt-1 block text-sm" />
      </div>
      <p className="text-xs text-ink-soft">Nothing is stored yet: the dry run shows what the sheet would add or change, and you commit afterwards.</p>
      <Button type="submit" disabled={busy}>
        {busy ? "Uploading…" : "Upload for a dry run"}
      </Button>
      {error ? (
        <div id="upload-error">
          <Notice tone="error">{error}</Notice>
        </div>
      ) : null}
    </form>
  );
}
