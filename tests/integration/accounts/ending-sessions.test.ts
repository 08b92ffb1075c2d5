import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

// Events that end every session issued before them (DESIGN §2): a password reset by link, a password
// change in /account (except the session that made it), a suspension and a decline. Nothing stands in
// for the session code: the request's cookies come from a stand-in for next/headers, next-auth decodes
// them and runs the real jwt callback against the temp database.
vi.mock("next/headers", async () => (await import("./request-context")).nextHeaders);
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const { approveApplicant, declineApplicant, reactivateAccount, suspendAccount } = await import("@/app/(admin)/admin/people/actions");
const { changeOwnPassword, saveProfile } = await import("@/app/(account)/account/actions");
const { requestResetLink, setPasswordFromLink } = await import("@/app/(auth)/actions");
const { IDLE_STATE } = await import("@/lib/auth/action-state");
const { forgetAccount } = await import("@/lib/auth/account-cache");
const { clearRateLimits } = await import("@/lib/auth/limits");
const { issueSessionToken } = await import("@/lib/auth/options");
const { readSessionFrom } = await import("@/lib/auth/session");
const { db } = await import("@/lib/db");
const { env } = await import("@/lib/env");
const { decode, encode } = await import("next-auth/jwt");
const { browser } = await import("./request-context");
const { auditOf, createPerson, form, outboxFor, PASSWORD, SESSION_COOKIE, sessionFor, signIn } = await import("./support");

let database: TestDatabase;
let admin: { id: number; email: string; name: string; role: "admin" };

/** Whether next-auth still accepts this session token, asked both ways the app asks. */
async function works(token: string): Promise<boolean> {
  const identity = await readSessionFrom({ headers: {}, cookies: { [SESSION_COOKIE]: token } });
  const session = await sessionFor(token);
  // both views must agree, else the test itself is wrong
  expect(Boolean(session.body.user)).toBe(identity !== null);
  return identity !== null;
}

async function signedIn(email: string, password = PASSWORD): Promise<string> {
  const attempt = await signIn(email, password);
  expect(attempt.error).toBeNull();
  return attempt.cookies[SESSION_COOKIE];
}

async function claims(token: string) {
  const payload = await decode({ token, secret: env.authSecret() });
  if (!payload) throw new Error("not a session token");
  return payload;
}

async function cutoffOf(userId: number): Promise<Date | null> {
  const { models } = await db();
  return (await models.User.findByPk(userId, { attributes: ["sessionsValidAfter"] }))?.sessionsValidAfter ?? null;
}

async function setCutoff(userId: number, cutoff: Date | null): Promise<void> {
  const { models } = await db();
  await models.User.update({ sessionsValidAfter: cutoff }, { where: { id: userId } });
  forgetAccount(userId);
}

async function asAdmin(): Promise<void> {
  browser.use({ [SESSION_COOKIE]: await signedIn(admin.email) });
}

beforeAll(async () => {
  database = await createTestDatabase();
  admin = { ...(await createPerson({ email: "gate.keeper@fitledger.test", role: "admin" })), role: "admin" };
});
afterAll(async () => {
  await database.destroy();
});

describe("a password reset by e-mailed link", () => {
  let person: { id: number; email: string };
  let onLaptop: string;
  let onPhone: string;

  beforeAll(async () => {
    clearRateLimits();
    person = await createPerson({ email: "lena.brandt@example.org", name: "Lena Brandt" });
    onLaptop = await signedIn(person.email);
    onPhone = await signedIn(person.email);
  });

  it("before: both sessions work and the account has no cutoff", async () => {
    expect(await works(onLaptop)).toBe(true);
    expect(await works(onPhone)).toBe(true);
    expect(await cutoffOf(person.id)).toBeNull();
  });

  it("after the reset, every session issued before it is signed out and its cookie cleared", async () => {
    browser.use({});
    expect((await requestResetLink(IDLE_STATE, form({ email: person.email }))).ok).toBe(true);
    const mail = (await outboxFor(person.email)).filter((message) => message.kind === "password-reset").at(-1);
    const token = decodeURIComponent(/\/reset\/new\?token=(\S+)/.exec(mail?.text ?? "")?.[1] ?? "");
    const state = await setPasswordFromLink(IDLE_STATE, form({ token, password: "a reset that locks thieves out", passwordConfirm: "a reset that locks thieves out" }));
    expect(state.ok).toBe(true);

    expect(await works(onLaptop)).toBe(false);
    expect(await works(onPhone)).toBe(false);
    expect((await sessionFor(onPhone)).cookies[SESSION_COOKIE]).toBe("");
    // the cutoff was written with the new password and is in the audit trail
    const reset = (await auditOf("User", person.id)).find((event) => event.action === "reset-password");
    expect(reset?.after).toHaveProperty("sessionsValidAfter");
    expect(await cutoffOf(person.id)).toBeInstanceOf(Date);
  });

  it("a guarded action sent with a pre-reset session is refused as signed out and changes nothing", async () => {
    browser.use({ [SESSION_COOKIE]: onLaptop });
    expect(await saveProfile(IDLE_STATE, form({ name: "Renamed By A Thief", affiliation: "" }))).toMatchObject({ ok: false, code: "unauthenticated" });
    const { models } = await db();
    expect((await models.User.findByPk(person.id))?.name).toBe("Lena Brandt");
  });

  it("signing in with the new password gives a session that works", async () => {
    const fresh = await signedIn(person.email, "a reset that locks thieves out");
    expect(await works(fresh)).toBe(true);
    browser.use({ [SESSION_COOKIE]: fresh });
    expect(await saveProfile(IDLE_STATE, form({ name: "Lena M. Brandt", affiliation: "" }))).toMatchObject({ ok: true });
  });
});

describe("a password change in /account", () => {
  let person: { id: number; email: string };
  let here: string;
  let elsewhere: string;
  let renewed: string;
  const NEW_PASSWORD = "changed while signed in here";

  beforeAll(async () => {
    clearRateLimits();
    person = await createPerson({ email: "otto.reyes@example.net", name: "Otto Reyes" });
    elsewhere = await signedIn(person.email);
    here = await signedIn(person.email);
  });

  it("a wrong current password changes nothing and ends no session", async () => {
    browser.use({ [SESSION_COOKIE]: here });
    const state = await changeOwnPassword(IDLE_STATE, form({ currentPassword: "not the password", newPassword: NEW_PASSWORD, newPasswordConfirm: NEW_PASSWORD }));
    expect(state).toMatchObject({ ok: false, code: "validation_failed" });
    expect(browser.takeWritten()).toEqual([]);
    expect(await cutoffOf(person.id)).toBeNull();
    expect(await works(elsewhere)).toBe(true);
  });

  it("the change renews the session that made it in the same response", async () => {
    browser.use({ [SESSION_COOKIE]: here });
    const state = await changeOwnPassword(IDLE_STATE, form({ currentPassword: PASSWORD, newPassword: NEW_PASSWORD, newPasswordConfirm: NEW_PASSWORD }));
    expect(state).toMatchObject({ ok: true });
    expect(state.message).toMatch(/other sessions are signed out/);
    const written = browser.takeWritten();
    expect(written.map((cookie) => cookie.name)).toEqual([SESSION_COOKIE]);
    expect(written[0].options).toMatchObject({ httpOnly: true, sameSite: "lax", path: "/" });
    renewed = written[0].value;
    expect(renewed).not.toBe(here);
  });

  it("the renewed session keeps working, for next-auth and for guarded actions", async () => {
    expect(await works(renewed)).toBe(true);
    expect((await sessionFor(renewed)).body.user).toMatchObject({ id: person.id, email: person.email });
    browser.use({ [SESSION_COOKIE]: renewed });
    expect(await saveProfile(IDLE_STATE, form({ name: "Otto R. Reyes", affiliation: "" }))).toMatchObject({ ok: true });
  });

  it("the renewed session begins exactly at the cutoff (the same millisecond still counts as after)", async () => {
    const cutoff = await cutoffOf(person.id);
    expect(cutoff).toBeInstanceOf(Date);
    expect((await claims(renewed)).signedInAt).toBe(cutoff!.getTime());
  });

  it("every other session is signed out, and so is the old token of the changing session", async () => {
    expect(await works(elsewhere)).toBe(false);
    expect(await works(here)).toBe(false);
  });

  it("a new sign-in with the new password works; the old password is refused", async () => {
    expect(await works(await signedIn(person.email, NEW_PASSWORD))).toBe(true);
    expect((await signIn(person.email, PASSWORD)).error).toBe("wrong-credentials");
  });
});

describe("where a session's beginning meets the cutoff", () => {
  let person: { id: number; email: string; name: string; role: "contributor" };
  // a cutoff in the middle of a second, so that every case below falls in that same second
  const cutoff = new Date(Math.floor(Date.now() / 1000) * 1000 - 60_000 + 500);

  beforeAll(async () => {
    person = { ...(await createPerson({ email: "ines.kowal@example.org", name: "Ines Kowal" })), role: "contributor" };
    await setCutoff(person.id, cutoff);
  });

  it("a session that began one millisecond before the cutoff is refused", async () => {
    expect(await works(await issueSessionToken({ ...person, status: "active" }, cutoff.getTime() - 1))).toBe(false);
  });

  it("sessions that began at or after the cutoff, within the same second, keep working", async () => {
    expect(await works(await issueSessionToken({ ...person, status: "active" }, cutoff.getTime()))).toBe(true);
    expect(await works(await issueSessionToken({ ...person, status: "active" }, cutoff.getTime() + 1))).toBe(true);
  });

  it("a refreshed token carries the time its session began, not the time it was re-encoded", async () => {
    const original = await issueSessionToken({ ...person, status: "active" }, cutoff.getTime() + 10);
    const refreshed = (await sessionFor(original)).cookies[SESSION_COOKIE];
    expect(refreshed).toBeTruthy();
    expect(refreshed).not.toBe(original);
    expect((await claims(refreshed)).signedInAt).toBe(cutoff.getTime() + 10);
  });

  it("a token from before the claim existed is judged by the start of its iat second", async () => {
    // what next-auth wrote before sessions carried signedInAt
    const legacy = await encode({ token: { sub: String(person.id), name: person.name, email: person.email, role: "contributor" }, secret: env.authSecret(), maxAge: 3600 });
    const iat = (await claims(legacy)).iat as number;
    await setCutoff(person.id, new Date(iat * 1000 + 1));
    expect(await works(legacy)).toBe(false);
    await setCutoff(person.id, new Date(iat * 1000));
    expect(await works(legacy)).toBe(true);
    // once read, the token keeps that beginning for good
    expect((await claims((await sessionFor(legacy)).cookies[SESSION_COOKIE])).signedInAt).toBe(iat * 1000);
  });
});

describe("a suspension", () => {
  let person: { id: number; email: string };
  let before: string;

  beforeAll(async () => {
    clearRateLimits();
    person = await createPerson({ email: "milan.sato@example.net", name: "Milan Sato" });
    before = await signedIn(person.email);
  });

  it("ends the session issued before it", async () => {
    expect(await works(before)).toBe(true);
    await asAdmin();
    expect((await suspendAccount(IDLE_STATE, form({ userId: person.id, reason: "Coding sheets shared with a non-member." }))).ok).toBe(true);
    expect(await works(before)).toBe(false);
    const suspend = (await auditOf("User", person.id)).find((event) => event.action === "suspend");
    expect(suspend?.after).toHaveProperty("sessionsValidAfter");
  });

  it("a reactivation does not bring the old session back", async () => {
    await asAdmin();
    expect((await reactivateAccount(IDLE_STATE, form({ userId: person.id }))).ok).toBe(true);
    expect(await works(before)).toBe(false);
    browser.use({ [SESSION_COOKIE]: before });
    expect(await saveProfile(IDLE_STATE, form({ name: "Back From The Dead", affiliation: "" }))).toMatchObject({ ok: false, code: "unauthenticated" });
  });

  it("after reactivation a new sign-in works", async () => {
    const fresh = await signedIn(person.email);
    expect(await works(fresh)).toBe(true);
    browser.use({ [SESSION_COOKIE]: fresh });
    expect(await saveProfile(IDLE_STATE, form({ name: "Milan K. Sato", affiliation: "" }))).toMatchObject({ ok: true });
  });

  it("a second suspension never moves the cutoff back", async () => {
    const first = await cutoffOf(person.id);
    const later = new Date(Date.now() + 3_600_000); // as if another instance's clock ran an hour ahead
    await setCutoff(person.id, later);
    await asAdmin();
    expect((await suspendAccount(IDLE_STATE, form({ userId: person.id, reason: "Again." }))).ok).toBe(true);
    expect((await cutoffOf(person.id))?.getTime()).toBe(later.getTime());
    expect(later.getTime()).toBeGreaterThan(first!.getTime());
  });
});

describe("a decline", () => {
  let applicant: { id: number; email: string; name: string; role: "contributor" };
  let before: string;

  beforeAll(async () => {
    clearRateLimits();
    applicant = { ...(await createPerson({ email: "noor.haddad@example.org", name: "Noor Haddad", status: "pending" })), role: "contributor" };
    // a pending account cannot sign in, so this token is minted the way the app mints one
    before = await issueSessionToken({ ...applicant, status: "pending" }, Date.now() - 1);
  });

  it("ends sessions issued before it, also once the applicant is approved after all", async () => {
    expect(await works(before)).toBe(false); // pending: refused for its status
    await asAdmin();
    expect((await declineApplicant(IDLE_STATE, form({ userId: applicant.id, reason: "Not coding for a registered audit." }))).ok).toBe(true);
    expect(await cutoffOf(applicant.id)).toBeInstanceOf(Date);
    await asAdmin();
    expect((await approveApplicant(IDLE_STATE, form({ userId: applicant.id, role: "contributor" }))).ok).toBe(true);
    expect(await works(before)).toBe(false);
  });

  it("after approval a new sign-in works", async () => {
    expect(await works(await signedIn(applicant.email))).toBe(true);
  });
});
