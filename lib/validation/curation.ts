// The inputs of the curation workflow (issue 5), one zod schema each, shared by the forms in the browser
// and by the server. Figures are validated with the recheck engine's own readers of printed numbers, so a
// cell the form accepts is a cell the engine can read, and "text where a figure belongs" is caught next to
// its field before anything is saved.
import { z } from "zod";
import { DOI_HINT, normaliseDoi, stripDoi } from "@/lib/doi/normalise";
import { validateComparison, validateModel } from "@/lib/recheck/parse";
import { ESTIMATORS, INVARIANCE_CLAIMS, METHODS, NESTED_VALUES, PREFERRED_VALUES } from "@/lib/recheck/types";
import { COMPARISON_FIGURES, MODEL_FIGURES, type ComparisonFigure, type ModelFigure } from "@/models/figures";
import type { Verdict } from "@/models/flag-disposition";

// models/flag-disposition.ts pulls in Sequelize, which the browser must not load: the list is repeated
// here and checked against the model's type at compile time.
export const VERDICTS = ["confirmed", "coding_error", "explained", "engine_limitation"] as const satisfies readonly Verdict[];
type VerdictsComplete = Exclude<Verdict, (typeof VERDICTS)[number]> extends never ? true : never;
const verdictsComplete: VerdictsComplete = true;
void verdictsComplete;

const trimmed = (max: number) => z.string().trim().max(max, `At most ${max} characters.`);
const optionalText = (max: number) => trimmed(max).nullish().transform((value) => value ?? "");
const id = z.coerce.number({ error: "Missing entry." }).int().positive("Missing entry.");

// ---- paper metadata ------------------------------------------------------------------------------

const doiField = optionalText(300).superRefine((value, context) => {
  if (value !== "" && !normaliseDoi(value)) context.addIssue({ code: "custom", message: `This is not a DOI. ${DOI_HINT}` });
}).transform((value) => (value === "" ? "" : (normaliseDoi(value) ?? stripDoi(value))));

const yearField = optionalText(4).superRefine((value, context) => {
  if (value !== "" && !(/^\d{4}$/.test(value) && Number(value) >= 1900 && Number(value) <= 2100)) context.addIssue({ code: "custom", message: "A year between 1900 and 2100." });
});

export const paperMetadataSchema = z.object({
  doi: doiField,
  ref: optionalText(100),
  title: trimmed(2000).min(1, "The paper needs a title."),
  /** one author a line: "Family, Given" */
  authors: optionalText(20_000),
  journal: optionalText(300),
  year: yearField,
  volume: optionalText(40),
  issue: optionalText(40),
  pages: optionalText(40),
  field: optionalText(100),
});
export type PaperMetadataInput = z.output<typeof paperMetadataSchema>;

/** New paper: the metadata, and the CSL record it came from when resolved or parsed. */
export const newPaperSchema = paperMetadataSchema.extend({
  csl: optionalText(100_000).superRefine((value, context) => {
    if (value === "") return;
    try {
      const parsed = JSON.parse(value) as unknown;
      if (parsed === null || typeof parsed !== "object" || Array.isArray(parsed)) throw new Error("not an object");
    } catch {
      context.addIssue({ code: "custom", message: "The citation record sent with the form is not readable; type the metadata instead." });
    }
  }),
});

export const doiLookupSchema = z.object({
  doi: trimmed(300).min(1, "Type a DOI.").refine((value) => normaliseDoi(value) !== undefined, { message: `This is not a DOI. ${DOI_HINT}` }),
});

export const citationTextSchema = z.object({
  text: z.string().trim().min(1, "Paste or upload a BibTeX or RIS record.").max(200_000, "At most 200 000 characters."),
  format: z.enum(["bibtex", "ris", "auto"]).default("auto"),
});

// ---- coding: samples, models, comparisons ---------------------------------------------------------

/** Rows already stored are keyed "s12", "m34", "c56"; new rows carry any other key ("new-…"). */
export const rowKey = z.string().trim().min(1).max(40);

function modelFigureProblem(figure: ModelFigure, text: string): string | null {
  const errors = validateModel({ [figure]: text }, {});
  return errors[0]?.message ?? null;
}

function comparisonFigureProblem(figure: ComparisonFigure | "alpha", text: string): string | null {
  const errors = validateComparison({ method: "lrt", [figure]: text, sample: {}, restricted: {}, free: {} });
  return errors[0]?.message ?? null;
}

const printed = (check: (text: string) => string | null) =>
  optionalText(40).superRefine((value, context) => {
    if (value === "") return;
    const problem = check(value);
    if (problem) context.addIssue({ code: "custom", message: problem });
  });

const wholeNumber = (min: number, what: string) =>
  optionalText(12).superRefine((value, context) => {
    if (value !== "" && !(/^\d+$/.test(value) && Number(value) >= min)) context.addIssue({ code: "custom", message: `${what} is a whole number of at least ${min}.` });
  });

export const sampleRowSchema = z.object({
  key: rowKey,
  label: trimmed(200).min(1, "Name the sample (e.g. Sample 1)."),
  n: wholeNumber(1, "N"),
  groups: wholeNumber(1, "The number of groups").transform((value) => (value === "" ? "1" : value)),
  groupNs: optionalText(2000).superRefine((value, context) => {
    if (value !== "" && !/^\s*\d+(\s*[,;]\s*\d+)*\s*$/.test(value)) context.addIssue({ code: "custom", message: "Group sizes as whole numbers separated by commas (e.g. 212, 198)." });
  }),
});
export type SampleRow = z.output<typeof sampleRowSchema>;

const modelFigures = Object.fromEntries(MODEL_FIGURES.map((figure) => [figure, printed((text) => modelFigureProblem(figure, text))])) as Record<ModelFigure, ReturnType<typeof printed>>;

export const modelRowSchema = z.object({
  key: rowKey,
  sampleKey: rowKey,
  label: trimmed(200).min(1, "Name the model as the paper does."),
  estimator: z.union([z.enum(ESTIMATORS), z.literal("")], { error: "Choose an estimator from the list." }).optional().transform((value) => value ?? ""),
  meanStructure: z.union([z.enum(["yes", "no"]), z.literal("")], { error: "yes, no or blank" }).optional().transform((value) => value ?? ""),
  ...modelFigures,
});
export type ModelRow = z.output<typeof modelRowSchema>;

const comparisonFigures = Object.fromEntries(COMPARISON_FIGURES.map((figure) => [figure, printed((text) => comparisonFigureProblem(figure, text))])) as Record<ComparisonFigure, ReturnType<typeof printed>>;

export const comparisonRowSchema = z.object({
  key: rowKey,
  label: trimmed(200).min(1, "Name the comparison (e.g. Metric vs configural)."),
  restrictedKey: rowKey.or(z.literal("")).refine((value) => value !== "", { message: "Choose the restricted model (A)." }),
  freeKey: rowKey.or(z.literal("")).refine((value) => value !== "", { message: "Choose the free model (B)." }),
  method: z.enum(METHODS, { error: "Choose the comparison method." }),
  nested: z.enum(NESTED_VALUES).default("unknown"),
  alpha: printed((text) => comparisonFigureProblem("alpha", text)),
  location: optionalText(300),
  ...comparisonFigures,
  preferred: z.union([z.enum(PREFERRED_VALUES), z.literal("")], { error: "a, b, none or blank" }).optional().transform((value) => value ?? ""),
  invarianceClaimed: z.enum(INVARIANCE_CLAIMS).default("n/a"),
  notes: optionalText(5000),
});
export type ComparisonRow = z.output<typeof comparisonRowSchema>;

/** The whole coding of one paper, saved at once with the version it was read at. */
export const codingDocumentSchema = z
  .object({
    version: z.number().int().positive(),
    metadata: paperMetadataSchema,
    samples: z.array(sampleRowSchema).max(200),
    models: z.array(modelRowSchema).max(2000),
    comparisons: z.array(comparisonRowSchema).max(2000),
  })
  .superRefine((document, context) => {
    const sampleKeys = new Set<string>();
    document.samples.forEach((sample, index) => {
      if (sampleKeys.has(sample.key)) context.addIssue({ code: "custom", path: ["samples", index, "key"], message: "Two samples share a key." });
      sampleKeys.add(sample.key);
      if (document.samples.findIndex((other) => other.label === sample.label) !== index) context.addIssue({ code: "custom", path: ["samples", index, "label"], message: "Another sample of this paper has this name." });
    });
    const modelSample = new Map<string, string>();
    document.models.forEach((model, index) => {
      if (!sampleKeys.has(model.sampleKey)) context.addIssue({ code: "custom", path: ["models", index, "sampleKey"], message: "Choose a sample of this paper." });
      if (modelSample.has(model.key)) context.addIssue({ code: "custom", path: ["models", index, "key"], message: "Two models share a key." });
      modelSample.set(model.key, model.sampleKey);
      if (document.models.findIndex((other) => other.sampleKey === model.sampleKey && other.label === model.label) !== index) {
        context.addIssue({ code: "custom", path: ["models", index, "label"], message: "Another model of this sample has this name." });
      }
    });
    const comparisonSample: string[] = [];
    document.comparisons.forEach((comparison, index) => {
      const restrictedSample = modelSample.get(comparison.restrictedKey);
      const freeSample = modelSample.get(comparison.freeKey);
      if (comparison.restrictedKey && restrictedSample === undefined) context.addIssue({ code: "custom", path: ["comparisons", index, "restrictedKey"], message: "Choose a model of this paper." });
      if (comparison.freeKey && freeSample === undefined) context.addIssue({ code: "custom", path: ["comparisons", index, "freeKey"], message: "Choose a model of this paper." });
      if (comparison.restrictedKey && comparison.restrictedKey === comparison.freeKey) context.addIssue({ code: "custom", path: ["comparisons", index, "freeKey"], message: "A comparison needs two different models." });
      if (restrictedSample !== undefined && freeSample !== undefined && restrictedSample !== freeSample) {
        context.addIssue({ code: "custom", path: ["comparisons", index, "freeKey"], message: "Both models of a comparison come from the same sample." });
      }
      comparisonSample.push(restrictedSample ?? "");
      if (document.comparisons.findIndex((other, at) => at < index && comparisonSample[at] === comparisonSample[index] && other.label === comparison.label) !== -1) {
        context.addIssue({ code: "custom", path: ["comparisons", index, "label"], message: "Another comparison of this sample has this name." });
      }
    });
  });
export type CodingDocumentInput = z.input<typeof codingDocumentSchema>;
export type CodingDocument = z.output<typeof codingDocumentSchema>;

/** zod issues → `{"models.2.chisq": ["…"]}`, the field names the forms use for their ids. */
export function pathFieldErrors(error: z.ZodError): Record<string, string[]> {
  const fields: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".") || "form";
    (fields[key] ??= []).push(issue.message);
  }
  return fields;
}

// ---- workflow ------------------------------------------------------------------------------------

export const submitEntrySchema = z.object({ paperId: id, version: z.coerce.number().int().positive() });

export const returnEntrySchema = z.object({
  paperId: id,
  comment: trimmed(5000).min(5, "Tell the contributor what to change (a sentence at least)."),
});

export const verifyEntrySchema = z.object({ paperId: id });

export const dispositionSchema = z
  .object({
    paperId: id,
    flagId: id,
    verdict: z.enum(VERDICTS, { error: "Choose a verdict." }),
    note: optionalText(5000),
    link: optionalText(1000).superRefine((value, context) => {
      if (value !== "" && !/^https?:\/\/\S+$/i.test(value)) context.addIssue({ code: "custom", message: "A web address starting with https://" });
    }),
  })
  .superRefine((input, context) => {
    if (input.verdict === "explained" && input.link === "") context.addIssue({ code: "custom", path: ["link"], message: "Link the erratum or the author's reply that explains the finding." });
  });

export const VERDICT_LABELS: Record<(typeof VERDICTS)[number], string> = {
  confirmed: "Confirmed reporting error",
  coding_error: "Coding error (fixed)",
  explained: "Explained (erratum or author reply)",
  engine_limitation: "Engine limitation",
};

export const correctionSchema = z.object({
  paperId: id,
  name: trimmed(200).min(1, "Your name, so a curator can reply."),
  email: z.string().trim().toLowerCase().pipe(z.email({ error: "An e-mail address, so a curator can reply." })),
  message: trimmed(5000).min(10, "Say what is wrong and where (a sentence at least)."),
  /** a field people do not see; a form that fills it was filled by a program */
  website: optionalText(200),
});

export const fullRecheckSchema = z.object({ confirm: z.literal("recheck-everything", { error: "Confirm the full recheck." }) });

/** A curator marks a correction as dealt with, or opens it again. */
export const correctionStatusSchema = z.object({
  correctionId: z.coerce.number().int().positive(),
  status: z.enum(["open", "closed"]),
});
