import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/db";
import { isAppError } from "@/lib/errors";
import { returnEntry, submitEntry, verifyEntry } from "@/lib/curation/workflow";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";
import { newDraft, person, save, twoModelDocument } from "./support";

// The entry's state machine (DESIGN §3) and who may take each step (DESIGN §2, issue 5's four-eyes rule),
// through the real workflow functions on a temp database.

let database: TestDatabase;
beforeAll(async () => {
  database = await createTestDatabase();
});
afterAll(async () => {
  await database.destroy();
});

async function refusal(work: Promise<unknown>) {
  try {
    await work;
  } catch (error) {
    if (isAppError(error)) return { code: error.code, message: error.message };
    throw error;
  }
  throw new Error("expected the step to be refused");
}

async function stateOf(paperId: number) {
  const { models } = await db();
  return (await models.Paper.findByPk(paperId, { attributes: ["state", "curatorComment", "verifiedBy"] }))!.get({ plain: true });
}

describe("draft → submitted → returned → submitted → verified", () => {
  it("walks the whole path, with the right person at each step", async () => {
    const coder = await person("contributor", "Bram Coder");
    const curatorA = await person("curator");
    const curatorB = await person("curator");
    const paperId = await newDraft(coder);
    expect((await stateOf(paperId)).state).toBe("draft");
    await save(paperId, coder, twoModelDocument(1));

    await expect(submitEntry({ paperId, version: 2, actor: coder })).resolves.toBe("submitted");
    await expect(returnEntry({ paperId, comment: "Δdf in Table 2 is 4, please check.", actor: curatorA })).resolves.toBe("returned");
    expect(await stateOf(paperId)).toMatchObject({ state: "returned", curatorComment: "Δdf in Table 2 is 4, please check." });
    await expect(submitEntry({ paperId, actor: coder })).resolves.toBe("submitted");
    await expect(verifyEntry({ paperId, actor: curatorB })).resolves.toBe("verified");
    expect(await stateOf(paperId)).toMatchObject({ state: "verified", curatorComment: null, verifiedBy: curatorB.id });

    const { models } = await db();
    const steps = await models.AuditEvent.findAll({ where: { entity: "Paper", entityId: String(paperId), action: ["submit", "return", "verify"] }, order: [["id", "ASC"]] });
    expect(steps.map((event) => [event.action, event.actorId])).toEqual([
      ["submit", coder.id],
      ["return", curatorA.id],
      ["submit", coder.id],
      ["verify", curatorB.id],
    ]);
    expect(steps[1].before).toMatchObject({ state: "submitted" });
    expect(steps[1].after).toMatchObject({ state: "returned" });
  });

  it("returning an entry e-mails its coder through the outbox, in the same transaction", async () => {
    const coder = await person("contributor");
    const curator = await person("curator");
    const paperId = await newDraft(coder);
    await submitEntry({ paperId, actor: coder });
    await returnEntry({ paperId, comment: "Model B's df is printed as 20, not 21.", actor: curator });
    const { models } = await db();
    const mail = await models.OutboxMessage.findOne({ where: { to: coder.email, kind: "entry-returned" } });
    expect(mail?.text).toContain("Model B's df is printed as 20, not 21.");
    expect(mail?.text).toContain(`/workbench/papers/${paperId}`);
  });
});

describe("who may take each step", () => {
  it("another contributor cannot submit someone else's draft", async () => {
    const coder = await person("contributor");
    const other = await person("contributor");
    const paperId = await newDraft(coder);
    expect(await refusal(submitEntry({ paperId, actor: other }))).toMatchObject({ code: "forbidden" });
    expect((await stateOf(paperId)).state).toBe("draft");
  });

  it("a contributor can neither return nor verify", async () => {
    const coder = await person("contributor");
    const other = await person("contributor");
    const paperId = await newDraft(coder);
    await submitEntry({ paperId, actor: coder });
    expect(await refusal(returnEntry({ paperId, comment: "please fix this", actor: other }))).toMatchObject({ code: "forbidden" });
    expect(await refusal(verifyEntry({ paperId, actor: other }))).toMatchObject({ code: "forbidden" });
    expect((await stateOf(paperId)).state).toBe("submitted");
  });

  it("four-eyes rule: a curator cannot verify a paper they coded themselves, another curator can", async () => {
    const curatorCoder = await person("curator");
    const secondCurator = await person("curator");
    const paperId = await newDraft(curatorCoder);
    await submitEntry({ paperId, actor: curatorCoder });
    const refused = await refusal(verifyEntry({ paperId, actor: curatorCoder }));
    expect(refused.code).toBe("forbidden");
    expect(refused.message).toMatch(/another curator/);
    expect((await stateOf(paperId)).state).toBe("submitted");
    await expect(verifyEntry({ paperId, actor: secondCurator })).resolves.toBe("verified");
  });

  it("an admin who coded the paper is bound by the same rule", async () => {
    const admin = await person("admin");
    const paperId = await newDraft(admin);
    await submitEntry({ paperId, actor: admin });
    expect(await refusal(verifyEntry({ paperId, actor: admin }))).toMatchObject({ code: "forbidden" });
  });

  it("steps out of order are refused as conflicts: a draft cannot be verified, a verified entry not verified or submitted again", async () => {
    const coder = await person("contributor");
    const curator = await person("curator");
    const paperId = await newDraft(coder);
    expect(await refusal(verifyEntry({ paperId, actor: curator }))).toMatchObject({ code: "conflict" });
    expect(await refusal(returnEntry({ paperId, comment: "too early to say", actor: curator }))).toMatchObject({ code: "conflict" });
    await submitEntry({ paperId, actor: coder });
    expect(await refusal(submitEntry({ paperId, actor: coder }))).toMatchObject({ code: "conflict" });
    await verifyEntry({ paperId, actor: curator });
    expect(await refusal(verifyEntry({ paperId, actor: curator }))).toMatchObject({ code: "conflict" });
    expect(await refusal(submitEntry({ paperId, actor: coder }))).toMatchObject({ code: "conflict" });
  });

  it("submitting from a stale version is refused, so a coder never submits what they have not seen", async () => {
    const coder = await person("contributor");
    const paperId = await newDraft(coder);
    await save(paperId, coder, twoModelDocument(1));
    expect(await refusal(submitEntry({ paperId, version: 1, actor: coder }))).toMatchObject({ code: "conflict" });
  });
});

describe("a correction to a verified entry", () => {
  it("returns the verified entry to its coder, hides it from the public until it is verified again", async () => {
    const coder = await person("contributor");
    const curatorA = await person("curator");
    const curatorB = await person("curator");
    const paperId = await newDraft(coder);
    await save(paperId, coder, twoModelDocument(1));
    await submitEntry({ paperId, actor: coder });
    await verifyEntry({ paperId, actor: curatorA });

    // only a curator may send it back
    expect(await refusal(returnEntry({ paperId, comment: "The authors' erratum changes Table 2.", actor: coder }))).toMatchObject({ code: "forbidden" });
    await expect(returnEntry({ paperId, comment: "The authors' erratum changes Table 2.", actor: curatorB })).resolves.toBe("returned");
    expect(await stateOf(paperId)).toMatchObject({ state: "returned", curatorComment: "The authors' erratum changes Table 2." });
    const { models } = await db();
    expect(await models.Paper.count({ where: { id: paperId, state: "verified" } })).toBe(0);
    const mail = await models.OutboxMessage.findOne({ where: { to: coder.email, kind: "entry-returned" }, order: [["id", "DESC"]] });
    expect(mail?.text).toContain("The authors' erratum changes Table 2.");
    const event = await models.AuditEvent.findOne({ where: { entity: "Paper", entityId: String(paperId), action: "return" }, order: [["id", "DESC"]] });
    expect([event?.before, event?.after]).toMatchObject([{ state: "verified" }, { state: "returned" }]);

    // the coder fixes and resubmits it; a curator verifies it again
    await expect(submitEntry({ paperId, actor: coder })).resolves.toBe("submitted");
    await expect(verifyEntry({ paperId, actor: curatorB })).resolves.toBe("verified");
  });
});
