import { describe, expect, it } from "vitest";
import { clientAddressFrom } from "@/lib/auth/client-address";
import { signInMessage } from "@/lib/auth/refusals";
import { hasRole, ROLE_ORDER } from "@/lib/auth/roles";
import { safeLocalPath } from "@/lib/auth/safe-path";

describe("roles", () => {
  it("each role includes the ones before it (DESIGN §2)", () => {
    expect(ROLE_ORDER).toEqual(["reader", "contributor", "curator", "admin"]);
    expect(hasRole("admin", "curator")).toBe(true);
    expect(hasRole("curator", "contributor")).toBe(true);
    expect(hasRole("contributor", "curator")).toBe(false);
    expect(hasRole("reader", "reader")).toBe(true);
  });
});

describe("where a sign-in may send the person next", () => {
  it("keeps paths on this site", () => {
    expect(safeLocalPath("/admin/people?status=pending")).toBe("/admin/people?status=pending");
  });
  it("replaces other sites, protocol-relative and backslash tricks with the workbench", () => {
    for (const value of ["https://elsewhere.example/", "//elsewhere.example", "/\\elsewhere.example", "javascript:alert(1)", "", null]) expect(safeLocalPath(value)).toBe("/workbench");
  });
});

describe("the caller's network address", () => {
  it("takes the first X-Forwarded-For entry, then X-Real-IP, else 'unknown'", () => {
    expect(clientAddressFrom(new Headers({ "x-forwarded-for": "203.0.113.1, 10.0.0.1" }))).toBe("203.0.113.1");
    expect(clientAddressFrom({ "x-real-ip": "203.0.113.2" })).toBe("203.0.113.2");
    expect(clientAddressFrom({})).toBe("unknown");
  });
});

describe("sign-in messages", () => {
  it("a wrong password and next-auth's own refusal read the same, and never say which part was wrong", () => {
    expect(signInMessage("CredentialsSignin")).toBe(signInMessage("wrong-credentials"));
    expect(signInMessage("wrong-credentials")).not.toMatch(/password is wrong|no account|unknown/i);
  });
  it("names the account's state for pending, declined and suspended accounts", () => {
    expect(signInMessage("account-pending")).toMatch(/waiting for an admin/);
    expect(signInMessage("account-declined")).toMatch(/declined/);
    expect(signInMessage("account-suspended")).toMatch(/suspended/);
    expect(signInMessage("something-else")).toMatch(/did not work/);
  });
});
