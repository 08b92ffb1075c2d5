import { describe, expect, it } from "vitest";
import { canEditCoding, canRead, stepRefusal, STEPS } from "@/lib/curation/rules";

// The entry-state table of DESIGN §3 and the roles of §2, with issue 5's four-eyes rule.

const coder = { id: 1, role: "contributor" as const };
const otherContributor = { id: 2, role: "contributor" as const };
const curator = { id: 3, role: "curator" as const };
const entry = (state: "draft" | "submitted" | "returned" | "verified", createdBy = coder.id) => ({ state, createdBy });

describe("the state machine", () => {
  it("leads draft → submitted → returned → submitted → verified, and back to returned for a correction", () => {
    expect(STEPS.submit).toEqual({ from: ["draft", "returned"], to: "submitted" });
    expect(STEPS.return).toEqual({ from: ["submitted", "verified"], to: "returned" });
    expect(STEPS.verify).toEqual({ from: ["submitted"], to: "verified" });
  });

  it.each([
    ["submit", "submitted"],
    ["submit", "verified"],
    ["return", "draft"],
    ["return", "returned"],
    ["verify", "draft"],
    ["verify", "verified"],
  ] as const)("refuses to %s a %s entry", (step, state) => {
    expect(stepRefusal(step, entry(state), curator)).toMatch(/^This entry is/);
  });
});

describe("who may take each step", () => {
  it("the coder submits their own entry; another contributor cannot", () => {
    expect(stepRefusal("submit", entry("draft"), coder)).toBeNull();
    expect(stepRefusal("submit", entry("draft"), otherContributor)).toMatch(/Only the person who coded/);
  });

  it("only curators return and verify", () => {
    expect(stepRefusal("return", entry("submitted"), otherContributor)).toMatch(/Only a curator/);
    expect(stepRefusal("verify", entry("submitted"), otherContributor)).toMatch(/Only a curator/);
    expect(stepRefusal("return", entry("submitted"), curator)).toBeNull();
    expect(stepRefusal("verify", entry("submitted"), curator)).toBeNull();
    // a verified entry goes back to its coder only through a curator
    expect(stepRefusal("return", entry("verified"), curator)).toBeNull();
    expect(stepRefusal("return", entry("verified"), coder)).toMatch(/Only a curator/);
  });

  it("four-eyes: a curator never verifies an entry they coded, but may return it", () => {
    expect(stepRefusal("verify", entry("submitted", curator.id), curator)).toMatch(/another curator/);
    expect(stepRefusal("return", entry("submitted", curator.id), curator)).toBeNull();
    expect(stepRefusal("verify", entry("submitted", curator.id), { id: 9, role: "admin" })).toBeNull();
  });
});

describe("reading and editing", () => {
  it("an unverified entry is read by its coder and curators only; a verified one by anyone", () => {
    expect(canRead(entry("draft"), null)).toBe(false);
    expect(canRead(entry("draft"), otherContributor)).toBe(false);
    expect(canRead(entry("draft"), coder)).toBe(true);
    expect(canRead(entry("submitted"), curator)).toBe(true);
    expect(canRead(entry("verified"), null)).toBe(true);
  });

  it("the coder edits a draft or returned entry; a curator a submitted or returned one; nobody a verified one", () => {
    expect(canEditCoding(entry("draft"), coder)).toBe(true);
    expect(canEditCoding(entry("returned"), coder)).toBe(true);
    expect(canEditCoding(entry("submitted"), coder)).toBe(false);
    expect(canEditCoding(entry("draft"), curator)).toBe(false);
    expect(canEditCoding(entry("submitted"), curator)).toBe(true);
    expect(canEditCoding(entry("verified"), curator)).toBe(false);
  });
});
