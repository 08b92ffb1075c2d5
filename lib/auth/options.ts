import "server-only";
import type { NextAuthOptions } from "next-auth";
import { encode, type JWT } from "next-auth/jwt";
import CredentialsProvider from "next-auth/providers/credentials";
import type { AccountState } from "@/lib/db/queries/users";
import { env } from "@/lib/env";
import { readAccountForSession } from "./account-cache";
import { clientAddressFrom } from "./client-address";
import { checkCredentials } from "./credentials";
import { isRole } from "./roles";
import { safeLocalPath } from "./safe-path";
import { endedByCutoff, sessionStart } from "./session-cutoff";

// next-auth 4 with the Credentials provider and JWT sessions. The token only says who signed in; the
// role and status are re-read from the database (briefly cached) on every request, so a suspension or
// a role change applies on the person's next request even though their JWT was issued before it. A
// password reset or change, a suspension or a decline also ends every session that began before it
// (lib/auth/session-cutoff.ts): the token carries when its session began, the account its cutoff.

export const SESSION_MAX_AGE_SECONDS = 7 * 24 * 3600;

/** Thrown from the jwt callback for a session that no longer counts: next-auth then clears the cookie. */
export class SessionEnded extends Error {
  constructor() {
    super("The account behind this session is not active, or its sessions were ended.");
    this.name = "SessionEnded";
  }
}

function isSessionEnded(value: unknown): boolean {
  return value instanceof SessionEnded || (typeof value === "object" && value !== null && (value as { name?: unknown }).name === "SessionEnded");
}

/**
 * next-auth's session cookie, named here so that renewSession (lib/auth/session.ts) writes exactly the
 * cookie next-auth reads. The __Secure- prefix and the secure flag follow useSecureCookies.
 */
export function sessionCookie() {
  const secure = env.APP_URL.startsWith("https://");
  return { name: `${secure ? "__Secure-" : ""}next-auth.session-token`, options: { httpOnly: true, sameSite: "lax" as const, path: "/", secure } };
}

/** The claims of a session token; `signedInAt` (ms) is when the session began and is never moved on. */
function sessionClaims(token: JWT, account: AccountState, signedInAt: number): JWT {
  token.sub = String(account.id);
  token.role = account.role;
  token.name = account.name;
  token.email = account.email;
  token.signedInAt = signedInAt;
  return token;
}

/** A fresh session token for `account` that began at `signedInAt`, encoded the way next-auth encodes its own. */
export async function issueSessionToken(account: AccountState, signedInAt: number): Promise<string> {
  return encode({ token: sessionClaims({}, account, signedInAt), secret: env.authSecret(), maxAge: SESSION_MAX_AGE_SECONDS });
}

let options: NextAuthOptions | undefined;

/** Built on first use rather than at import: `next build` imports this module without AUTH_SECRET. */
export function authOptions(): NextAuthOptions {
  options ??= {
    secret: env.authSecret(),
    session: { strategy: "jwt", maxAge: SESSION_MAX_AGE_SECONDS },
    // next-auth would otherwise guess from NEXTAUTH_URL, which this app does not use (lib/env.ts).
    useSecureCookies: env.APP_URL.startsWith("https://"),
    cookies: { sessionToken: sessionCookie() },
    pages: { signIn: "/signin", error: "/signin", signOut: "/signin" },
    providers: [
      CredentialsProvider({
        id: "credentials",
        name: "E-mail and password",
        credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
        async authorize(credentials, request) {
          // The session begins before the password is read: a reset that commits while this sign-in
          // checks the old password (a bcrypt compare takes a quarter of a second) still ends it.
          const signedInAt = Date.now();
          const result = await checkCredentials(credentials ?? {}, clientAddressFrom(request?.headers ?? {}));
          // next-auth turns a thrown message into `?error=<message>` for the sign-in form.
          if (!result.ok) throw new Error(result.refusal);
          return { id: String(result.account.id), name: result.account.name, email: result.account.email, signedInAt };
        },
      }),
    ],
    callbacks: {
      // Runs at sign-in (with `user`) and on every later read of the session.
      async jwt({ token, user }) {
        const userId = Number(token.sub);
        if (!Number.isInteger(userId) || userId <= 0) throw new SessionEnded();
        const startedAt = user?.signedInAt ?? sessionStart(token);
        if (startedAt === null) throw new SessionEnded();
        const account = await readAccountForSession(userId);
        if (!account || account.status !== "active") throw new SessionEnded();
        if (endedByCutoff(startedAt, account.sessionsValidAfter)) throw new SessionEnded();
        return sessionClaims(token, account, startedAt);
      },
      async session({ session, token }) {
        session.user = { id: Number(token.sub), name: token.name ?? "", email: token.email ?? "", role: isRole(token.role) ? token.role : "reader" };
        return session;
      },
      // Always a path on this site, never an absolute URL built from a guessed host.
      async redirect({ url, baseUrl }) {
        if (url.startsWith(baseUrl)) return safeLocalPath(url.slice(baseUrl.length) || "/", "/");
        return safeLocalPath(url, "/");
      },
    },
    logger: {
      error(code, metadata) {
        if (isSessionEnded(metadata)) return; // an ended session is expected, not an error
        const detail = metadata instanceof Error ? metadata.message : typeof metadata === "object" && metadata && "message" in metadata ? String(metadata.message) : "";
        console.error(`[auth] ${code} ${detail}`);
      },
      warn(code) {
        if (code === "NEXTAUTH_URL") return; // the app's address comes from APP_URL (lib/env.ts)
        console.warn(`[auth] warning ${code}`);
      },
      debug() {},
    },
  };
  return options;
}
