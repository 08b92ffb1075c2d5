// The live recheck of the entry form: the same engine as the server (DESIGN §4 runs in the browser),
// on the rows as typed. Pure.
import { recheck, recheckModel } from "@/lib/recheck/recheck";
import type { ComparisonInput, FieldError, Finding, ModelInput, RecheckSettings, SampleInput } from "@/lib/recheck/types";
import { COMPARISON_FIGURES, MODEL_FIGURES } from "@/models/figures";
import type { ComparisonRow, ModelRow, SampleRow } from "@/lib/validation/curation";

type Loose<T> = { [K in keyof T]?: T[K] | string | null };

const blankToUndefined = (value: unknown) => (typeof value === "string" && value.trim() !== "" ? value.trim() : undefined);

export function modelRowInput(row: Loose<ModelRow>): ModelInput {
  const input: ModelInput = { label: blankToUndefined(row.label), estimator: blankToUndefined(row.estimator), meanStructure: blankToUndefined(row.meanStructure) };
  for (const figure of MODEL_FIGURES) input[figure] = blankToUndefined(row[figure]);
  return input;
}

export function sampleRowInput(row: Loose<SampleRow> | undefined): SampleInput {
  return { label: blankToUndefined(row?.label), n: blankToUndefined(row?.n), groups: blankToUndefined(row?.groups) };
}

export function comparisonRowInput(row: Loose<ComparisonRow>, restricted: Loose<ModelRow>, free: Loose<ModelRow>, sample: Loose<SampleRow> | undefined): ComparisonInput {
  const input: ComparisonInput = {
    label: blankToUndefined(row.label),
    method: blankToUndefined(row.method),
    nested: blankToUndefined(row.nested),
    alpha: blankToUndefined(row.alpha),
    preferred: blankToUndefined(row.preferred),
    invarianceClaimed: blankToUndefined(row.invarianceClaimed),
    sample: sampleRowInput(sample),
    restricted: modelRowInput(restricted),
    free: modelRowInput(free),
  };
  for (const figure of COMPARISON_FIGURES) input[figure] = blankToUndefined(row[figure]);
  return input;
}

export interface LiveFindings {
  /** the row this is about: "c:<key>" or "m:<key>" */
  owner: string;
  label: string;
  findings: Finding[];
  /** cells the engine cannot read yet (shown beside the findings, not as findings) */
  unreadable: FieldError[];
}

/** What the engine would raise for the document as typed: per comparison, and per model not in any comparison. */
export function liveRecheck(
  document: { samples: Loose<SampleRow>[]; models: Loose<ModelRow>[]; comparisons: Loose<ComparisonRow>[] },
  settings?: Partial<RecheckSettings>,
): LiveFindings[] {
  const samples = new Map(document.samples.map((sample) => [sample.key ?? "", sample]));
  const models = new Map(document.models.map((model) => [model.key ?? "", model]));
  const covered = new Set<string>();
  const out: LiveFindings[] = [];
  for (const comparison of document.comparisons) {
    const restricted = models.get(comparison.restrictedKey ?? "");
    const free = models.get(comparison.freeKey ?? "");
    if (!restricted || !free || restricted === free) continue;
    covered.add(restricted.key ?? "").add(free.key ?? "");
    const outcome = recheck(comparisonRowInput(comparison, restricted, free, samples.get(restricted.sampleKey ?? "")), settings);
    out.push({ owner: `c:${comparison.key}`, label: comparison.label || "Unnamed comparison", findings: outcome.ok ? outcome.result.findings : [], unreadable: outcome.ok ? [] : outcome.errors });
  }
  for (const model of document.models) {
    if (covered.has(model.key ?? "")) continue;
    const outcome = recheckModel(modelRowInput(model), sampleRowInput(samples.get(model.sampleKey ?? "")), settings);
    out.push({ owner: `m:${model.key}`, label: model.label || "Unnamed model", findings: outcome.ok ? outcome.result.findings : [], unreadable: outcome.ok ? [] : outcome.errors });
  }
  return out;
}
