import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { seedDemo } from "@/seeders/demo-seed";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

// Saving a search through its server action, and the daily digest of newly verified comparisons that
// match it, queued in the outbox. Real SQLite; the session is replaced at its edge (lib/auth/session).

const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.8",
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));
vi.mock("@/lib/mail/sender", async (importOriginal) => ({ ...(await importOriginal<typeof import("@/lib/mail/sender")>()), wakeMailSender: () => undefined }));

const { saveSearch, removeSavedSearch } = await import("@/app/(public)/explore/actions");
const { IDLE_STATE } = await import("@/lib/auth/action-state");
const { runDigest } = await import("@/lib/digest");
const { listSavedSearches } = await import("@/lib/db/queries/saved-searches");

let database: TestDatabase;
let readerId: number;

const form = (values: Record<string, string>) => {
  const data = new FormData();
  for (const [key, value] of Object.entries(values)) data.set(key, value);
  return data;
};

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemo(database);
  readerId = (await database.models.User.findOne({ where: { role: "reader", status: "active" } }))!.id;
}, 120_000);
afterAll(async () => database.destroy());

describe("saved searches and their daily digest", () => {
  it("saves a view for the signed-in reader only, and refuses one without a name", async () => {
    caller.userId = readerId;
    const refused = await saveSearch(IDLE_STATE, form({ name: "", query: "code=just-identified-model" }));
    expect(refused).toMatchObject({ ok: false, code: "validation_failed" });
    expect(refused.fieldErrors.name).toBeTruthy();
    const saved = await saveSearch(IDLE_STATE, form({ name: "Just-identified", query: "code=just-identified-model&page=3", alerts: "on" }));
    expect(saved.ok).toBe(true);
    const list = await listSavedSearches({ userId: readerId });
    expect(list).toHaveLength(1);
    expect(list[0]).toMatchObject({ name: "Just-identified", query: "code=just-identified-model", alerts: true });
    caller.userId = null;
  });

  it("mails the comparisons verified since the last digest that match, once", async () => {
    const { models } = database;
    const search = await models.SavedSearch.findOne({ where: { userId: readerId } });
    // the search was saved "two days ago"; one matching paper was verified since
    const twoDaysAgo = new Date(Date.now() - 2 * 86_400_000);
    await search!.update({ lastNotifiedAt: twoDaysAgo });
    const matching = await models.Paper.findOne({
      where: { state: "verified" },
      include: [{ model: models.Flag, as: "flags", attributes: [], where: { code: "just-identified-model" }, required: true }],
    });
    expect(matching).not.toBeNull();
    await models.Paper.update({ verifiedAt: new Date(Date.now() - 86_400_000 * 3) }, { where: {}, validate: false });
    await matching!.update({ verifiedAt: new Date(Date.now() - 3_600_000) });
    const expected = await models.Comparison.count({ where: { paperId: matching!.id }, include: [{ model: models.Flag, as: "flags", attributes: [], where: { code: "just-identified-model" }, required: true }], distinct: true, col: "id" });

    const outboxBefore = await models.OutboxMessage.count();
    const first = await runDigest();
    expect(first.mailed).toBe(1);
    const messages = await models.OutboxMessage.findAll({ order: [["id", "DESC"]], limit: 1 });
    expect(await models.OutboxMessage.count()).toBe(outboxBefore + 1);
    const reader = await models.User.findByPk(readerId);
    expect(messages[0].to).toBe(reader!.email);
    expect(messages[0].subject).toContain(`${expected} new`);
    expect(messages[0].text).toContain(matching!.title);
    expect(messages[0].text).toContain("not evidence of misconduct");

    // the same day again: nothing is due
    const second = await runDigest();
    expect(second.checked).toBe(0);
    expect(await models.OutboxMessage.count()).toBe(outboxBefore + 1);
  });

  it("deletes only the caller's own saved search", async () => {
    const { models } = database;
    const search = await models.SavedSearch.findOne({ where: { userId: readerId } });
    const other = await models.User.findOne({ where: { role: "contributor", status: "active" } });
    caller.userId = other!.id;
    const refused = await removeSavedSearch(IDLE_STATE, form({ id: String(search!.id) }));
    expect(refused).toMatchObject({ ok: false, code: "not_found" });
    caller.userId = readerId;
    expect((await removeSavedSearch(IDLE_STATE, form({ id: String(search!.id) }))).ok).toBe(true);
    expect(await listSavedSearches({ userId: readerId })).toEqual([]);
    caller.userId = null;
  });
});
