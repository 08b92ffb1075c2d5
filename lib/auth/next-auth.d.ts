import type { Role } from "@/models/user";

// What Fitledger keeps in next-auth's session and token: who, (re-read on every request) the role, and
// when the session began (lib/auth/session-cutoff.ts).
declare module "next-auth" {
  interface Session {
    user: { id: number; name: string; email: string; role: Role };
  }
  interface User {
    /** ms since the epoch; set by the Credentials provider's authorize() */
    signedInAt?: number;
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    role?: Role;
    /** ms since the epoch, set once when the session begins; next-auth's own iat moves on every read */
    signedInAt?: number;
  }
}
