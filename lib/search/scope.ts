import "server-only";
import { hasRole, type Role } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { parseSearchQuery, type Paging, type SearchFilters } from "@/lib/validation/search";
import type { SearchScope } from "./engine";

// Who may see what (DESIGN §2): everyone sees verified entries; `mine=1` is a signed-in contributor's own
// entries in any state; entry states other than verified are for curators and admins. A request asking
// for more than its caller may see is refused (401/403) through the one guard, never silently widened.
// The guard and session modules are loaded only for such requests: an anonymous search never needs them
// (and the benchmark calls the handlers outside Next, where they cannot load).

const SESSION_COOKIES = ["next-auth.session-token", "__Secure-next-auth.session-token"];

/** Only a request carrying a session cookie can be a signed-in caller: anonymous searches skip the session read. */
function mayHaveSession(request: Request): boolean {
  const cookie = request.headers.get("cookie") ?? "";
  return SESSION_COOKIES.some((name) => cookie.includes(`${name}=`));
}

export async function scopeFor(request: Request, filters: SearchFilters): Promise<SearchScope> {
  if (filters.mine) {
    const { authorizeCaller } = await import("@/lib/auth/guard");
    const user = await authorizeCaller("contributor");
    return { kind: "owner", userId: user.id };
  }
  const widens = filters.state.some((state) => state !== "verified");
  if (widens) {
    const { authorizeCaller } = await import("@/lib/auth/guard");
    await authorizeCaller("curator");
    return { kind: "staff" };
  }
  if (mayHaveSession(request)) {
    const { getCurrentUser } = await import("@/lib/auth/current-user");
    const user = await getCurrentUser();
    if (user && hasRole(user.role, "curator")) return { kind: "staff" };
  }
  return { kind: "public" };
}

/**
 * The same rule for a page that already knows its reader (null: signed out). Returns the scope, or the
 * refusal as an AppError for the page to show.
 */
export function scopeForReader(user: { id: number; role: Role } | null, filters: SearchFilters): SearchScope | AppError {
  if (filters.mine) {
    if (!user) return new AppError("unauthenticated", "Sign in to see your own entries.");
    if (!hasRole(user.role, "contributor")) return new AppError("forbidden", "Only contributors have entries of their own.");
    return { kind: "owner", userId: user.id };
  }
  const staff = user !== null && hasRole(user.role, "curator");
  if (filters.state.some((state) => state !== "verified") && !staff) return new AppError(user ? "forbidden" : "unauthenticated", "Only curators and admins can see entries that are not verified.");
  return staff ? { kind: "staff" } : { kind: "public" };
}

/** The search of a request's query string, or a 400 naming each bad parameter. */
export function readSearchRequest(request: Request, options: { paging?: boolean; extra?: readonly string[] } = {}): { filters: SearchFilters; paging: Paging; rest: Record<string, string> } {
  const parsed = parseSearchQuery(new URL(request.url).searchParams, options);
  if (!parsed.ok) {
    const names = Object.keys(parsed.problems);
    const first = names[0];
    throw new AppError("validation_failed", `Invalid parameter ${first}: ${parsed.problems[first][0]}${names.length > 1 ? ` (and ${names.length - 1} more)` : ""}`, { fields: parsed.problems });
  }
  return parsed.value;
}
