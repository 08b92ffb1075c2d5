// How many worker threads the recheck command starts (lib/cli/recheck-pool.ts workerCount).
import { availableParallelism } from "node:os";
import { describe, expect, it } from "vitest";
import { workerCount } from "@/lib/cli/recheck-pool";

const MB = 1024 * 1024;

describe("recheck worker threads: how many", () => {
  it("uses none for a sheet under 2 MB, where starting them costs more than they save", () => {
    expect(workerCount(2 * MB - 1, undefined)).toBe(0);
  });

  it("uses one per core, at most four, from 2 MB on a machine with two cores or more", () => {
    const cores = availableParallelism();
    expect(workerCount(2 * MB, undefined)).toBe(cores >= 2 ? Math.min(cores, 4) : 0);
  });

  it("follows FITLEDGER_RECHECK_THREADS whatever the size, 0 meaning none", () => {
    expect(workerCount(100, "2")).toBe(2);
    expect(workerCount(50 * MB, "0")).toBe(0);
    expect(workerCount(50 * MB, " ")).toBe(workerCount(50 * MB, undefined));
  });

  it.each(["many", "-1", "1.5", "65"])("refuses %j", (setting) => {
    expect(() => workerCount(MB, setting)).toThrow(`FITLEDGER_RECHECK_THREADS must be a whole number from 0 to 64, not "${setting}"`);
  });
});
