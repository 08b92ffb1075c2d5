import "server-only";
import { findCredentials, type AccountState } from "@/lib/db/queries/users";
import { signInSchema } from "@/lib/validation/account";
import { recordSignInFailure, signInBlock } from "./limits";
import { spendVerificationTime, verifyPassword } from "./password";
import type { SignInRefusal } from "./refusals";

export type SignInCheck = { ok: true; account: AccountState } | { ok: false; refusal: SignInRefusal };

/**
 * The sign-in check behind next-auth's Credentials provider. The password is checked before the
 * account's state, so only someone who knows the password learns that an account is pending,
 * declined or suspended; none of those gets a session.
 */
export async function checkCredentials(input: { email?: unknown; password?: unknown }, address: string): Promise<SignInCheck> {
  const parsed = signInSchema.safeParse(input);
  if (!parsed.success) return { ok: false, refusal: "invalid-input" };
  const { email, password } = parsed.data;
  if (signInBlock({ address, email })) return { ok: false, refusal: "rate-limited" };

  const found = await findCredentials({ email });
  if (!found) {
    await spendVerificationTime(password);
    recordSignInFailure({ address, email });
    return { ok: false, refusal: "wrong-credentials" };
  }
  const { passwordHash, ...account } = found;
  if (!(await verifyPassword(password, passwordHash))) {
    recordSignInFailure({ address, email });
    return { ok: false, refusal: "wrong-credentials" };
  }
  if (account.status === "pending") return { ok: false, refusal: "account-pending" };
  if (account.status === "declined") return { ok: false, refusal: "account-declined" };
  if (account.status === "suspended") return { ok: false, refusal: "account-suspended" };
  return { ok: true, account };
}
