import { afterAll, beforeEach, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.24",
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const { changeAccountRole, suspendAccount } = await import("@/app/(admin)/admin/people/actions");
const { IDLE_STATE } = await import("@/lib/auth/action-state");
const { changeRole, suspendPerson } = await import("@/lib/auth/accounts");
const { db } = await import("@/lib/db");
const { createPerson, form, statusOf } = await import("./support");

let database: TestDatabase | undefined;
beforeEach(async () => {
  await database?.destroy();
  database = await createTestDatabase();
});
afterAll(async () => {
  await database?.destroy();
});

async function activeAdmins(): Promise<number> {
  const { models } = await db();
  return models.User.count({ where: { role: "admin", status: "active" } });
}

describe("admins and their own account", () => {
  it("an admin cannot change their own role", async () => {
    const admin = await createPerson({ email: "solo@fitledger.test", role: "admin" });
    caller.userId = admin.id;
    const state = await changeAccountRole(IDLE_STATE, form({ userId: admin.id, role: "curator" }));
    expect(state).toMatchObject({ ok: false, code: "forbidden" });
    expect(state.message).toMatch(/your own role/);
    expect(await statusOf(admin.id)).toMatchObject({ role: "admin", status: "active" });
  });

  it("demoting another admin works while one active admin remains", async () => {
    const first = await createPerson({ email: "first@fitledger.test", role: "admin" });
    const second = await createPerson({ email: "second@fitledger.test", role: "admin" });
    caller.userId = first.id;
    expect((await changeAccountRole(IDLE_STATE, form({ userId: second.id, role: "curator" }))).ok).toBe(true);
    expect(await activeAdmins()).toBe(1);
  });

  it("the demoted admin can no longer act as one", async () => {
    const first = await createPerson({ email: "first@fitledger.test", role: "admin" });
    const second = await createPerson({ email: "second@fitledger.test", role: "admin" });
    caller.userId = first.id;
    await changeAccountRole(IDLE_STATE, form({ userId: second.id, role: "curator" }));
    caller.userId = second.id;
    expect(await changeAccountRole(IDLE_STATE, form({ userId: first.id, role: "curator" }))).toMatchObject({ ok: false, code: "forbidden" });
    expect(await statusOf(first.id)).toMatchObject({ role: "admin" });
  });
});

describe("the last active admin", () => {
  it("cannot be demoted, even when two admins demote each other at the same moment", async () => {
    const first = await createPerson({ email: "first@fitledger.test", role: "admin" });
    const second = await createPerson({ email: "second@fitledger.test", role: "admin" });
    const results = await Promise.allSettled([
      changeRole({ actor: first, userId: second.id, role: "curator" }),
      changeRole({ actor: second, userId: first.id, role: "curator" }),
    ]);
    expect(results.filter((result) => result.status === "fulfilled")).toHaveLength(1);
    const refused = results.find((result) => result.status === "rejected") as PromiseRejectedResult;
    expect(refused.reason).toMatchObject({ code: "conflict" });
    expect(refused.reason.message).toMatch(/last active admin/);
    expect(await activeAdmins()).toBe(1);
  });

  it("cannot be suspended by another admin at the same moment they suspend that admin", async () => {
    const first = await createPerson({ email: "first@fitledger.test", role: "admin" });
    const second = await createPerson({ email: "second@fitledger.test", role: "admin" });
    const results = await Promise.allSettled([
      suspendPerson({ actor: first, userId: second.id, reason: "handover" }),
      suspendPerson({ actor: second, userId: first.id, reason: "handover" }),
    ]);
    expect(results.filter((result) => result.status === "fulfilled")).toHaveLength(1);
    expect((results.find((result) => result.status === "rejected") as PromiseRejectedResult).reason).toMatchObject({ code: "conflict" });
    expect(await activeAdmins()).toBe(1);
  });

  it("stays an admin when the only other admin is suspended", async () => {
    const keeper = await createPerson({ email: "keeper@fitledger.test", role: "admin" });
    const other = await createPerson({ email: "other@fitledger.test", role: "admin" });
    caller.userId = keeper.id;
    expect((await suspendAccount(IDLE_STATE, form({ userId: other.id, reason: "on leave" }))).ok).toBe(true);
    expect(await activeAdmins()).toBe(1);
    // the suspended admin's session is refused, so it cannot demote the keeper
    caller.userId = other.id;
    expect(await changeAccountRole(IDLE_STATE, form({ userId: keeper.id, role: "reader" }))).toMatchObject({ ok: false, code: "unauthenticated" });
    expect(await statusOf(keeper.id)).toMatchObject({ role: "admin", status: "active" });
  });
});
