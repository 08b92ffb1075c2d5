import { describe, expect, it } from "vitest";
import { ACCOUNT_TTL_MS, createAccountCache } from "@/lib/auth/account-cache";
import type { AccountState } from "@/lib/db/queries/users";

function setup() {
  let now = 0;
  let stored: AccountState = { id: 7, email: "k@example.org", name: "K", role: "curator", status: "active" };
  let loads = 0;
  const cache = createAccountCache({
    load: async () => {
      loads += 1;
      return { ...stored };
    },
    now: () => now,
  });
  return {
    cache,
    loads: () => loads,
    advance: (ms: number) => (now += ms),
    change: (next: Partial<AccountState>) => (stored = { ...stored, ...next }),
  };
}

describe("the per-request account read", () => {
  it("reads the database once for repeated reads within the TTL", async () => {
    const { cache, loads } = setup();
    await cache.read(7);
    await cache.read(7);
    expect(loads()).toBe(1);
  });

  it("a change made elsewhere is seen once the entry is older than the TTL (5 s)", async () => {
    const { cache, advance, change } = setup();
    await cache.read(7);
    change({ status: "suspended" });
    advance(ACCOUNT_TTL_MS - 1);
    expect((await cache.read(7))?.status).toBe("active");
    advance(1);
    expect((await cache.read(7))?.status).toBe("suspended");
    expect(ACCOUNT_TTL_MS).toBe(5_000);
  });

  it("forget makes the next read go to the database at once", async () => {
    const { cache, change, loads } = setup();
    await cache.read(7);
    change({ role: "reader" });
    cache.forget(7);
    expect((await cache.read(7))?.role).toBe("reader");
    expect(loads()).toBe(2);
  });
});
