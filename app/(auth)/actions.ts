"use server";

import { applyForAccount } from "@/lib/auth/accounts";
import { publicAction } from "@/lib/auth/guard";
import { requestPasswordReset, resetPassword } from "@/lib/auth/password-reset";
import { applySchema, resetConfirmSchema, resetRequestSchema } from "@/lib/validation/account";

// The forms a visitor without a session uses. Public, but each goes through the same guard (input
// validation) and the account rate limits.

export const submitApplication = publicAction(applySchema, async (input, { address }) => {
  await applyForAccount(input, { address });
  return "Application received.";
});

export const requestResetLink = publicAction(resetRequestSchema, async (input, { address }) => {
  await requestPasswordReset(input, { address });
  return "If an active account uses that address, we have sent it a link to choose a new password. The link works once, for an hour.";
});

export const setPasswordFromLink = publicAction(resetConfirmSchema, async (input) => {
  await resetPassword({ token: input.token, password: input.password });
  return "Your new password is set. You can sign in with it now.";
});
