import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.23",
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));
// a password change renews the caller's session cookie (ending-sessions.test.ts looks at that cookie)
vi.mock("next/headers", async () => (await import("./request-context")).nextHeaders);

const { requestResetLink, setPasswordFromLink } = await import("@/app/(auth)/actions");
const { changeOwnPassword } = await import("@/app/(account)/account/actions");
const { IDLE_STATE } = await import("@/lib/auth/action-state");
const { hashResetToken, RESET_TTL_MINUTES } = await import("@/lib/auth/password-reset");
const { clearRateLimits } = await import("@/lib/auth/limits");
const { db } = await import("@/lib/db");
const { auditOf, createPerson, form, outboxFor, PASSWORD, signIn } = await import("./support");

let database: TestDatabase;
let person: { id: number; email: string };

/** The token in the newest reset e-mail queued for `email`, read from the link the person would click. */
async function tokenFromLatestMail(email: string): Promise<string> {
  const mail = (await outboxFor(email)).filter((message) => message.kind === "password-reset").at(-1);
  const link = /https?:\/\/\S+\/reset\/new\?token=(\S+)/.exec(mail?.text ?? "");
  if (!link) throw new Error("no reset link in the outbox");
  return decodeURIComponent(link[1]);
}

async function tokenRows(userId: number) {
  const { models } = await db();
  return (await models.PasswordResetToken.unscoped().findAll({ where: { userId }, order: [["id", "ASC"]] })).map((row) => row.get({ plain: true }));
}

beforeAll(async () => {
  database = await createTestDatabase();
  person = await createPerson({ email: "amara.lind@example.org", name: "Amara Lind" });
  await createPerson({ email: "still.waiting@example.org", status: "pending" });
});
afterAll(async () => {
  await database.destroy();
});

describe("password reset by e-mailed link", () => {
  it("answers the same for a registered, a pending and an unknown address, and mails only the active account", async () => {
    const registered = await requestResetLink(IDLE_STATE, form({ email: person.email }));
    const pending = await requestResetLink(IDLE_STATE, form({ email: "still.waiting@example.org" }));
    const unknown = await requestResetLink(IDLE_STATE, form({ email: "no.account@example.org" }));
    expect(registered.ok).toBe(true);
    expect(pending).toEqual(registered);
    expect(unknown).toEqual(registered);
    expect((await outboxFor(person.email)).map((message) => message.kind)).toEqual(["password-reset"]);
    expect(await outboxFor("still.waiting@example.org")).toEqual([]);
    expect(await outboxFor("no.account@example.org")).toEqual([]);
  });

  it("stores only the token's hash, expiring an hour after the request", async () => {
    const token = await tokenFromLatestMail(person.email);
    const [row] = await tokenRows(person.id);
    expect(token.length).toBeGreaterThanOrEqual(43); // 32 random bytes, base64url
    expect(row.tokenHash).toBe(hashResetToken(token));
    expect(row.tokenHash).not.toContain(token);
    const minutes = (new Date(row.expiresAt).getTime() - new Date(row.createdAt).getTime()) / 60_000;
    expect(minutes).toBeCloseTo(RESET_TTL_MINUTES, 1);
    const [event] = await auditOf("PasswordResetToken", row.id);
    expect(JSON.stringify(event)).not.toContain(row.tokenHash);
  });

  it("the link sets a new password once: the new one signs in, the old one no longer does", async () => {
    const token = await tokenFromLatestMail(person.email);
    const state = await setPasswordFromLink(IDLE_STATE, form({ token, password: "reset with a fresh phrase", passwordConfirm: "reset with a fresh phrase" }));
    expect(state.ok).toBe(true);
    expect((await signIn(person.email, "reset with a fresh phrase")).error).toBeNull();
    expect((await signIn(person.email, PASSWORD)).error).toBe("wrong-credentials");
    expect((await outboxFor(person.email)).at(-1)?.kind).toBe("password-changed");
  });

  it("the same link a second time is refused and changes nothing", async () => {
    const token = await tokenFromLatestMail(person.email);
    const state = await setPasswordFromLink(IDLE_STATE, form({ token, password: "a second try at this", passwordConfirm: "a second try at this" }));
    expect(state).toMatchObject({ ok: false, code: "bad_request" });
    expect(state.message).toMatch(/expired or has already been used/);
    expect((await signIn(person.email, "reset with a fresh phrase")).error).toBeNull();
    expect((await signIn(person.email, "a second try at this")).error).toBe("wrong-credentials");
  });

  it("an expired link is refused and changes nothing", async () => {
    clearRateLimits();
    await requestResetLink(IDLE_STATE, form({ email: person.email }));
    const token = await tokenFromLatestMail(person.email);
    const { models } = await db();
    await models.PasswordResetToken.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { tokenHash: hashResetToken(token) } });
    const state = await setPasswordFromLink(IDLE_STATE, form({ token, password: "too late for this one", passwordConfirm: "too late for this one" }));
    expect(state).toMatchObject({ ok: false, code: "bad_request" });
    expect((await signIn(person.email, "too late for this one")).error).toBe("wrong-credentials");
  });

  it("a made-up token and a weak new password are refused with clear messages", async () => {
    const madeUp = await setPasswordFromLink(IDLE_STATE, form({ token: "x".repeat(43), password: "a perfectly fine phrase", passwordConfirm: "a perfectly fine phrase" }));
    expect(madeUp).toMatchObject({ ok: false, code: "bad_request" });
    const weak = await setPasswordFromLink(IDLE_STATE, form({ token: "x".repeat(43), password: "short", passwordConfirm: "short" }));
    expect(weak.fieldErrors.password?.[0]).toMatch(/at least 12/);
  });

  it("changing the password while signed in revokes links that are still open", async () => {
    clearRateLimits();
    await requestResetLink(IDLE_STATE, form({ email: person.email }));
    const token = await tokenFromLatestMail(person.email);
    caller.userId = person.id;
    const wrongCurrent = await changeOwnPassword(IDLE_STATE, form({ currentPassword: "not my password", newPassword: "changed from my account", newPasswordConfirm: "changed from my account" }));
    expect(wrongCurrent.fieldErrors.currentPassword).toEqual(["That is not your current password."]);
    const changed = await changeOwnPassword(IDLE_STATE, form({ currentPassword: "reset with a fresh phrase", newPassword: "changed from my account", newPasswordConfirm: "changed from my account" }));
    expect(changed.ok).toBe(true);
    const viaLink = await setPasswordFromLink(IDLE_STATE, form({ token, password: "sneaking in by link", passwordConfirm: "sneaking in by link" }));
    expect(viaLink).toMatchObject({ ok: false, code: "bad_request" });
    expect((await signIn(person.email, "changed from my account")).error).toBeNull();
  });
});
