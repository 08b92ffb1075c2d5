import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

// The session is the test's edge: the guard reads it through lib/auth/session.ts, replaced here.
const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.20",
}));
// revalidatePath needs Next's request scope; outside it there is no page cache to refresh.
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const { submitApplication } = await import("@/app/(auth)/actions");
const { approveApplicant } = await import("@/app/(admin)/admin/people/actions");
const { IDLE_STATE } = await import("@/lib/auth/action-state");
const { db } = await import("@/lib/db");
const { auditOf, createPerson, form, outboxFor, PASSWORD, SESSION_COOKIE, sessionFor, signIn, statusOf } = await import("./support");

let database: TestDatabase;
let admins: { id: number; email: string }[];
const applicant = { name: "Ilse Marchetti", email: "ilse.marchetti@uni-example.org", affiliation: "Institute of Survey Methods", reason: "I audit invariance claims in published CFA studies." };
const applicantPassword = "nested models need df";
let applicantId: number;

beforeAll(async () => {
  database = await createTestDatabase();
  admins = [await createPerson({ email: "first.admin@fitledger.test", role: "admin" }), await createPerson({ email: "second.admin@fitledger.test", role: "admin" })];
  await createPerson({ email: "resting.admin@fitledger.test", role: "admin", status: "suspended" });
});
afterAll(async () => {
  await database.destroy();
});

describe("apply → pending → approve → sign in", () => {
  it("an application makes a pending contributor account and says what happens next", async () => {
    const state = await submitApplication(IDLE_STATE, form({ ...applicant, password: applicantPassword, passwordConfirm: applicantPassword }));
    expect(state).toMatchObject({ ok: true, fieldErrors: {} });
    const { models } = await db();
    const row = await models.User.findOne({ where: { email: applicant.email } });
    expect(row).not.toBeNull();
    applicantId = row!.id;
    expect({ status: row!.status, role: row!.role, name: row!.name, affiliation: row!.affiliation }).toEqual({ status: "pending", role: "contributor", name: applicant.name, affiliation: applicant.affiliation });
  });

  it("e-mails every active admin, and only them, with the applicant's details", async () => {
    for (const admin of admins) {
      const mail = await outboxFor(admin.email);
      expect(mail.map((message) => message.kind)).toEqual(["application-received"]);
      expect(mail[0].text).toContain(applicant.reason);
      expect(mail[0].text).toContain("/admin/people?status=pending");
    }
    expect(await outboxFor("resting.admin@fitledger.test")).toEqual([]);
    expect((await outboxFor(applicant.email)).map((message) => message.kind)).toEqual(["application-acknowledged"]);
  });

  it("records the application in the audit log without the password hash", async () => {
    const [event] = await auditOf("User", applicantId);
    expect(event.action).toBe("apply");
    expect(event.after).toMatchObject({ email: applicant.email, status: "pending" });
    expect(event.after).not.toHaveProperty("passwordHash");
    expect(JSON.stringify(event.after)).not.toMatch(/\$2[aby]\$/);
  });

  it("a pending account is told its state at sign-in and gets no session", async () => {
    const attempt = await signIn(applicant.email, applicantPassword);
    expect(attempt.error).toBe("account-pending");
    expect(attempt.cookies[SESSION_COOKIE]).toBeUndefined();
  });

  it("an admin approves the application: active, audited, and the person is e-mailed", async () => {
    caller.userId = admins[0].id;
    const state = await approveApplicant(IDLE_STATE, form({ userId: applicantId, role: "contributor" }));
    expect(state.ok).toBe(true);
    expect(state.message).toContain(applicant.name);
    expect(await statusOf(applicantId)).toMatchObject({ status: "active", role: "contributor" });
    const approval = (await auditOf("User", applicantId)).find((event) => event.action === "approve");
    expect(approval).toMatchObject({ actorId: admins[0].id, before: { status: "pending" }, after: { status: "active" } });
    const mail = await outboxFor(applicant.email);
    expect(mail.map((message) => message.kind)).toEqual(["application-acknowledged", "account-approved"]);
    expect(mail[1].text).toContain("/signin");
  });

  it("approving twice is refused and changes nothing", async () => {
    const state = await approveApplicant(IDLE_STATE, form({ userId: applicantId, role: "admin" }));
    expect(state).toMatchObject({ ok: false, code: "conflict" });
    expect(await statusOf(applicantId)).toMatchObject({ status: "active", role: "contributor" });
  });

  it("the approved person signs in, and the session names them and their role", async () => {
    const attempt = await signIn(applicant.email, applicantPassword);
    expect(attempt.error).toBeNull();
    const token = attempt.cookies[SESSION_COOKIE];
    expect(token).toBeTruthy();
    const session = await sessionFor(token);
    expect(session.body.user).toEqual({ id: applicantId, name: applicant.name, email: applicant.email, role: "contributor" });
  });
});

describe("no account enumeration", () => {
  it("applying with a registered address shows the same outcome and mails that address a note", async () => {
    const state = await submitApplication(IDLE_STATE, form({ ...applicant, name: "Someone Else", password: "a different passphrase", passwordConfirm: "a different passphrase" }));
    const fresh = await submitApplication(IDLE_STATE, form({ ...applicant, email: "brand.new@uni-example.org", password: "a different passphrase", passwordConfirm: "a different passphrase" }));
    expect(state).toEqual(fresh);
    const { models } = await db();
    expect(await models.User.count({ where: { email: applicant.email } })).toBe(1);
    expect(await statusOf(applicantId)).toMatchObject({ status: "active" });
    expect((await outboxFor(applicant.email)).at(-1)?.kind).toBe("address-already-registered");
    // the existing password still works, the one in the second application does not
    expect((await signIn(applicant.email, applicantPassword)).error).toBeNull();
    expect((await signIn(applicant.email, "a different passphrase")).error).toBe("wrong-credentials");
  });

  it("a wrong password and an unknown address are refused with the same code", async () => {
    const wrongPassword = await signIn(applicant.email, "not the password at all");
    const unknown = await signIn("nobody.here@uni-example.org", PASSWORD);
    expect(wrongPassword.error).toBe("wrong-credentials");
    expect(unknown.error).toBe("wrong-credentials");
    expect(wrongPassword.status).toBe(unknown.status);
    expect(wrongPassword.cookies[SESSION_COOKIE]).toBeUndefined();
  });
});
