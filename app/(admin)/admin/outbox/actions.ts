"use server";

import { revalidatePath } from "next/cache";
import { actionWithRole } from "@/lib/auth/guard";
import { retryMessageNow } from "@/lib/mail/outbox";
import { retryMessageSchema } from "@/lib/validation/account";

export const retryOutboxMessage = actionWithRole("admin", retryMessageSchema, async (input, user) => {
  await retryMessageNow({ messageId: input.messageId, actorId: user.id });
  revalidatePath("/admin/outbox");
  return "Queued for another try now.";
});
