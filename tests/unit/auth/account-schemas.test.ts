import { describe, expect, it } from "vitest";
import { applySchema, changePasswordSchema, PASSWORD_RULE, peopleQuerySchema, resetConfirmSchema } from "@/lib/validation/account";

const valid = { name: "  Jun Park ", email: " Jun.Park@Example.ORG ", affiliation: "", reason: "Auditing CFA papers.", password: "fitted models agree", passwordConfirm: "fitted models agree" };
const fieldErrors = (result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  Object.fromEntries((result.error?.issues ?? []).map((issue) => [String(issue.path[0]), issue.message]));

describe("the application schema", () => {
  it("trims and lower-cases the address, trims the name and turns an empty affiliation into null", () => {
    const parsed = applySchema.parse(valid);
    expect(parsed).toMatchObject({ name: "Jun Park", email: "jun.park@example.org", affiliation: null });
  });

  it("drops fields it does not know, such as a forged role", () => {
    expect(applySchema.parse({ ...valid, role: "admin", status: "active" })).not.toHaveProperty("role");
  });

  it("states its password rule and enforces it: 12 characters, at most 72 bytes, not the address", () => {
    expect(PASSWORD_RULE).toMatch(/12 characters/);
    expect(fieldErrors(applySchema.safeParse({ ...valid, password: "short one", passwordConfirm: "short one" })).password).toMatch(/at least 12/);
    const long = "éàüö".repeat(10); // 40 characters, 80 bytes in UTF-8
    expect(fieldErrors(applySchema.safeParse({ ...valid, password: long, passwordConfirm: long })).password).toMatch(/72 bytes/);
    expect(fieldErrors(applySchema.safeParse({ ...valid, password: "aaaaaaaaaaaaaaaa", passwordConfirm: "aaaaaaaaaaaaaaaa" })).password).toMatch(/different characters/);
    const same = "jun.park@example.org";
    expect(fieldErrors(applySchema.safeParse({ ...valid, password: same, passwordConfirm: same })).password).toMatch(/e-mail address/);
  });

  it("requires the two passwords to match", () => {
    expect(fieldErrors(applySchema.safeParse({ ...valid, passwordConfirm: "something else entirely" })).passwordConfirm).toMatch(/differ/);
    expect(fieldErrors(changePasswordSchema.safeParse({ currentPassword: "x", newPassword: "a long new phrase", newPasswordConfirm: "nope" })).newPasswordConfirm).toMatch(/differ/);
  });

  it("refuses names over 200 characters, reasons over 2000 and malformed addresses", () => {
    const errors = fieldErrors(applySchema.safeParse({ ...valid, name: "n".repeat(10_000), reason: "r".repeat(2001), email: "not an address" }));
    expect(Object.keys(errors).sort()).toEqual(["email", "name", "reason"]);
  });

  it("keeps markup as plain text: validation neither strips nor rejects it", () => {
    expect(applySchema.parse({ ...valid, name: "<b>Jun</b>" }).name).toBe("<b>Jun</b>");
  });
});

describe("other schemas", () => {
  it("a reset needs a token of plausible length", () => {
    expect(resetConfirmSchema.safeParse({ token: "abc", password: "long enough phrase", passwordConfirm: "long enough phrase" }).success).toBe(false);
  });
  it("the people page falls back to defaults for nonsense in its address", () => {
    expect(peopleQuerySchema.parse({ status: "everyone", page: "-3", q: ["a", "b"] })).toEqual({ status: "pending", page: 1, q: "" });
  });
});
