import "server-only";
import { cookies, headers } from "next/headers";
import { getServerSession } from "next-auth/next";
import type { AccountState } from "@/lib/db/queries/users";
import { clientAddressFrom } from "./client-address";
import { authOptions, issueSessionToken, SESSION_MAX_AGE_SECONDS, sessionCookie } from "./options";

// The one place that asks next-auth who is calling, and the request's network address. The guards,
// getCurrentUser() and the pages go through these functions only, so integration tests can stand in
// for a signed-in caller by replacing this module (vi.mock) without touching anything else.

export interface SessionIdentity {
  userId: number;
}

/**
 * The session behind a request's headers and cookies. next-auth decodes the JWT and runs the jwt
 * callback, which re-reads the account and ends the session unless it is active.
 */
export async function readSessionFrom(request: { headers: Record<string, string>; cookies: Record<string, string> }): Promise<SessionIdentity | null> {
  // getServerSession's (req, res, options) form; the response stub drops the refreshed cookie, which
  // a server component could not set anyway.
  const ignored = { getHeader() {}, setCookie() {}, setHeader() {} };
  const session = await getServerSession(request as never, ignored as never, authOptions());
  const userId = session?.user?.id;
  return typeof userId === "number" && Number.isInteger(userId) && userId > 0 ? { userId } : null;
}

/** The signed-in caller of the current request, or null. An inactive account's session counts as none. */
export async function readSession(): Promise<SessionIdentity | null> {
  // Reading the request first also marks the page as dynamic before any setting is needed.
  const [headerList, cookieStore] = await Promise.all([headers(), cookies()]);
  return readSessionFrom({
    headers: Object.fromEntries(headerList),
    cookies: Object.fromEntries(cookieStore.getAll().map((cookie) => [cookie.name, cookie.value])),
  });
}

export async function readClientAddress(): Promise<string> {
  return clientAddressFrom(await headers());
}

/**
 * Replaces the caller's session cookie with a token whose session begins at `startedAt` — for a person
 * who has just changed their own password, which ended every session that began before `startedAt`.
 * The caller proved the current password, so this is as good as signing in again. Server actions only
 * (a server component cannot set cookies).
 */
export async function renewSession(account: AccountState, startedAt: Date): Promise<void> {
  const cookie = sessionCookie();
  const token = await issueSessionToken(account, startedAt.getTime());
  (await cookies()).set(cookie.name, token, { ...cookie.options, expires: new Date(Date.now() + SESSION_MAX_AGE_SECONDS * 1000) });
}
