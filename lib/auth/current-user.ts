import "server-only";
import { cache } from "react";
import { redirect } from "next/navigation";
import type { AccountState } from "@/lib/db/queries/users";
import { readAccount } from "./account-cache";
import { hasRole, type Role } from "./roles";
import { readSession } from "./session";

export type SessionUser = AccountState & { status: "active" };

/**
 * The signed-in, active account of this request, or null — for server components. Role and status come
 * from the database (cached a few seconds), not from the token. Deduplicated per request.
 */
export const getCurrentUser = cache(async (): Promise<SessionUser | null> => {
  const session = await readSession();
  if (!session) return null;
  const account = await readAccount(session.userId);
  return account && account.status === "active" ? (account as SessionUser) : null;
});

/** For layouts and pages that need a signed-in account: anyone else is sent to the sign-in page. */
export async function requireSignedIn(next: string): Promise<SessionUser> {
  const user = await getCurrentUser();
  if (!user) redirect(`/signin?next=${encodeURIComponent(next)}`);
  return user;
}

/** The signed-in account and whether its role reaches `role` (the page shows a notice when it does not). */
export async function requireRole(role: Role, next: string): Promise<{ user: SessionUser; allowed: boolean }> {
  const user = await requireSignedIn(next);
  return { user, allowed: hasRole(user.role, role) };
}
