"use client";

import { useDeferredValue, useMemo, useState } from "react";
import { useRouter } from "next/navigation";
import { LiveFindingsPanel } from "@/components/live-findings";
import { ModelGrid, type ModelGridRow } from "@/components/model-grid";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { SubmitEntryForm } from "./submit-form";
import { liveRecheck } from "@/lib/curation/live";
import { COMPARISON_FIGURES, MODEL_FIGURES, type ComparisonFigure, type ModelFigure } from "@/models/figures";
import { INVARIANCE_CLAIMS, METHODS, NESTED_VALUES } from "@/lib/recheck/types";
import { codingDocumentSchema, pathFieldErrors, type CodingDocument } from "@/lib/validation/curation";

// The entry form of one paper: metadata, samples, the model grid and the comparisons, with the live
// recheck beside it. The whole coding is saved at once with the version it was loaded at; a conflict
// keeps everything typed in the form.

type Doc = CodingDocument;
type ComparisonRowState = Doc["comparisons"][number];

const CONTROL = "w-full rounded-sm border bg-paper-raised px-1.5 py-1 text-sm focus-visible:outline-2 focus-visible:outline-ledger";
const ALWAYS_SHOWN = /\.(n|groups|groupNs|alpha|doi|year|key|restrictedKey|freeKey|sampleKey|dChisq|dDf|dP|dCfi|dRmsea|dAic|dBic|chisq|df|p|chisqScaled|scaling|cfi|tli|rmsea|rmseaLo|rmseaHi|srmr|aic|bic|loglik|loglikScaling|npar|nObserved|nFixedX|baselineChisq|baselineDf)$/;

let counter = 0;
const newKey = (prefix: string) => `new-${prefix}${Date.now().toString(36)}${(counter += 1)}`;

const emptyModel = (sampleKey: string): Doc["models"][number] => ({ key: newKey("m"), sampleKey, label: "", estimator: "", meanStructure: "", ...(Object.fromEntries(MODEL_FIGURES.map((figure) => [figure, ""])) as Record<ModelFigure, string>) }) as Doc["models"][number];

const emptyComparison = (): ComparisonRowState => ({
  key: newKey("c"),
  label: "",
  restrictedKey: "",
  freeKey: "",
  method: "lrt",
  nested: "yes",
  alpha: "",
  location: "",
  ...(Object.fromEntries(COMPARISON_FIGURES.map((figure) => [figure, ""])) as Record<ComparisonFigure, string>),
  preferred: "",
  invarianceClaimed: "n/a",
  notes: "",
});

const COMPARISON_FIGURE_LABELS: Record<ComparisonFigure, string> = { dChisq: "Δχ²", dDf: "Δdf", dP: "p of the difference", dCfi: "ΔCFI", dRmsea: "ΔRMSEA", dAic: "ΔAIC", dBic: "ΔBIC" };
const METHOD_LABELS: Record<string, string> = { lrt: "χ² difference test", scaled_lrt: "scaled χ² difference test", ic: "information criteria", invariance: "invariance step" };
const CORE_FIGURES: ModelFigure[] = ["chisq", "df", "p", "chisqScaled", "scaling", "cfi", "tli", "rmsea", "rmseaLo", "rmseaHi", "srmr", "aic", "bic"];

function ErrorText({ id, errors }: { id: string; errors?: string[] }) {
  return errors?.length ? (
    <p id={id} className="mt-0.5 text-xxs text-finding-error">
      {errors.join(" ")}
    </p>
  ) : null;
}

function Input({ name, label, value, onChange, errors, disabled, wide, hint }: { name: string; label: string; value: string; onChange: (value: string) => void; errors?: string[]; disabled?: boolean; wide?: boolean; hint?: string }) {
  const id = `f-${name.replace(/\./g, "-")}`;
  const describedBy = [hint ? `${id}-hint` : "", errors?.length ? `${id}-error` : ""].filter(Boolean).join(" ") || undefined;
  return (
    <div className={wide ? "col-span-2" : ""}>
      <label htmlFor={id} className="block text-xxs font-medium text-ink-soft">
        {label}
      </label>
      <input id={id} name={name} value={value} disabled={disabled} autoComplete="off" spellCheck={false} onChange={(event) => onChange(event.target.value)} aria-invalid={errors?.length ? true : undefined} aria-describedby={describedBy} className={`${CONTROL} ${errors?.length ? "border-finding-error" : "border-rule-strong"}`} />
      {hint ? (
        <p id={`${id}-hint`} className="text-xxs text-ink-faint">
          {hint}
        </p>
      ) : null}
      <ErrorText id={`${id}-error`} errors={errors} />
    </div>
  );
}

function Select({ name, label, value, options, onChange, errors, disabled }: { name: string; label: string; value: string; options: { value: string; label: string }[]; onChange: (value: string) => void; errors?: string[]; disabled?: boolean }) {
  const id = `f-${name.replace(/\./g, "-")}`;
  return (
    <div>
      <label htmlFor={id} className="block text-xxs font-medium text-ink-soft">
        {label}
      </label>
      <select id={id} name={name} value={value} disabled={disabled} onChange={(event) => onChange(event.target.value)} aria-invalid={errors?.length ? true : undefined} aria-describedby={errors?.length ? `${id}-error` : undefined} className={`${CONTROL} ${errors?.length ? "border-finding-error" : "border-rule-strong"}`}>
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
      <ErrorText id={`${id}-error`} errors={errors} />
    </div>
  );
}

type SaveState = { kind: "idle" } | { kind: "saving" } | { kind: "saved"; message: string } | { kind: "conflict"; message: string } | { kind: "error"; message: string };

export function CodingEditor({ paperId, initial, editable, submitLabel }: { paperId: number; initial: Doc; editable: boolean; /** shown when the entry may be submitted from here */ submitLabel?: string }) {
  const router = useRouter();
  const [doc, setDoc] = useState<Doc>(() => (initial.samples.length > 0 ? initial : { ...initial, samples: [{ key: newKey("s"), label: "Sample 1", n: "", groups: "1", groupNs: "" }] }));
  const [dirty, setDirty] = useState(false);
  // the version the server holds after our last save: submitting names it, so nobody submits what they have not seen
  const [savedVersion, setSavedVersion] = useState(initial.version);
  const [attempted, setAttempted] = useState(false);
  const [serverErrors, setServerErrors] = useState<Record<string, string[]>>({});
  const [save, setSave] = useState<SaveState>({ kind: "idle" });
  const [allFigures, setAllFigures] = useState(() => initial.models.some((model) => MODEL_FIGURES.some((figure) => !CORE_FIGURES.includes(figure) && model[figure] !== "")));
  const disabled = !editable || save.kind === "saving";

  const deferred = useDeferredValue(doc);
  const live = useMemo(() => liveRecheck(deferred), [deferred]);
  const clientErrors = useMemo(() => {
    const parsed = codingDocumentSchema.safeParse(doc);
    return parsed.success ? {} : pathFieldErrors(parsed.error);
  }, [doc]);
  const errors = useMemo(() => {
    const shown: Record<string, string[]> = {};
    for (const [key, messages] of Object.entries(clientErrors)) if (attempted || ALWAYS_SHOWN.test(key)) shown[key] = messages;
    for (const [key, messages] of Object.entries(serverErrors)) shown[key] = [...new Set([...(shown[key] ?? []), ...messages])];
    return shown;
  }, [clientErrors, serverErrors, attempted]);

  const change = (next: (current: Doc) => Doc) => {
    setDoc((current) => next(current));
    setDirty(true);
    if (save.kind === "saved") setSave({ kind: "idle" });
  };
  const setMeta = (field: keyof Doc["metadata"], value: string) => change((current) => ({ ...current, metadata: { ...current.metadata, [field]: value } }));
  const setRow = <K extends "samples" | "models" | "comparisons">(list: K, index: number, field: string, value: string) =>
    change((current) => ({ ...current, [list]: current[list].map((row, at) => (at === index ? { ...row, [field]: value } : row)) }));
  const removeRow = (list: "samples" | "models" | "comparisons", index: number) => change((current) => ({ ...current, [list]: current[list].filter((_, at) => at !== index) }));

  const modelOptions = [{ value: "", label: "— choose —" }, ...doc.models.map((model, index) => ({ value: model.key, label: model.label || `Model ${index + 1}` }))];

  async function onSave() {
    setAttempted(true);
    const parsed = codingDocumentSchema.safeParse(doc);
    if (!parsed.success) {
      setSave({ kind: "error", message: "Some fields need attention (marked in red); nothing was saved." });
      return;
    }
    setSave({ kind: "saving" });
    setServerErrors({});
    const sent = doc;
    try {
      const response = await fetch(`/api/curation/papers/${paperId}`, { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify({ document: sent }) });
      const body = (await response.json().catch(() => ({}))) as { version?: number; flags?: number; document?: Doc; error?: { code: string; message: string; fields?: Record<string, string[]> } };
      if (response.ok) {
        // carry on from what was stored: new rows now have their keys, and the document its new version
        // (the form is disabled while a save runs, so nothing was typed meanwhile)
        if (body.document) setDoc(body.document);
        setDirty(false);
        if (body.version) setSavedVersion(body.version);
        setSave({ kind: "saved", message: `Saved (version ${body.version}); ${body.flags ?? 0} finding${body.flags === 1 ? "" : "s"} stored.` });
        router.refresh();
        return;
      }
      if (response.status === 409) {
        setSave({ kind: "conflict", message: body.error?.message ?? "Someone else saved this paper first." });
        return;
      }
      setServerErrors(body.error?.fields ?? {});
      setSave({ kind: "error", message: body.error?.message ?? `The save failed (status ${response.status}); nothing was saved.` });
    } catch {
      setSave({ kind: "error", message: "The server could not be reached; nothing was saved. Your input is still here." });
    }
  }

  return (
    <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_22rem]">
      <div className="space-y-6">
        <fieldset disabled={disabled} className="space-y-2">
          <legend className="text-sm font-semibold">Paper</legend>
          <div className="grid grid-cols-2 gap-2 md:grid-cols-4">
            <Input wide name="metadata.title" label="Title" value={doc.metadata.title} onChange={(value) => setMeta("title", value)} errors={errors["metadata.title"]} />
            <Input name="metadata.doi" label="DOI" value={doc.metadata.doi} onChange={(value) => setMeta("doi", value)} errors={errors["metadata.doi"]} />
            <Input name="metadata.ref" label="Reference (no DOI)" value={doc.metadata.ref} onChange={(value) => setMeta("ref", value)} errors={errors["metadata.ref"]} />
            <Input wide name="metadata.journal" label="Journal" value={doc.metadata.journal} onChange={(value) => setMeta("journal", value)} errors={errors["metadata.journal"]} />
            <Input name="metadata.year" label="Year" value={doc.metadata.year} onChange={(value) => setMeta("year", value)} errors={errors["metadata.year"]} />
            <Input name="metadata.field" label="Field" value={doc.metadata.field} onChange={(value) => setMeta("field", value)} errors={errors["metadata.field"]} />
            <Input name="metadata.volume" label="Volume" value={doc.metadata.volume} onChange={(value) => setMeta("volume", value)} />
            <Input name="metadata.issue" label="Issue" value={doc.metadata.issue} onChange={(value) => setMeta("issue", value)} />
            <Input name="metadata.pages" label="Pages" value={doc.metadata.pages} onChange={(value) => setMeta("pages", value)} />
          </div>
          <div>
            <label htmlFor="f-metadata-authors" className="block text-xxs font-medium text-ink-soft">
              Authors, one a line (Family, Given)
            </label>
            <textarea id="f-metadata-authors" name="metadata.authors" rows={3} value={doc.metadata.authors} onChange={(event) => setMeta("authors", event.target.value)} className={`${CONTROL} border-rule-strong`} />
          </div>
        </fieldset>

        <fieldset disabled={disabled} className="space-y-2">
          <legend className="text-sm font-semibold">Samples</legend>
          {doc.samples.map((sample, index) => (
            <div key={sample.key} className="grid grid-cols-2 items-start gap-2 md:grid-cols-[2fr_1fr_1fr_2fr_auto]">
              <Input name={`samples.${index}.label`} label="Sample" value={sample.label} onChange={(value) => setRow("samples", index, "label", value)} errors={errors[`samples.${index}.label`]} />
              <Input name={`samples.${index}.n`} label="N (total)" value={sample.n} onChange={(value) => setRow("samples", index, "n", value)} errors={errors[`samples.${index}.n`]} />
              <Input name={`samples.${index}.groups`} label="Groups" value={sample.groups} onChange={(value) => setRow("samples", index, "groups", value)} errors={errors[`samples.${index}.groups`]} />
              <Input name={`samples.${index}.groupNs`} label="Group sizes" value={sample.groupNs} onChange={(value) => setRow("samples", index, "groupNs", value)} errors={errors[`samples.${index}.groupNs`]} />
              <button type="button" className="mt-4 text-xs text-ink-faint hover:text-finding-error disabled:opacity-50" disabled={doc.samples.length === 1} onClick={() => removeRow("samples", index)} aria-label={`Remove sample ${sample.label || index + 1}`}>
                Remove
              </button>
              <ErrorText id={`f-samples-${index}-key-error`} errors={errors[`samples.${index}.key`]} />
            </div>
          ))}
          <Button tone="secondary" size="small" onClick={() => change((current) => ({ ...current, samples: [...current.samples, { key: newKey("s"), label: `Sample ${current.samples.length + 1}`, n: "", groups: "1", groupNs: "" }] }))}>
            Add a sample
          </Button>
        </fieldset>

        <fieldset disabled={disabled} className="space-y-2">
          <legend className="text-sm font-semibold">Models</legend>
          <label className="flex items-center gap-1.5 text-xs text-ink-soft">
            <input type="checkbox" checked={allFigures} onChange={(event) => setAllFigures(event.target.checked)} /> Show every figure column (log-likelihood, parameters, baseline model…)
          </label>
          <ModelGrid
            rows={doc.models as ModelGridRow[]}
            samples={doc.samples}
            figures={allFigures ? MODEL_FIGURES : CORE_FIGURES}
            errors={errors}
            disabled={disabled}
            onChange={(index, field, value) => setRow("models", index, field, value)}
            onAdd={() => change((current) => ({ ...current, models: [...current.models, emptyModel(current.samples[0]?.key ?? "")] }))}
            onRemove={(index) => removeRow("models", index)}
            onFill={(start, values) =>
              change((current) => {
                const models = [...current.models];
                values.forEach((cells, offset) => {
                  const at = start + offset;
                  if (!models[at]) models[at] = emptyModel(current.samples[0]?.key ?? "");
                  models[at] = { ...models[at], ...cells } as Doc["models"][number];
                });
                return { ...current, models };
              })
            }
          />
          {Object.entries(errors)
            .filter(([key]) => /^models\.\d+\.(key|sampleKey)$/.test(key))
            .map(([key, messages]) => (
              <p key={key} className="text-xxs text-finding-error">
                Model {Number(key.split(".")[1]) + 1}: {messages.join(" ")}
              </p>
            ))}
        </fieldset>

        <fieldset disabled={disabled} className="space-y-3">
          <legend className="text-sm font-semibold">Comparisons</legend>
          {doc.comparisons.map((comparison, index) => {
            const name = (field: string) => `comparisons.${index}.${field}`;
            const set = (field: string) => (value: string) => setRow("comparisons", index, field, value);
            return (
              <div key={comparison.key} className="space-y-2 rounded border border-rule bg-paper-raised p-2" aria-label={`Comparison ${index + 1}`} role="group">
                <div className="grid grid-cols-2 gap-2 md:grid-cols-4">
                  <Input wide name={name("label")} label="Comparison" value={comparison.label} onChange={set("label")} errors={errors[name("label")]} />
                  <Select name={name("restrictedKey")} label="Model A (restricted, more df)" value={comparison.restrictedKey} options={modelOptions} onChange={set("restrictedKey")} errors={errors[name("restrictedKey")]} />
                  <Select name={name("freeKey")} label="Model B (free, fewer df)" value={comparison.freeKey} options={modelOptions} onChange={set("freeKey")} errors={errors[name("freeKey")]} />
                  <Select name={name("method")} label="Method" value={comparison.method} options={METHODS.map((method) => ({ value: method, label: METHOD_LABELS[method] }))} onChange={set("method")} errors={errors[name("method")]} />
                  <Select name={name("nested")} label="Nested" value={comparison.nested} options={NESTED_VALUES.map((value) => ({ value, label: value }))} onChange={set("nested")} />
                  <Input name={name("alpha")} label="Alpha" value={comparison.alpha} onChange={set("alpha")} errors={errors[name("alpha")]} hint="blank: .05" />
                  <Input name={name("location")} label="Where in the paper" value={comparison.location} onChange={set("location")} errors={errors[name("location")]} hint="e.g. Table 3, p. 412" />
                </div>
                <div className="grid grid-cols-3 gap-2 md:grid-cols-7">
                  {COMPARISON_FIGURES.map((figure) => (
                    <Input key={figure} name={name(figure)} label={COMPARISON_FIGURE_LABELS[figure]} value={comparison[figure]} onChange={set(figure)} errors={errors[name(figure)]} />
                  ))}
                </div>
                <div className="grid grid-cols-2 gap-2 md:grid-cols-4">
                  <Select name={name("preferred")} label="Preferred model" value={comparison.preferred} options={[{ value: "", label: "not stated" }, { value: "a", label: "A (restricted)" }, { value: "b", label: "B (free)" }, { value: "none", label: "neither" }]} onChange={set("preferred")} />
                  <Select name={name("invarianceClaimed")} label="Invariance claimed" value={comparison.invarianceClaimed} options={INVARIANCE_CLAIMS.map((value) => ({ value, label: value }))} onChange={set("invarianceClaimed")} />
                  <Input wide name={name("notes")} label="Notes" value={comparison.notes} onChange={set("notes")} />
                </div>
                <ErrorText id={`f-comparisons-${index}-key-error`} errors={errors[name("key")]} />
                <Button tone="danger" size="small" onClick={() => removeRow("comparisons", index)}>
                  Remove this comparison
                </Button>
              </div>
            );
          })}
          <Button tone="secondary" size="small" onClick={() => change((current) => ({ ...current, comparisons: [...current.comparisons, emptyComparison()] }))}>
            Add a comparison
          </Button>
        </fieldset>

        {editable ? (
          <div className="sticky bottom-0 space-y-2 border-t border-rule bg-paper py-2">
            {save.kind === "conflict" ? (
              <Notice tone="error" title="Not saved: someone else saved first">
                <p>{save.message}</p>
                <p className="mt-1 flex flex-wrap gap-3">
                  <a href={`/papers/${paperId}`} target="_blank" rel="noopener" className="underline">
                    Open the saved version in a new tab
                  </a>
                  <button type="button" className="underline" onClick={() => window.location.reload()}>
                    Reload the saved version here (discards what you typed)
                  </button>
                </p>
              </Notice>
            ) : null}
            {save.kind === "error" ? <Notice tone="error">{save.message}</Notice> : null}
            {save.kind === "saved" ? <Notice tone="success">{save.message}</Notice> : null}
            <div className="flex items-center gap-3">
              <Button onClick={onSave} disabled={save.kind === "saving"}>
                {save.kind === "saving" ? "Saving…" : "Save coding"}
              </Button>
              <span className="text-xs text-ink-soft">{dirty ? "Unsaved changes." : "All changes saved."}</span>
            </div>
            {submitLabel ? (
              <div className="space-y-1 border-t border-rule pt-2">
                <p className="text-xs text-ink-soft">{dirty ? "Save your changes before submitting." : "Ready? A curator checks the entry against the paper and verifies it or returns it with a comment."}</p>
                <SubmitEntryForm paperId={paperId} version={savedVersion} label={submitLabel} disabled={dirty || save.kind === "saving"} />
              </div>
            ) : null}
          </div>
        ) : null}
      </div>
      <aside className="xl:sticky xl:top-4 xl:max-h-[90vh] xl:overflow-y-auto">
        <LiveFindingsPanel results={live} />
      </aside>
    </div>
  );
}
