import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/db";
import { isAppError } from "@/lib/errors";
import { createPaper } from "@/lib/curation/create";
import { recordDisposition } from "@/lib/curation/dispositions";
import { fullRecheckFinished, recheckProgress, startFullRecheck } from "@/lib/curation/recheck-job";
import { ENGINE_VERSION } from "@/lib/recheck/settings";
import { codingDocumentSchema, newPaperSchema, pathFieldErrors } from "@/lib/validation/curation";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";
import { flagCodes, newDraft, person, save, savedDocument, twoModelDocument } from "./support";

// Saving a paper's coding: recheck in the same transaction, optimistic concurrency on `version`,
// audited changes, refusals that save nothing, dispositions that outlive a recheck.

let database: TestDatabase;
beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(async () => {
  await database.destroy();
});

async function failure(work: Promise<unknown>) {
  try {
    await work;
  } catch (error) {
    if (isAppError(error)) return { code: error.code, message: error.message, fields: error.fields ?? {} };
    throw error;
  }
  throw new Error("expected the save to be refused");
}

async function counts(paperId: number) {
  const { models } = await db();
  const [samples, fitModels, comparisons, flags] = await Promise.all([models.Sample.count({ where: { paperId } }), models.FitModel.count({ where: { paperId } }), models.Comparison.count({ where: { paperId } }), models.Flag.count({ where: { paperId } })]);
  return { samples, fitModels, comparisons, flags };
}

describe("flags are rewritten on every save", () => {
  it("a wrong Δdf is flagged when saved, and the flag goes when the Δdf is fixed", async () => {
    const coder = await person("contributor");
    const paperId = await newDraft(coder);
    // Δdf printed as 3, but 24 − 20 = 4 (DESIGN §4.3 df-difference-mismatch)
    const first = await save(paperId, coder, twoModelDocument(1, { dDf: "3" }));
    expect(first.version).toBe(2);
    expect(await flagCodes(paperId)).toContain("df-difference-mismatch");
    const { models } = await db();
    const flag = await models.Flag.findOne({ where: { paperId, code: "df-difference-mismatch" } });
    expect(flag?.message).toMatch(/3/);
    expect(flag?.message).toMatch(/24 − 20 = 4/);
    expect(flag?.engineVersion).toBe(ENGINE_VERSION);

    const document = await savedDocument(paperId);
    document.comparisons[0].dDf = "4";
    await save(paperId, coder, document);
    expect(await flagCodes(paperId)).not.toContain("df-difference-mismatch");
  });

  it("keeps every figure's printed text, decimals included", async () => {
    const coder = await person("contributor");
    const paperId = await newDraft(coder);
    await save(paperId, coder, twoModelDocument(1));
    const { models } = await db();
    const metric = await models.FitModel.findOne({ where: { paperId, label: "Metric" } });
    expect(metric?.chisqText).toBe("61.30");
    expect(metric?.chisq).toBe(61.3);
  });

  it("updates rows in place: a second save keeps the ids and records only what changed", async () => {
    const coder = await person("contributor");
    const paperId = await newDraft(coder);
    await save(paperId, coder, twoModelDocument(1));
    const before = await savedDocument(paperId);
    before.models[1].chisq = "48.25";
    await save(paperId, coder, before);
    const after = await savedDocument(paperId);
    expect(after.models.map((model) => model.key)).toEqual(before.models.map((model) => model.key));
    const { models } = await db();
    const event = await models.AuditEvent.findOne({ where: { entity: "Paper", entityId: String(paperId), action: "coding-saved" }, order: [["id", "DESC"]] });
    expect((event?.after as { changes: unknown[] }).changes).toEqual([{ entity: "FitModel", label: "Configural", action: "update", fields: { chisqText: ["48.20", "48.25"], chisq: [48.2, 48.25] } }]);
  });
});

describe("optimistic concurrency", () => {
  it("the second of two saves from the same version gets a conflict and changes nothing", async () => {
    const coder = await person("contributor");
    const curator = await person("curator");
    const paperId = await newDraft(coder);
    await save(paperId, coder, twoModelDocument(1));
    const { submitEntry } = await import("@/lib/curation/workflow");
    await submitEntry({ paperId, actor: coder });

    const mine = await savedDocument(paperId);
    const theirs = await savedDocument(paperId);
    mine.models[0].chisq = "61.35";
    theirs.models[0].chisq = "61.90";
    await save(paperId, curator, mine);
    const refused = await failure(save(paperId, curator, theirs));
    expect(refused.code).toBe("conflict");
    expect(refused.message).toMatch(/Someone else saved this paper/);
    expect(refused.message).toMatch(/version 2; it is now at version 3/);
    expect((await savedDocument(paperId)).models[0].chisq).toBe("61.35");
  });
});

describe("bad input: a message next to the field, nothing saved half-way", () => {
  it("text where a figure belongs is refused by the shared schema, naming the cell", () => {
    const document = twoModelDocument(1);
    document.models[0].chisq = "sixty-one";
    const parsed = codingDocumentSchema.safeParse(document);
    expect(parsed.success).toBe(false);
    expect(Object.keys(pathFieldErrors(parsed.error!))).toContain("models.0.chisq");
  });

  it("a comparison whose two models are the same is refused", () => {
    const document = twoModelDocument(1);
    document.comparisons[0].freeKey = "new-m1";
    const parsed = codingDocumentSchema.safeParse(document);
    expect(parsed.success).toBe(false);
    expect(pathFieldErrors(parsed.error!)["comparisons.0.freeKey"]).toEqual(["A comparison needs two different models."]);
  });

  it("a malformed DOI is refused next to the DOI field", () => {
    const parsed = newPaperSchema.safeParse({ title: "A paper", doi: "10.12/not-a-registrant" });
    expect(parsed.success).toBe(false);
    expect(pathFieldErrors(parsed.error!).doi?.[0]).toMatch(/not a DOI/);
  });

  it("a comparison pointing at a model of another paper is refused and nothing of the save is kept", async () => {
    const coder = await person("contributor");
    const otherPaper = await newDraft(coder);
    await save(otherPaper, coder, twoModelDocument(1));
    const foreignModel = (await savedDocument(otherPaper)).models[0];

    const paperId = await newDraft(coder);
    await save(paperId, coder, twoModelDocument(1));
    const before = await counts(paperId);
    const document = await savedDocument(paperId);
    // the other paper's stored model, smuggled in with its own key
    document.models.push({ ...foreignModel, sampleKey: document.samples[0].key, label: "Borrowed" });
    document.comparisons[0].freeKey = foreignModel.key;
    document.samples.push({ key: "new-extra", label: "Sample 2", n: "90", groups: "1", groupNs: "" });
    const refused = await failure(save(paperId, coder, document));
    expect(refused.code).toBe("validation_failed");
    expect(refused.fields["models.2.key"]).toEqual(["This model is not part of this paper."]);
    expect(refused.fields["comparisons.0.freeKey"]).toEqual(["Choose a model of this paper."]);
    expect(await counts(paperId)).toEqual(before);
    expect((await savedDocument(paperId)).version).toBe(2);
  });

  it("a verified entry's coding cannot be changed", async () => {
    const coder = await person("contributor");
    const curator = await person("curator");
    const paperId = await newDraft(coder);
    await save(paperId, coder, twoModelDocument(1));
    const { submitEntry, verifyEntry } = await import("@/lib/curation/workflow");
    await submitEntry({ paperId, actor: coder });
    await verifyEntry({ paperId, actor: curator });
    const document = await savedDocument(paperId);
    expect((await failure(save(paperId, curator, document))).code).toBe("forbidden");
  });
});

describe("new papers", () => {
  it("a DOI already in the corpus leads to the existing paper instead of a duplicate", async () => {
    const coder = await person("contributor");
    const paperId = await newDraft(coder, { doi: "https://doi.org/10.5555/ALREADY.here" });
    const again = await createPaper(newPaperSchema.parse({ doi: "10.5555/already.here", title: "Same paper, typed again" }), coder);
    expect(again).toEqual({ created: false, existingPaperId: paperId, state: "draft", createdBy: coder.id });
  });

  it("a paper without DOI gets a curator reference", async () => {
    const coder = await person("contributor");
    const outcome = await createPaper(newPaperSchema.parse({ title: "A conference paper", authors: "Øvergaard, Siri", year: "2019" }), coder);
    const { models } = await db();
    const paper = await models.Paper.findByPk(outcome.created ? outcome.paperId : 0);
    expect(paper?.doi).toBeNull();
    expect(paper?.ref).toMatch(/^overgaard2019-[0-9a-z]{4}$/);
  });
});

describe("dispositions", () => {
  it("survive a recheck while the finding is unchanged, and lapse when its figures change", async () => {
    const coder = await person("contributor");
    const curator = await person("curator");
    const paperId = await newDraft(coder);
    await save(paperId, coder, twoModelDocument(1, { dDf: "3" }));
    const { models } = await db();
    const flag = (await models.Flag.findOne({ where: { paperId, code: "df-difference-mismatch" } }))!;
    await recordDisposition({ paperId, flagId: flag.id, verdict: "confirmed", note: "Table 2 prints 3.", link: "", actor: curator });

    // an unrelated edit: the flag row is rewritten, its fingerprint is the same
    let document = await savedDocument(paperId);
    document.comparisons[0].location = "Table 2, p. 14";
    await save(paperId, coder, document);
    const { readPaper } = await import("@/lib/db/queries/papers");
    let view = await readPaper({ paperId, includeUnverified: true });
    const rewritten = view!.findings.find((finding) => finding.code === "df-difference-mismatch")!;
    expect(rewritten.id).not.toBe(flag.id);
    expect(rewritten.disposition).toMatchObject({ verdict: "confirmed", note: "Table 2 prints 3." });

    // the figures behind the finding change: it is a different finding, with no verdict yet
    document = await savedDocument(paperId);
    document.comparisons[0].dDf = "2";
    await save(paperId, coder, document);
    view = await readPaper({ paperId, includeUnverified: true });
    expect(view!.findings.find((finding) => finding.code === "df-difference-mismatch")!.disposition).toBeNull();
  });

  it("a contributor cannot record a verdict", async () => {
    const coder = await person("contributor");
    const paperId = await newDraft(coder);
    await save(paperId, coder, twoModelDocument(1));
    const { models } = await db();
    const flag = (await models.Flag.findOne({ where: { paperId } }))!;
    expect((await failure(recordDisposition({ paperId, flagId: flag.id, verdict: "confirmed", note: "", link: "", actor: coder }))).code).toBe("forbidden");
  });
});

describe("the full recheck", () => {
  it("rewrites every paper's flags in the background and reports its progress", async () => {
    const admin = await person("admin");
    const { models } = await db();
    const total = await models.Paper.count();
    // a stale stamp, as after an engine change
    await models.Flag.update({ engineVersion: "0.0.1" }, { where: {} });
    expect(startFullRecheck({ actorId: admin.id })).toBe(true);
    expect(startFullRecheck({ actorId: admin.id })).toBe(false); // one at a time
    expect(recheckProgress().state).toBe("running");
    await fullRecheckFinished();
    const progress = recheckProgress();
    expect(progress).toMatchObject({ state: "finished", total, done: total, engineVersion: ENGINE_VERSION });
    expect(await models.Flag.count({ where: { engineVersion: "0.0.1" } })).toBe(0);
    expect(progress.flags).toBe(await models.Flag.count());
  });
});
