import "server-only";
import { readAccountState, type AccountState } from "@/lib/db/queries/users";

// A JWT outlives a suspension or a role change, so every request re-reads the account's role and
// status (DESIGN §2: "its sessions stop working"). The read is cached for a few seconds so a page that
// asks several times costs one query. The cache is per process: a change made here is forgotten at
// once (forgetAccount); one made by another instance is seen here within TTL_MS.

export const ACCOUNT_TTL_MS = 5_000;

interface Entry {
  value: AccountState | null;
  expiresAt: number;
}

export interface AccountCache {
  read(userId: number): Promise<AccountState | null>;
  forget(userId: number): void;
  clear(): void;
}

export function createAccountCache(options: { load: (userId: number) => Promise<AccountState | null>; ttlMs?: number; now?: () => number; maxEntries?: number }): AccountCache {
  const ttl = options.ttlMs ?? ACCOUNT_TTL_MS;
  const now = options.now ?? Date.now;
  const maxEntries = options.maxEntries ?? 5_000;
  const entries = new Map<number, Entry>();
  return {
    async read(userId) {
      const at = now();
      const cached = entries.get(userId);
      if (cached && cached.expiresAt > at) return cached.value;
      const value = await options.load(userId);
      if (entries.size >= maxEntries) entries.clear(); // crude bound; every entry is cheap to reload
      entries.set(userId, { value, expiresAt: at + ttl });
      return value;
    },
    forget(userId) {
      entries.delete(userId);
    },
    clear() {
      entries.clear();
    },
  };
}

// Shared across the route-handler and server-component bundles, like the database instance.
const globalForAccounts = globalThis as typeof globalThis & { __fitledgerAccounts?: AccountCache };
const shared = (globalForAccounts.__fitledgerAccounts ??= createAccountCache({ load: (userId) => readAccountState({ userId }) }));

export function readAccount(userId: number): Promise<AccountState | null> {
  return shared.read(userId);
}

/** Call after changing a person's role or status, so this process applies it on the next request. */
export function forgetAccount(userId: number): void {
  shared.forget(userId);
}

export function forgetAllAccounts(): void {
  shared.clear();
}
