"use server";

import { revalidatePath } from "next/cache";
import { changePassword, updateProfile } from "@/lib/auth/accounts";
import { actionWithRole } from "@/lib/auth/guard";
import { renewSession } from "@/lib/auth/session";
import { changePasswordSchema, profileSchema } from "@/lib/validation/account";

// Changes to one's own account. The account comes from the session, never from the form, so a
// forged id or role in the body changes nothing (the schemas drop unknown fields).

export const saveProfile = actionWithRole("reader", profileSchema, async (input, user) => {
  const message = await updateProfile({ user, name: input.name, affiliation: input.affiliation });
  revalidatePath("/account");
  return message;
});

// The change ends every session that began before it; this one is renewed in the same response, so the
// person stays signed in here and only their other sessions end.
export const changeOwnPassword = actionWithRole("reader", changePasswordSchema, async (input, user, { address }) => {
  const { message, sessionsValidAfter } = await changePassword({ user, currentPassword: input.currentPassword, newPassword: input.newPassword }, { address });
  await renewSession(user, sessionsValidAfter);
  return message;
});
