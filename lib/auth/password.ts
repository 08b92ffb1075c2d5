import "server-only";
import bcrypt from "bcryptjs";
import { env } from "@/lib/env";

// bcrypt (DESIGN §3). Cost 12 is about a quarter of a second per hash in bcryptjs on this kind of
// machine: slow for a guesser, bearable at sign-in. Tests use the minimum cost so the suite stays fast;
// a hash records its own cost, so accounts made with either verify the same way.
const COST = env.NODE_ENV === "test" ? 4 : 12;

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, COST);
}

export function verifyPassword(password: string, passwordHash: string): Promise<boolean> {
  return bcrypt.compare(password, passwordHash);
}

// Compared against when the e-mail is unknown, so a wrong address costs the same time as a wrong
// password and response times do not reveal which addresses have accounts.
let decoyHash: Promise<string> | undefined;
export async function spendVerificationTime(password: string): Promise<void> {
  decoyHash ??= bcrypt.hash("fitledger-decoy-password", COST);
  await bcrypt.compare(password, await decoyHash);
}
