import "server-only";
import { readSessionAccount, type AccountState, type SessionAccount } from "@/lib/db/queries/users";

// A JWT outlives a suspension or a role change, so every request re-reads the account's role and
// status (DESIGN §2: "its sessions stop working"), and the cutoff before which its sessions ended
// (lib/auth/session-cutoff.ts). The read is cached for a few seconds so a page that asks several times
// costs one query. The cache is per process: a change made here is forgotten at once (forgetAccount);
// one made by another instance is seen here within TTL_MS — a suspension and an ended session alike.

export const ACCOUNT_TTL_MS = 5_000;

interface Entry<T> {
  value: T | null;
  expiresAt: number;
}

export interface AccountCache<T = AccountState> {
  read(userId: number): Promise<T | null>;
  forget(userId: number): void;
  clear(): void;
}

export function createAccountCache<T = AccountState>(options: { load: (userId: number) => Promise<T | null>; ttlMs?: number; now?: () => number; maxEntries?: number }): AccountCache<T> {
  const ttl = options.ttlMs ?? ACCOUNT_TTL_MS;
  const now = options.now ?? Date.now;
  const maxEntries = options.maxEntries ?? 5_000;
  const entries = new Map<number, Entry<T>>();
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
const globalForAccounts = globalThis as typeof globalThis & { __fitledgerSessionAccounts?: AccountCache<SessionAccount> };
const shared = (globalForAccounts.__fitledgerSessionAccounts ??= createAccountCache({ load: (userId) => readSessionAccount({ userId }) }));

/** The account's role and status, for the guard and the pages. */
export async function readAccount(userId: number): Promise<AccountState | null> {
  const account = await shared.read(userId);
  return account && { id: account.id, email: account.email, name: account.name, role: account.role, status: account.status };
}

/** The same cached read with the session cutoff, for the jwt callback that decides whether a session lives. */
export function readAccountForSession(userId: number): Promise<SessionAccount | null> {
  return shared.read(userId);
}

/** Call after changing a person's role, status or session cutoff, so this process applies it on the next request. */
export function forgetAccount(userId: number): void {
  shared.forget(userId);
}

export function forgetAllAccounts(): void {
  shared.clear();
}
