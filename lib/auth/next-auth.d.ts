import type { Role } from "@/models/user";

// What Fitledger keeps in next-auth's session and token: who, and (re-read on every request) the role.
declare module "next-auth" {
  interface Session {
    user: { id: number; name: string; email: string; role: Role };
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    role?: Role;
  }
}
