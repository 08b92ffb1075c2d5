import { describe, expect, it } from "vitest";
import { endedByCutoff, nextCutoff, sessionStart } from "@/lib/auth/session-cutoff";

// A cutoff half-way through a second, so that "the same second" has a before and an after.
const cutoff = new Date("2026-03-02T10:15:30.500Z");
const second = Math.floor(cutoff.getTime() / 1000);

describe("when a session began", () => {
  it("is the signedInAt claim in milliseconds when the token has one", () => {
    expect(sessionStart({ signedInAt: cutoff.getTime() + 1, iat: second + 5 })).toBe(cutoff.getTime() + 1);
  });

  it("falls back to the start of the iat second for a token without the claim", () => {
    expect(sessionStart({ iat: second })).toBe(second * 1000);
  });

  it("is unknown for a token that says neither", () => {
    expect(sessionStart({})).toBeNull();
    expect(sessionStart({ signedInAt: "yesterday", iat: Number.NaN })).toBeNull();
  });
});

describe("whether the account's cutoff ended a session", () => {
  it("never, while the account has no cutoff", () => {
    expect(endedByCutoff(0, null)).toBe(false);
  });

  it("a session begun in the cutoff's second but before it is ended; at or after it, it lives", () => {
    expect(endedByCutoff(cutoff.getTime() - 1, cutoff)).toBe(true);
    expect(endedByCutoff(cutoff.getTime(), cutoff)).toBe(false);
    expect(endedByCutoff(cutoff.getTime() + 499, cutoff)).toBe(false);
  });

  it("a token without the claim, issued in the cutoff's second, is ended (its iat cannot tell before from after)", () => {
    expect(endedByCutoff(sessionStart({ iat: second })!, cutoff)).toBe(true);
    expect(endedByCutoff(sessionStart({ iat: second + 1 })!, cutoff)).toBe(false);
  });
});

describe("the cutoff an event stores", () => {
  it("is now when the account has none or an earlier one", () => {
    const now = new Date("2026-03-02T11:00:00.000Z");
    expect(nextCutoff(null, now)).toBe(now);
    expect(nextCutoff(cutoff, now)).toBe(now);
  });

  it("keeps a later stored cutoff, so an event never brings ended sessions back", () => {
    const now = new Date("2026-03-02T10:00:00.000Z");
    expect(nextCutoff(cutoff, now)).toBe(cutoff);
  });
});
