import { describe, expect, it } from "vitest";
import { isStuck, STUCK_AFTER_ATTEMPTS } from "@/lib/mail/outbox";
import { RETRY_MAX_MS, retryDelayMs } from "@/lib/mail/sender";
import { SENSITIVE_KINDS } from "@/lib/mail/templates";

describe("retrying a failed send", () => {
  it("waits 30 s after the first failure and doubles each time", () => {
    expect([1, 2, 3, 4].map(retryDelayMs)).toEqual([30_000, 60_000, 120_000, 240_000]);
  });

  it("never waits more than an hour, however often it failed, and never gives up", () => {
    expect(retryDelayMs(8)).toBe(RETRY_MAX_MS);
    expect(retryDelayMs(1000)).toBe(60 * 60_000);
  });
});

describe("a stuck message", () => {
  const now = new Date("2025-03-01T12:00:00Z");
  it(`is one that failed ${STUCK_AFTER_ATTEMPTS} times`, () => {
    expect(isStuck({ attempts: STUCK_AFTER_ATTEMPTS, createdAt: now }, now)).toBe(true);
    expect(isStuck({ attempts: STUCK_AFTER_ATTEMPTS - 1, createdAt: now }, now)).toBe(false);
  });
  it("or one waiting more than a quarter of an hour", () => {
    expect(isStuck({ attempts: 0, createdAt: new Date(now.getTime() - 16 * 60_000) }, now)).toBe(true);
    expect(isStuck({ attempts: 0, createdAt: new Date(now.getTime() - 14 * 60_000) }, now)).toBe(false);
  });
});

describe("messages that hold a secret", () => {
  it("are the password reset links, whose bodies are removed once delivered", () => {
    expect([...SENSITIVE_KINDS]).toEqual(["password-reset"]);
  });
});
