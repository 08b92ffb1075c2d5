// Why a sign-in did not create a session, and what the sign-in page says. Plain data, shared by the
// server (which names the refusal) and the sign-in form (which shows the sentence). A wrong e-mail and
// a wrong password get the same sentence, so the form never tells which addresses have accounts; the
// account's state is only told to someone who gave its correct password.

export const SIGN_IN_REFUSALS = ["wrong-credentials", "account-pending", "account-declined", "account-suspended", "invalid-input", "rate-limited"] as const;
export type SignInRefusal = (typeof SIGN_IN_REFUSALS)[number];

const MESSAGES: Record<SignInRefusal, string> = {
  "wrong-credentials": "That e-mail address and password do not match an account.",
  "account-pending": "Your application is still waiting for an admin's decision. You will get an e-mail as soon as it is decided; until then you cannot sign in.",
  "account-declined": "Your application was declined, so this account cannot sign in. The e-mail we sent you gives the reason.",
  "account-suspended": "This account is suspended and cannot sign in. The e-mail we sent you gives the reason; an admin can reactivate it.",
  "invalid-input": "Enter your e-mail address and password.",
  "rate-limited": "Too many failed attempts. Wait a few minutes and try again.",
};

export function isSignInRefusal(value: unknown): value is SignInRefusal {
  return typeof value === "string" && (SIGN_IN_REFUSALS as readonly string[]).includes(value);
}

/** The sentence for an `error` code from next-auth; its own "CredentialsSignin" means wrong credentials. */
export function signInMessage(code: string | null | undefined): string {
  if (isSignInRefusal(code)) return MESSAGES[code];
  if (code === "CredentialsSignin") return MESSAGES["wrong-credentials"];
  return "Signing in did not work. Please try again.";
}
