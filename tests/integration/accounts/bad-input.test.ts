import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.26",
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const { POST: applyRoute } = await import("@/app/api/account/apply/route");
const { saveProfile } = await import("@/app/(account)/account/actions");
const { approveApplicant, changeAccountRole } = await import("@/app/(admin)/admin/people/actions");
const { IDLE_STATE } = await import("@/lib/auth/action-state");
const { clearRateLimits } = await import("@/lib/auth/limits");
const { db } = await import("@/lib/db");
const { createPerson, form, outboxFor, statusOf } = await import("./support");

let database: TestDatabase;
let admin: { id: number; email: string };
const context = { params: Promise.resolve({}) };
const goodApplication = { name: "Lea Brunner", email: "lea.brunner@example.org", affiliation: "", reason: "Coding MI studies.", password: "several words of passphrase", passwordConfirm: "several words of passphrase" };

function postApply(body: unknown, raw?: string) {
  return applyRoute(
    new Request("http://fitledger.test/api/account/apply", { method: "POST", headers: { "content-type": "application/json", "x-forwarded-for": "198.51.100.77" }, body: raw ?? JSON.stringify(body) }),
    context,
  );
}

async function userCount(): Promise<number> {
  const { models } = await db();
  return models.User.count();
}

beforeAll(async () => {
  database = await createTestDatabase();
  admin = await createPerson({ email: "gate@fitledger.test", role: "admin" });
});
beforeEach(() => clearRateLimits());
afterAll(async () => {
  await database.destroy();
});

describe("bad input to the application endpoint", () => {
  it("an invalid e-mail address is a 400 naming the field, and no account is made", async () => {
    const before = await userCount();
    const response = await postApply({ ...goodApplication, email: "lea.brunner(at)example" });
    expect(response.status).toBe(400);
    const body = await response.json();
    expect(body.error.code).toBe("validation_failed");
    expect(body.error.fields.email[0]).toMatch(/e-mail address/);
    expect(await userCount()).toBe(before);
  });

  it("a 10 000-character name is refused with the limit stated", async () => {
    const response = await postApply({ ...goodApplication, name: "N".repeat(10_000) });
    expect(response.status).toBe(400);
    expect((await response.json()).error.fields.name).toEqual(["Names have at most 200 characters."]);
    expect(await outboxFor(goodApplication.email)).toEqual([]);
  });

  it("a body that is not JSON is a clear 400", async () => {
    const response = await postApply(null, "{name: lea");
    expect(response.status).toBe(400);
    expect((await response.json()).error).toEqual({ code: "bad_request", message: "The request body is not valid JSON." });
  });

  it("a forged role and status in the body are ignored: the account is a pending contributor", async () => {
    const response = await postApply({ ...goodApplication, role: "admin", status: "active", id: 1 });
    expect(response.status).toBe(202);
    const { models } = await db();
    const row = await models.User.findOne({ where: { email: goodApplication.email } });
    expect({ role: row?.role, status: row?.status }).toEqual({ role: "contributor", status: "pending" });
    expect(await statusOf(admin.id)).toMatchObject({ role: "admin", status: "active" });
  });

  it("HTML and script in every field are stored as typed and escaped in the e-mail to admins", async () => {
    const hostile = { name: '<script>alert("n")</script>', email: "x.tag@example.org", affiliation: "<img src=x onerror=alert(1)>", reason: "<b>bold</b> & <i>claims</i>" };
    const response = await postApply({ ...goodApplication, ...hostile });
    expect(response.status).toBe(202);
    const { models } = await db();
    const row = await models.User.findOne({ where: { email: hostile.email } });
    expect({ name: row?.name, affiliation: row?.affiliation, reason: row?.reason }).toEqual({ name: hostile.name, affiliation: hostile.affiliation, reason: hostile.reason });
    const notice = (await outboxFor(admin.email)).at(-1);
    expect(notice?.html).toContain("&lt;script&gt;alert(&quot;n&quot;)&lt;/script&gt;");
    expect(notice?.html).toContain("&lt;img src=x onerror=alert(1)&gt;");
    expect(notice?.html).not.toMatch(/<script|<img|<b>/);
    expect(notice?.subject).toContain('<script>alert("n")</script>'); // a subject is plain text, not HTML
  });

  it("no answer ever carries a password hash, a password or a token", async () => {
    const response = await postApply({ ...goodApplication, email: "third.person@example.org" });
    const text = await response.text();
    expect(text).not.toMatch(/\$2[aby]\$|passwordHash|several words of passphrase|token/i);
  });
});

describe("bad input to the account and admin actions", () => {
  it("a forged id and role in the profile form change only the caller's own name", async () => {
    const coder = await createPerson({ email: "own.only@example.org", name: "Own Only", role: "contributor" });
    caller.userId = coder.id;
    const state = await saveProfile(IDLE_STATE, form({ name: "Renamed Myself", affiliation: "", id: admin.id, userId: admin.id, role: "admin" }));
    expect(state.ok).toBe(true);
    const { models } = await db();
    expect((await models.User.findByPk(coder.id))?.name).toBe("Renamed Myself");
    expect(await statusOf(coder.id)).toMatchObject({ role: "contributor" });
    expect((await models.User.findByPk(admin.id))?.name).not.toBe("Renamed Myself");
  });

  it("a role outside the list is refused, and the form is refilled without passwords", async () => {
    const person = await createPerson({ email: "waiting.one@example.org", status: "pending" });
    caller.userId = admin.id;
    const state = await approveApplicant(IDLE_STATE, form({ userId: person.id, role: "superuser" }));
    expect(state).toMatchObject({ ok: false, code: "validation_failed" });
    expect(state.fieldErrors.role).toEqual(["Choose one of the listed roles."]);
    expect(state.values).toEqual({ userId: String(person.id), role: "superuser" });
    expect(await statusOf(person.id)).toMatchObject({ status: "pending" });
  });

  it("a missing or malformed account id is refused before anything is read", async () => {
    caller.userId = admin.id;
    expect((await changeAccountRole(IDLE_STATE, form({ userId: "1 OR 1=1", role: "reader" }))).fieldErrors.userId).toBeDefined();
    expect((await changeAccountRole(IDLE_STATE, form({ role: "reader" }))).code).toBe("validation_failed");
    expect(await statusOf(admin.id)).toMatchObject({ role: "admin" });
  });

  it("an action's answer never carries the password fields back", async () => {
    caller.userId = null;
    const { submitApplication } = await import("@/app/(auth)/actions");
    const state = await submitApplication(IDLE_STATE, form({ ...goodApplication, email: "not-an-address" }));
    expect(state.ok).toBe(false);
    expect(state.values).not.toHaveProperty("password");
    expect(state.values).not.toHaveProperty("passwordConfirm");
    expect(JSON.stringify(state)).not.toContain(goodApplication.password);
  });
});
