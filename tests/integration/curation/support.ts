// Shared by the curation tests: people and a coded paper written through the real curation code on the
// temp database.
import { db } from "@/lib/db";
import { createPaper } from "@/lib/curation/create";
import { saveCoding } from "@/lib/curation/save";
import { readCodingDocument } from "@/lib/db/queries/workbench";
import { codingDocumentSchema, newPaperSchema, type CodingDocumentInput } from "@/lib/validation/curation";
import type { Role } from "@/models/user";

let counter = 0;

export async function person(role: Role, name?: string) {
  const { models } = await db();
  counter += 1;
  const user = await models.User.create({ email: `${role}${counter}@curation.test`, name: name ?? `${role} ${counter}`, affiliation: null, reason: null, passwordHash: "x".repeat(60), role, status: "active", statusNote: null });
  return { id: user.id, role: user.role as Role, email: user.email, name: user.name };
}

export async function newDraft(actor: { id: number; role: Role }, overrides: Record<string, string> = {}) {
  counter += 1;
  const input = newPaperSchema.parse({ doi: `10.5555/curation.${counter}`, title: `A test paper ${counter}`, authors: "van der Berg, Anna\nOkafor, Chidi", journal: "Journal of Test Methods", year: "2020", ...overrides });
  const outcome = await createPaper(input, actor);
  if (!outcome.created) throw new Error("expected a new paper");
  return outcome.paperId;
}

/**
 * Two nested CFA models of one sample and their chi-square difference test. Figures as printed:
 * df 24 vs 20 → Δdf = 4; χ² 61.30 − 48.20 = 13.10. `dDf` defaults to the wrong "3" (a coding slip the
 * engine flags as df-difference-mismatch: reported 3, but 24 − 20 = 4).
 */
export function twoModelDocument(version: number, options: { dDf?: string; title?: string; doi?: string } = {}): CodingDocumentInput {
  return {
    version,
    metadata: { doi: options.doi ?? "", ref: "", title: options.title ?? "A test paper", authors: "van der Berg, Anna", journal: "Journal of Test Methods", year: "2020", volume: "", issue: "", pages: "", field: "" },
    samples: [{ key: "new-s1", label: "Sample 1", n: "412", groups: "1", groupNs: "" }],
    models: [
      { key: "new-m1", sampleKey: "new-s1", label: "Metric", estimator: "ML", meanStructure: "", chisq: "61.30", df: "24" },
      { key: "new-m2", sampleKey: "new-s1", label: "Configural", estimator: "ML", meanStructure: "", chisq: "48.20", df: "20" },
    ] as CodingDocumentInput["models"],
    comparisons: [{ key: "new-c1", label: "Metric vs configural", restrictedKey: "new-m1", freeKey: "new-m2", method: "lrt", nested: "yes", alpha: "", location: "Table 2", dChisq: "13.10", dDf: options.dDf ?? "3", preferred: "", invarianceClaimed: "n/a", notes: "" }] as CodingDocumentInput["comparisons"],
  };
}

export async function savedDocument(paperId: number) {
  const document = await readCodingDocument({ paperId });
  if (!document) throw new Error("no such paper");
  return document;
}

export async function save(paperId: number, actor: { id: number; role: Role }, document: CodingDocumentInput) {
  return saveCoding({ paperId, actor, document: codingDocumentSchema.parse(document) });
}

export async function flagCodes(paperId: number) {
  const { models } = await db();
  return (await models.Flag.findAll({ where: { paperId }, attributes: ["code"], order: [["code", "ASC"]] })).map((flag) => flag.code);
}
