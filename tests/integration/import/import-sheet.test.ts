import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, it, onTestFinished, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";
import { AuditEvent, Comparison, FitModel, Flag, Paper, Sample } from "@/models";
import { readBatch } from "@/lib/db/queries/imports";
import { claimCommit, commitClaimed, createBatch, runCommit, runDryRun, stageUpload } from "@/lib/import/batches";
import { liveProgress } from "@/lib/import/progress";
import { createAccount, dryRun, importSheet } from "./support";

// A realistic sheet (imports/: several invented papers, LRT and information criteria, WLSMV, a paper
// without DOI, multi-group invariance steps with MLR) through the dry run and the commit, on a real
// migrated SQLite file.
const several = fs.readFileSync(new URL("../../../imports/example-several-papers.csv", import.meta.url), "utf8");
const invariance = fs.readFileSync(new URL("../../../imports/example-invariance-steps.csv", import.meta.url), "utf8");

let database: TestDatabase;
let coder: number;
let other: number;

beforeAll(async () => {
  database = await createTestDatabase();
  coder = await createAccount("coder@import.test");
  other = await createAccount("other@import.test");
});
afterAll(async () => {
  await database.destroy();
});

const counts = async () => ({ papers: await Paper.count(), samples: await Sample.count(), models: await FitModel.count(), comparisons: await Comparison.count(), flags: await Flag.count(), audit: await AuditEvent.count() });

describe("importing a realistic sheet", () => {
  it("previews every row as new, with the findings each would get, and stores nothing", async () => {
    const batch = await dryRun(coder, several);
    expect(batch.status).toBe("previewed");
    expect(batch.progress).toMatchObject({ new: 4, updated: 0, unchanged: 0, rejected: 0 });
    // row 4 is a WLSMV comparison whose Δχ² is the plain difference of the scaled statistics (Satorra & Bentler 2001)
    expect(batch.progress["finding:unscaled-robust-difference"]).toBe(1);
    expect(await Paper.count()).toBe(0);
  });

  it("commits papers, samples, models and comparisons as drafts of the uploader, matched by label", async () => {
    const batch = await importSheet(coder, several);
    expect(batch.status).toBe("committed");
    const papers = await Paper.findAll({ order: [["id", "ASC"]] });
    expect(papers.map((p) => [p.doi, p.ref, p.state, p.createdBy])).toEqual([
      ["10.5555/fitledger-import.cfa2019", null, "draft", coder],
      [null, "quill-2024-preprint", "draft", coder],
    ]);
    expect(papers[0].authors).toEqual([{ family: "Quill", given: "Ada" }, { family: "Marsh", given: "Tobias" }]);
    // "Two factors" and "Three factors" appear in two rows each but are one model each
    expect(await FitModel.count({ where: { paperId: papers[0].id } })).toBe(3);
    expect(await Comparison.count()).toBe(4);
    const twoFactors = await FitModel.findOne({ where: { label: "Two factors" } });
    expect([twoFactors?.chisqText, twoFactors?.chisq, twoFactors?.pText]).toEqual(["98.17", 98.17, "< .001"]);
    // flags as rewriteFlagsForPaper would write them, from the stored text
    expect(await Flag.count({ where: { code: "unscaled-robust-difference", paperId: papers[1].id } })).toBe(1);
    // one audit event per created entity (2 papers, 2 samples, 5 models, 4 comparisons), plus a recheck per paper and the commit
    expect(await AuditEvent.count({ where: { action: "import" } })).toBe(13);
    expect(await AuditEvent.count({ where: { action: "recheck" } })).toBe(2);
  });

  it("imports the same sheet again without creating or writing anything", async () => {
    const before = await counts();
    const batch = await importSheet(coder, several);
    expect(batch.status).toBe("committed");
    expect(batch.progress).toMatchObject({ new: 0, updated: 0, unchanged: 4, rejected: 0 });
    expect(await counts()).toEqual({ ...before, audit: before.audit + 1 }); // only the batch's own commit event
  });

  it("updates a changed figure, audits the change and rechecks the paper", async () => {
    const changed = several.replace("Two vs three factors,lrt,yes,,Table 2,37.13,2", "Two vs three factors,lrt,yes,,Table 2,37.13,3");
    expect(changed).not.toBe(several);
    const batch = await importSheet(coder, changed);
    expect(batch.progress).toMatchObject({ new: 0, updated: 1, unchanged: 3 });
    const comparison = await Comparison.findOne({ where: { label: "Two vs three factors" } });
    expect(comparison?.dDfText).toBe("3");
    const event = await AuditEvent.findOne({ where: { entity: "Comparison", entityId: String(comparison!.id), action: "import-update" } });
    expect(event?.before).toEqual({ dDfText: "2" });
    expect(event?.after).toEqual({ dDfText: "3" });
    // the paper was rechecked: reported Δdf = 3 but 34 − 32 = 2
    expect(await Flag.count({ where: { comparisonId: comparison!.id, code: "df-difference-mismatch" } })).toBe(1);
    expect((await Paper.findByPk(comparison!.paperId))?.version).toBe(2);
  });

  it("imports multi-group invariance steps with robust estimators, the shared metric model once", async () => {
    const batch = await importSheet(coder, invariance);
    expect(batch.progress).toMatchObject({ new: 3, rejected: 0 });
    const paper = await Paper.findOne({ where: { doi: "10.5555/fitledger-import.inv2022" } });
    const sample = await Sample.findOne({ where: { paperId: paper!.id } });
    expect([sample?.n, sample?.groups]).toEqual([912, 3]);
    expect((await FitModel.findAll({ where: { paperId: paper!.id }, order: [["label", "ASC"]] })).map((m) => [m.label, m.estimator, m.chisqScaledText, m.meanStructure])).toEqual([
      ["Configural", "MLR", "152.30", true],
      ["Metric", "MLR", "165.02", true],
      ["Scalar", "MLR", "214.66", true],
    ]);
  });
});

describe("entries the uploader may not change", () => {
  it("refuses every row of another contributor's paper and changes nothing of it", async () => {
    const before = await counts();
    const batch = await importSheet(other, several);
    expect(batch.status).toBe("previewed"); // nothing to commit
    expect(batch.rejectedRows).toBe(4);
    expect(batch.rowErrors[0]).toMatchObject({ row: 1, column: "doi", message: expect.stringContaining("coded by another contributor") });
    expect(await counts()).toEqual(before);
  });

  it("accepts an unchanged row of a verified paper but refuses one that would change it", async () => {
    await Paper.update({ state: "verified" }, { where: { doi: "10.5555/fitledger-import.inv2022" }, validate: false });
    const unchanged = await dryRun(coder, invariance);
    expect(unchanged.progress).toMatchObject({ unchanged: 3, rejected: 0 });
    const changed = await dryRun(coder, invariance.replaceAll("Table 3, p. 118", "Table 4, p. 120"));
    expect(changed.progress).toMatchObject({ unchanged: 1, rejected: 2 });
    expect(changed.rowErrors[0].message).toMatch(/is verified; a verified entry changes only through a curator/);
  });
});

describe("committing", () => {
  it("refuses a batch that is already committed, or one without an accepted row, and writes nothing", async () => {
    const before = await counts();
    const committed = await importSheet(coder, invariance); // all rows unchanged (the paper is verified by now)
    expect(committed.status).toBe("committed");
    await expect(runCommit(committed.id, coder)).rejects.toThrow(/already been committed/);
    const refused = await dryRun(other, several);
    await expect(runCommit(refused.id, other)).rejects.toThrow(/nothing to commit/);
    // someone else's batch is not found at all
    await expect(runCommit(committed.id, other)).rejects.toThrow(/no such import/);
    expect({ ...(await counts()), audit: 0 }).toEqual({ ...before, audit: 0 });
  });
});

describe("a page read while an import starts", () => {
  it("sees the dry run running from the moment it is called, never an interrupted import", async () => {
    const batchId = await createBatch({ uploaderId: coder, fileName: "starting.csv" });
    await stageUpload(batchId, (async function* () {
      yield new TextEncoder().encode(several);
    })());
    const run = runDryRun(batchId); // the upload route starts it like this, without waiting
    expect(liveProgress(batchId)).toBeDefined(); // before its first await
    const view = await readBatch({ batchId, uploaderId: coder });
    expect(view).toMatchObject({ status: "validating", interrupted: false });
    expect(view!.live).not.toBeNull();
    await run;
    expect(await readBatch({ batchId, uploaderId: coder })).toMatchObject({ status: "previewed", interrupted: false, live: null });
  });

  it("claims a commit before the route answers: a page read right after sees it running", async () => {
    const batch = await dryRun(coder, several.replaceAll("10.5555/", "10.5555/claimed-"));
    expect(batch.status).toBe("previewed");
    const claim = await claimCommit(batch.id, coder);
    const view = await readBatch({ batchId: batch.id, uploaderId: coder });
    expect(view).toMatchObject({ status: "committing", interrupted: false });
    expect(view!.live).not.toBeNull();
    await expect(claimCommit(batch.id, coder)).rejects.toThrow(/Only a previewed import/); // a second press
    await commitClaimed(claim);
    expect(await readBatch({ batchId: batch.id, uploaderId: coder })).toMatchObject({ status: "committed", live: null });
  });

  it("takes a running status without live progress for interrupted only once it is old (a restart)", async () => {
    const batchId = await createBatch({ uploaderId: coder, fileName: "left-behind.csv" });
    expect(await readBatch({ batchId, uploaderId: coder })).toMatchObject({ status: "validating", interrupted: false });
    // a minute later, with no run of this process behind it (the server was restarted)
    vi.useFakeTimers({ toFake: ["Date"], now: Date.now() + 60_000 });
    onTestFinished(() => void vi.useRealTimers());
    expect(await readBatch({ batchId, uploaderId: coder })).toMatchObject({ status: "validating", interrupted: true });
  });
});
