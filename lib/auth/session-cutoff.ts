// Ending every session issued before an event (a password reset or change, a suspension, a decline).
// The event stores a cutoff on the account (users.sessions_valid_after); a session that began before
// it counts as signed out, wherever the account is re-read for a request.
//
// When did a session begin? Not `iat`: next-auth 4 re-encodes the token on every session read and
// stamps a fresh iat each time, so a stolen token that is used once while a cached account read is
// still stale (ACCOUNT_TTL_MS) would come back with an iat after the cutoff and live on for good.
// The token instead carries `signedInAt`, in milliseconds, set once when the session begins and copied
// unchanged into every re-encoded token. Milliseconds also settle the same-second case: a session that
// begins after the cutoff but within the same second keeps working, one just before it does not.

export interface SessionTimes {
  signedInAt?: unknown;
  iat?: unknown;
}

/**
 * When the session behind a token began (ms since the epoch), or null when the token does not say.
 * A token from before `signedInAt` existed falls back to the start of its iat second, which is never
 * later than the moment it was issued: such a token issued in the cutoff's own second is refused.
 */
export function sessionStart(token: SessionTimes): number | null {
  if (typeof token.signedInAt === "number" && Number.isFinite(token.signedInAt)) return token.signedInAt;
  if (typeof token.iat === "number" && Number.isFinite(token.iat)) return token.iat * 1000;
  return null;
}

/** true when a session that began at `startedAt` was ended by the account's cutoff. */
export function endedByCutoff(startedAt: number, cutoff: Date | null): boolean {
  if (cutoff === null) return false;
  // the session that made the change is re-issued starting exactly at the cutoff, and must survive
  return startedAt < cutoff.getTime();
}

/**
 * The cutoff to store for an event happening now. Never earlier than the stored one: with two app
 * instances whose clocks differ slightly, a later event must not bring back sessions an earlier one ended.
 */
export function nextCutoff(stored: Date | null, now: Date = new Date()): Date {
  return stored && stored.getTime() > now.getTime() ? stored : now;
}
