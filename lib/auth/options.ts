import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { env } from "@/lib/env";
import { readAccount } from "./account-cache";
import { clientAddressFrom } from "./client-address";
import { checkCredentials } from "./credentials";
import { isRole } from "./roles";
import { safeLocalPath } from "./safe-path";

// next-auth 4 with the Credentials provider and JWT sessions. The token only says who signed in; the
// role and status are re-read from the database (briefly cached) on every request, so a suspension or
// a role change applies on the person's next request even though their JWT was issued before it.

export const SESSION_MAX_AGE_SECONDS = 7 * 24 * 3600;

/** Thrown from the jwt callback for an account that is no longer active: next-auth then clears the cookie. */
export class SessionEnded extends Error {
  constructor() {
    super("The account behind this session is not active.");
    this.name = "SessionEnded";
  }
}

function isSessionEnded(value: unknown): boolean {
  return value instanceof SessionEnded || (typeof value === "object" && value !== null && (value as { name?: unknown }).name === "SessionEnded");
}

let options: NextAuthOptions | undefined;

/** Built on first use rather than at import: `next build` imports this module without AUTH_SECRET. */
export function authOptions(): NextAuthOptions {
  options ??= {
    secret: env.authSecret(),
    session: { strategy: "jwt", maxAge: SESSION_MAX_AGE_SECONDS },
    // next-auth would otherwise guess from NEXTAUTH_URL, which this app does not use (lib/env.ts).
    useSecureCookies: env.APP_URL.startsWith("https://"),
    pages: { signIn: "/signin", error: "/signin", signOut: "/signin" },
    providers: [
      CredentialsProvider({
        id: "credentials",
        name: "E-mail and password",
        credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
        async authorize(credentials, request) {
          const result = await checkCredentials(credentials ?? {}, clientAddressFrom(request?.headers ?? {}));
          // next-auth turns a thrown message into `?error=<message>` for the sign-in form.
          if (!result.ok) throw new Error(result.refusal);
          return { id: String(result.account.id), name: result.account.name, email: result.account.email };
        },
      }),
    ],
    callbacks: {
      async jwt({ token }) {
        const userId = Number(token.sub);
        if (!Number.isInteger(userId) || userId <= 0) throw new SessionEnded();
        const account = await readAccount(userId);
        if (!account || account.status !== "active") throw new SessionEnded();
        token.role = account.role;
        token.name = account.name;
        token.email = account.email;
        return token;
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
