"use server";

import { revalidatePath } from "next/cache";
import { approvePerson, changeRole, declinePerson, reactivatePerson, suspendPerson } from "@/lib/auth/accounts";
import { actionWithRole } from "@/lib/auth/guard";
import { approveSchema, changeRoleSchema, declineSchema, reactivateSchema, suspendSchema } from "@/lib/validation/account";

// The admin's decisions on people. Each writes an AuditEvent and queues an e-mail to the person in the
// same transaction (lib/auth/accounts.ts); the rules (not oneself, not the last admin) live there too.

function done(message: string): string {
  revalidatePath("/admin/people");
  return message;
}

export const approveApplicant = actionWithRole("admin", approveSchema, async (input, user) => done(await approvePerson({ actor: user, userId: input.userId, role: input.role })));

export const declineApplicant = actionWithRole("admin", declineSchema, async (input, user) => done(await declinePerson({ actor: user, userId: input.userId, reason: input.reason })));

export const suspendAccount = actionWithRole("admin", suspendSchema, async (input, user) => done(await suspendPerson({ actor: user, userId: input.userId, reason: input.reason })));

export const reactivateAccount = actionWithRole("admin", reactivateSchema, async (input, user) => done(await reactivatePerson({ actor: user, userId: input.userId })));

export const changeAccountRole = actionWithRole("admin", changeRoleSchema, async (input, user) => done(await changeRole({ actor: user, userId: input.userId, role: input.role })));
