import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/db";
import { listReviewQueue, readChangesSinceVerification } from "@/lib/db/queries/review";
import { submitEntry, verifyEntry } from "@/lib/curation/workflow";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";
import { newDraft, person, save, twoModelDocument } from "./support";

// The curator's queue (oldest submission first, filters) and the view of what changed since the last
// verification, read from the audit trail.

let database: TestDatabase;
beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(async () => {
  await database.destroy();
});

describe("the review queue", () => {
  it("lists submitted entries only, the longest-waiting first, with their finding counts", async () => {
    const coder = await person("contributor");
    const curator = await person("curator");
    const older = await newDraft(coder, { title: "Older submission about invariance" });
    const newer = await newDraft(coder, { title: "Newer submission" });
    const ownByCurator = await newDraft(curator, { title: "The curator's own entry" });
    await newDraft(coder, { title: "Still a draft" });
    await save(older, coder, twoModelDocument(1, { dDf: "3", title: "Older submission about invariance", doi: "10.5555/review.older" }));
    for (const id of [newer, older, ownByCurator]) await submitEntry({ paperId: id, actor: id === ownByCurator ? curator : coder });
    const { models } = await db();
    await models.Paper.update({ submittedAt: new Date("2026-01-01T00:00:00Z") }, { where: { id: older }, validate: false });

    const queue = await listReviewQueue({ viewerId: curator.id, page: 1, pageSize: 10 });
    expect(queue.rows.map((row) => row.id)).toEqual([older, newer, ownByCurator]);
    expect(queue.rows[0]).toMatchObject({ comparisons: 1, errors: 1 }); // the df-difference-mismatch of Δdf 3 vs 24 − 20 = 4

    const others = await listReviewQueue({ viewerId: curator.id, filters: { coder: "others" }, page: 1, pageSize: 10 });
    expect(others.rows.map((row) => row.id)).toEqual([older, newer]);
    const searched = await listReviewQueue({ viewerId: curator.id, filters: { q: "invariance" }, page: 1, pageSize: 10 });
    expect(searched.rows.map((row) => row.id)).toEqual([older]);
  });
});

describe("changes since the last verification", () => {
  it("lists every event before the first verification, and only the later ones after it", async () => {
    const coder = await person("contributor");
    const curator = await person("curator");
    const paperId = await newDraft(coder);
    await save(paperId, coder, twoModelDocument(1));
    const before = await readChangesSinceVerification({ paperId });
    expect(before.lastVerifiedAt).toBeNull();
    // newest first: the save's summary, its recheck, the metadata update it made, and the paper's creation
    expect(before.events.map((event) => event.action)).toEqual(["coding-saved", "recheck", "update", "create"]);

    await submitEntry({ paperId, actor: coder });
    await verifyEntry({ paperId, actor: curator });
    const after = await readChangesSinceVerification({ paperId });
    expect(after.lastVerifiedAt).not.toBeNull();
    expect(after.events).toEqual([]);
  });
});
