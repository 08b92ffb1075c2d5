import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.22",
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const { changeAccountRole, reactivateAccount, suspendAccount } = await import("@/app/(admin)/admin/people/actions");
const { saveProfile } = await import("@/app/(account)/account/actions");
const { IDLE_STATE } = await import("@/lib/auth/action-state");
const { authorizeCaller } = await import("@/lib/auth/guard");
const { readSessionFrom } = await import("@/lib/auth/session");
const { auditOf, createPerson, form, outboxFor, PASSWORD, SESSION_COOKIE, sessionFor, signIn, statusOf } = await import("./support");

let database: TestDatabase;
let admin: { id: number };
let coder: { id: number; email: string };

const as = (userId: number) => {
  caller.userId = userId;
};

beforeAll(async () => {
  database = await createTestDatabase();
  admin = await createPerson({ email: "keeper@fitledger.test", role: "admin" });
  coder = await createPerson({ email: "tomasz.w@example.net", name: "Tomasz W", role: "contributor" });
});
afterAll(async () => {
  await database.destroy();
});

describe("suspension takes effect on the next request", () => {
  let token: string;

  it("before: the contributor's session works for guarded actions and next-auth", async () => {
    const attempt = await signIn(coder.email, PASSWORD);
    token = attempt.cookies[SESSION_COOKIE];
    expect(await readSessionFrom({ headers: {}, cookies: { [SESSION_COOKIE]: token } })).toEqual({ userId: coder.id });
    as(coder.id);
    expect(await saveProfile(IDLE_STATE, form({ name: "Tomasz Wr.", affiliation: "" }))).toMatchObject({ ok: true });
  });

  it("a reason is required to suspend", async () => {
    as(admin.id);
    expect(await suspendAccount(IDLE_STATE, form({ userId: coder.id }))).toMatchObject({ ok: false, code: "validation_failed" });
    expect(await statusOf(coder.id)).toMatchObject({ status: "active" });
  });

  it("the admin suspends: audited, and the person is e-mailed the reason", async () => {
    as(admin.id);
    const state = await suspendAccount(IDLE_STATE, form({ userId: coder.id, reason: "Entries copied from another coder's sheet." }));
    expect(state.ok).toBe(true);
    expect(await statusOf(coder.id)).toMatchObject({ status: "suspended", statusNote: "Entries copied from another coder's sheet." });
    expect((await auditOf("User", coder.id)).map((event) => event.action)).toContain("suspend");
    const mail = await outboxFor(coder.email);
    expect(mail.at(-1)).toMatchObject({ kind: "account-suspended" });
    expect(mail.at(-1)?.text).toContain("Entries copied from another coder's sheet.");
  });

  it("the next guarded request from the same session is refused as signed out, and changes nothing", async () => {
    as(coder.id);
    const state = await saveProfile(IDLE_STATE, form({ name: "Changed After Suspension" }));
    expect(state).toMatchObject({ ok: false, code: "unauthenticated" });
    const { db } = await import("@/lib/db");
    const { models } = await db();
    expect((await models.User.findByPk(coder.id))?.name).toBe("Tomasz Wr.");
  });

  it("the JWT issued before the suspension no longer yields a session, and next-auth clears its cookie", async () => {
    expect(await readSessionFrom({ headers: {}, cookies: { [SESSION_COOKIE]: token } })).toBeNull();
    const session = await sessionFor(token);
    expect(session.body).toEqual({});
    expect(session.cookies[SESSION_COOKIE]).toBe("");
  });

  it("signing in again is refused with the account's state", async () => {
    const attempt = await signIn(coder.email, PASSWORD);
    expect(attempt.error).toBe("account-suspended");
    expect(attempt.cookies[SESSION_COOKIE]).toBeUndefined();
  });

  it("after reactivation the person can sign in again and is e-mailed", async () => {
    as(admin.id);
    expect((await reactivateAccount(IDLE_STATE, form({ userId: coder.id }))).ok).toBe(true);
    expect((await outboxFor(coder.email)).at(-1)?.kind).toBe("account-reactivated");
    expect((await signIn(coder.email, PASSWORD)).error).toBeNull();
  });
});

describe("a role change takes effect on the next request", () => {
  it("a contributor made reader loses contributor access at once, with the old JWT", async () => {
    const token = (await signIn(coder.email, PASSWORD)).cookies[SESSION_COOKIE];
    as(coder.id);
    await expect(authorizeCaller("contributor")).resolves.toMatchObject({ id: coder.id, role: "contributor" });
    as(admin.id);
    expect((await changeAccountRole(IDLE_STATE, form({ userId: coder.id, role: "reader" }))).ok).toBe(true);
    as(coder.id);
    await expect(authorizeCaller("contributor")).rejects.toMatchObject({ code: "forbidden", status: 403 });
    expect((await sessionFor(token)).body.user).toMatchObject({ id: coder.id, role: "reader" });
    expect((await outboxFor(coder.email)).at(-1)).toMatchObject({ kind: "role-changed" });
  });

  it("an admin cannot suspend their own account", async () => {
    as(admin.id);
    expect(await suspendAccount(IDLE_STATE, form({ userId: admin.id, reason: "testing" }))).toMatchObject({ ok: false, code: "forbidden" });
    expect(await statusOf(admin.id)).toMatchObject({ status: "active" });
  });
});
