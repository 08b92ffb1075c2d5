import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.21",
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const { approveApplicant, declineApplicant } = await import("@/app/(admin)/admin/people/actions");
const { IDLE_STATE } = await import("@/lib/auth/action-state");
const { auditOf, createPerson, form, outboxFor, PASSWORD, SESSION_COOKIE, signIn, statusOf } = await import("./support");

let database: TestDatabase;
let admin: { id: number };
let applicant: { id: number; email: string };

beforeAll(async () => {
  database = await createTestDatabase();
  admin = await createPerson({ email: "desk.admin@fitledger.test", role: "admin" });
  applicant = await createPerson({ email: "ravi.okafor@example.net", name: "Ravi Okafor", status: "pending" });
  caller.userId = admin.id;
});
afterAll(async () => {
  await database.destroy();
});

describe("declining an application", () => {
  it("needs a reason, and without one changes nothing", async () => {
    const state = await declineApplicant(IDLE_STATE, form({ userId: applicant.id, reason: "   " }));
    expect(state).toMatchObject({ ok: false, code: "validation_failed" });
    expect(state.fieldErrors.reason?.[0]).toMatch(/reason/);
    expect(await statusOf(applicant.id)).toMatchObject({ status: "pending" });
    expect(await outboxFor(applicant.email)).toEqual([]);
  });

  it("sets the account to declined, keeps the reason, audits it and e-mails the reason", async () => {
    const reason = "We only open accounts to people coding for a registered audit <b>project</b> at present.";
    const state = await declineApplicant(IDLE_STATE, form({ userId: applicant.id, reason }));
    expect(state.ok).toBe(true);
    expect(await statusOf(applicant.id)).toEqual({ status: "declined", role: "contributor", statusNote: reason });
    const event = (await auditOf("User", applicant.id)).find((entry) => entry.action === "decline");
    expect(event).toMatchObject({ actorId: admin.id, before: { status: "pending" }, after: { status: "declined", statusNote: reason } });
    const [mail] = await outboxFor(applicant.email);
    expect(mail.kind).toBe("account-declined");
    expect(mail.text).toContain(reason);
    // the reason is admin-typed text: escaped in the HTML part, never markup
    expect(mail.html).toContain("&lt;b&gt;project&lt;/b&gt;");
    expect(mail.html).not.toContain("<b>project</b>");
  });

  it("a declined account is told so at sign-in and gets no session", async () => {
    const attempt = await signIn(applicant.email, PASSWORD);
    expect(attempt.error).toBe("account-declined");
    expect(attempt.cookies[SESSION_COOKIE]).toBeUndefined();
  });

  it("cannot be declined twice, but can still be approved later", async () => {
    expect(await declineApplicant(IDLE_STATE, form({ userId: applicant.id, reason: "again" }))).toMatchObject({ ok: false, code: "conflict" });
    expect((await approveApplicant(IDLE_STATE, form({ userId: applicant.id, role: "reader" }))).ok).toBe(true);
    expect(await statusOf(applicant.id)).toEqual({ status: "active", role: "reader", statusNote: null });
  });

  it("an unknown account id is a clear error", async () => {
    expect(await declineApplicant(IDLE_STATE, form({ userId: 99_999, reason: "no one" }))).toMatchObject({ ok: false, code: "not_found" });
  });
});
