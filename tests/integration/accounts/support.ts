// Helpers shared by the account tests: people written straight to the temp database, form data, and
// a client for next-auth's real endpoints (CSRF token, credentials callback, session).
import { GET as authGet, POST as authPost } from "@/app/api/auth/[...nextauth]/route";
import { hashPassword } from "@/lib/auth/password";
import { db } from "@/lib/db";
import type { AccountStatus, Role } from "@/models/user";

export const PASSWORD = "a ledger of fitted models";

export async function createPerson(options: { email: string; role?: Role; status?: AccountStatus; name?: string; password?: string }) {
  const { models } = await db();
  const user = await models.User.create({
    email: options.email,
    name: options.name ?? options.email.split("@")[0],
    affiliation: null,
    reason: null,
    passwordHash: await hashPassword(options.password ?? PASSWORD),
    role: options.role ?? "contributor",
    status: options.status ?? "active",
    statusNote: null,
  });
  return { id: user.id, email: user.email, name: user.name, role: user.role as Role };
}

export function form(values: Record<string, string | number>): FormData {
  const data = new FormData();
  for (const [key, value] of Object.entries(values)) data.set(key, String(value));
  return data;
}

const BASE = "http://fitledger.test";
const context = (segments: string[]) => ({ params: Promise.resolve({ nextauth: segments }) });

function cookiesOf(response: Response): Record<string, string> {
  const jar: Record<string, string> = {};
  for (const line of response.headers.getSetCookie()) {
    const [pair] = line.split(";");
    const index = pair.indexOf("=");
    jar[pair.slice(0, index)] = pair.slice(index + 1);
  }
  return jar;
}

const cookieHeader = (jar: Record<string, string>) =>
  Object.entries(jar)
    .filter(([, value]) => value !== "")
    .map(([name, value]) => `${name}=${value}`)
    .join("; ");

export const SESSION_COOKIE = "next-auth.session-token";

export interface SignInAttempt {
  status: number;
  /** the `error` code next-auth put in its reply URL, or null on success */
  error: string | null;
  /** the cookies the reply set (the session token among them on success) */
  cookies: Record<string, string>;
  body: unknown;
  headers: Headers;
}

/** Signs in the way the browser form does: fetch a CSRF token, then post the credentials. */
export async function signIn(email: string, password: string, address = "198.51.100.10"): Promise<SignInAttempt> {
  const csrfResponse = await authGet(new Request(`${BASE}/api/auth/csrf`), context(["csrf"]));
  const { csrfToken } = (await csrfResponse.json()) as { csrfToken: string };
  const jar = cookiesOf(csrfResponse);
  const response = await authPost(
    new Request(`${BASE}/api/auth/callback/credentials`, {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded", cookie: cookieHeader(jar), "x-forwarded-for": address },
      body: new URLSearchParams({ email, password, csrfToken, json: "true" }),
    }),
    context(["callback", "credentials"]),
  );
  const body = (await response.json()) as { url?: string };
  const error = body.url ? new URL(body.url, BASE).searchParams.get("error") : "no-url";
  return { status: response.status, error, cookies: cookiesOf(response), body, headers: response.headers };
}

/** next-auth's session endpoint for a given session cookie: what the browser's header menu reads. */
export async function sessionFor(sessionToken: string): Promise<{ body: Record<string, unknown>; cookies: Record<string, string> }> {
  const response = await authGet(new Request(`${BASE}/api/auth/session`, { headers: { cookie: `${SESSION_COOKIE}=${sessionToken}` } }), context(["session"]));
  return { body: (await response.json()) as Record<string, unknown>, cookies: cookiesOf(response) };
}

/** Every message in the outbox for one address, oldest first. */
export async function outboxFor(email: string) {
  const { models } = await db();
  const rows = await models.OutboxMessage.findAll({ where: { to: email }, order: [["id", "ASC"]] });
  return rows.map((row) => row.get({ plain: true }));
}

/** The audit trail of one row, oldest first. */
export async function auditOf(entity: string, entityId: number) {
  const { models } = await db();
  const rows = await models.AuditEvent.findAll({ where: { entity, entityId: String(entityId) }, order: [["id", "ASC"]] });
  return rows.map((row) => row.get({ plain: true }));
}

export async function statusOf(userId: number) {
  const { models } = await db();
  const row = await models.User.findByPk(userId, { attributes: ["status", "role", "statusNote"] });
  return row ? { status: row.status, role: row.role, statusNote: row.statusNote } : null;
}
